import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { count, startTestApp, type TestApp } from './harness';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ LOCKOUT_AFTER: '3' });
});
afterAll(() => t.close());

const expectErrorShape = (body: any, code: string) => {
  expect(body).toHaveProperty('error.code', code);
  expect(typeof body.error.message).toBe('string');
  expect(JSON.stringify(body)).not.toMatch(/at .*\.ts:\d+|select |insert /i);
};

describe('sign-in', () => {
  it('signs in a demo person, stores the session in PostgreSQL and answers /auth/me', async () => {
    const c = t.client();
    const r = await c.login('inspector@demo.example');
    expect(r.status).toBe(200);
    expect(r.body).toMatchObject({ email: 'inspector@demo.example', role: 'inspector' });
    expect(r.headers.get('set-cookie')).toMatch(/HttpOnly/i);
    expect(r.headers.get('set-cookie')).toMatch(/SameSite=Lax/i);
    expect(await count(t.db, 'session')).toBeGreaterThan(0);
    const me = await c.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.role).toBe('inspector');
    expect(me.body).not.toHaveProperty('passwordHash');
  });

  it('refuses a wrong password with 401 and the error shape', async () => {
    const r = await t.client().login('engineer@demo.example', 'not-the-password');
    expect(r.status).toBe(401);
    expectErrorShape(r.body, 'unauthenticated');
    const unknown = await t.client().login('nobody@demo.example', 'whatever-it-is');
    expect(unknown.status).toBe(401);
    expect(unknown.body.error.message).toBe(r.body.error.message);
  });

  it('gives a new session id at sign-in (no session fixation) and the old id stops working', async () => {
    const c = t.client();
    await c.login('foreman@demo.example');
    const first = c.cookie;
    await c.login('foreman@demo.example');
    const second = c.cookie;
    expect(second).not.toBe(first);
    const old = t.client();
    old.cookie = first;
    expect((await old.get('/api/auth/me')).status).toBe(401);
    expect((await c.get('/api/auth/me')).status).toBe(200);
  });

  it('signs out: the old cookie no longer opens anything', async () => {
    const c = await t.as('trainer');
    const before = c.cookie;
    expect((await c.post('/api/auth/logout')).status).toBe(204);
    const stale = t.client();
    stale.cookie = before;
    expect((await stale.get('/api/auth/me')).status).toBe(401);
    expect((await c.get('/api/auth/me')).status).toBe(401);
  });

  it('signs out everywhere: every session of that person ends', async () => {
    const a = await t.as('engineer');
    const b = await t.as('engineer');
    expect((await a.post('/api/auth/logout-everywhere')).status).toBe(204);
    expect((await b.get('/api/auth/me')).status).toBe(401);
    expect((await a.get('/api/auth/me')).status).toBe(401);
  });

  it('refuses a deactivated account, and ends its running sessions', async () => {
    const admin = await t.as('admin');
    const created = await admin.post('/api/people', { email: 'temp.worker@demo.example', name: 'Temp Worker', role: 'inspector', password: 'a-long-password-9' });
    expect(created.status).toBe(201);
    const worker = t.client();
    expect((await worker.login('temp.worker@demo.example', 'a-long-password-9')).status).toBe(200);
    const off = await admin.patch(`/api/people/${created.body.id}`, { version: created.body.version, active: false });
    expect(off.status).toBe(200);
    expect((await worker.get('/api/auth/me')).status).toBe(401);
    const again = await t.client().login('temp.worker@demo.example', 'a-long-password-9');
    expect(again.status).toBe(403);
    expectErrorShape(again.body, 'forbidden');
  });

  it('locks an account after repeated wrong passwords until an admin unlocks it', async () => {
    const admin = await t.as('admin');
    const p = await admin.post('/api/people', { email: 'lock.me@demo.example', name: 'Lock Me', role: 'engineer', password: 'right-password-77' });
    for (let i = 0; i < 3; i++) expect((await t.client().login('lock.me@demo.example', 'wrong-password')).status).toBe(401);
    const locked = await t.client().login('lock.me@demo.example', 'right-password-77');
    expect(locked.status).toBe(423);
    expectErrorShape(locked.body, 'locked');
    const list = await admin.get('/api/people');
    expect(list.body.items.find((x: any) => x.id === p.body.id).locked).toBe(true);
    expect((await admin.post(`/api/people/${p.body.id}/unlock`)).status).toBe(200);
    expect((await t.client().login('lock.me@demo.example', 'right-password-77')).status).toBe(200);
  });

  it('changes your own password, checking the current one and the rules', async () => {
    const admin = await t.as('admin');
    await admin.post('/api/people', { email: 'pw.change@demo.example', name: 'Pw Change', role: 'trainer', password: 'first-password-1' });
    const c = t.client();
    await c.login('pw.change@demo.example', 'first-password-1');
    const wrong = await c.post('/api/auth/password', { currentPassword: 'nope', newPassword: 'second-password-2' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.fields.currentPassword).toBeTruthy();
    const weak = await c.post('/api/auth/password', { currentPassword: 'first-password-1', newPassword: 'short' });
    expect(weak.status).toBe(400);
    expect(weak.body.error.fields.newPassword).toMatch(/10/);
    expect((await c.post('/api/auth/password', { currentPassword: 'first-password-1', newPassword: 'second-password-2' })).status).toBe(204);
    expect((await t.client().login('pw.change@demo.example', 'second-password-2')).status).toBe(200);
  });
});

describe('request hygiene', () => {
  it('refuses a cross-origin POST even with a valid session', async () => {
    const c = await t.as('admin');
    const body = { email: 'x.site@demo.example', name: 'Cross Site', role: 'inspector', password: 'cross-site-pass-1' };
    const evil = await c.post('/api/people', body, { origin: 'https://evil.example' });
    expect(evil.status).toBe(403);
    expectErrorShape(evil.body, 'forbidden');
    const fetchSite = await c.post('/api/people', body, { 'sec-fetch-site': 'cross-site' });
    expect(fetchSite.status).toBe(403);
    expect((await c.get('/api/people')).body.items.some((p: any) => p.email === 'x.site@demo.example')).toBe(false);
    const own = await c.post('/api/people', body, { origin: t.url, 'sec-fetch-site': 'same-origin' });
    expect(own.status).toBe(201);
  });

  it('refuses a form-encoded or text body with 415', async () => {
    const c = await t.as('admin');
    const r = await c.post('/api/people', 'email=a@b.c', { 'content-type': 'application/x-www-form-urlencoded' });
    expect(r.status).toBe(415);
    expectErrorShape(r.body, 'unsupported_media_type');
    const txt = await c.post('/api/auth/login', 'hello', { 'content-type': 'text/plain' });
    expect(txt.status).toBe(415);
  });

  it('refuses malformed JSON and wrong types with 400 and the error shape', async () => {
    const c = t.client();
    const bad = await c.post('/api/auth/login', '{"email": "x@y.z", ', { 'content-type': 'application/json' });
    expect(bad.status).toBe(400);
    expectErrorShape(bad.body, 'bad_request');
    const types = await c.post('/api/auth/login', { email: 42, password: ['a'] });
    expect(types.status).toBe(400);
    expectErrorShape(types.body, 'validation');
    expect(Object.keys(types.body.error.fields)).toEqual(expect.arrayContaining(['email', 'password']));
  });

  it('answers an unknown API route with 404 in the error shape', async () => {
    const r = await t.client().get('/api/no-such-thing');
    expect(r.status).toBe(404);
    expectErrorShape(r.body, 'not_found');
  });

  it('sets a Content-Security-Policy on every answer', async () => {
    const r = await t.client().get('/api/health');
    expect(r.status).toBe(200);
    expect(r.body).toEqual({ status: 'ok', db: 'ok' });
    expect(r.headers.get('content-security-policy')).toMatch(/default-src 'self'/);
    expect(r.headers.get('x-powered-by')).toBeNull();
  });
});

describe('rate limit', () => {
  it('answers 429 after too many sign-in attempts from one address', async () => {
    const limited = await startTestApp({ LOGIN_RATE_LIMIT: '3' });
    try {
      const statuses: number[] = [];
      for (let i = 0; i < 5; i++) statuses.push((await limited.client().login('inspector@demo.example', 'wrong-wrong')).status);
      expect(statuses.slice(0, 3)).toEqual([401, 401, 401]);
      expect(statuses[3]).toBe(429);
      const r = await limited.client().login('inspector@demo.example');
      expect(r.status).toBe(429);
      expect(r.body.error.code).toBe('rate_limited');
    } finally {
      await limited.close();
    }
  });
});
