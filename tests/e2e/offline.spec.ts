import { expect, test, type Page } from '@playwright/test';
import { DEMO_PASSWORD, freePointOf, signIn } from './helpers';

// Offline walkaround: findings pinned and parts passed or marked n.a. without a connection are kept on the
// device and sent once, in order, the moment it returns (the server keeps one finding per idempotency key, and
// answers a coverage mark's retry by its Idempotency-Key); a record signed meanwhile is shown as a conflict.

// An 8×8 grey PNG; the server decides its type by its bytes.
const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAgAAAAICAIAAABLbSncAAAACXBIWXMAAAPoAAAD6AG1e1JrAAAAD0lEQVQImWNowAEYhpYEAILzYAEeEbvlAAAAAElFTkSuQmCC', 'base64');
const PILOT = /Pilot height above rail out of limit/;

interface Insp {
  id: string;
  status: string;
  findings: { id: string; idempotencyKey?: string; instanceId: string; defectLabel: string; measurement: { value: number } | null; photos: { id: string }[] }[];
  items: { instanceId: string; state: string; reason: string | null }[];
  routine: { areas: { key: string; label: string; instanceIds: string[] }[] };
  coverage: { passed: number; findings: number; notApplicable: number; gaps: { instanceId: string }[] };
}

const NO_CONNECTION = /^No connection\. Findings you pin and parts you pass or mark n\.a\. are kept on this device/;

/** Opens an area of the routine by its button. */
async function openArea(page: Page, name: RegExp) {
  await page.getByRole('navigation', { name: 'Routine' }).locator('button[id^=walk-area-]').filter({ hasText: name }).click();
}

/** The parts listed for the open area, with their instance ids and labels. */
async function partsOfArea(page: Page, area: string) {
  const list = page.getByRole('list', { name: `Parts of ${area}` });
  // The area opens on a tap; read its parts once they are drawn (evaluateAll does not wait).
  await expect(list.locator('li[data-instance]').first()).toBeVisible();
  return list.locator('li[data-instance]').evaluateAll((els) => els.map((e) => ({ id: (e as HTMLElement).dataset.instance!, label: e.querySelector('span.text-lg')?.childNodes[0]?.textContent ?? '' })));
}

/** Marks a part not applicable through its own N.a. button, with the reason. */
async function markNa(page: Page, label: string, reason: string) {
  await page.getByRole('button', { name: `Not applicable: ${label}` }).click();
  await page.getByLabel('Why it does not apply').fill(reason);
  await page.getByRole('button', { name: 'Mark n.a.' }).click();
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

test('offline: three findings (one with a photo), an area passed and a part marked n.a. wait on the device and arrive once, in order; a finding and a mark made while the record is signed elsewhere show the conflict', async ({ page, browser }) => {
  test.setTimeout(240_000);
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await signIn(page, 'inspector');

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
  const start = await getInsp(page, id);
  const before = start.findings.length;
  expect(start.items).toEqual([]);
  const [front, , cab] = start.routine.areas;
  expect(front.label).toBe('Front end (short hood)');
  expect(cab.label).toBe('Cab');
  const frontParts = await partsOfArea(page, front.label);
  expect(frontParts.map((p) => p.id)).toEqual(front.instanceIds);

  await page.context().setOffline(true);
  // The banner moves the drawing down; tap only once it is there.
  await expect(page.getByText(NO_CONNECTION)).toBeVisible();
  await pinPilot(page, '2.5', true);
  await pinPilot(page, '2.25');
  await pinPilot(page, '2');
  // The rest of the front end passed, and one part of the cab not applicable, all without a connection.
  const passRest = page.getByRole('button', { name: /Pass the rest of this area/ });
  await expect(passRest).toHaveText(`Pass the rest of this area (${front.instanceIds.length - 1})`);
  await passRest.click();
  await openArea(page, /^\d+Cab/);
  const [cabPart] = await partsOfArea(page, cab.label);
  await markNa(page, cabPart.label, 'Not fitted on this unit');

  const waiting = page.getByTestId('offline-waiting');
  await expect(waiting.getByRole('heading')).toHaveText('Waiting to send: 3 findings and 2 coverage marks');
  await expect(waiting).toContainText('(1 photo)');
  await expect(waiting.locator('li[data-kind=coverage]')).toHaveText([
    front.instanceIds.length - 1 <= 3 ? /^Passed: / : `Passed: ${front.instanceIds.length - 1} parts of Front end (short hood)`,
    `Not applicable: ${cabPart.label} (Not fitted on this unit)`,
  ]);
  // The coverage on screen already counts them as the server will, marked as waiting.
  const coverage = page.getByTestId('coverage');
  await expect(coverage).toContainText(`${front.instanceIds.length - 1} passed`);
  await expect(coverage).toContainText('1 with a finding');
  await expect(coverage).toContainText('1 n.a.');
  await expect(page.getByTestId('coverage-waiting')).toHaveText(`${front.instanceIds.length + 1} parts waiting to send`);
  const cabRow = page.locator(`li[data-instance="${cabPart.id}"]`);
  await expect(cabRow).toHaveAttribute('data-pending', 'true');
  await expect(cabRow).toHaveAttribute('data-state', 'not_applicable');
  await expect(cabRow).toContainText('Waiting to send');
  await expect(cabRow).toContainText('Not applicable: Not fitted on this unit');
  await expect(page.locator('[data-testid=finding][data-pending=true]')).toHaveCount(0); // the cab has no findings
  await openArea(page, /Front end \(short hood\)/);
  await expect(page.locator('[data-testid=finding][data-pending=true]')).toHaveCount(3);
  await expect(page.locator('[data-testid=finding][data-pending=true]').first()).toContainText('Waiting to send');
  await expect(page.locator(`li[data-instance="${frontParts[1].id}"]`)).toHaveAttribute('data-pending', 'true');
  // For a look at the waiting state at 1024×768: the top of the screen, and the whole page.
  await page.evaluate(() => window.scrollTo(0, 0));
  await page.screenshot({ path: '.tmp/e2e-output/offline-waiting.png' });
  await page.screenshot({ path: '.tmp/e2e-output/offline-waiting-full.png', fullPage: true });
  // Nothing reached the server (page.request is not the browser's network).
  let insp = await getInsp(page, id);
  expect(insp.findings.length).toBe(before);
  expect(insp.items).toEqual([]);

  // Back online: sent at once on the online event (the default 10 s wait is shorter than the backoff the
  // failed tries have built up by now), in order, each once, the photo after its finding.
  await page.context().setOffline(false);
  await expect(waiting).toBeHidden();
  await expect(page.getByTestId('coverage-waiting')).toBeHidden();
  insp = await getInsp(page, id);
  expect(insp.findings.length).toBe(before + 3);
  const fresh = insp.findings.slice(before);
  expect(fresh.map((f) => f.measurement?.value)).toEqual([2.5, 2.25, 2]);
  expect(fresh.map((f) => f.photos.length)).toEqual([1, 0, 0]);
  // The coverage on the server: the front end passed but for the pilot (it has findings, so it stays a finding), the cab part n.a. with its reason.
  const state = new Map(insp.items.map((i) => [i.instanceId, i]));
  for (const p of front.instanceIds) expect(state.get(p)?.state, p).toBe(p === 'pilot_sh' ? 'finding' : 'passed');
  expect(state.get(cabPart.id)).toEqual({ instanceId: cabPart.id, state: 'not_applicable', reason: 'Not fitted on this unit' });
  expect(insp.items).toHaveLength(front.instanceIds.length + 1);
  expect(insp.coverage).toMatchObject({ passed: front.instanceIds.length - 1, findings: 1, notApplicable: 1 });
  await expect(page.locator('[data-testid=finding][data-pending=true]')).toHaveCount(0);
  await expect(coverage).toContainText(`${front.instanceIds.length - 1} passed`);
  // A little later still exactly three: no retry made a second finding.
  await page.waitForTimeout(3000);
  expect((await getInsp(page, id)).findings.length).toBe(before + 3);

  // Offline again: one more finding and one more mark; the app shell reloads from the service worker and the queue from IndexedDB.
  await page.context().setOffline(true);
  await expect(page.getByText(NO_CONNECTION)).toBeVisible();
  await pinPilot(page, '1.75');
  await openArea(page, /^\d+Cab/);
  const secondCab = (await partsOfArea(page, cab.label))[1];
  await markNa(page, secondCab.label, 'Cab locked by the shop');
  await expect(waiting.getByRole('heading')).toHaveText('Waiting to send: 1 finding and 1 coverage mark');
  // Reloaded offline, the shell comes from the service worker and opens as the last signed-in person,
  // with what waits still on the device.
  await page.reload();
  await expect(page.getByRole('button', { name: 'Sign out' })).toBeVisible();
  await expect(waiting.getByRole('heading')).toHaveText('Waiting to send: 1 finding and 1 coverage mark');

  // Meanwhile the same inspector signs the record from another device.
  const other = await browser.newContext();
  const otherPage = await other.newPage();
  await signIn(otherPage, 'inspector');
  insp = await getInsp(otherPage, id);
  const gaps = insp.coverage.gaps.map((g) => g.instanceId);
  if (gaps.length) expect((await otherPage.request.post(`/api/inspections/${id}/coverage`, { data: { instanceIds: gaps, state: 'passed' } })).ok()).toBe(true);
  const signed = await otherPage.request.post(`/api/inspections/${id}/sign`, { data: { password: DEMO_PASSWORD } });
  expect(signed.ok()).toBe(true);
  expect(((await signed.json()) as Insp).status).toBe('signed');
  await other.close();

  // Back online: the queue goes at once; both refusals are shown, not dropped, in the server's words.
  await page.context().setOffline(false);
  const failed = page.getByTestId('offline-failed');
  await expect(failed).toBeVisible();
  await expect(failed).toContainText('Could not be sent');
  // Sent one after the other; on a busy machine the second answer can take longer than the default wait.
  await expect(failed.getByTestId('failed-entry')).toHaveCount(2, { timeout: 30_000 });
  const [refusedFinding, refusedMark] = [failed.locator('[data-kind=finding]'), failed.locator('[data-kind=coverage]')];
  await expect(refusedFinding).toContainText(PILOT);
  // The server's own words (409 conflict), whichever way it puts that the record is signed.
  await expect(refusedFinding).toContainText(/record (is|was) signed/);
  await expect(refusedMark).toContainText(`Not applicable: ${secondCab.label} (Cab locked by the shop)`);
  await expect(refusedMark).toContainText(/This mark is not on the record: .*record (is|was) signed/);
  await expect(page.getByTestId('offline-waiting')).toBeHidden();
  insp = await getInsp(page, id);
  expect(insp.findings.length).toBe(before + 3);
  // The other device passed that part before signing; the refused n.a. did not change it.
  expect(insp.items.find((i) => i.instanceId === secondCab.id)?.state).toBe('passed');
  // They stay until the inspector dismisses them.
  await page.reload();
  await expect(page.getByTestId('offline-failed')).toBeVisible();
  await expect(page.getByTestId('offline-failed').getByTestId('failed-entry')).toHaveCount(2);
  for (let i = 0; i < 2; i++) await page.getByTestId('offline-failed').getByRole('button', { name: 'Dismiss' }).first().click();
  await expect(page.getByTestId('offline-failed')).toBeHidden();
  expect(errors).toEqual([]);
});
