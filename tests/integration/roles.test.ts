import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, type Role } from '../../shared/domain/roles';
import { Client, startTestApp, type TestApp } from './harness';

// Built from the server's own route table: a route added without an access rule, or with the wrong
// one, shows up here without anyone keeping a list by hand.
let t: TestApp;
const clients = new Map<Role, Client>();
beforeAll(async () => {
  t = await startTestApp();
  for (const r of ROLES) clients.set(r, await t.as(r));
});
afterAll(() => t.close());

const SAMPLE_PARAMS: Record<string, string> = { key: 'six_axle_road', check: 'pilot_height' };
const fill = (path: string) => path.replace(/:(\w+)/g, (_m, name: string) => SAMPLE_PARAMS[name] ?? '00000000-0000-4000-8000-000000000000');

describe('role × route', () => {
  it('has a declared access rule on every route', () => {
    expect(t.handle.routeTable.length).toBeGreaterThan(8);
    for (const r of t.handle.routeTable) expect(r.access === 'public' || r.access === 'signed_in' || Array.isArray(r.access)).toBe(true);
  });

  it('answers 401 to anonymous callers, 403 to roles outside the rule, and lets allowed roles through', async () => {
    const failures: string[] = [];
    for (const route of t.handle.routeTable) {
      const path = fill(route.path);
      const method = route.method.toUpperCase();
      const body = method === 'GET' ? undefined : {};
      const anon = await t.client().req(method, path, body);
      if (route.access === 'public') {
        if ([401, 403].includes(anon.status)) failures.push(`${method} ${route.path} anonymous got ${anon.status}, expected through`);
      } else if (anon.status !== 401) failures.push(`${method} ${route.path} anonymous got ${anon.status}, expected 401`);
      for (const role of ROLES) {
        let c = clients.get(role)!;
        const allowed = route.access === 'public' || route.access === 'signed_in' || (route.access as readonly Role[]).includes(role);
        const r = await c.req(method, path, body);
        if (allowed && [401, 403].includes(r.status)) failures.push(`${method} ${route.path} as ${role} got ${r.status}, expected through`);
        if (!allowed && r.status !== 403) failures.push(`${method} ${route.path} as ${role} got ${r.status}, expected 403`);
        if (r.status >= 500) failures.push(`${method} ${route.path} as ${role} got ${r.status}`);
        // Routes such as sign-out end the session: sign in again for the next route.
        if ((await c.get('/api/auth/me')).status === 401) {
          c = await t.as(role);
          clients.set(role, c);
        }
      }
    }
    expect(failures).toEqual([]);
  }, 120_000);
});
