import { expect, test, type Page } from '@playwright/test';
import { DEMO_PASSWORD, freePointOf, signIn } from './helpers';

// An 8×8 grey PNG; the server decides its type by its bytes.
const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAgAAAAICAIAAABLbSncAAAACXBIWXMAAAPoAAAD6AG1e1JrAAAAD0lEQVQImWNowAEYhpYEAILzYAEeEbvlAAAAAElFTkSuQmCC', 'base64');
const UNIT = 'HRL 2201'; // four-axle road unit, Marlow Yard, F on the short hood in the record

/** Whether a canvas pixel near (x, y) has the federal pin colour (deep red, #9f1d1d in the day theme). */
async function redPinNear(page: Page, x: number, y: number) {
  return page.evaluate(
    ({ x, y }) =>
      [...document.querySelectorAll('canvas')].some((c) => {
        const r = c.getBoundingClientRect();
        const k = c.width / r.width;
        const ctx = c.getContext('2d');
        if (!ctx) return false;
        const d = ctx.getImageData(Math.round((x - r.left - 8) * k), Math.round((y - r.top - 8) * k), Math.round(16 * k), Math.round(16 * k)).data;
        for (let i = 0; i < d.length; i += 4) if (d[i + 3] > 200 && d[i] > 130 && d[i] < 190 && d[i + 1] < 60 && d[i + 2] < 60) return true;
        return false;
      }),
    { x, y },
  );
}

/** Subject (unfolded, RFC 5322) and body (quoted-printable decoded) of a raw message. */
function readMail(raw: string) {
  const [head, ...rest] = raw.split(/\r?\n\r?\n/);
  const subject = /^Subject: (.*)$/m.exec(head.replace(/\r?\n[ \t]+/g, ' '))?.[1] ?? '';
  const qp = /quoted-printable/i.test(head);
  let body = rest.join('\n\n');
  if (qp) body = Buffer.from(body.replace(/=\r?\n/g, '').replace(/=([0-9A-F]{2})/g, (_, h) => String.fromCharCode(parseInt(h, 16))), 'latin1').toString('utf8');
  return { subject, body };
}

async function passRemainingAreas(page: Page) {
  // The areas themselves, not the part rows listed inside the open one.
  const areas = page.locator('nav[aria-label="Routine"] > ol > li > button');
  const n = await areas.count();
  expect(n).toBeGreaterThan(3);
  for (let i = 0; i < n; i++) {
    await areas.nth(i).click();
    await expect(areas.nth(i)).toHaveAttribute('aria-current', 'step');
    const gate = page.getByRole('button', { name: 'Blue signal is up — continue' });
    if (await gate.isVisible()) {
      await expect(page.getByRole('note', { name: 'Blue-signal caution' })).toContainText('49 CFR Part 218');
      await gate.click();
    }
    const pass = page.getByRole('button', { name: /Pass the rest of this area/ });
    if (await pass.isEnabled()) await pass.click();
    await expect(pass).toBeDisabled();
  }
}

test('an inspector walks a unit, pins a gauged finding with a photo, signs, prints the record and the tag; the foreman is mailed', async ({ page, browser }) => {
  test.setTimeout(240_000);
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await signIn(page, 'inspector');

  // Start: pick the unit by road number, daily, confirm the F.
  await page.goto('/walkaround');
  await expect(page.getByRole('heading', { level: 1, name: 'Walkaround' })).toBeVisible();
  await expect(page.getByRole('heading', { name: 'Your open inspections' })).toBeVisible();
  await page.getByLabel('Road number').fill('2201');
  await page.getByRole('radio', { name: new RegExp(UNIT) }).click();
  await page.getByRole('radio', { name: 'Daily' }).click();
  const fRecord = page.getByRole('radio', { name: /F on the short hood/ });
  await expect(fRecord).toHaveAttribute('aria-checked', 'true');
  await expect(fRecord).toContainText('The unit record says this');
  // Choosing the other end warns that the foreman and admin will be told; back to what we see.
  await page.getByRole('radio', { name: /F on the long hood/ }).click();
  await expect(page.getByRole('alert')).toContainText('The foreman and admin will be told; this inspection uses what you saw');
  await fRecord.click();
  await expect(page.getByRole('alert')).toHaveCount(0);
  await page.getByRole('button', { name: 'Confirm F on the short hood and start' }).click();
  await expect(page).toHaveURL(/\/walkaround\/inspections\/[0-9a-f-]{36}/);
  const inspectionUrl = page.url().split('?')[0];

  // The first area puts us at the end of the unit: blue signal first.
  const areas = page.getByRole('navigation', { name: 'Routine' });
  await expect(areas.getByRole('button', { name: /Front end \(short hood\)/ })).toHaveAttribute('aria-current', 'step');
  await expect(page.getByRole('note', { name: 'Blue-signal caution' })).toBeVisible();
  await page.getByRole('button', { name: 'Blue signal is up — continue' }).click();
  await expect(page.getByTestId('coverage')).toBeVisible();
  // A run that stopped half way leaves its inspection open; it is resumed, so count what is there.
  const mine = page.getByRole('region', { name: /Findings in Front end/ }).getByTestId('finding');
  const pilotFindings = mine.filter({ hasText: 'Pilot height above rail out of limit' });
  await expect(page.getByRole('button', { name: /Pass the rest of this area/ })).toBeVisible();
  const before = await pilotFindings.count();

  // Tap the front pilot on the drawing.
  await expect(page.locator('[data-testid=area-outlines] rect[data-instance=pilot_sh]').first()).toBeAttached();
  const tap = await freePointOf(page, 'pilot_sh');
  await page.mouse.click(tap.x, tap.y);
  await expect(page.getByRole('heading', { name: 'Finding on Front pilot' })).toBeVisible();
  await page.getByRole('radio', { name: /Pilot height above rail out of limit/ }).check();
  await page.getByLabel('Reading').fill('2.5');
  // 2.5 in is below the 3 in minimum of 49 CFR 229.123(a): the check fails as it is typed.
  const check = page.getByTestId('check-result');
  await expect(check).toHaveAttribute('data-result', 'fail');
  await expect(check).toContainText('49 CFR 229.123(a)');

  // A reload keeps the unsent form (and the area, in the address).
  await page.reload();
  await expect(page.getByLabel('Reading')).toHaveValue('2.5');
  await expect(page.getByRole('radio', { name: /Pilot height above rail out of limit/ })).toBeChecked();

  await page.getByLabel('Add photos').setInputFiles({ name: 'pilot.png', mimeType: 'image/png', buffer: PNG });
  await expect(page.getByRole('list', { name: 'Photos to send' })).toContainText('pilot.png');
  await page.getByRole('button', { name: 'Pin the finding' }).click();
  // Tapped off the centreline, the pin says which side of the pilot it is on (product.md §3).
  await expect(page.getByRole('heading', { name: /^Pinned: (Left side, |Right side, )?front pilot$/i })).toBeVisible();
  await expect(page.getByTestId('finding-stored')).toContainText('Federal');
  await expect(page.getByRole('list', { name: 'Photo uploads' })).toContainText('Sent');
  await expect(page.getByRole('progressbar', { name: 'Upload of pilot.png' })).toHaveAttribute('value', '1');
  await expect.poll(() => redPinNear(page, tap.x, tap.y), { message: 'a federal pin where the pilot was tapped' }).toBe(true);
  await page.getByRole('button', { name: 'Done' }).click();
  await expect(pilotFindings).toHaveCount(before + 1);
  const thumb = mine.getByRole('img', { name: /Photo of .*front pilot/i }).first();
  await thumb.scrollIntoViewIfNeeded();
  await expect(thumb).toBeInViewport();
  // The thumbnail is the server's, decoded by the browser (not a broken image).
  await expect.poll(() => thumb.evaluate((i: HTMLImageElement) => (i.complete ? i.naturalWidth : 0))).toBeGreaterThan(0);

  await page.screenshot({ path: '.tmp/screens/walkaround-1024-walk.png' });

  // Walk the rest of the routine.
  await passRemainingAreas(page);
  await expect(page.getByTestId('coverage-left')).toHaveText('0 left');

  // Phone size: the canvas on top, the panels below.
  await page.setViewportSize({ width: 390, height: 844 });
  await page.goto(inspectionUrl);
  await expect(page.getByRole('application', { name: /unit drawing|plan|elevation/ }).or(page.locator('[role=application]')).first()).toBeVisible();
  await page.screenshot({ path: '.tmp/screens/walkaround-390-walk.png' });
  const canvasBox = (await page.locator('[role=application]').first().boundingBox())!;
  const panelBox = (await page.getByRole('navigation', { name: 'Routine' }).boundingBox())!;
  expect(panelBox.y).toBeGreaterThan(canvasBox.y + canvasBox.height - 1);
  await page.setViewportSize({ width: 1024, height: 768 });

  // Sign: a wrong password is refused next to the field, the right one signs.
  await page.getByRole('link', { name: /sign/i }).click();
  await expect(page.getByRole('heading', { name: /Sign: HRL 2201/ })).toBeVisible();
  await expect(page.getByText('None: every part of the routine is done.')).toBeVisible();
  await page.getByLabel('Your password').fill('not-the-password');
  await page.getByRole('button', { name: 'Sign the record' }).click();
  await expect(page.getByText('Wrong password')).toBeVisible();
  await page.getByLabel('Your password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign the record' }).click();
  await expect(page).toHaveURL(/\/record$/);

  // The printable record.
  const rec = page.getByRole('article');
  await expect(rec).toContainText('Hollins Ridge & Lakeshore Railroad (HRL)');
  await expect(rec.getByRole('heading', { level: 1 })).toHaveText(`Daily inspection record: ${UNIT}`);
  const facts = page.getByTestId('record-facts');
  await expect(facts).toContainText('Marlow Yard');
  await expect(facts).toContainText('Dana Okafor');
  await expect(facts).toContainText('(America/Chicago)');
  await expect(facts).toContainText(/Signed.*\d{1,2} \w{3} \d{4}, \d{2}:\d{2}/s);
  const row = page.getByTestId('record-finding').filter({ hasText: 'Pilot height above rail out of limit' }).first();
  await expect(row).toContainText(/front pilot/i);
  await expect(row).toContainText('Federal');
  await expect(row).toContainText('49 CFR 229.123');
  await expect(row).toContainText('2.5 in');
  await page.evaluate(() => {
    (window as unknown as { printed: number }).printed = 0;
    window.print = () => void (window as unknown as { printed: number }).printed++;
  });
  await page.getByRole('button', { name: 'Print' }).click();
  expect(await page.evaluate(() => (window as unknown as { printed: number }).printed)).toBe(1);
  await page.emulateMedia({ media: 'print' });
  await expect(page.getByRole('button', { name: 'Print' })).toBeHidden();
  await expect(page.getByRole('navigation', { name: 'Screens' })).toBeHidden();
  await expect(rec.getByRole('heading', { level: 1 })).toBeVisible();
  await page.screenshot({ path: '.tmp/screens/walkaround-1024-record-print.png', fullPage: true });
  await page.emulateMedia({ media: 'screen' });

  // The tag for the control stand.
  await page.getByRole('link', { name: 'Non-complying tag →' }).click();
  const tag = page.getByTestId('tag');
  await expect(tag.getByRole('heading', { level: 1 })).toHaveText('NON-COMPLYING LOCOMOTIVE');
  await expect(tag).toContainText(UNIT);
  await expect(tag).toContainText('Hollins Ridge & Lakeshore Railroad (HRL)');
  await expect(tag).toContainText('Marlow Yard');
  await expect(page.getByTestId('tag-defect').filter({ hasText: /front pilot: Pilot height above rail out of limit \(49 CFR 229\.123\)/i }).first()).toBeVisible();
  await expect(tag).toContainText('Signature of the qualified person');
  await expect(tag).toContainText('Movement restrictions');
  // Only a foreman edits the movement part.
  await expect(page.getByRole('button', { name: 'Save on the tag' })).toHaveCount(0);
  await page.screenshot({ path: '.tmp/screens/walkaround-1024-tag.png', fullPage: true });
  const tagUrl = page.url();

  // The foreman sets destination and restrictions on the tag.
  const foremanCtx = await browser.newContext();
  const foreman = await foremanCtx.newPage();
  await signIn(foreman, 'foreman');
  await foreman.goto(tagUrl);
  await foreman.getByLabel(/Destination/).fill('Marlow Yard shop, track 3');
  await foreman.getByLabel('Movement restrictions').fill('Trailing position only, 10 mph');
  await foreman.getByRole('button', { name: 'Save on the tag' }).click();
  await expect(foreman.getByTestId('tag-destination')).toHaveText('Marlow Yard shop, track 3');
  await expect(foreman.getByTestId('tag-restrictions')).toHaveText('Trailing position only, 10 mph');
  await foremanCtx.close();

  // The admin sees the foreman's mail at the fake SMTP server.
  const adminCtx = await browser.newContext();
  const admin = await adminCtx.newPage();
  await signIn(admin, 'admin');
  await expect
    .poll(
      async () => {
        const r = await admin.request.get('/api/outbox/received');
        const items = ((await r.json()) as { items: { to: string[]; subject: string; raw: string }[] }).items;
        return items.some((m) => {
          const { subject, body } = readMail(m.raw);
          return (
            m.to.includes('foreman@demo.example') &&
            subject.startsWith(`${UNIT} is non-complying:`) &&
            /front pilot, Pilot height above rail out of limit$/i.test(subject) &&
            body.includes('Defect: Pilot height above rail out of limit (49 CFR 229.123)') &&
            body.includes('non-complying under 49 CFR 229.9') &&
            body.includes('Reading: 2.5 in')
          );
        });
      },
      { timeout: 20_000, message: 'the foreman is mailed about the non-complying unit' },
    )
    .toBe(true);
  await adminCtx.close();

  expect(errors).toEqual([]);
});

test('the walkaround start screen at phone size', async ({ page }) => {
  await page.setViewportSize({ width: 390, height: 844 });
  await signIn(page, 'inspector');
  await page.goto('/walkaround');
  await page.getByLabel('Road number').fill('4103');
  await page.getByRole('radio', { name: /HRL 4103/ }).click();
  // The record says long hood; the record's end is chosen until the inspector says otherwise.
  await expect(page.getByRole('radio', { name: /F on the long hood/ })).toHaveAttribute('aria-checked', 'true');
  const start = page.getByRole('button', { name: 'Confirm F on the long hood and start' });
  await start.scrollIntoViewIfNeeded();
  const box = (await start.boundingBox())!;
  expect(box.height).toBeGreaterThanOrEqual(48);
  expect(box.x + box.width).toBeLessThanOrEqual(390);
  await page.screenshot({ path: '.tmp/screens/walkaround-390-start.png', fullPage: true });
});
