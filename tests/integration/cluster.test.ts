import { spawn, type ChildProcess } from 'node:child_process';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TEST_DB_URL } from './harness';

// WEB_CONCURRENCY=2: two server processes share one port (node:cluster), as production runs one per core.
// Sessions live in PostgreSQL, so a sign-in made through one process holds in the other; a process that
// dies is replaced; a stop ends them all.
const dbName = `hoodline_cluster_${process.pid}`;
const dbUrl = TEST_DB_URL.replace(/\/[^/]+$/, `/${dbName}`);
const adminUrl = TEST_DB_URL.replace(/\/[^/]+$/, '/postgres');
const PORT = String(3300 + Math.floor(Math.random() * 50));
let proc: ChildProcess;
let out = '';
let exited: Promise<number | null>;

async function until(f: () => boolean, ms = 90_000) {
  const end = Date.now() + ms;
  while (!f()) {
    if (Date.now() > end) throw new Error(`timed out; output:\n${out}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}
const listening = () => [...out.matchAll(/listening on \S+ \(process (\d) of 2, pid (\d+)\)/g)].map((m) => ({ n: Number(m[1]), pid: Number(m[2]) }));

beforeAll(async () => {
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  await admin.query(`drop database if exists ${dbName} with (force)`);
  await admin.query(`create database ${dbName}`);
  await admin.end();
  proc = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    env: { ...process.env, NODE_ENV: 'production', DATABASE_URL: dbUrl, PORT, HOST: '127.0.0.1', SEED_DEMO: '1', FAKE_SMTP: '0', WORKERS: '0', WEB_CONCURRENCY: '2', SESSION_SECRET: 'cluster-test-secret-0123456789' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  proc.stdout!.on('data', (d) => (out += d));
  proc.stderr!.on('data', (d) => (out += d));
  exited = new Promise((r) => proc.on('exit', (c) => r(c)));
  await until(() => listening().length >= 2);
}, 120_000);

afterAll(async () => {
  if (proc.exitCode === null) proc.kill('SIGKILL');
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  await admin.query(`drop database if exists ${dbName} with (force)`);
  await admin.end();
});

const api = (p: string, init?: RequestInit) => fetch(`http://127.0.0.1:${PORT}${p}`, init);

describe('several server processes on one port', () => {
  it('share sign-ins, replace a process that dies, and all stop on SIGTERM', async () => {
    expect(listening().map((l) => l.n).sort()).toEqual([1, 2]);
    const login = await api('/api/auth/login', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'inspector@demo.example', password: 'hoodline-demo' }) });
    expect(login.status).toBe(200);
    const cookie = login.headers.getSetCookie()[0].split(';')[0];
    // New connections each time, so the primary hands them to both processes in turn.
    const me = () => api('/api/auth/me', { headers: { cookie, connection: 'close' } }).then((r) => r.status);
    const statuses = await Promise.all(Array.from({ length: 20 }, me));
    expect(statuses).toEqual(Array(20).fill(200));

    const second = listening().find((l) => l.n === 2)!;
    process.kill(second.pid, 'SIGKILL');
    await until(() => listening().filter((l) => l.n === 2).length >= 2);
    expect(out).toMatch(/exited .*starting another/);
    expect(await Promise.all(Array.from({ length: 10 }, me))).toEqual(Array(10).fill(200));

    proc.kill('SIGTERM');
    expect(await exited).toBe(0);
  }, 120_000);
});
