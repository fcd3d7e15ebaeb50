import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Mail } from '../../server/mail/mailer';
import { civilDateInZone } from '../../shared/checks/civil-date';
import { startTestApp, type TestApp } from './harness';

let a: TestApp;
let b: TestApp;
const sentA: Mail[] = [];
const sentB: Mail[] = [];
beforeAll(async () => {
  a = await startTestApp({}, { mailer: { send: async (m) => void sentA.push(m) } });
  // A second app server on the same database, as behind a load balancer.
  b = await startTestApp({}, { fresh: false, mailer: { send: async (m) => void sentB.push(m) } });
});
afterAll(async () => {
  await b.close();
  await a.close();
});

describe('due board', () => {
  it('computes "today" in the railroad’s zone, not the server’s', async () => {
    // Pacific/Auckland is 13 hours ahead of UTC in December: late evening UTC is already tomorrow there.
    await a.db.execute(sql`update railroad_settings set time_zone = 'Pacific/Auckland'`);
    const c = await a.as('foreman');
    const r = await c.get('/api/due');
    expect(r.body.timeZone).toBe('Pacific/Auckland');
    expect(r.body.on).toBe(civilDateInZone(new Date(), 'Pacific/Auckland'));
    await a.db.execute(sql`update railroad_settings set time_zone = 'America/Chicago'`);
  });

  it('shows each unit’s items by the interval rule and flags units overdue on anything (49 CFR 229.23, 229.27, 229.31)', async () => {
    const c = await a.as('foreman');
    const { on, items } = (await c.get('/api/due')).body;
    const u = items.find((x: any) => x.roadNumber === 'HRL 2204');
    const periodic = u.items.find((i: any) => i.key === 'periodic');
    // The demo periodic of HRL 2204 was 5 days ago: 92 − 5 = 87 days left.
    expect(periodic).toMatchObject({ status: 'good', daysLeft: 87 });
    const over = items.find((x: any) => x.roadNumber === 'HRL 4104'); // periodic 95 days ago
    expect(over.items.find((i: any) => i.key === 'periodic').status).toBe('overdue');
    expect(over.state).toBe('overdue');
    expect(items[0].state).toBe('overdue'); // worst first
    const filtered = (await c.get('/api/due?state=good')).body.items;
    expect(filtered.every((x: any) => x.state === 'good')).toBe(true);
    expect(on).toMatch(/^\d{4}-\d{2}-\d{2}$/);
  });

  it('counts a signed daily inspection and adds railroad dates', async () => {
    const admin = await a.as('admin');
    const unit = (await admin.get('/api/units?q=HRL 1303')).body.items[0];
    const add = await admin.post(`/api/units/${unit.id}/dates`, { label: 'Fire extinguisher check', intervalDays: 30, lastDoneOn: '2020-01-01' });
    expect(add.status).toBe(201);
    const bad = await admin.post(`/api/units/${unit.id}/dates`, { label: 'X', intervalDays: 0, lastDoneOn: '2020-02-30' });
    expect(bad.status).toBe(400);
    const row = (await admin.get('/api/due')).body.items.find((x: any) => x.roadNumber === 'HRL 1303');
    expect(row.items.find((i: any) => i.label.startsWith('Fire extinguisher')).status).toBe('overdue');
  });

  it('exports the board as CSV', async () => {
    const c = await a.as('engineer');
    const r = await c.get('/api/due.csv');
    expect(r.headers.get('content-disposition')).toMatch(/due-board-\d{4}-\d{2}-\d{2}\.csv/);
    expect(String(r.body).split('\n')[0]).toBe('Unit,Yard,Unit state,Item,Last done,Last good day,Days left,Status,Source');
  });
});

describe('daily digest', () => {
  it('is queued and sent exactly once per day per foreman, even with two app servers racing', async () => {
    await a.db.execute(sql`update railroad_settings set digest_hour = 0`);
    const [ra, rb] = await Promise.all([a.handle.deps.services.due.runDigest(), b.handle.deps.services.due.runDigest()]);
    const again = await b.handle.deps.services.due.runDigest();
    const queued = await a.db.execute<{ n: number }>(sql`select count(*)::int n from notifications_outbox where kind = 'digest'`);
    const foremen = await a.db.execute<{ n: number }>(sql`select count(*)::int n from people where role = 'foreman' and active and yard_id is not null`);
    expect(queued.rows[0].n).toBe(foremen.rows[0].n);
    expect(ra.queued + rb.queued + again.queued).toBe(foremen.rows[0].n);
    await Promise.all([a.handle.deps.services.outbox.runOnce(), b.handle.deps.services.outbox.runOnce(), a.handle.deps.services.outbox.runOnce()]);
    const digests = [...sentA, ...sentB].filter((m) => /due and overdue/.test(m.subject));
    expect(digests.length).toBe(foremen.rows[0].n);
    expect(new Set(digests.map((m) => m.to)).size).toBe(digests.length);
    const marlow = digests.find((m) => m.to === 'foreman@demo.example')!;
    expect(marlow.subject).toMatch(/^Marlow Yard/);
    expect(marlow.text).toMatch(/HRL 4103/);
  });

  it('waits for the digest hour in the railroad’s zone', async () => {
    await a.db.execute(sql`update railroad_settings set digest_hour = 23, time_zone = 'America/Chicago'`);
    const early = new Date('2026-12-02T12:00:00Z'); // 06:00 in Chicago
    expect((await a.handle.deps.services.due.runDigest(early)).queued).toBe(0);
  });

  it('retries a failed send with backoff and shows the error', async () => {
    const failing = await startTestApp({}, { fresh: false, mailer: { send: async () => { throw new Error('SMTP 451 try later'); } } });
    try {
      await failing.db.execute(sql`insert into notifications_outbox (kind, to_address, subject, body) values ('test', 'x@demo.example', 'Retry me', 'body')`);
      await failing.handle.deps.services.outbox.runOnce();
      const r = await failing.db.execute<{ status: string; attempts: number; last_error: string; wait: number }>(
        sql`select status, attempts, last_error, extract(epoch from next_attempt_at - now())::int as wait from notifications_outbox where subject = 'Retry me'`,
      );
      expect(r.rows[0]).toMatchObject({ status: 'pending', attempts: 1, last_error: 'SMTP 451 try later' });
      expect(r.rows[0].wait).toBeGreaterThan(20);
    } finally {
      await failing.close();
    }
  });
});
