import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemo } from '../../server/seed/demo';
import { count, startTestApp, type TestApp } from './harness';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({}, { historyDays: 120 });
});
afterAll(() => t.close());

describe('demo railroad', () => {
  it('seeds one account per role, all signing in with the demo password', async () => {
    for (const role of ['inspector', 'foreman', 'engineer', 'trainer', 'admin'] as const) {
      const r = await t.client().login(`${role}@demo.example`);
      expect(r.status).toBe(200);
      expect(r.body.role).toBe(role);
    }
  });

  it('is idempotent: a second seed neither duplicates nor wipes', async () => {
    const tables = ['people', 'units', 'yards', 'unit_types', 'railroad_settings', 'inspections', 'findings', 'finding_events', 'inspection_items'];
    const before = await Promise.all(tables.map((n) => count(t.db, n)));
    expect(await seedDemo(t.db, t.handle.deps.drawings)).toBe(false);
    expect(await Promise.all(tables.map((n) => count(t.db, n)))).toEqual(before);
    expect(before[1]).toBeGreaterThanOrEqual(12);
  });

  it('has units with the F on each end across three unit types', async () => {
    const r = await t.pool.query('select unit_type_key, front_end, count(*)::int n from units group by 1, 2');
    expect(new Set(r.rows.map((x) => x.unit_type_key)).size).toBe(3);
    expect(r.rows.some((x) => x.front_end === 'long_hood')).toBe(true);
  });
});

describe('demo history', () => {
  it('holds months of signed daily inspections with findings whose labels follow each unit’s F end', async () => {
    const r = await t.pool.query(`select count(*)::int n, min(signed_at) first from inspections where status = 'signed'`);
    expect(r.rows[0].n).toBeGreaterThan(1000);
    expect(Date.now() - new Date(r.rows[0].first).getTime()).toBeGreaterThan(100 * 86400_000);
    // The weak spot is the same front-relative part on units with the F on either end.
    const spots = await t.pool.query(`select front_end, count(*)::int n from findings where label = 'Left side, #1 traction motor' group by 1`);
    expect(spots.rows.map((x) => x.front_end).sort()).toEqual(['long_hood', 'short_hood']);
    const sides = await t.pool.query(`select distinct front_end, sign(body_y)::int s from findings where label = 'Left side, #1 traction motor'`);
    for (const row of sides.rows) expect(row.s).toBe(row.front_end === 'short_hood' ? -1 : 1); // left is -y only with the F on the short hood
    const open = await t.pool.query(`select count(*)::int n from findings where state in ('open', 'in_repair')`);
    expect(open.rows[0].n).toBeGreaterThan(0);
    // Units tagged by the history have an open federal finding, and only those.
    const tagged = await t.pool.query(`select u.road_number, exists(select 1 from findings f where f.unit_id = u.id and f.weight = 'federal' and f.state in ('open','in_repair')) has from units u where u.non_complying_since is not null`);
    expect(tagged.rows.every((x) => x.has)).toBe(true);
  });
});
