import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '../../shared/domain/roles';
import { Client, startTestApp, type TestApp } from './harness';

// Hostile input on every state-changing route: always a 4xx with the error shape, never a 5xx, and the
// database exactly as before (row counts and a checksum of every table's rows).
let t: TestApp;
const clients = new Map<string, Client>();
beforeAll(async () => {
  t = await startTestApp({ WRITE_RATE_LIMIT: '100000' });
  for (const r of ['inspector', 'foreman', 'engineer', 'trainer', 'admin'] as const) clients.set(r, await t.as(r));
  clients.set('anonymous', t.client());
});
afterAll(() => t.close());

async function fingerprint() {
  const tables = (await t.pool.query(`select tablename from pg_tables where schemaname = 'public' and tablename <> 'session' order by 1`)).rows.map((r) => r.tablename);
  const out: Record<string, string> = {};
  for (const name of tables) {
    const r = await t.pool.query(`select count(*)::text || ':' || coalesce(md5(string_agg(x::text, '|' order by x::text)), '') as f from "${name}" x`);
    out[name] = r.rows[0].f;
  }
  return out;
}

const HOSTILE_STRINGS = [
  "'; drop table findings; --",
  "' or '1'='1",
  '<script>alert(1)</script>',
  '<img src=x onerror=alert(1)>',
  '../../../../etc/passwd',
  '\u0000\u0001\u0002',
  '{{7*7}}',
  '${process.exit(1)}',
  'NaN',
  '💥'.repeat(50),
];
const hostileString = fc.oneof(fc.constantFrom(...HOSTILE_STRINGS), fc.string({ maxLength: 40 }), fc.string({ minLength: 5000, maxLength: 20000 }));
const hostileValue: fc.Arbitrary<unknown> = fc.letrec((tie) => ({
  value: fc.oneof(
    { depthSize: 'small' },
    hostileString,
    fc.integer(),
    fc.double(),
    fc.constantFrom(null, true, false, -1, 1e308, Number.MAX_SAFE_INTEGER + 2),
    fc.array(tie('value'), { maxLength: 4 }),
    fc.dictionary(fc.oneof(hostileString, fc.constantFrom('__proto__', 'constructor', 'prototype', 'version', 'id', 'role')), tie('value'), { maxKeys: 5 }),
  ),
})).value;
/** Bodies that cannot be valid: wrong top-level types, objects with poison keys, or huge. */
const hostileBody = fc.oneof(
  fc.constantFrom('"just a string"', '[]', 'null', '42', '{"a":', '{"__proto__":{"isAdmin":true}}', '{"constructor":{"prototype":{"role":"admin"}}}'),
  fc.dictionary(fc.constantFrom('__proto__', 'constructor', 'password', 'email', 'state', 'x', 'y', 'unitId', 'version'), hostileValue, { minKeys: 1, maxKeys: 6 }).map((o) => JSON.stringify({ ...o, __proto__: { polluted: 1 }, extra_unknown_field_1: "'; select pg_sleep(5); --" })),
  fc.constant(JSON.stringify({ note: 'x'.repeat(300 * 1024) })),
);
const hostileParam = fc.oneof(fc.constantFrom("1' or '1'='1", '..%2F..%2Fetc', '%00', 'null', '-1', '9'.repeat(40)), fc.uuid(), fc.string({ minLength: 1, maxLength: 20 }).map(encodeURIComponent));

describe('fuzz: every state-changing route', () => {
  it('answers hostile bodies and parameters with a 4xx in the error shape and changes nothing', async () => {
    // Sign-out takes no input and always acts (that is its job), so it has nothing to refuse.
    const routes = t.handle.routeTable.filter((r) => r.method !== 'get' && !/^\/api\/auth\/logout/.test(r.path));
    expect(routes.length).toBeGreaterThan(20);
    const before = await fingerprint();
    const failures: string[] = [];
    for (const r of routes) {
      const who = r.access === 'public' ? 'anonymous' : r.access === 'signed_in' ? 'inspector' : (r.access as readonly Role[])[0];
      await fc.assert(
        fc.asyncProperty(hostileBody, hostileParam, async (body, param) => {
          const c = clients.get(who)!;
          const path = r.path.replace(/:(\w+)/g, () => param);
          const res = await c.req(r.method.toUpperCase(), path, body, { 'content-type': 'application/json' });
          const shaped = res.status === 204 || (res.body && typeof res.body === 'object' && 'error' in res.body && typeof res.body.error.code === 'string');
          if (res.status >= 500 || res.status < 400 || !shaped) {
            failures.push(`${r.method.toUpperCase()} ${r.path} (${who}) → ${res.status} ${String(JSON.stringify(res.body)).slice(0, 160)} for ${String(body).slice(0, 80)}`);
          }
        }),
        { numRuns: 12, seed: 20261201 },
      );
    }
    expect(failures).toEqual([]);
    expect(await fingerprint()).toEqual(before);
  }, 300_000);
});
