import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemo } from '../../server/seed/demo';
import { count, startTestApp, type TestApp } from './harness';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
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
    const tables = ['people', 'units', 'yards', 'unit_types', 'railroad_settings'];
    const before = await Promise.all(tables.map((n) => count(t.db, n)));
    const dims = () => ({ lengthIn: 1, widthIn: 1, axleCount: 4 });
    expect(await seedDemo(t.db, dims)).toBe(false);
    expect(await Promise.all(tables.map((n) => count(t.db, n)))).toEqual(before);
    expect(before[1]).toBeGreaterThanOrEqual(12);
  });

  it('has units with the F on each end across three unit types', async () => {
    const r = await t.pool.query('select unit_type_key, front_end, count(*)::int n from units group by 1, 2');
    expect(new Set(r.rows.map((x) => x.unit_type_key)).size).toBe(3);
    expect(r.rows.some((x) => x.front_end === 'long_hood')).toBe(true);
  });
});
