import { expect, test } from '@playwright/test';
import { signIn } from './helpers';

const HOMES: Record<string, string> = {
  inspector: 'Walkaround',
  foreman: 'Repair queue',
  engineer: 'Hot spots',
  trainer: 'Orientation lab',
  admin: 'People',
};

for (const [role, home] of Object.entries(HOMES)) {
  test(`the demo ${role} signs in and lands on ${home}`, async ({ page }) => {
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    // The sign-in page asks /api/auth/me first and is told 401 (not signed in yet): expected.
    page.on('console', (m) => m.type() === 'error' && !/status of 401/.test(m.text()) && errors.push(m.text()));
    await signIn(page, role);
    await expect(page.getByRole('heading', { level: 1, name: home })).toBeVisible();
    await expect(page.getByTestId('signed-in')).toContainText(role === 'admin' ? 'Admin' : role[0].toUpperCase() + role.slice(1));
    // Only the role's own screens are offered.
    const nav = page.getByRole('navigation', { name: 'Screens' });
    if (role === 'trainer') await expect(nav.getByRole('link', { name: 'Walkaround' })).toHaveCount(0);
    if (role !== 'admin') await expect(nav.getByRole('link', { name: 'People' })).toHaveCount(0);
    await page.screenshot({ path: `.tmp/screens/home-${role}.png` });
    await page.getByRole('button', { name: 'Sign out' }).click();
    await expect(page.getByRole('button', { name: 'Sign in' })).toBeVisible();
    expect(errors).toEqual([]);
  });
}

test('a wrong password shows a clear message and no 500', async ({ page }) => {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill('inspector@demo.example');
  await page.getByLabel('Password').fill('wrong-password');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('alert')).toContainText('Wrong e-mail or password');
});

test('an unknown address shows the 404 page', async ({ page }) => {
  await signIn(page, 'engineer');
  await page.goto('/no-such-screen');
  await expect(page.getByRole('heading', { name: 'No such page' })).toBeVisible();
});
