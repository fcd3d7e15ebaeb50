import { TZDate } from '@date-fns/tz';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadDrawingsFromDir } from '../../server/drawings/load';
import { SUMMARY_CELL_IN, summaryAnswers } from '../../server/modules/hot-spots/repository';
import { hotSpotsService } from '../../server/modules/hot-spots/service';
import { HotSpotsQuery } from '../../shared/api/hot-spots';
import { DEFAULT_CELL_IN } from '../../shared/hot-spots/grid';
import { pinFinding, startTestApp, type Client, type TestApp } from './harness';

/*
 * The hot spots screen reads whole civil months from a summary kept by triggers on findings
 * (drizzle/0005_hot_spots_summary.sql) and the partial months at the ends of its range from findings.
 * The reference is the same screen computed from findings alone (the statement filtered queries use,
 * whose figures tests/integration/hot-spots.test.ts checks by hand). After each kind of write (pins,
 * repairs, a send-back, voids, rows inserted, moved and deleted in bulk, a new repeat window, a new time
 * zone) the kept summary must equal one rebuilt from findings, and the API's answer must equal the
 * reference for ranges that start and end on and beside month edges, in a railroad zone that is not
 * UTC and has half-hour offsets and daylight saving time (Australia/Adelaide: +9:30, +10:30 in summer).
 */
const ZONE = 'Australia/Adelaide';
const drawings = loadDrawingsFromDir('diagrams');
const TYPES = ['six_axle_road', 'four_axle_road', 'four_axle_switcher'];

let t: TestApp;
let inspector: Client;
let foreman: Client;
let engineer: Client;
let admin: Client;
let zone = ZONE;

/** Civil date (YYYY-MM-DD) in the railroad's zone, `days` from today. */
const civil = (days: number, tz = zone) => new Intl.DateTimeFormat('en-CA', { timeZone: tz }).format(new Date(Date.now() + days * 86_400_000));
/** The instant of a local wall time in the railroad's zone. */
const at = (y: number, m: number, d: number, h = 0, min = 0, s = 0, ms = 0) => new Date(new TZDate(y, m - 1, d, h, min, s, ms, zone).getTime());
const ym = (date: string) => date.split('-').map(Number) as [number, number, number];
const lastDay = (y: number, m: number) => new Date(Date.UTC(y, m, 0)).getUTCDate();
const iso = (y: number, m: number, d: number) => `${y}-${String(m).padStart(2, '0')}-${String(d).padStart(2, '0')}`;
/** Year and month `k` months before this one in the zone. */
const monthsAgo = (k: number) => {
  const [y, m] = ym(civil(0));
  const n = y * 12 + (m - 1) - k;
  return [Math.floor(n / 12), (n % 12) + 1] as const;
};

/** Ranges (civil dates, railroad zone) that begin and end on, before and after month edges. */
function ranges(): [string, string][] {
  const [y2, m2] = monthsAgo(2);
  const [y3, m3] = monthsAgo(3);
  const [y1, m1] = monthsAgo(1);
  return [
    [civil(-364), civil(0)], // the screen's default
    [civil(-89), civil(0)],
    [iso(y2, m2, 1), iso(y2, m2, lastDay(y2, m2))], // exactly one whole month
    [iso(y3, m3, lastDay(y3, m3)), iso(y2, m2, 1)], // a day either side of a month edge, no whole month
    [iso(y3, m3, 2), iso(y1, m1, 1)], // partial, whole, partial
    [iso(y2, m2, 1), iso(y2, m2, 1)], // one day, the first of a month
    [iso(y3, m3, 1), civil(0)], // from a month's first day to today
    [iso(y3, m3, 10), iso(y3, m3, 20)], // inside one month
    [civil(-800), civil(30)], // everything
  ];
}

const reference = () => hotSpotsService(t.pool, drawings, { summary: false });

/** The API's answer (summary) and the one from findings alone: counts equal, mean positions to float precision. */
async function expectScreensAgree() {
  const ref = reference();
  let findings = 0;
  for (const type of TYPES) {
    for (const [from, to] of ranges()) {
      const r = await engineer.get(`/api/hot-spots?unitType=${type}&from=${from}&to=${to}`);
      expect(r.status).toBe(200);
      const want = JSON.parse(JSON.stringify(await ref.screen(HotSpotsQuery.parse({ unitType: type, from, to }))));
      const at = `${type} ${from}..${to}`;
      expect({ at, ...r.body, rows: r.body.rows.map((x: any) => ({ ...x, along: 0, left: 0 })) }).toEqual({
        at,
        ...want,
        rows: want.rows.map((x: any) => ({ ...x, along: 0, left: 0 })),
      });
      r.body.rows.forEach((x: any, i: number) => {
        expect(x.along).toBeCloseTo(want.rows[i].along, 9);
        expect(x.left).toBeCloseTo(want.rows[i].left, 9);
      });
      findings += r.body.totals.findings;
    }
  }
  expect(findings).toBeGreaterThan(0); // the ranges hold findings to compare
}

const SUMMARY = ['hot_spots_by_label', 'hot_spots_by_cell', 'hot_spots_by_unit', 'hot_spots_label_units'];

/** Rows of each summary table that differ from a rebuild from findings (the rebuild is rolled back). */
async function differencesFromRebuild() {
  const c = await t.pool.connect();
  try {
    await c.query('begin');
    // Single writes leave their changes in hot_spots_pending until a fold (the screen folds before reading).
    await c.query('select hot_spots_fold()');
    for (const s of SUMMARY) await c.query(`create temp table kept_${s} on commit drop as select * from ${s}`);
    await c.query('select hot_spots_summary_rebuild()');
    const out: Record<string, { kept: number; differing: number }> = {};
    for (const s of SUMMARY) {
      const r = await c.query(`select (select count(*)::int from kept_${s}) as kept,
        (select count(*)::int from ((select * from kept_${s} except all select * from ${s}) union all (select * from ${s} except all select * from kept_${s})) x) as differing`);
      out[s] = r.rows[0];
    }
    return out;
  } finally {
    await c.query('rollback');
    c.release();
  }
}

async function expectSummaryKept() {
  const d = await differencesFromRebuild();
  for (const s of SUMMARY) {
    expect({ table: s, differing: d[s].differing }).toEqual({ table: s, differing: 0 });
    expect(d[s].kept).toBeGreaterThan(0);
  }
}

// A four-axle road unit's #2 traction motor, a shop defect (as tests/integration/hot-spots-prior-repair.test.ts pins it).
const motor = (note: string, x = 173) => ({ partId: 'pl-traction_motor_2', view: 'plan', x, y: -8, defectType: 'traction_motor_other', note });

/** Copies of a finding at other instants, in one statement (a bulk load as the seeds write it). */
async function copiesAt(findingId: string, instants: Date[]) {
  const r = await t.pool.query(
    `insert into findings (inspection_id, unit_id, unit_type_key, part_id, instance_id, part_kind, view, body_x, body_y, body_z, front_along, front_left,
       front_end, label, part_label, side, end_role, number, defect_type, weight, state, created_by, created_at, updated_at)
     select f.inspection_id, f.unit_id, f.unit_type_key, f.part_id, f.instance_id, f.part_kind, f.view, f.body_x, f.body_y, f.body_z, f.front_along, f.front_left,
       f.front_end, f.label, f.part_label, f.side, f.end_role, f.number, f.defect_type, f.weight, 'open', f.created_by, a.at, a.at
       from findings f, unnest($2::timestamptz[]) as a(at) where f.id = $1 returning id`,
    [findingId, instants],
  );
  return r.rows.map((x) => x.id as string);
}

beforeAll(async () => {
  t = await startTestApp({}, { historyDays: 120 });
  [inspector, foreman, engineer, admin] = await Promise.all([t.as('inspector'), t.as('foreman'), t.as('engineer'), t.as('admin')]);
  const s = await admin.patch('/api/settings', { timeZone: ZONE });
  expect(s.status).toBe(200);
});
afterAll(() => t?.close());

describe('the hot spots summary', () => {
  it('holds the 12 in cells the screen asks for, and answers only unfiltered selections', () => {
    expect(SUMMARY_CELL_IN).toBe(DEFAULT_CELL_IN);
    const f = { unitType: 'six_axle_road', start: new Date(), end: new Date(), defectTypes: [], weights: [], yards: [] };
    expect(summaryAnswers(f, DEFAULT_CELL_IN)).toBe(true);
    expect(summaryAnswers({ ...f, weights: ['federal'] }, DEFAULT_CELL_IN)).toBe(false);
    expect(summaryAnswers({ ...f, defectTypes: ['sand_low'] }, DEFAULT_CELL_IN)).toBe(false);
    expect(summaryAnswers({ ...f, yards: ['00000000-0000-4000-8000-000000000001'] }, DEFAULT_CELL_IN)).toBe(false);
    expect(summaryAnswers(f, 6)).toBe(false);
  });

  it('after the seeded history and a change of time zone equals a rebuild, and the screen equals the one from findings alone', async () => {
    await expectSummaryKept();
    await expectScreensAgree();
  });

  it('is what the screen reads for whole months, while partial months come from findings', async () => {
    const [y, m] = monthsAgo(2);
    const month = iso(y, m, 1);
    const whole = `/api/hot-spots?unitType=six_axle_road&from=${month}&to=${iso(y, m, lastDay(y, m))}`;
    const partial = `/api/hot-spots?unitType=six_axle_road&from=${iso(y, m, 2)}&to=${iso(y, m, lastDay(y, m))}`;
    const before = [(await engineer.get(whole)).body.totals.findings, (await engineer.get(partial)).body.totals.findings];
    const bump = await t.pool.query(`update hot_spots_by_unit set findings = findings + 1000 where unit_type_key = 'six_axle_road' and month = $1`, [month]);
    expect(bump.rowCount).toBeGreaterThan(0);
    try {
      const after = [(await engineer.get(whole)).body.totals.findings, (await engineer.get(partial)).body.totals.findings];
      expect(after).toEqual([before[0] + 1000 * (bump.rowCount ?? 0), before[1]]);
    } finally {
      await t.pool.query('select hot_spots_summary_rebuild()');
    }
  });

  it('follows pins, repairs, a send-back and voids made through the app, several at once', async () => {
    // Four units pinned at once on the same part: the same summary rows written by concurrent transactions.
    const pins = await Promise.all(['HRL 2201', 'HRL 2202', 'HRL 2203', 'HRL 2204'].map((u, i) => pinFinding(inspector, u, motor(`Weeping ${i}`, 170 + i))));
    await expectSummaryKept();
    const [a, b] = pins;
    const r1 = await foreman.post(`/api/findings/${a.finding.id}/repair`, { version: a.finding.version, whatDone: 'Re-sealed' });
    expect(r1.status).toBe(200);
    const again = await inspector.post(`/api/inspections/${a.inspection.id}/findings`, motor('Weeping again'));
    expect(again.status).toBe(201);
    const back = await inspector.post(`/api/findings/${a.finding.id}/send-back`, { version: r1.body.version, reason: 'Still weeping' });
    expect(back.status).toBe(200);
    const r2 = await foreman.post(`/api/findings/${a.finding.id}/repair`, { version: back.body.version, whatDone: 'New seal' });
    expect(r2.status).toBe(200);
    await expectSummaryKept();
    // Voids at once: the repaired precedent and another unit's only finding on that part.
    const voids = await Promise.all([
      inspector.post(`/api/findings/${a.finding.id}/void`, { version: r2.body.version, reason: 'Pinned on the wrong unit' }),
      inspector.post(`/api/findings/${b.finding.id}/void`, { version: b.finding.version, reason: 'Pinned twice' }),
    ]);
    expect(voids.map((v) => v.status)).toEqual([200, 200]);
    await expectSummaryKept();
    await expectScreensAgree();
  });

  it('takes a pin while the summary rows it adds to are locked, and folds it in before the screen reads', async () => {
    // Another transaction holds this unit type's summary rows (as a fold or a bulk write would): the pin only
    // appends to hot_spots_pending, so it neither waits nor makes the next pin on the same part wait.
    const hold = await t.pool.connect();
    try {
      await hold.query('begin');
      const held = await hold.query(`select 1 from hot_spots_by_label where unit_type_key = 'four_axle_road' and month = date_trunc('month', now() at time zone $1)::date for update`, [zone]);
      expect(held.rowCount).toBeGreaterThan(0); // the pins above are this month's
      await hold.query(`select 1 from hot_spots_by_cell where unit_type_key = 'four_axle_road' for update`);
      await hold.query(`select 1 from hot_spots_by_unit where unit_type_key = 'four_axle_road' for update`);
      const pinned = await Promise.all(['HRL 2201', 'HRL 2202'].map((u) => pinFinding(inspector, u, motor('Weeping while the summary is held'))));
      expect(pinned.map((p) => p.finding.state)).toEqual(['open', 'open']);
      expect((await t.pool.query('select count(*)::int as n from hot_spots_pending')).rows[0].n).toBeGreaterThanOrEqual(2);
    } finally {
      await hold.query('rollback');
      hold.release();
    }
    await expectScreensAgree();
    expect((await t.pool.query('select count(*)::int as n from hot_spots_pending')).rows[0].n).toBe(0);
    await expectSummaryKept();
  });

  it('follows rows inserted at month edges in bulk, moved across a month edge and a cell, relabelled, and deleted', async () => {
    const some = (await t.pool.query(`select id from findings where unit_type_key = 'six_axle_road' and state <> 'voided' order by created_at limit 1`)).rows[0].id;
    const [y3, m3] = monthsAgo(3);
    const [y2, m2] = monthsAgo(2);
    const edge = at(y2, m2, 1); // local midnight starting a month
    const ids = await copiesAt(some, [
      new Date(edge.getTime() - 1), // the last millisecond of the month before
      edge,
      new Date(edge.getTime() + 1),
      at(y3, m3, lastDay(y3, m3), 23, 59, 59),
      at(y3, m3, 1, 0, 30),
    ]);
    expect(ids).toHaveLength(5);
    await expectSummaryKept();
    await expectScreensAgree();
    // Across the edge (into the month before), to another cell and another part name, in one statement.
    await t.pool.query(`update findings set created_at = created_at - interval '2 hours', front_along = front_along + 30, label = label || ' (moved)' where id = any($1::uuid[])`, [ids.slice(1, 3)]);
    await t.pool.query(`delete from findings where id = $1`, [ids[0]]);
    await expectSummaryKept();
    await expectScreensAgree();
  });

  it('lets a pin and a repair of the same part go through side by side (the pin takes its turn on the part before any summary row)', async () => {
    // The repair's order (server/modules/repairs/service.ts): the part's turn first, then its writes. The pin's: the
    // finding, then its turn (priorRepairs.fill). Were the pin to hold summary rows while it waits for its turn,
    // the repair's write of the same rows would wait for the pin: neither would finish.
    const f0 = (await t.pool.query(`select id from findings where unit_type_key = 'four_axle_road' and state <> 'voided' order by created_at desc limit 1`)).rows[0].id;
    const [now] = await copiesAt(f0, [new Date()]);
    const key = `(select hashtext(unit_id::text || '/' || instance_id || '/' || defect_type) from findings where id = '${now}')`;
    const repair = await t.pool.connect();
    const pin = await t.pool.connect();
    let pinned: string[] = [];
    try {
      await repair.query(`begin; set local statement_timeout = '5s'; select pg_advisory_xact_lock(4242006, ${key})`);
      await pin.query(`begin; set local statement_timeout = '10s'`);
      const inserting = pin.query(
        `insert into findings (inspection_id, unit_id, unit_type_key, part_id, instance_id, part_kind, view, body_x, body_y, body_z, front_along, front_left,
           front_end, label, part_label, side, end_role, number, defect_type, weight, state, created_by, created_at, updated_at)
         select inspection_id, unit_id, unit_type_key, part_id, instance_id, part_kind, view, body_x, body_y, body_z, front_along, front_left,
           front_end, label, part_label, side, end_role, number, defect_type, weight, 'open', created_by, now(), now() from findings where id = $1 returning id`,
        [now],
      );
      await new Promise((r) => setTimeout(r, 200));
      // The repair's recount of a later finding of the part, in the current month (a repeat now).
      await repair.query(`update findings set prior_repair_days = 0 where id = $1`, [now]);
      await repair.query('commit');
      pinned = (await inserting).rows.map((x) => x.id);
      await pin.query(`select pg_advisory_xact_lock(4242006, ${key})`);
      await pin.query('commit');
    } finally {
      await repair.query('rollback').catch(() => {});
      await pin.query('rollback').catch(() => {});
      repair.release();
      pin.release();
    }
    expect(pinned).toHaveLength(1);
    await expectSummaryKept();
    await t.pool.query(`delete from findings where id = any($1::uuid[])`, [[now, ...pinned]]);
    await expectSummaryKept();
  });

  it('follows a new repeat window and a new time zone', async () => {
    expect((await admin.patch('/api/settings', { repeatWindowDays: 30 })).status).toBe(200);
    await expectSummaryKept();
    await expectScreensAgree();
    expect((await admin.patch('/api/settings', { repeatWindowDays: 90, timeZone: 'America/Chicago' })).status).toBe(200);
    zone = 'America/Chicago';
    await expectSummaryKept();
    await expectScreensAgree();
  });

  it('is emptied with the findings', async () => {
    await t.pool.query('truncate findings cascade');
    const r = await t.pool.query(`select ${SUMMARY.map((s) => `(select count(*)::int from ${s})`).join(' + ')} as n`);
    expect(r.rows[0].n).toBe(0);
  });
});
