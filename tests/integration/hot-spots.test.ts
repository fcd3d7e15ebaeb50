import { createRequire } from 'node:module';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadDrawingsFromDir } from '../../server/drawings/load';
import { binPins, gridFor } from '../../shared/hot-spots/grid';
import { findRepeats } from '../../shared/hot-spots/repeats';
import { priorRepairs } from '../../server/modules/hot-spots/repository';
import { deriveLayout, pinLabel, pinSide } from '../../shared/orientation';
import type { FrontEnd, ViewKey } from '../../shared/domain/frames';
import { startTestApp, type TestApp } from './harness';

// Independent reference for the tail probability: jstat 1.9.6 (npm), regularized lower incomplete gamma.
const { jStat } = createRequire(import.meta.url)('jstat') as { jStat: { lowRegGamma(a: number, x: number): number } };

/*
 * A small hand-computed fixture on the demo railroad (time zone America/Chicago, repeat window 90 days),
 * range 2026-01-01 .. 2026-06-30 (Chicago days). Six-axle units: HRL 4101 (F on the short hood, Marlow),
 * HRL 4103 (F on the long hood, Marlow), HRL 4102 (short, Marlow), HRL 4104 (short, Bittern Jct),
 * HRL 4105 (long, Bittern Jct).
 *
 *   A  4101  "#1 traction motor" = traction_motor_1 (x = 92), pinned from its left (side_minus_y), 2 Feb, federal
 *   B  4103  "#1 traction motor" = traction_motor_6 (x = 758), pinned from its left (side_plus_y), 3 Mar, federal
 *      → both read "Left side, #1 traction motor", both at 92 in from the front on the centreline: cell (7, 5).
 *   P  4104  "Left side, #1 sand box", sand low, 5 Jan, repaired 10 Jan 15:00 CST
 *   R89/R90/R91  4104, same part, same defect, 9, 10, 11 Apr 09:00 CDT (89, 90, 91 days after the repair)
 *   D  4104  same part, another defect (sand box lid missing), 20 Jan: not a repeat
 *   V  4102  voided finding (entered in error): never counted
 *   O  4101  traction motor, 31 Dec 2025 23:30 CST: outside the range (in UTC it is already 1 Jan)
 *   F  2201 (four-axle road unit) traction motor finding: counts for the fleet baseline only
 *
 * Inspections of six-axle units in the range: one for each of A, B, P, R89, R90, R91, D, V, plus 4105 on
 * 1 May and 4102 on 30 Jun 23:00 CDT = 10 (the exposure). Outside: 4101 on 31 Dec 23:30 CST and on
 * 1 Jul 00:30 CDT. Four-axle road inspections in the range: 4.
 */
const RANGE = 'unitType=six_axle_road&from=2026-01-01&to=2026-06-30';
const drawings = loadDrawingsFromDir('diagrams');
const six = drawings.get('six_axle_road')!;

let t: TestApp;
const ids: Record<string, string> = {};

/** The labels the walkaround stores for a pin: derived from the unit's F at that moment. */
function pin(instanceId: string, view: ViewKey, frontEnd: FrontEnd) {
  const d = drawings.get('six_axle_road')!;
  const derived = deriveLayout(d.instances.map((i) => ({ instanceId: i.instanceId, kind: i.kind, centre: i.centre })), frontEnd, d.lengthIn);
  const part = derived.find((p) => p.instanceId === instanceId)!;
  const inst = d.instances.find((i) => i.instanceId === instanceId)!;
  const side = pinSide(view, view === 'plan' ? { u: inst.centre.x, v: inst.centre.y } : { u: inst.centre.x, v: inst.centre.z }, frontEnd);
  return { part, inst, label: pinLabel(part, side), side };
}

async function fixture() {
  const q = (text: string, values: unknown[] = []) => t.pool.query(text, values);
  const units = (await q(`select id, road_number, yard_id, front_end from units`)).rows as { id: string; road_number: string; yard_id: string; front_end: FrontEnd }[];
  const u = (n: string) => units.find((x) => x.road_number === `HRL ${n}`)!;
  const inspector = (await q(`select id from people where email = 'inspector@demo.example'`)).rows[0].id as string;
  const inspection = async (unit: string, at: string) => {
    const x = u(unit);
    const r = await q(
      `insert into inspections (unit_id, inspector_id, kind, status, front_end_seen, front_end_recorded, yard_id, started_at, signed_at)
       values ($1, $2, 'daily', 'signed', $3, $3, $4, $5, $5::timestamptz + interval '30 minutes') returning id`,
      [x.id, inspector, x.front_end, x.yard_id, at],
    );
    return r.rows[0].id as string;
  };
  const finding = async (key: string, unit: string, at: string, instanceId: string, view: ViewKey, defectType: string, weight: string, extra: { state?: string; repairedAt?: string; unitType?: string } = {}) => {
    const x = u(unit);
    const d = drawings.get(extra.unitType ?? 'six_axle_road')!;
    const derived = deriveLayout(d.instances.map((i) => ({ instanceId: i.instanceId, kind: i.kind, centre: i.centre })), x.front_end, d.lengthIn);
    const part = derived.find((p) => p.instanceId === instanceId)!;
    const inst = d.instances.find((i) => i.instanceId === instanceId)!;
    const side = pinSide(view, view === 'plan' ? { u: inst.centre.x, v: inst.centre.y } : { u: inst.centre.x, v: inst.centre.z }, x.front_end);
    const insp = await inspection(unit, at);
    const r = await q(
      `insert into findings (inspection_id, unit_id, unit_type_key, part_id, instance_id, part_kind, view, body_x, body_y, body_z,
                             front_along, front_left, front_end, label, part_label, side, end_role, number, defect_type, weight,
                             state, created_by, created_at, updated_at, repaired_at, void_reason)
       values ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, $15, $16, $17, $18, $19, $20, $21, $22, $23, $23, $24, $25)
       returning id`,
      [
        insp, x.id, d.key, `${view}:${instanceId}`, instanceId, part.kind, view, inst.centre.x, inst.centre.y, inst.centre.z,
        part.front.along, part.front.left, x.front_end, pinLabel(part, side), part.label, side, part.end ?? null, part.number ?? null,
        defectType, weight, extra.state ?? (extra.repairedAt ? 'repaired' : 'open'), inspector, at, extra.repairedAt ?? null,
        extra.state === 'voided' ? 'entered on the wrong unit' : null,
      ],
    );
    ids[key] = r.rows[0].id;
  };
  await finding('A', '4101', '2026-02-02T10:00:00-06:00', 'traction_motor_1', 'side_minus_y', 'motor_suspension_lug_cracked', 'federal');
  await finding('B', '4103', '2026-03-03T10:00:00-06:00', 'traction_motor_6', 'side_plus_y', 'motor_suspension_lug_cracked', 'federal');
  await finding('P', '4104', '2026-01-05T10:00:00-06:00', 'sand_box_1_my', 'plan', 'sand_low', 'shop', { repairedAt: '2026-01-10T15:00:00-06:00' });
  await finding('R89', '4104', '2026-04-09T09:00:00-05:00', 'sand_box_1_my', 'plan', 'sand_low', 'shop');
  await finding('R90', '4104', '2026-04-10T09:00:00-05:00', 'sand_box_1_my', 'plan', 'sand_low', 'shop');
  await finding('R91', '4104', '2026-04-11T09:00:00-05:00', 'sand_box_1_my', 'plan', 'sand_low', 'shop');
  await finding('D', '4104', '2026-01-20T10:00:00-06:00', 'sand_box_1_my', 'plan', 'sand_box_lid_missing', 'shop');
  await finding('V', '4102', '2026-02-10T10:00:00-06:00', 'sand_box_1_my', 'plan', 'sand_low', 'shop', { state: 'voided' });
  await finding('O', '4101', '2025-12-31T23:30:00-06:00', 'traction_motor_1', 'side_minus_y', 'motor_suspension_lug_cracked', 'federal');
  await inspection('4105', '2026-05-01T08:00:00-05:00');
  await inspection('4102', '2026-06-30T23:00:00-05:00');
  await inspection('4101', '2026-07-01T00:30:00-05:00');
  const four = drawings.get('four_axle_road')!;
  const fourMotor = four.instances.find((i) => i.kind === 'traction_motor')!.instanceId;
  await finding('F', '2201', '2026-02-15T10:00:00-06:00', fourMotor, 'plan', 'gear_case_leaking', 'shop', { unitType: 'four_axle_road' });
  for (const at of ['2026-03-01T08:00:00-06:00', '2026-04-01T08:00:00-05:00']) await inspection('2201', at);
  await inspection('2202', '2026-03-02T08:00:00-06:00');
  // Rows written straight to the table, like a bulk load: fill the repeat rule's day counts the way the seeds do.
  await priorRepairs(t.db).refreshAll();
}

beforeAll(async () => {
  t = await startTestApp();
  await fixture();
});
afterAll(() => t?.close());

describe('hot spots: front-relative rows and cells', () => {
  it('the two #1 motors under opposite F ends read the same label and are different physical parts', () => {
    const a = pin('traction_motor_1', 'side_minus_y', 'short_hood');
    const b = pin('traction_motor_6', 'side_plus_y', 'long_hood');
    expect(a.label).toBe('Left side, #1 traction motor');
    expect(b.label).toBe('Left side, #1 traction motor');
    expect(a.part.front.along).toBe(92);
    expect(b.part.front.along).toBe(92);
    expect(six.lengthIn - b.inst.centre.x).toBe(92);
  });

  it('lands them in the same row and the same cell; the rate uses the inspections as exposure', async () => {
    const eng = await t.as('engineer');
    const r = await eng.get(`/api/hot-spots?${RANGE}`);
    expect(r.status).toBe(200);
    expect(r.body.inspections).toBe(10);
    const tm = r.body.rows.find((x: any) => x.label === 'Left side, #1 traction motor');
    expect(tm).toMatchObject({ partLabel: '#1 traction motor', partKind: 'traction_motor', findings: 2, units: 2, repeats: 0, along: 92, left: 0 });
    expect(tm.ratePer100).toBeCloseTo(20, 12); // 2 findings per 10 inspections
    const sb = r.body.rows.find((x: any) => x.label === 'Left side, #1 sand box');
    expect(sb).toMatchObject({ findings: 5, units: 1, repeats: 2 });
    expect(sb.ratePer100).toBeCloseTo(50, 12);
    expect(r.body.rows).toHaveLength(2);
    expect(r.body.totals).toEqual({ findings: 7, units: 3, repeats: 2 });
    // Cells: 92 in from the front, on the centreline → (floor(92/12), floor((0 + 61.5)/12)) = (7, 5);
    // the sand box at 50 in, 42 in left → (4, floor(103.5/12)) = (4, 8).
    expect(r.body.grid.cells).toEqual([
      { col: 4, row: 8, count: 5 },
      { col: 7, row: 5, count: 2 },
    ]);
    expect(r.body.grid).toMatchObject({ cellIn: 12, cols: 71, rows: 11, lengthIn: 850, widthIn: 123 });
  });

  it('the SQL binning agrees with the pure binning in shared/', async () => {
    const eng = await t.as('engineer');
    const r = await eng.get(`/api/hot-spots?${RANGE}`);
    const pins = (await t.pool.query(`select front_along as along, front_left as "left" from findings f join units u on u.id = f.unit_id
      where f.unit_type_key = 'six_axle_road' and f.state <> 'voided' and f.created_at >= '2026-01-01T00:00:00-06:00' and f.created_at < '2026-07-01T00:00:00-05:00'`)).rows;
    expect(r.body.grid.cells).toEqual(binPins(gridFor(850, 123, 12), pins));
  });
});

describe('hot spots: repeats', () => {
  it('89 and 90 days after the repair are repeats, 91 is not (railroad calendar days)', async () => {
    const eng = await t.as('engineer');
    const r = await eng.get(`/api/hot-spots/findings?${RANGE}&label=${encodeURIComponent('Left side, #1 sand box')}`);
    expect(r.status).toBe(200);
    expect(r.body.total).toBe(5);
    const rep = Object.fromEntries(r.body.items.map((f: any) => [f.id, f.repeat]));
    expect(rep[ids.R89]).toBe(true);
    expect(rep[ids.R90]).toBe(true);
    expect(rep[ids.R91]).toBe(false);
    expect(rep[ids.P]).toBe(false);
    expect(rep[ids.D]).toBe(false); // same part, another defect type
    expect(r.body.items[0].id).toBe(ids.R91); // newest first
    expect(r.body.items[0]).toMatchObject({ roadNumber: 'HRL 4104', frontEnd: 'short_hood', defectLabel: expect.any(String), weight: 'shop' });
  });

  it('agrees with the pure repeat rule on the same rows', async () => {
    const rows = (await t.pool.query(`select id, unit_id as "unitId", instance_id as "instanceId", defect_type as "defectType", created_at as "createdAt",
      repaired_at as "repairedAt", state = 'voided' as voided from findings`)).rows;
    const pure = findRepeats(rows, 90, 'America/Chicago');
    expect([...pure].sort()).toEqual([ids.R89, ids.R90].sort());
  });

  it('lists the units with the most repeats', async () => {
    const eng = await t.as('engineer');
    const r = await eng.get(`/api/hot-spots?${RANGE}`);
    expect(r.body.repeatUnits).toEqual([{ unitId: expect.any(String), roadNumber: 'HRL 4104', frontEnd: 'short_hood', repeats: 2, findings: 5 }]);
    expect(r.body.repeatWindowDays).toBe(90);
  });

  it('a repair on a voided finding is no precedent', async () => {
    const unit = (await t.pool.query(`select unit_id, inspection_id from findings where id = $1`, [ids.V])).rows[0];
    await t.pool.query(`update findings set repaired_at = '2026-02-11T10:00:00-06:00' where id = $1`, [ids.V]);
    const copy = await t.pool.query(
      `insert into findings (inspection_id, unit_id, unit_type_key, part_id, instance_id, part_kind, view, body_x, body_y, body_z, front_along, front_left,
         front_end, label, part_label, side, end_role, number, defect_type, weight, state, created_by, created_at, updated_at)
       select inspection_id, unit_id, unit_type_key, part_id, instance_id, part_kind, view, body_x, body_y, body_z, front_along, front_left,
         front_end, label, part_label, side, end_role, number, defect_type, weight, 'open', created_by, '2026-02-20T10:00:00-06:00', now()
         from findings where id = $1 returning id`,
      [ids.V],
    );
    await priorRepairs(t.db).refreshAll();
    try {
      const eng = await t.as('engineer');
      const r = await eng.get(`/api/hot-spots/findings?${RANGE}&label=${encodeURIComponent('Left side, #1 sand box')}`);
      const mine = r.body.items.find((f: any) => f.id === copy.rows[0].id);
      expect(mine).toMatchObject({ roadNumber: 'HRL 4102', repeat: false });
      expect(unit.unit_id).toBe(mine.unitId);
    } finally {
      await t.pool.query(`delete from findings where id = $1`, [copy.rows[0].id]);
      await t.pool.query(`update findings set repaired_at = null where id = $1`, [ids.V]);
      await priorRepairs(t.db).refreshAll();
    }
  });

  it('follows the repeat window setting at once: with 89 days only the 89-day finding repeats', async () => {
    const eng = await t.as('engineer');
    await eng.get(`/api/hot-spots?${RANGE}`); // warms the settings the service keeps
    const admin = await t.as('admin');
    expect((await admin.patch('/api/settings', { repeatWindowDays: 89 })).status).toBe(200);
    try {
      const r = await eng.get(`/api/hot-spots/findings?${RANGE}&label=${encodeURIComponent('Left side, #1 sand box')}`);
      const rep = Object.fromEntries(r.body.items.map((f: any) => [f.id, f.repeat]));
      expect([rep[ids.R89], rep[ids.R90], rep[ids.R91]]).toEqual([true, false, false]);
      expect((await eng.get(`/api/hot-spots?${RANGE}`)).body.repeatWindowDays).toBe(89);
    } finally {
      await admin.patch('/api/settings', { repeatWindowDays: 90 });
    }
  });
});

describe('hot spots: what stands out', () => {
  it('tests each row against the fleet rate of its part kind, scaled by exposure (checked with jstat)', async () => {
    const eng = await t.as('engineer');
    const r = await eng.get(`/api/hot-spots?${RANGE}`);
    // Traction motors: 2 six-axle + 1 four-axle finding over 10 × 6 + 4 × 4 = 76 motor-inspections.
    const tm = r.body.rows.find((x: any) => x.partKind === 'traction_motor');
    expect(tm.standOut.expected).toBeCloseTo((3 / 76) * 10, 12);
    expect(tm.standOut.p).toBeCloseTo(jStat.lowRegGamma(2, (3 / 76) * 10), 12); // ≈ 0.06
    expect(tm.standOut.standsOut).toBe(false);
    // Sand boxes: 5 six-axle findings (the voided one excluded) over 10 × 8 + 4 × 8 = 112 sand-box inspections.
    const sb = r.body.rows.find((x: any) => x.partKind === 'sand_box');
    expect(sb.standOut.expected).toBeCloseTo((5 / 112) * 10, 12);
    expect(sb.standOut.p).toBeCloseTo(jStat.lowRegGamma(5, (5 / 112) * 10), 12);
    expect(sb.standOut.p).toBeLessThan(0.01);
    expect(sb.standOut.standsOut).toBe(true);
    expect(sb.standOut.words).toContain('Left side, #1 sand box: 5 findings in 10 inspections (50.0 per 100)');
    expect(sb.standOut.words).toContain('(5 findings over 112 inspections of sand boxes)');
    expect(r.body.fleet.find((k: any) => k.partKind === 'traction_motor')).toEqual({ partKind: 'traction_motor', findings: 3, partInspections: 76, ratePer100: (3 / 76) * 100 });
    expect(r.body.test).toMatchObject({ alpha: 0.01, tested: 2 });
  });
});

describe('hot spots: filters, trend, exports and access', () => {
  it('filters by weight, defect type and yard; exposure follows the yard', async () => {
    const eng = await t.as('engineer');
    const fed = (await eng.get(`/api/hot-spots?${RANGE}&weights=federal`)).body;
    expect(fed.rows.map((x: any) => x.label)).toEqual(['Left side, #1 traction motor']);
    const dt = (await eng.get(`/api/hot-spots?${RANGE}&defectTypes=sand_low,sand_box_lid_missing`)).body;
    expect(dt.rows.map((x: any) => [x.label, x.findings])).toEqual([['Left side, #1 sand box', 5]]);
    const yards = (await t.pool.query(`select id, code from yards`)).rows;
    const btj = yards.find((y: any) => y.code === 'BTJ').id;
    const y = (await eng.get(`/api/hot-spots?${RANGE}&yards=${btj}`)).body;
    expect(y.inspections).toBe(6); // 4104 × 5 and 4105 × 1
    expect(y.rows.map((x: any) => [x.label, x.findings])).toEqual([['Left side, #1 sand box', 5]]);
  });

  it('gives every month of the range, with zeros', async () => {
    const eng = await t.as('engineer');
    const r = await eng.get(`/api/hot-spots?${RANGE}`);
    expect(r.body.trend).toEqual([
      { month: '2026-01', findings: 2, repeats: 0 },
      { month: '2026-02', findings: 1, repeats: 0 },
      { month: '2026-03', findings: 1, repeats: 0 },
      { month: '2026-04', findings: 3, repeats: 2 },
      { month: '2026-05', findings: 0, repeats: 0 },
      { month: '2026-06', findings: 0, repeats: 0 },
    ]);
  });

  it('exports the table and the underlying findings as CSV', async () => {
    const eng = await t.as('engineer');
    const table = await eng.get(`/api/hot-spots/table.csv?${RANGE}`);
    expect(table.status).toBe(200);
    expect(table.headers.get('content-type')).toContain('text/csv');
    expect(table.headers.get('content-disposition')).toContain('hot-spots-table-six_axle_road-2026-01-01-to-2026-06-30.csv');
    const lines = (table.body as string).trim().split('\n');
    expect(lines[0]).toBe('Part,Part kind,Findings,Per 100 inspections (10 inspections),Units,Repeats,Stands out (p < 0.01),p (exact one-sided Poisson),Expected at fleet rate,Why');
    expect(lines[1]).toMatch(/^Left side, #1 sand box|^"Left side, #1 sand box"/);
    expect(lines).toHaveLength(3);
    const all = await eng.get(`/api/hot-spots/findings.csv?${RANGE}`);
    const rows = (all.body as string).trim().split('\n');
    expect(rows).toHaveLength(1 + 7);
    expect(rows[0]).toContain('Found (America/Chicago)');
    const one = await eng.get(`/api/hot-spots/findings.csv?${RANGE}&label=${encodeURIComponent('Left side, #1 traction motor')}`);
    const oneRows = (one.body as string).trim().split('\n');
    expect(oneRows).toHaveLength(3);
    expect(oneRows.slice(1).map((l) => l.split(',')[2]).sort()).toEqual(['HRL 4101', 'HRL 4103']);
    expect(oneRows[1]).toContain('2026-03-03 10:00'); // local time of B
  });

  it('lets engineers, foremen and admins read; not inspectors or trainers; not the signed-out', async () => {
    for (const role of ['engineer', 'foreman', 'admin'] as const) expect((await (await t.as(role)).get(`/api/hot-spots?${RANGE}`)).status).toBe(200);
    for (const role of ['inspector', 'trainer'] as const) {
      for (const p of ['/api/hot-spots', '/api/hot-spots/findings', '/api/hot-spots/table.csv', '/api/hot-spots/findings.csv']) {
        expect((await (await t.as(role)).get(`${p}?${RANGE}`)).status).toBe(403);
      }
    }
    expect((await t.client().get(`/api/hot-spots?${RANGE}`)).status).toBe(401);
  });

  it('refuses bad queries with field messages, and an unknown unit type with 404', async () => {
    const eng = await t.as('engineer');
    const backwards = await eng.get('/api/hot-spots?unitType=six_axle_road&from=2026-06-30&to=2026-01-01');
    expect(backwards.status).toBe(400);
    expect(Object.keys(backwards.body.error.fields)).toEqual(['to']);
    const heavy = await eng.get(`/api/hot-spots?${RANGE}&weights=heavy`);
    expect(heavy.status).toBe(400);
    expect(Object.keys(heavy.body.error.fields)).toEqual(['weights.0']);
    expect((await eng.get('/api/hot-spots?unitType=six_axle_road&from=2026-02-30&to=2026-03-01')).status).toBe(400);
    expect((await eng.get('/api/hot-spots?unitType=no_such_type&from=2026-01-01&to=2026-02-01')).status).toBe(404);
    expect((await eng.get(`/api/hot-spots?${RANGE}&yards=not-a-uuid`)).status).toBe(400);
  });
});
