import fs from 'node:fs';
import { expect, test } from '@playwright/test';
import pg from 'pg';
import { loadDrawingsFromDir } from '../../server/drawings/load';
import { deriveLayout, pinLabel } from '../../shared/orientation';
import { DEMO_PASSWORD } from './helpers';

const DB = process.env.E2E_DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54339/hoodline_e2e';

/**
 * The demo railroad carries a few months of history; if this database has too few six-axle findings
 * (an older seed), put in a handful of our own, pinned on the #1 traction motor of a unit with the F
 * on each end, so the flow below always has rows to pick.
 */
test.beforeAll(async () => {
  const c = new pg.Client({ connectionString: DB });
  await c.connect();
  try {
    const n = Number((await c.query(`select count(*) from findings where unit_type_key = 'six_axle_road' and created_at > now() - interval '300 days'`)).rows[0].count);
    if (n >= 5) return;
    const d = loadDrawingsFromDir('diagrams').get('six_axle_road')!;
    const inspector = (await c.query(`select id from people where email = 'inspector@demo.example'`)).rows[0].id;
    const units = (await c.query(`select id, front_end, yard_id from units where unit_type_key = 'six_axle_road' order by road_number`)).rows;
    for (const [i, u] of units.entries()) {
      const layout = deriveLayout(d.instances.map((x) => ({ instanceId: x.instanceId, kind: x.kind, centre: x.centre })), u.front_end, d.lengthIn);
      const motor = layout.find((p) => p.kind === 'traction_motor' && p.number === 1)!;
      const inst = d.instances.find((x) => x.instanceId === motor.instanceId)!;
      const at = new Date(Date.now() - (10 + i * 7) * 86_400_000);
      const insp = await c.query(
        `insert into inspections (unit_id, inspector_id, kind, status, front_end_seen, front_end_recorded, yard_id, started_at, signed_at)
         values ($1, $2, 'daily', 'signed', $3, $3, $4, $5, $5) returning id`,
        [u.id, inspector, u.front_end, u.yard_id, at],
      );
      await c.query(
        `insert into findings (inspection_id, unit_id, unit_type_key, part_id, instance_id, part_kind, view, body_x, body_y, body_z, front_along, front_left,
           front_end, label, part_label, side, number, defect_type, weight, created_by, created_at, updated_at)
         values ($1, $2, 'six_axle_road', $3, $4, 'traction_motor', 'plan', $5, $6, $7, $8, $9, $10, $11, $12, 'left', 1, 'gear_case_leaking', 'shop', $13, $14, $14)`,
        [insp.rows[0].id, u.id, `pl-${inst.instanceId}`, inst.instanceId, inst.centre.x, inst.centre.y, inst.centre.z, motor.front.along, motor.front.left, u.front_end, pinLabel(motor, 'left'), motor.label, inspector, at],
      );
    }
  } finally {
    await c.end();
  }
});

test('the engineer opens hot spots, filters, selects a row and exports the table as CSV', async ({ page }) => {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  page.on('console', (m) => m.type() === 'error' && !/status of 401/.test(m.text()) && errors.push(m.text()));
  page.on('response', (r) => r.status() >= 400 && r.status() !== 401 && errors.push(`${r.status()} ${r.url()}`));
  fs.mkdirSync('.tmp/screens', { recursive: true });

  // Signed in by hand: the shared helper waits for the name in the header, which the shell shows only on wide screens.
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill('engineer@demo.example');
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByTestId('signed-in')).toBeAttached();
  await page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Hot spots' }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'Hot spots' })).toBeVisible();
  const summary = page.getByTestId('hot-spots-summary');
  await expect(summary).toContainText('findings on');
  await expect(page.getByRole('table', { name: 'Findings by part' })).toBeVisible();
  await expect(page.locator('canvas').first()).toBeVisible();

  // Filter: the six-axle type, shop and federal weights only.
  await page.getByLabel('Unit type').selectOption('six_axle_road');
  await expect(page).toHaveURL(/unitType=six_axle_road/);
  await page.getByText('Shop', { exact: true }).click();
  await page.getByText('Federal', { exact: true }).click();
  await expect(page).toHaveURL(/weights=shop%2Cfederal|weights=shop,federal/);
  await expect(summary).not.toContainText('Updating');
  const rows = page.getByTestId('hot-spot-row');
  await expect(rows.first()).toBeVisible();

  // Select the #1 traction motor row if the selection has one (units with the F on either end add up there), else the top row.
  const motor = rows.filter({ hasText: '#1 traction motor' }).first();
  const target = (await motor.count()) ? motor : rows.first();
  const label = (await target.getAttribute('data-label'))!;
  await target.getByRole('button').click();
  await expect(page).toHaveURL(/row=/);
  const detail = page.getByTestId('row-detail');
  await expect(detail.getByRole('heading', { name: label })).toBeVisible();
  const firstFinding = detail.getByRole('list', { name: `Findings on ${label}` }).getByRole('link').first();
  await expect(firstFinding).toBeVisible();
  await expect(firstFinding).toHaveAttribute('href', /\/repairs\/findings\/[0-9a-f-]{36}$/);
  await expect(page.getByText('Findings per month')).toBeVisible();
  await expect(page.locator('.recharts-surface').first()).toBeVisible();

  await page.screenshot({ path: '.tmp/screens/hot-spots-1024.png', fullPage: true });

  // Export the table: a real CSV download with the header and the selected part in it.
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-table').click()]);
  expect(download.suggestedFilename()).toMatch(/^hot-spots-table-six_axle_road-\d{4}-\d{2}-\d{2}-to-\d{4}-\d{2}-\d{2}\.csv$/);
  const csv = fs.readFileSync(await download.path(), 'utf8');
  const lines = csv.trim().split('\n');
  expect(lines[0]).toMatch(/^Part,Part kind,Findings,Per 100 inspections \(\d+ inspections\),Units,Repeats,/);
  expect(csv).toContain(label);
  expect(lines.length).toBe((await rows.count()) + 1);

  // The same screen on a phone.
  await page.setViewportSize({ width: 390, height: 844 });
  await expect(detail).toBeVisible();
  await page.screenshot({ path: '.tmp/screens/hot-spots-390.png', fullPage: true });
  await page.screenshot({ path: '.tmp/screens/hot-spots-390-top.png' });
  expect(errors).toEqual([]);
});
