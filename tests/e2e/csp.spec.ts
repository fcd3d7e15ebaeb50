import { expect, test, type Page } from '@playwright/test';
import { DEMO_PASSWORD } from './helpers';

// The strict Content-Security-Policy is only worth having if the app passes it: visit every screen of
// every role and fail on any violation the browser reports.
const SCREENS: Record<string, string[]> = {
  inspector: ['/walkaround', '/repairs', '/due', '/units', '/lab'],
  foreman: ['/repairs', '/hot-spots'],
  engineer: ['/hot-spots', '/units'],
  trainer: ['/lab', '/lab/flip', '/lab/present'],
  admin: ['/people', '/outbox', '/railroad', '/railroad/audit'],
};

async function collectViolations(page: Page) {
  const seen: string[] = [];
  await page.exposeFunction('__cspViolation', (v: string) => seen.push(v));
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => (window as unknown as { __cspViolation(v: string): void }).__cspViolation(`${e.violatedDirective} ${e.blockedURI}`));
  });
  page.on('console', (m) => m.type() === 'error' && /Content Security Policy/.test(m.text()) && seen.push(m.text()));
  return seen;
}

for (const [role, paths] of Object.entries(SCREENS)) {
  test(`no Content-Security-Policy violation on the ${role}'s screens`, async ({ page }) => {
    const violations = await collectViolations(page);
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').fill(`${role}@demo.example`);
    await page.getByLabel('Password').fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect(page.getByRole('button', { name: 'Sign out' })).toBeVisible();
    for (const p of paths) {
      await page.goto(p);
      await expect(page.getByRole('heading', { level: 1 }).first()).toBeVisible();
      await page.waitForLoadState('networkidle');
    }
    if (role === 'engineer') {
      // A screen with the canvas: a unit page.
      await page.goto('/units');
      await page.getByRole('link', { name: 'HRL 4101' }).first().click();
      await page.waitForLoadState('networkidle');
    }
    expect(violations).toEqual([]);
  });
}
