import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { count, startTestApp, type TestApp } from './harness';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ WRITE_RATE_LIMIT: '40' });
});
afterAll(() => t.close());

describe('Idempotency-Key on state-changing routes', () => {
  it('runs a request once and replays its answer to a retry with the same key', async () => {
    const admin = await t.as('admin');
    const before = await count(t.db, 'people');
    const body = { email: 'retry.me@demo.example', name: 'Retry Me', role: 'inspector', password: 'retry-password-1' };
    const [a, b] = await Promise.all([
      admin.post('/api/people', body, { 'idempotency-key': 'create-retry-me-01' }),
      admin.post('/api/people', body, { 'idempotency-key': 'create-retry-me-01' }),
    ]);
    // One ran; the racing copy was either told to retry (409 in progress) or got the same answer.
    expect([a.status, b.status]).toContain(201);
    // The racing copy, when told to wait, says so with its own code, which offline clients retry.
    for (const r of [a, b]) if (r.status === 409) expect(r.body.error.code).toBe('in_progress');
    const c = await admin.post('/api/people', body, { 'idempotency-key': 'create-retry-me-01' });
    expect(c.status).toBe(201);
    expect(c.headers.get('idempotent-replayed')).toBe('true');
    expect(c.body.id).toBe((a.status === 201 ? a : b).body.id);
    expect(await count(t.db, 'people')).toBe(before + 1);
  });

  it('refuses a key reused for another request, and a malformed key', async () => {
    const admin = await t.as('admin');
    const other = await admin.req('PATCH', '/api/settings', { digestHour: 7 }, { 'idempotency-key': 'create-retry-me-01' });
    expect(other.status).toBe(409);
    expect(other.body.error.code).toBe('conflict');
    expect(other.body.error.message).toMatch(/another request/);
    const bad = await admin.req('PATCH', '/api/settings', { digestHour: 7 }, { 'idempotency-key': 'no spaces allowed!' });
    expect(bad.status).toBe(400);
  });

  it('limits the rate of changes per person with 429 and the error shape', async () => {
    const c = await t.as('foreman');
    const statuses: number[] = [];
    for (let i = 0; i < 45; i++) statuses.push((await c.post('/api/units/00000000-0000-4000-8000-000000000000/tag/clear')).status);
    expect(statuses.filter((s) => s === 404).length).toBeGreaterThan(30);
    const last = await c.post('/api/units/00000000-0000-4000-8000-000000000000/tag/clear');
    expect(last.status).toBe(429);
    expect(last.body.error.code).toBe('rate_limited');
  });
});
