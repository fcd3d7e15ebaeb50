import { expect, test, type Page } from '@playwright/test';
import { DEMO_PASSWORD } from './helpers';

// Offline walkaround: findings pinned without a connection are kept on the device and sent once when it
// returns (the server keeps one finding per idempotency key); a record signed meanwhile is shown as a conflict.

// An 8×8 grey PNG; the server decides its type by its bytes.
const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAgAAAAICAIAAABLbSncAAAACXBIWXMAAAPoAAAD6AG1e1JrAAAAD0lEQVQImWNowAEYhpYEAILzYAEeEbvlAAAAAElFTkSuQmCC', 'base64');
const PILOT = /Pilot height above rail out of limit/;

interface Insp {
  id: string;
  status: string;
  findings: { id: string; idempotencyKey?: string; defectLabel: string; measurement: { value: number } | null; photos: { id: string }[] }[];
  coverage: { gaps: { instanceId: string }[] };
}

async function signInAs(page: Page, role: string) {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(`${role}@demo.example`);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByTestId('signed-in')).toBeAttached();
}

/** A point inside the part's outline that no other outlined part covers. */
async function freePointOf(page: Page, instanceId: string) {
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

async function getInsp(page: Page, id: string) {
  const r = await page.request.get(`/api/inspections/${id}`);
  expect(r.ok()).toBe(true);
  return (await r.json()) as Insp;
}

/** Pins a pilot-height finding (49 CFR 229.123(a): 3 in minimum, so these readings fail) through the form. */
async function pinPilot(page: Page, reading: string, photo = false) {
  // The part's own Defect… button: the panels above the drawing grow as findings wait, so a tap spot moves.
  await page.getByRole('button', { name: 'Report a defect on Front pilot' }).click();
  await expect(page.getByRole('heading', { name: 'Finding on Front pilot' })).toBeVisible();
  await page.getByRole('radio', { name: PILOT }).check();
  await page.getByLabel('Reading').fill(reading);
  await expect(page.getByTestId('check-result')).toHaveAttribute('data-result', 'fail');
  if (photo) await page.getByLabel('Add photos').setInputFiles({ name: 'pilot-offline.png', mimeType: 'image/png', buffer: PNG });
  await page.getByRole('button', { name: 'Pin the finding' }).click();
  // Kept on the device: the form closes, the pin stays.
  await expect(page.getByRole('heading', { name: 'Finding on Front pilot' })).toBeHidden();
}

test('offline: three findings (one with a photo) wait on the device, arrive once; one pinned while the record is signed elsewhere shows the conflict', async ({ page, browser }) => {
  test.setTimeout(240_000);
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await signInAs(page, 'inspector');

  // Start a daily inspection of HRL 2201 online (F on the short hood, as the record says).
  await page.goto('/walkaround');
  await page.getByLabel('Road number').fill('2201');
  await page.getByRole('radio', { name: /HRL 2201/ }).click();
  await page.getByRole('radio', { name: 'Daily' }).click();
  await page.getByRole('button', { name: 'Confirm F on the short hood and start' }).click();
  await expect(page).toHaveURL(/\/walkaround\/inspections\/[0-9a-f-]{36}/);
  const id = /inspections\/([0-9a-f-]{36})/.exec(page.url())![1];
  await page.getByRole('button', { name: 'Blue signal is up — continue' }).click();
  await expect(page.locator('[data-testid=area-outlines] rect[data-instance=pilot_sh]').first()).toBeAttached();

  // The service worker holds the app shell before the connection goes.
  await page.waitForFunction(async () => {
    await navigator.serviceWorker.ready;
    return navigator.serviceWorker.controller !== null;
  });
  // Open the form once online, so the pilot's defect list is in memory, then drop it.
  const tap = await freePointOf(page, 'pilot_sh');
  await page.mouse.click(tap.x, tap.y);
  await expect(page.getByRole('radio', { name: PILOT })).toBeVisible();
  await page.getByRole('button', { name: 'Cancel' }).click();
  const before = (await getInsp(page, id)).findings.length;

  await page.context().setOffline(true);
  // The banner moves the drawing down; tap only once it is there.
  await expect(page.getByText(/^No connection\. Findings you pin are kept on this device/)).toBeVisible();
  await pinPilot(page, '2.5', true);
  await pinPilot(page, '2.25');
  await pinPilot(page, '2');
  const waiting = page.getByTestId('offline-waiting');
  await expect(waiting).toContainText('Waiting to send: 3 findings');
  await expect(waiting).toContainText('(1 photo)');
  // The waiting findings already count the pilot as covered, as the server will (a part with a finding is done).
  await expect(page.getByTestId('coverage')).toContainText('1 with a finding');
  await expect(page.locator('[data-testid=finding][data-pending=true]')).toHaveCount(3);
  await expect(page.locator('[data-testid=finding][data-pending=true]').first()).toContainText('Waiting to send');
  // Nothing reached the server (page.request is not the browser's network).
  expect((await getInsp(page, id)).findings.length).toBe(before);

  // Back online: sent in order, each once, the photo after its finding.
  await page.context().setOffline(false);
  await expect(waiting).toBeHidden({ timeout: 30_000 });
  await expect.poll(async () => (await getInsp(page, id)).findings.length, { timeout: 30_000 }).toBe(before + 3);
  let insp = await getInsp(page, id);
  const fresh = insp.findings.slice(before);
  expect(fresh.map((f) => f.measurement?.value)).toEqual([2.5, 2.25, 2]);
  expect(fresh.map((f) => f.photos.length)).toEqual([1, 0, 0]);
  await expect(page.locator('[data-testid=finding][data-pending=true]')).toHaveCount(0);
  // A little later still exactly three: no retry made a second finding.
  await page.waitForTimeout(3000);
  expect((await getInsp(page, id)).findings.length).toBe(before + 3);

  // Offline again: one more finding; the app shell reloads from the service worker and the queue from IndexedDB.
  await page.context().setOffline(true);
  await expect(page.getByText(/^No connection\. Findings you pin are kept on this device/)).toBeVisible();
  await pinPilot(page, '1.75');
  await expect(waiting).toContainText('Waiting to send: 1 finding');
  // Reloaded offline, the shell comes from the service worker and opens as the last signed-in person,
  // with the finding still waiting on the device.
  await page.reload();
  await expect(page.getByRole('button', { name: 'Sign out' })).toBeVisible();
  await expect(waiting).toContainText('Waiting to send: 1 finding');

  // Meanwhile the same inspector signs the record from another device.
  const other = await browser.newContext();
  const otherPage = await other.newPage();
  await signInAs(otherPage, 'inspector');
  insp = await getInsp(otherPage, id);
  const gaps = insp.coverage.gaps.map((g) => g.instanceId);
  if (gaps.length) expect((await otherPage.request.post(`/api/inspections/${id}/coverage`, { data: { instanceIds: gaps, state: 'passed' } })).ok()).toBe(true);
  const signed = await otherPage.request.post(`/api/inspections/${id}/sign`, { data: { password: DEMO_PASSWORD } });
  expect(signed.ok()).toBe(true);
  expect(((await signed.json()) as Insp).status).toBe('signed');
  await other.close();

  // Back online and reloaded: the queue, kept in IndexedDB, is sent at start; the refusal is shown, not dropped.
  await page.context().setOffline(false);
  await page.reload();
  const failed = page.getByTestId('offline-failed');
  await expect(failed).toBeVisible({ timeout: 30_000 });
  await expect(failed).toContainText('Could not be sent');
  // The server's own words (409 conflict), whichever way it puts that the record is signed.
  await expect(failed).toContainText(/record (is|was) signed/);
  await expect(failed).toContainText(PILOT);
  await expect(page.getByTestId('offline-waiting')).toBeHidden();
  expect((await getInsp(page, id)).findings.length).toBe(before + 3);
  // It stays until the inspector dismisses it.
  await page.reload();
  await expect(page.getByTestId('offline-failed')).toBeVisible();
  await page.getByTestId('offline-failed').getByRole('button', { name: 'Dismiss' }).click();
  await expect(page.getByTestId('offline-failed')).toBeHidden();
  expect(errors).toEqual([]);
});
