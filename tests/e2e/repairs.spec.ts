// The repair flow in Chromium: an inspector pins a federal finding (pilot 2.5 in above the rail, under the
// 3 in minimum of 49 CFR 229.123(a)), the foreman assigns and records the repair with a photo, the
// inspector verifies it, the foreman clears the non-complying tag (49 CFR 229.9), and the due board
// shows the unit compliant and, once the inspector signs the day's inspection, its daily good
// (49 CFR 229.21: once each calendar day). The finding is made here through the API; the demo data
// is not relied on beyond its accounts and units.
import { expect, test, type APIRequestContext, type Browser, type Page } from '@playwright/test';
import { DEMO_PASSWORD, signIn } from './helpers';

const SHOTS = '.tmp/screens';
// An 8×8 grey PNG; the server decides its type by its bytes.
const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAgAAAAICAIAAABLbSncAAAACXBIWXMAAAPoAAAD6AG1e1JrAAAAD0lEQVQImWNowAEYhpYEAILzYAEeEbvlAAAAAElFTkSuQmCC', 'base64');
const PILOT_LOW = { partId: 'pl-pilot_sh', view: 'plan', x: 18, y: 0, defectType: 'pilot_height_out_of_limit', measurement: { value: 2.5, unit: 'in' } };
const MOTOR_NOTE = { partId: 'pl-traction_motor_2', view: 'plan', x: 173, y: 0, defectType: 'traction_motor_other', note: 'Weeping oil at the gear case' };

async function newSession(browser: Browser, role: string, viewport = { width: 1024, height: 768 }) {
  const ctx = await browser.newContext({ viewport });
  const page = await ctx.newPage();
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await signIn(page, role);
  return { ctx, page, errors };
}

const ok = async <T>(r: Awaited<ReturnType<APIRequestContext['get']>>): Promise<T> => {
  expect(r.ok(), `${r.url()} answered ${r.status()}: ${await r.text()}`).toBe(true);
  return (await r.json()) as T;
};

interface UnitRow {
  id: string;
  roadNumber: string;
  unitTypeKey: string;
  frontEnd: string;
  nonComplying: boolean;
  serviceState: string;
}

/** A six-axle unit in service with no open federal finding, so its tag can be cleared once ours is repaired. */
async function pickUnit(api: APIRequestContext): Promise<UnitRow> {
  const units = (await ok<{ items: UnitRow[] }>(await api.get('/api/units'))).items;
  // The queue comes a page at a time: follow it to the end.
  const federal: { unitId: string; state: string }[] = [];
  let cursor: string | null = null;
  do {
    const page: { items: { unitId: string; state: string }[]; nextCursor: string | null } = await ok(await api.get(`/api/repairs?weight=federal&limit=500${cursor ? `&cursor=${encodeURIComponent(cursor)}` : ''}`));
    federal.push(...page.items);
    cursor = page.nextCursor;
  } while (cursor);
  const busy = new Set(federal.filter((f) => f.state === 'open' || f.state === 'in_repair').map((f) => f.unitId));
  const u = units.find((x) => x.unitTypeKey === 'six_axle_road' && x.serviceState === 'in_service' && !x.nonComplying && !busy.has(x.id));
  expect(u, 'a six-axle unit without open federal findings').toBeTruthy();
  return u!;
}

async function pin(api: APIRequestContext, unit: UnitRow, body: Record<string, unknown>) {
  const insp = await ok<{ id: string }>(await api.post('/api/inspections', { data: { unitId: unit.id, kind: 'daily', frontEndSeen: unit.frontEnd } }));
  const finding = await ok<{ id: string; weight: string; version: number }>(await api.post(`/api/inspections/${insp.id}/findings`, { data: body }));
  return { inspectionId: insp.id, finding };
}

const dueRow = (page: Page, roadNumber: string) => page.locator(`[data-testid="due-row"][data-unit="${roadNumber}"]`);

test('foreman assigns and repairs, inspector verifies, the unit turns compliant and the due board follows', async ({ browser }) => {
  const insp = await newSession(browser, 'inspector');
  const unit = await pickUnit(insp.page.request);
  const { inspectionId, finding } = await pin(insp.page.request, unit, PILOT_LOW);
  expect(finding.weight).toBe('federal'); // 2.5 in is below the 3 in minimum of 49 CFR 229.123(a)

  // The foreman's queue: the unit is non-complying and comes first, with its finding.
  const fm = await newSession(browser, 'foreman');
  await fm.page.goto('/repairs');
  await expect(fm.page.getByRole('heading', { level: 1, name: 'Repair queue' })).toBeVisible();
  const firstRow = fm.page.getByTestId('queue-row').first();
  await expect(firstRow).toHaveAttribute('data-nc', 'true');
  await expect(fm.page.getByText(/^(Showing [\d,]+ of [\d,]+ findings|[\d,]+ findings?) · non-complying units first$/)).toBeVisible();
  // Sorting goes to the server and into the address; non-complying units stay on top.
  const sorted = fm.page.waitForResponse((r) => r.url().includes('/api/repairs?sort=age.desc') && r.ok());
  await fm.page.getByRole('button', { name: /^Found/ }).click();
  await sorted;
  await expect(fm.page).toHaveURL(/[?&]sort=age\.desc/);
  await expect(fm.page.getByRole('columnheader', { name: /Found/ })).toHaveAttribute('aria-sort', 'descending');
  await expect(firstRow).toHaveAttribute('data-nc', 'true');
  await fm.page.screenshot({ path: `${SHOTS}/repairs-queue-sorted-1024.png` });
  await fm.page.getByLabel('Unit', { exact: true }).selectOption({ label: unit.roadNumber });
  const link = fm.page.locator(`a[href="/repairs/findings/${finding.id}"]`);
  await expect(link).toBeVisible();
  const row = fm.page.getByTestId('queue-row').filter({ has: link });
  await expect(row).toContainText('NON-COMPLYING');
  await expect(row).toContainText('Federal');
  await expect(row).toContainText('Open');
  await fm.page.screenshot({ path: `${SHOTS}/repairs-queue-1024.png`, fullPage: true });
  await link.click();

  // Assign to himself, then record the repair behind the blue-signal caution, with a photo.
  await expect(fm.page.getByRole('heading', { level: 1 })).toBeVisible();
  await fm.page.getByRole('button', { name: 'Assign' }).click();
  await expect(fm.page.getByLabel('Assign to')).toHaveValue(/.+/);
  await fm.page.getByRole('form', { name: 'Assign the finding' }).getByRole('button', { name: 'Assign' }).click();
  await expect(fm.page.getByText('In repair', { exact: true })).toBeVisible();
  await expect(fm.page.getByRole('list', { name: 'Events, newest first' })).toContainText('Assigned it to Ray Lindqvist');
  await fm.page.getByRole('button', { name: 'Record the repair' }).click();
  const form = fm.page.getByRole('form', { name: 'Record the repair' });
  await expect(form.getByRole('note', { name: 'Blue-signal caution' })).toContainText('49 CFR Part 218');
  await form.getByLabel('What was done').fill('Raised the pilot to 4 in above the top of rail');
  await form.getByLabel('Parts used').fill('Two shims');
  await form.getByLabel('Time (minutes)').fill('45');
  await form.getByLabel('Add photos of the repair').setInputFiles({ name: 'pilot-after.png', mimeType: 'image/png', buffer: PNG });
  await fm.page.screenshot({ path: `${SHOTS}/repairs-form-1024.png`, fullPage: true });
  await form.getByRole('button', { name: 'Record the repair' }).click();
  await expect(fm.page.getByText('Repaired', { exact: true })).toBeVisible();
  await expect(fm.page.getByRole('list', { name: 'Repair photos being sent' })).toContainText('Sent');
  const events = fm.page.getByRole('list', { name: 'Events, newest first' });
  await expect(events.getByRole('listitem').first()).toContainText('Recorded the repair');
  await expect(events.getByRole('listitem').first()).toContainText('Parts: Two shims');
  await expect(events.getByRole('listitem').first().getByRole('img')).toHaveCount(1);
  // Whoever recorded the repair does not verify it.
  await expect(fm.page.getByRole('button', { name: 'Verify the repair' })).toHaveCount(0);

  // The inspector verifies it from the queue.
  await insp.page.goto(`/repairs?unit=${unit.id}&state=repaired`);
  await insp.page.locator(`a[href="/repairs/findings/${finding.id}"]`).click();
  await insp.page.getByRole('button', { name: 'Verify the repair' }).click();
  await expect(insp.page.getByText('Verified', { exact: true })).toBeVisible();
  await expect(insp.page.getByRole('list', { name: 'Events, newest first' }).getByRole('listitem').first()).toContainText('Verified the repair');

  // The due board still flags the unit until its tag is cleared.
  await fm.page.goto('/due');
  await expect(dueRow(fm.page, unit.roadNumber).getByTestId('due-nc')).toBeVisible();

  // The foreman clears the tag; who and when are shown.
  await fm.page.goBack();
  await expect(fm.page.getByText('Verified', { exact: true })).toBeVisible();
  await fm.page.getByRole('button', { name: 'Clear the non-complying tag' }).click();
  await expect(fm.page.getByRole('status').filter({ hasText: 'is compliant' })).toContainText(`${unit.roadNumber} is compliant: tag cleared by Ray Lindqvist at`);
  await fm.page.screenshot({ path: `${SHOTS}/repairs-finding-1024.png`, fullPage: true });
  const tag = await ok<{ open: boolean }>(await fm.page.request.get(`/api/units/${unit.id}/tag`));
  expect(tag.open).toBe(false);

  // The inspector finishes and signs the day's inspection of the unit.
  const cur = await ok<{ coverage: { gaps: { instanceId: string }[] } }>(await insp.page.request.get(`/api/inspections/${inspectionId}`));
  const gaps = cur.coverage.gaps.map((g) => g.instanceId);
  if (gaps.length) await ok(await insp.page.request.post(`/api/inspections/${inspectionId}/coverage`, { data: { instanceIds: gaps, state: 'passed' } }));
  const signed = await ok<{ status: string }>(await insp.page.request.post(`/api/inspections/${inspectionId}/sign`, { data: { password: DEMO_PASSWORD } }));
  expect(signed.status).toBe('signed');

  // The due board: no non-complying flag any more, and the daily done today (good).
  await fm.page.goto('/due');
  const due = dueRow(fm.page, unit.roadNumber);
  await expect(due).toBeVisible();
  await expect(due.getByTestId('due-nc')).toHaveCount(0);
  const daily = due.locator('[data-item="daily"]');
  await expect(daily).toContainText('Good');
  await expect(daily).toContainText('done today');
  await expect(fm.page.getByTestId('due-computed-for')).toContainText('America/Chicago');
  await fm.page.screenshot({ path: `${SHOTS}/due-1024.png`, fullPage: true });

  expect(insp.errors).toEqual([]);
  expect(fm.errors).toEqual([]);
  await insp.ctx.close();
  await fm.ctx.close();
});

test('a change based on an old version is refused with who changed what, and the page reloads it', async ({ browser }) => {
  const insp = await newSession(browser, 'inspector');
  const unit = await pickUnit(insp.page.request);
  const { finding } = await pin(insp.page.request, unit, MOTOR_NOTE);
  const fm = await newSession(browser, 'foreman');
  await fm.page.goto(`/repairs/findings/${finding.id}`);
  await expect(fm.page.getByText('Open', { exact: true })).toBeVisible();
  // Meanwhile the inspector voids it (entered in error).
  await ok(await insp.page.request.post(`/api/findings/${finding.id}/void`, { data: { version: finding.version, reason: 'Pinned on the wrong unit' } }));
  await fm.page.getByRole('button', { name: 'Assign' }).click();
  await fm.page.getByRole('form', { name: 'Assign the finding' }).getByRole('button', { name: 'Assign' }).click();
  const alert = fm.page.getByRole('alert');
  await expect(alert).toContainText('Dana Okafor voided it');
  await alert.getByRole('button', { name: 'Reload' }).click();
  await expect(fm.page.getByText('Voided', { exact: true })).toBeVisible();
  await expect(fm.page.getByText('Pinned on the wrong unit').first()).toBeVisible();
  await expect(fm.page.getByRole('group', { name: 'Actions' })).toHaveCount(0);
  expect(fm.errors).toEqual([]);
  await insp.ctx.close();
  await fm.ctx.close();
});

test('on a phone the queue and the due board become stacked cards with large targets; the admin reads the outbox', async ({ browser }) => {
  const phone = { width: 390, height: 844 };
  const fm = await newSession(browser, 'foreman', phone);
  await fm.page.goto('/repairs');
  await expect(fm.page.getByRole('heading', { level: 1, name: 'Repair queue' })).toBeVisible();
  // Filters fold away on a phone.
  await expect(fm.page.getByLabel('Yard')).toBeHidden();
  await fm.page.getByRole('button', { name: /^Filters/ }).click();
  await expect(fm.page.getByLabel('Yard')).toBeVisible();
  await fm.page.getByRole('button', { name: 'Hide filters' }).click();
  const rows = fm.page.getByTestId('queue-row');
  if ((await rows.count()) > 0) {
    // Cards, not table rows: the column headers are hidden and each row is a block as wide as the screen.
    await expect(fm.page.getByRole('table', { name: 'Repair queue' }).locator('thead')).toBeHidden();
    const box = (await rows.first().boundingBox())!;
    expect(box.width).toBeGreaterThan(300);
    const linkBox = (await rows.first().getByRole('link').boundingBox())!;
    expect(linkBox.height).toBeGreaterThanOrEqual(48);
  }
  await fm.page.screenshot({ path: `${SHOTS}/repairs-queue-390.png` });
  if ((await rows.count()) > 0) {
    await rows.first().getByRole('link').click();
    await expect(fm.page.getByRole('heading', { level: 2, name: 'History' })).toBeVisible();
    await fm.page.screenshot({ path: `${SHOTS}/repairs-finding-390.png`, fullPage: true });
  }
  await fm.page.goto('/due');
  await expect(fm.page.getByTestId('due-row').first()).toBeVisible();
  await expect(fm.page.getByRole('table', { name: 'Due board' }).locator('thead')).toBeHidden();
  for (const b of await fm.page.locator('main select, main input, main a.btn, main button').all()) {
    if (!(await b.isVisible())) continue;
    expect((await b.boundingBox())!.height, await b.evaluate((e) => e.outerHTML.slice(0, 80))).toBeGreaterThanOrEqual(48);
  }
  await fm.page.screenshot({ path: `${SHOTS}/due-390.png` });
  expect(fm.errors).toEqual([]);
  await fm.ctx.close();

  for (const viewport of [{ width: 1024, height: 768 }, phone]) {
    const admin = await newSession(browser, 'admin', viewport);
    await admin.page.goto('/outbox');
    await expect(admin.page.getByRole('heading', { level: 1, name: 'Outbox' })).toBeVisible();
    // Pinning federal findings above mailed the yard's foremen through the outbox.
    await expect(admin.page.getByTestId('outbox-row').first()).toBeVisible();
    const received = admin.page.getByRole('list', { name: 'Received mail' });
    if (await received.isVisible()) await received.locator('summary').first().click();
    await admin.page.evaluate(() => window.scrollTo(0, 0));
    await admin.page.screenshot({ path: `${SHOTS}/outbox-${viewport.width}.png`, fullPage: viewport.width > 500 });
    expect(admin.errors).toEqual([]);
    await admin.ctx.close();
  }
});
