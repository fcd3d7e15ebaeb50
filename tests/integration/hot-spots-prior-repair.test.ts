import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { priorRepairs } from '../../server/modules/hot-spots/repository';
import { findRepeats } from '../../shared/hot-spots/repeats';
import { pinFinding, startTestApp, type Client, type TestApp } from './harness';

/*
 * The repeat rule of the hot spots (issue 6 and shared/hot-spots/repeats.ts: same unit, same physical
 * part, same defect type, a repair of a non-voided finding no later than this one and within the window,
 * in calendar days of the railroad's zone) is answered from findings.prior_repair_days, which every
 * write keeps. These tests hold the kept number against the pure rule in shared/ and follow it through
 * the writes that change it: a new pin, a void, a repair recorded again after a send-back.
 */
const ZONE = 'America/Chicago'; // the demo railroad's zone (server/seed/demo-data.ts)

let t: TestApp;
let inspector: Client;
let foreman: Client;
let engineer: Client;
beforeAll(async () => {
  t = await startTestApp({}, { historyDays: 200 });
  [inspector, foreman, engineer] = await Promise.all([t.as('inspector'), t.as('foreman'), t.as('engineer')]);
});
afterAll(() => t?.close());

const all = async () =>
  (
    await t.pool.query(`select id, unit_id as "unitId", instance_id as "instanceId", defect_type as "defectType", created_at as "createdAt",
      repaired_at as "repairedAt", state = 'voided' as voided, prior_repair_days as days from findings`)
  ).rows as { id: string; unitId: string; instanceId: string; defectType: string; createdAt: Date; repairedAt: Date | null; voided: boolean; days: number | null }[];

/** Ids the kept number calls repeats under a window, voided findings left out as the screen does. */
const keptRepeats = (rows: Awaited<ReturnType<typeof all>>, window: number) => rows.filter((r) => !r.voided && r.days !== null && r.days <= window).map((r) => r.id).sort();

describe('the repeat day count kept on each finding', () => {
  it('is filled by the demo seed in agreement with the pure repeat rule, for windows of 7, 30 and 90 days', async () => {
    const rows = await all();
    expect(rows.length).toBeGreaterThan(100);
    const repeats90 = keptRepeats(rows, 90);
    expect(repeats90.length).toBeGreaterThan(0); // the seeded history has repeats to compare
    for (const w of [7, 30, 90]) expect(keptRepeats(rows, w)).toEqual([...findRepeats(rows, w, ZONE)].sort());
  });

  it('gives the same numbers when computed one finding at a time, as a new pin is', async () => {
    const rows = await all();
    const before = new Map(rows.map((r) => [r.id, r.days]));
    const after = new Map<string, number | null>();
    // The expression a pin's insert carries, evaluated at each finding's own instant.
    for (const r of rows) {
      const q = await t.db.execute<{ days: number | null }>(sql`select ${priorRepairs(t.db).onInsert(r, sql`${r.createdAt.toISOString()}::timestamptz`)} as days`);
      after.set(r.id, q.rows[0].days);
    }
    expect(after).toEqual(before);
  });
});

/** The hot spots findings list for a unit type over the days around today (railroad zone). */
async function repeatFlags(unitType: string) {
  const day = (offset: number) => new Intl.DateTimeFormat('en-CA', { timeZone: ZONE }).format(new Date(Date.now() + offset * 86_400_000));
  const r = await engineer.get(`/api/hot-spots/findings?unitType=${unitType}&from=${day(-2)}&to=${day(1)}`);
  expect(r.status).toBe(200);
  return Object.fromEntries(r.body.items.map((f: any) => [f.id, f.repeat])) as Record<string, boolean>;
}

// A four-axle road unit's #2 traction motor, a shop defect (pinned the way tests/integration/repairs.test.ts does).
const motor = (note: string) => ({ partId: 'pl-traction_motor_2', view: 'plan', x: 173, y: -8, defectType: 'traction_motor_other', note });

describe('writes that change which findings are repeats', () => {
  it('a pin after a repair of the same part and defect is a repeat; voiding that repaired finding makes it no longer one', async () => {
    const first = await pinFinding(inspector, 'HRL 2201', motor('Weeping oil'));
    const repaired = await foreman.post(`/api/findings/${first.finding.id}/repair`, { version: first.finding.version, whatDone: 'Re-sealed' });
    expect(repaired.status).toBe(200);
    const later = await inspector.post(`/api/inspections/${first.inspection.id}/findings`, motor('Weeping again'));
    expect(later.status).toBe(201);
    // Repaired today, found again today: 0 days, within the 90-day window.
    expect((await repeatFlags('four_axle_road'))[later.body.id]).toBe(true);
    const voided = await inspector.post(`/api/findings/${first.finding.id}/void`, { version: repaired.body.version, reason: 'Pinned on the wrong unit' });
    expect(voided.status).toBe(200);
    // A repair on a voided finding is no precedent (shared/hot-spots/repeats.ts).
    const flags = await repeatFlags('four_axle_road');
    expect(flags[later.body.id]).toBe(false);
    expect(keptRepeats(await all(), 90)).toEqual([...findRepeats(await all(), 90, ZONE)].sort());
  });

  it('a repair recorded again after a send-back, later than the next pin, is no longer its precedent', async () => {
    const first = await pinFinding(inspector, 'HRL 2202', motor('Weeping oil'));
    const r1 = await foreman.post(`/api/findings/${first.finding.id}/repair`, { version: first.finding.version, whatDone: 'Re-sealed' });
    const later = await inspector.post(`/api/inspections/${first.inspection.id}/findings`, motor('Weeping again'));
    expect(later.status).toBe(201);
    expect((await repeatFlags('four_axle_road'))[later.body.id]).toBe(true);
    const back = await inspector.post(`/api/findings/${first.finding.id}/send-back`, { version: r1.body.version, reason: 'Still weeping at the seal' });
    expect(back.body.state).toBe('in_repair');
    expect((await repeatFlags('four_axle_road'))[later.body.id]).toBe(true); // the first repair still stands
    const r2 = await foreman.post(`/api/findings/${first.finding.id}/repair`, { version: back.body.version, whatDone: 'New seal fitted' });
    expect(r2.status).toBe(200);
    // Its repair is now recorded after the later finding was pinned, so the rule no longer counts it.
    const rows = await all();
    const at = Object.fromEntries(rows.map((x) => [x.id, x]));
    expect(at[first.finding.id].repairedAt!.getTime()).toBeGreaterThan(at[later.body.id].createdAt.getTime());
    expect((await repeatFlags('four_axle_road'))[later.body.id]).toBe(false);
    expect(keptRepeats(rows, 90)).toEqual([...findRepeats(rows, 90, ZONE)].sort());
  });
});
