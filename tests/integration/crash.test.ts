import { spawn, type ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, TEST_DB_URL, type Client, type TestApp } from './harness';

// The server is killed with SIGKILL in the middle of a burst of finding submissions; the client keeps
// retrying each one with its idempotency key until it is accepted. Afterwards every finding exists once
// and whole (its created event and its coverage item with it).
const PORT = 3190 + Math.floor(Math.random() * 50);
let t: TestApp;
let child: ChildProcess | null = null;

function startServer(): Promise<ChildProcess> {
  return new Promise((resolve, reject) => {
    // One process (node with the tsx loader), so SIGKILL really kills the server and not a wrapper.
    const p = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
      env: { ...process.env, DATABASE_URL: TEST_DB_URL, PORT: String(PORT), FAKE_SMTP: '0', WORKERS: '0', NODE_ENV: 'test', WRITE_RATE_LIMIT: '100000' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    const timer = setTimeout(() => reject(new Error('server did not start')), 60_000);
    p.stdout!.on('data', (d) => {
      if (String(d).includes('listening')) {
        clearTimeout(timer);
        resolve(p);
      }
    });
    p.stderr!.on('data', () => undefined);
    p.on('exit', () => clearTimeout(timer));
  });
}

beforeAll(async () => {
  t = await startTestApp();
  child = await startServer();
}, 90_000);
afterAll(async () => {
  child?.kill('SIGKILL');
  await t.close();
});

describe('crash during a burst of findings', () => {
  it('ends with exactly 500 findings, none partial, after a SIGKILL and restart', async () => {
    const local: Client = await t.as('inspector');
    const base = `http://127.0.0.1:${PORT}`;
    const call = async (path: string, body: unknown, key?: string) => {
      const res = await fetch(base + path, {
        method: 'POST',
        headers: { 'content-type': 'application/json', cookie: local.cookie, ...(key ? { 'idempotency-key': key } : {}) },
        body: JSON.stringify(body),
      });
      return { status: res.status, body: await res.json().catch(() => null) };
    };
    const unit = (await local.get('/api/units?q=HRL 4102')).body.items[0];
    const insp = await call('/api/inspections', { unitId: unit.id, kind: 'periodic', frontEndSeen: unit.frontEnd });
    expect(insp.status).toBe(201);

    let accepted = 0;
    let refusedConnections = 0;
    let killed = false;
    let restarting: Promise<void> | null = null;
    const submit = async (i: number) => {
      const key = `crash-burst-${String(i).padStart(4, '0')}`;
      const body = { partId: 'pl-traction_motor_1', view: 'plan', x: 84 + (i % 16), y: -20 + (i % 40), defectType: 'traction_motor_other', note: `burst ${i}` };
      for (let attempt = 0; attempt < 400; attempt++) {
        if (restarting) await restarting;
        try {
          const r = await call(`/api/inspections/${insp.body.id}/findings`, body, key);
          if (r.status === 201 || r.status === 200) {
            accepted++;
            if (accepted === 120 && !killed) {
              killed = true;
              child!.kill('SIGKILL');
              restarting = (async () => {
                await new Promise((r) => setTimeout(r, 300));
                child = await startServer();
                restarting = null;
              })();
            }
            return r.body.id as string;
          }
          if (r.status < 500) throw new Error(`refused ${r.status} ${JSON.stringify(r.body)}`);
        } catch (e) {
          if ((e as Error).message.startsWith('refused')) throw e;
          refusedConnections++;
        }
        await new Promise((r) => setTimeout(r, 50));
      }
      throw new Error(`finding ${i} never accepted`);
    };
    const ids: string[] = [];
    const queue = Array.from({ length: 500 }, (_, i) => i);
    await Promise.all(
      Array.from({ length: 16 }, async () => {
        for (let i = queue.shift(); i !== undefined; i = queue.shift()) ids.push(await submit(i));
      }),
    );
    expect(killed).toBe(true);
    expect(refusedConnections).toBeGreaterThan(0); // the kill really cut requests off
    expect(new Set(ids).size).toBe(500);
    const n = await t.pool.query(`select count(*)::int n from findings where inspection_id = $1`, [insp.body.id]);
    expect(n.rows[0].n).toBe(500);
    const partial = await t.pool.query(
      `select count(*)::int n from findings f where f.inspection_id = $1 and (select count(*) from finding_events e where e.finding_id = f.id and e.kind = 'created') <> 1`,
      [insp.body.id],
    );
    expect(partial.rows[0].n).toBe(0);
    const keys = await t.pool.query(`select count(distinct idempotency_key)::int n from findings where inspection_id = $1`, [insp.body.id]);
    expect(keys.rows[0].n).toBe(500);
    const item = await t.pool.query(`select state from inspection_items where inspection_id = $1 and instance_id = 'traction_motor_1'`, [insp.body.id]);
    expect(item.rows[0].state).toBe('finding');
  }, 240_000);
});
