import { expect, type Page } from '@playwright/test';

export const DEMO_PASSWORD = 'hoodline-demo';

export async function signIn(page: Page, role: string) {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(`${role}@demo.example`);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('button', { name: 'Sign out' })).toBeVisible();
}
