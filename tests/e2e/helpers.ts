import { expect, type Page } from '@playwright/test';

export const DEMO_PASSWORD = 'hoodline-demo';

export async function signIn(page: Page, role: string) {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(`${role}@demo.example`);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('button', { name: 'Sign out' })).toBeVisible();
}

/** A point inside the part's outline that no other outlined part covers, so a tap there hits that part. */
export async function freePointOf(page: Page, instanceId: string) {
  return page.evaluate((id) => {
    const rects = [...document.querySelectorAll<SVGRectElement>('[data-testid=area-outlines] rect')].map((r) => ({ id: r.dataset.instance, b: r.getBoundingClientRect() }));
    const me = rects.find((r) => r.id === id)!.b;
    const others = rects.filter((r) => r.id !== id).map((r) => r.b);
    for (let fy = 0.9; fy > 0.1; fy -= 0.05)
      for (let fx = 0.1; fx < 0.9; fx += 0.05) {
        const x = me.left + me.width * fx;
        const y = me.top + me.height * fy;
        if (!others.some((o) => x >= o.left - 4 && x <= o.right + 4 && y >= o.top - 4 && y <= o.bottom + 4)) return { x, y };
      }
    return { x: me.left + me.width / 2, y: me.top + me.height * 0.85 };
  }, instanceId);
}
