import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { loadDrawingsFromDir } from '../../server/drawings/load';
import { unitLayout } from '../../shared/layout/unit-layout';
import { startTestApp, type TestApp } from './harness';

// What keeps a busy yard's requests cheap must not change what anyone sees: layouts are sent from a copy
// made once (with a tag, so a tablet that has one gets 304), and the signed-in person is reused for a moment.
let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ PERSON_CACHE_MS: '60000' });
});
afterAll(() => t.close());

describe('layouts sent from a copy made once', () => {
  it('are the layout the orientation engine derives, tagged, and 304 to a client that has them', async () => {
    const c = await t.as('inspector');
    const unit = (await c.get('/api/units')).body.items.find((u: any) => u.unitTypeKey === 'six_axle_road');
    const r = await c.get(`/api/units/${unit.id}/layout`);
    expect(r.status).toBe(200);
    expect(r.headers.get('content-type')).toMatch(/application\/json/);
    const drawing = loadDrawingsFromDir('diagrams').get('six_axle_road')!;
    expect(r.body).toEqual(JSON.parse(JSON.stringify(unitLayout(drawing, unit.frontEnd))));
    const etag = r.headers.get('etag')!;
    expect(etag).toMatch(/^"[\w-]+"$/);
    const again = await c.req('GET', `/api/units/${unit.id}/layout`, undefined, { 'if-none-match': etag, 'cache-control': 'max-age=0' }); // as a browser revalidates (fetch() would add no-cache)
    expect(again.status).toBe(304);
    expect(again.body).toBeUndefined();
    // The other front end is another layout with another tag.
    const other = unit.frontEnd === 'short_hood' ? 'long_hood' : 'short_hood';
    const flipped = await c.get(`/api/unit-types/six_axle_road/layout/${other}`);
    expect(flipped.headers.get('etag')).not.toBe(etag);
    expect(flipped.body).toEqual(JSON.parse(JSON.stringify(unitLayout(drawing, other))));
    // Still behind sign-in.
    expect((await t.client().get(`/api/units/${unit.id}/layout`)).status).toBe(401);
  });
});

describe('the signed-in person reused between requests', () => {
  it('sees a role change made through the app at once, even with a long reuse time', async () => {
    const admin = await t.as('admin');
    const inspector = await t.as('inspector');
    expect((await inspector.get('/api/auth/me')).body.role).toBe('inspector');
    const me = (await admin.get('/api/people')).body.items.find((p: any) => p.email === 'inspector@demo.example');
    expect((await admin.patch(`/api/people/${me.id}`, { version: me.version, role: 'engineer' })).status).toBe(200);
    expect((await inspector.get('/api/auth/me')).body.role).toBe('engineer');
  });

  it('keeps a row changed behind its back for the reuse time, and deactivation still signs out at once', async () => {
    const foreman = await t.as('foreman');
    expect((await foreman.get('/api/auth/me')).body.role).toBe('foreman');
    // Another process changing the row: this one keeps its copy (PERSON_CACHE_MS is a minute here).
    await t.db.execute(sql`update people set name = 'Renamed Elsewhere' where email = 'foreman@demo.example'`);
    expect((await foreman.get('/api/auth/me')).body.name).not.toBe('Renamed Elsewhere');
    // Deactivating deletes the stored sessions and forgets this process's copies of them.
    const admin = await t.as('admin');
    const f = (await admin.get('/api/people')).body.items.find((p: any) => p.email === 'foreman@demo.example');
    expect((await admin.patch(`/api/people/${f.id}`, { version: f.version, active: false })).status).toBe(200);
    expect((await foreman.get('/api/auth/me')).status).toBe(401);
  });

  it('ends a session signed out through this process at once for every tablet holding it, even with a long reuse time', async () => {
    const a = await t.as('inspector');
    const b = t.client();
    b.cookie = a.cookie; // the same session on a second tablet
    expect((await b.get('/api/auth/me')).status).toBe(200);
    expect((await a.post('/api/auth/logout', {})).status).toBeLessThan(300);
    expect((await b.get('/api/auth/me')).status).toBe(401);
    // Sign-out everywhere: a third tablet's session, already read and kept, ends too.
    const c = await t.as('inspector');
    const d = t.client();
    d.cookie = c.cookie;
    const e = await t.as('inspector');
    expect((await e.get('/api/auth/me')).status).toBe(200);
    expect((await c.post('/api/auth/logout-everywhere', {})).status).toBeLessThan(300);
    expect((await d.get('/api/auth/me')).status).toBe(401);
    expect((await e.get('/api/auth/me')).status).toBe(401);
  });
});
