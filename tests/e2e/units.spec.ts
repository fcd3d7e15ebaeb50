// Units in Chromium: the roster, a six-axle unit's page, a traction motor tapped on the canvas and read,
// the F moved to the other end by the admin and the same physical motor read again, then the same by
// keyboard. Expected numbers come from the orientation rule, not from the app: repeated parts are
// counted 1..n from the end carrying the F, and the #1 traction motor is the one nearest the F
// (common practice, no source; product brief §3), so after a flip the same motor is n + 1 − its number.
// Screen positions come from the canvas's own camera (data-camera on the page) and the pure transforms
// of shared/drawings/screen.ts, never from fixed pixels.
import { expect, test, type Page } from '@playwright/test';
import type { FrontEnd, ViewKey } from '../../shared/domain/frames';
import { partAtPoint } from '../../shared/drawings/geometry';
import { minHitSideIn, viewOrientation, viewToScreen, type Camera, type DrawingMode } from '../../shared/drawings/screen';
import type { Drawing, ViewPart } from '../../shared/drawings/types';
import { signIn } from './helpers';

const UNIT = 'HRL 4101'; // demo six-axle road unit; its record has the F on the short hood
const SHOTS = '.tmp/screens';

const canvasBox = (page: Page) => page.getByTestId('unit-canvas');
const surface = (page: Page) => canvasBox(page).getByRole('application');
const canvasStatus = (page: Page) => canvasBox(page).getByRole('status');
const selectedLabel = (page: Page) => page.getByTestId('selected-part-label');

async function openUnit(page: Page, roadNumber = UNIT) {
  await page.goto('/units');
  await page.getByLabel('Road number').fill(roadNumber.split(' ')[1]);
  const link = page.getByRole('table', { name: 'Units' }).getByRole('link', { name: roadNumber });
  await expect(link).toBeVisible();
  await link.click();
  await expect(page.getByRole('heading', { level: 1, name: roadNumber })).toBeVisible();
  await expect(surface(page)).toBeVisible();
  await expect(canvasBox(page)).toHaveAttribute('data-camera', /^\d/);
}

async function cameraOf(page: Page): Promise<Camera> {
  const [scale, ox, oy] = (await canvasBox(page).getAttribute('data-camera'))!.split(' ').map(Number);
  return { scale, ox, oy };
}

/** Waits until the camera written on the page differs from `before` and stops changing. */
async function settledCamera(page: Page, before?: Camera): Promise<Camera> {
  let last = '';
  await expect
    .poll(async () => {
      const now = (await canvasBox(page).getAttribute('data-camera')) ?? '';
      const moved = !before || now !== `${before.scale} ${before.ox} ${before.oy}`;
      const stable = now === last;
      last = now;
      return moved && stable;
    }, { intervals: [100, 100, 200, 200, 400] })
    .toBe(true);
  return cameraOf(page);
}

interface Shown {
  view: Drawing['views'][number];
  mode: DrawingMode;
  frontEnd: FrontEnd;
}
async function shownOf(page: Page, drawing: Drawing): Promise<Shown> {
  const box = canvasBox(page);
  const key = (await box.getAttribute('data-view')) as ViewKey;
  return { view: drawing.views.find((v) => v.key === key)!, mode: (await box.getAttribute('data-mode')) as DrawingMode, frontEnd: (await box.getAttribute('data-front-end')) as FrontEnd };
}

/** Where a part's centre is on the page now, from the canvas's camera and the pure view → screen transform. */
async function pageXY(page: Page, drawing: Drawing, part: ViewPart) {
  const s = await shownOf(page, drawing);
  const cam = await cameraOf(page);
  const p = viewToScreen(part.centre, viewOrientation(s.view, s.mode, s.frontEnd), cam);
  const bb = (await surface(page).boundingBox())!;
  return { x: bb.x + p.sx, y: bb.y + p.sy, cam, bb };
}

/** The plan's traction motors ordered along the carbody from the short hood end (x = 0). */
function motorsFromShortHood(drawing: Drawing): ViewPart[] {
  const plan = drawing.views.find((v) => v.key === 'plan')!;
  return plan.parts.filter((p) => p.kind === 'traction_motor').sort((a, b) => a.centre.u - b.centre.u);
}

async function drawingOf(page: Page, typeKey: string): Promise<Drawing> {
  const r = await page.request.get(`/api/unit-types/${typeKey}`);
  expect(r.ok()).toBe(true);
  return (await r.json()) as Drawing;
}

/**
 * Zooms in with the wheel over a part until a tap on its centre means that part (by the same pure
 * hit test the canvas uses, at the canvas's own scale), then taps its centre.
 */
async function zoomAndTap(page: Page, drawing: Drawing, part: ViewPart) {
  const view = (await shownOf(page, drawing)).view;
  let at = await pageXY(page, drawing, part);
  for (let i = 0; i < 8 && partAtPoint(view, part.centre, minHitSideIn(at.cam.scale))?.id !== part.id; i++) {
    await page.mouse.move(at.x, at.y);
    await page.mouse.wheel(0, -300);
    await settledCamera(page, at.cam);
    at = await pageXY(page, drawing, part);
  }
  expect(partAtPoint(view, part.centre, minHitSideIn(at.cam.scale))?.id).toBe(part.id);
  expect(at.x).toBeGreaterThan(at.bb.x);
  expect(at.x).toBeLessThan(at.bb.x + at.bb.width);
  expect(at.y).toBeGreaterThan(at.bb.y);
  expect(at.y).toBeLessThan(at.bb.y + at.bb.height);
  await page.mouse.click(at.x, at.y);
}

async function changeFrontEnd(page: Page, to: 'short hood' | 'long hood', reason: string) {
  await page.getByRole('button', { name: 'Change F end…' }).click();
  const dialog = page.getByRole('dialog', { name: new RegExp(`Move the F of ${UNIT} to the ${to}`) });
  await expect(dialog).toBeVisible();
  // It sends someone to look at the stencil on the unit: the blue-signal caution is there.
  await expect(dialog.getByRole('note', { name: 'Blue-signal caution' })).toBeVisible();
  await dialog.getByLabel(/Reason/).fill(reason);
  await dialog.getByRole('button', { name: `Move the F to the ${to}` }).click();
  await expect(dialog).toBeHidden();
  await expect(page.getByRole('status').filter({ hasText: `The F is now on the ${to}` })).toBeVisible();
}

test.describe.configure({ mode: 'serial' });

test('the roster filters and opens a unit; screenshots at tablet and phone size', async ({ page }) => {
  await signIn(page, 'inspector');
  await page.goto('/units');
  const table = page.getByRole('table', { name: 'Units' });
  await expect(table.getByRole('link', { name: UNIT })).toBeVisible();
  // Which units are compliant right now, from the API (other flows may have tagged some meanwhile).
  const units = (await (await page.request.get('/api/units')).json()).items as { roadNumber: string; nonComplying: boolean }[];
  const compliant = units.filter((u) => !u.nonComplying).map((u) => u.roadNumber);
  expect(compliant.length).toBeGreaterThan(0);
  await page.getByLabel('F end').selectOption({ label: 'F on long hood' });
  await expect(table.getByRole('link', { name: UNIT })).toBeHidden();
  await expect(table.getByRole('row').nth(1)).toContainText('F on long hood');
  await page.getByRole('button', { name: 'Clear filters' }).first().click();
  // Let the cleared filters land in the address before choosing the next one (two changes in the same
  // instant would both start from the old address).
  await expect(table.getByRole('row')).toHaveCount(units.length + 1);
  await page.getByLabel('State').selectOption({ label: 'Non-complying' });
  // Every unit left is flagged, by the word as well as the shape, and no compliant one is listed.
  await expect
    .poll(async () => {
      const rows = (await table.getByRole('row').count()) - 1;
      const flags = await table.locator('[data-flag="non-complying"]', { hasText: 'NON-COMPLYING' }).count();
      const shown = (await table.getByRole('link').allTextContents()).map((t) => t.trim());
      return rows > 0 && rows === flags && rows === units.length - compliant.length && !shown.some((t) => compliant.includes(t));
    })
    .toBe(true);
  await page.getByRole('button', { name: 'Clear filters' }).first().click();
  await expect(table.getByRole('row')).toHaveCount(13); // twelve demo units + the header row
  await page.screenshot({ path: `${SHOTS}/units-roster-1024.png`, fullPage: true });

  // Keyboard: the road numbers are links in table order; Enter opens one.
  await table.getByRole('link', { name: UNIT }).focus();
  await page.keyboard.press('Enter');
  await expect(page.getByRole('heading', { level: 1, name: UNIT })).toBeVisible();
  await expect(surface(page)).toBeVisible();
  await expect(canvasBox(page)).toHaveAttribute('data-camera', /^\d/);
  await expect(page.getByRole('heading', { name: 'History' })).toBeVisible();
  await expect(page.getByRole('button', { name: 'Change F end…' })).toHaveCount(0); // the admin's alone
  await page.screenshot({ path: `${SHOTS}/units-unit-1024.png`, fullPage: true });

  // Phone: cards instead of the table, opened with a tap.
  await page.setViewportSize({ width: 390, height: 844 });
  await page.goto('/units');
  const cards = page.getByRole('list', { name: 'Units' });
  await expect(cards).toBeVisible();
  await expect(page.getByRole('table', { name: 'Units' })).toBeHidden();
  await page.screenshot({ path: `${SHOTS}/units-roster-390.png`, fullPage: true });
  await cards.getByRole('link', { name: new RegExp(UNIT) }).click();
  await expect(page.getByRole('heading', { level: 1, name: UNIT })).toBeVisible();
  await expect(canvasBox(page)).toHaveAttribute('data-camera', /^\d/);
  await page.screenshot({ path: `${SHOTS}/units-unit-390.png`, fullPage: true });
});

test('the inspector previews the F on the other end without changing the unit', async ({ page }) => {
  await signIn(page, 'inspector');
  await openUnit(page);
  const drawing = await drawingOf(page, 'six_axle_road');
  const motors = motorsFromShortHood(drawing);
  await zoomAndTap(page, drawing, motors[0]);
  await expect(selectedLabel(page)).toHaveText('#1 traction motor');
  await page.getByRole('button', { name: 'What if the F were on the other end?' }).click();
  await expect(page.getByTestId('preview-banner')).toContainText('nothing is saved');
  await expect(selectedLabel(page)).toHaveText(`#${motors.length} traction motor`);
  await expect(page.getByTestId('selected-part')).toContainText('this part is #1 traction motor');
  await page.reload();
  await expect(page.getByRole('heading', { level: 1, name: UNIT })).toBeVisible();
  await expect(page.locator('main header')).toContainText('F on short hood');
});

test('admin: tap a traction motor, move the F, read the same motor’s new number, move it back', async ({ page }) => {
  await signIn(page, 'admin');
  await openUnit(page);
  await expect(page.locator('main header')).toContainText('F on short hood');
  const drawing = await drawingOf(page, 'six_axle_road');
  const motors = motorsFromShortHood(drawing);
  expect(motors).toHaveLength(6);
  const motor = motors[0]; // nearest the short hood, where this unit carries its F

  await zoomAndTap(page, drawing, motor);
  await expect(selectedLabel(page)).toHaveText('#1 traction motor');
  await expect(canvasStatus(page)).toHaveText('Selected: #1 traction motor');
  await page.screenshot({ path: `${SHOTS}/units-motor-selected-1024.png` });

  await page.getByRole('button', { name: 'Change F end…' }).click();
  await expect(page.getByRole('dialog')).toContainText('#1 traction motor will be #6 traction motor');
  await page.screenshot({ path: `${SHOTS}/units-change-f-dialog-1024.png` });
  await page.getByRole('button', { name: 'Cancel' }).click();

  await changeFrontEnd(page, 'long hood', 'F stencil seen on the long hood (end-to-end test)');
  await expect(page.locator('main header')).toContainText('F on long hood');
  // Same physical motor, now counted from the long hood end: 6 + 1 − 1.
  await expect(selectedLabel(page)).toHaveText('#6 traction motor');
  await expect(canvasStatus(page)).toHaveText('Selected: #6 traction motor');
  // Drawn as built, nothing moved on screen: a fresh tap on the same spot names it the same way.
  const again = await pageXY(page, drawing, motor);
  await page.mouse.click(again.x, again.y);
  await expect(selectedLabel(page)).toHaveText('#6 traction motor');
  await page.screenshot({ path: `${SHOTS}/units-after-flip-1024.png` });
  // The change is in the unit's history, newest first.
  await expect(page.getByTestId('history').getByRole('listitem').first()).toContainText('F moved from the short hood to the long hood');

  await changeFrontEnd(page, 'short hood', 'Back as it was (end-to-end test)');
  await expect(page.locator('main header')).toContainText('F on short hood');
  await expect(selectedLabel(page)).toHaveText('#1 traction motor');
});

test('admin: the same by keyboard — Tab to the motor, Enter, move the F, read the live region', async ({ page }) => {
  await signIn(page, 'admin');
  await openUnit(page);
  await surface(page).focus();
  const status = canvasStatus(page);
  // Tab walks the parts from the front; stop on the first traction motor.
  let found = false;
  for (let i = 0; i < 400 && !found; i++) {
    await page.keyboard.press('Tab');
    found = (await status.textContent())?.startsWith('#1 traction motor.') ?? false;
  }
  expect(found).toBe(true);
  await page.keyboard.press('Enter');
  await expect(status).toHaveText('Selected: #1 traction motor');

  const change = page.getByRole('button', { name: 'Change F end…' });
  await change.focus();
  await page.keyboard.press('Enter');
  const dialog = page.getByRole('dialog');
  await expect(dialog.getByLabel(/Reason/)).toBeFocused();
  await page.keyboard.type('F stencil seen on the long hood (keyboard test)');
  await page.keyboard.press('Tab'); // Cancel
  await page.keyboard.press('Tab'); // Move the F
  await expect(dialog.getByRole('button', { name: 'Move the F to the long hood' })).toBeFocused();
  await page.keyboard.press('Enter');
  await expect(dialog).toBeHidden();
  await expect(status).toHaveText('Selected: #6 traction motor');
  await expect(change).toBeFocused(); // focus goes back where it was

  await page.keyboard.press('Enter');
  await page.keyboard.type('Back as it was (keyboard test)');
  await page.keyboard.press('Tab');
  await page.keyboard.press('Tab');
  await page.keyboard.press('Enter');
  await expect(page.getByRole('dialog')).toBeHidden();
  await expect(status).toHaveText('Selected: #1 traction motor');
  await expect(page.locator('main header')).toContainText('F on short hood');
});
