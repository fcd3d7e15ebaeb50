import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { count, startTestApp, type TestApp } from './harness';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(() => t.close());

describe('people (admin)', () => {
  it('creates a person, refuses a duplicate e-mail, and records both in the audit log', async () => {
    const admin = await t.as('admin');
    const before = await count(t.db, 'audit_log');
    const body = { email: 'New.Hire@Demo.Example', name: 'New Hire', role: 'inspector', password: 'good-password-42' };
    const r = await admin.post('/api/people', body);
    expect(r.status).toBe(201);
    expect(r.body).toMatchObject({ email: 'new.hire@demo.example', role: 'inspector', active: true });
    const dup = await admin.post('/api/people', { ...body, email: 'new.hire@demo.example' });
    expect(dup.status).toBe(409);
    expect(dup.body.error.fields.email).toBeTruthy();
    expect(await count(t.db, 'audit_log')).toBe(before + 1);
  });

  it('validates role and password rules with field messages', async () => {
    const admin = await t.as('admin');
    const r = await admin.post('/api/people', { email: 'not-an-email', name: '', role: 'captain', password: 'aaaaaaaaaaaa' });
    expect(r.status).toBe(400);
    expect(Object.keys(r.body.error.fields).sort()).toEqual(['email', 'name', 'password', 'role']);
  });

  it('changes a role with the version it was based on, and answers a stale version with 409', async () => {
    const admin = await t.as('admin');
    const list = (await admin.get('/api/people')).body.items;
    const luis = list.find((p: any) => p.email === 'l.ferreira@demo.example');
    const ok = await admin.patch(`/api/people/${luis.id}`, { version: luis.version, role: 'foreman' });
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({ role: 'foreman', version: luis.version + 1 });
    const stale = await admin.patch(`/api/people/${luis.id}`, { version: luis.version, role: 'engineer' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale');
    expect(stale.body.error.message).toMatch(/Luis Ferreira/);
  });

  it('has no way to delete a person, and the admin cannot lock themself out', async () => {
    const admin = await t.as('admin');
    const people = (await admin.get('/api/people')).body.items;
    const me = people.find((p: any) => p.email === 'admin@demo.example');
    expect((await admin.req('DELETE', `/api/people/${me.id}`)).status).toBe(404);
    const self = await admin.patch(`/api/people/${me.id}`, { version: me.version, active: false });
    expect(self.status).toBe(409);
  });

  it('keeps the audit log append-only, even for the database owner', async () => {
    await expect(t.pool.query('update audit_log set action = $1', ['tampered'])).rejects.toThrow(/append-only/);
    await expect(t.pool.query('delete from audit_log')).rejects.toThrow(/append-only/);
  });
});
