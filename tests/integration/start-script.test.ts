import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';

// `npm start` itself: its own cluster with fsync on, data kept across restarts, one copy at a time.
const state = fs.mkdtempSync(path.join(os.tmpdir(), 'hoodline-start-'));
const PGPORT = String(54360 + Math.floor(Math.random() * 30));
const PORT = String(3260 + Math.floor(Math.random() * 30));
const env = { ...process.env, PG_DATA_DIR: path.join(state, 'pg'), PG_RUN_DIR: path.join(state, 'run'), PGPORT, PORT, SKIP_CLIENT_BUILD: '1', FAKE_SMTP: '0', DATABASE_URL: '' };
delete (env as Record<string, string | undefined>).DATABASE_URL;
delete (env as Record<string, string | undefined>).NODE_ENV;
const running: ChildProcess[] = [];

function start(): Promise<{ proc: ChildProcess; out: () => string; exit: Promise<number | null> }> {
  const proc = spawn(process.execPath, ['--import', 'tsx', 'scripts/start.ts'], { env, stdio: ['ignore', 'pipe', 'pipe'] });
  running.push(proc);
  let out = '';
  proc.stdout!.on('data', (d) => (out += d));
  proc.stderr!.on('data', (d) => (out += d));
  const exit = new Promise<number | null>((r) => proc.on('exit', (c) => r(c)));
  return Promise.resolve({ proc, out: () => out, exit });
}
async function until(f: () => boolean, ms = 120_000) {
  const end = Date.now() + ms;
  while (!f()) {
    if (Date.now() > end) throw new Error('timed out');
    await new Promise((r) => setTimeout(r, 200));
  }
}
const api = (p: string, init?: RequestInit) => fetch(`http://127.0.0.1:${PORT}${p}`, init);

afterAll(() => {
  for (const p of running) p.kill('SIGKILL');
  spawnSync('bash', ['scripts/pg.sh', 'destroy'], { env });
  fs.rmSync(state, { recursive: true, force: true });
});

describe('npm start', () => {
  it('serves with the demo sign-ins, refuses a second copy, stops PostgreSQL on Ctrl-C, and keeps the data', async () => {
    const a = await start();
    await until(() => a.out().includes('Hoodline is running'));
    expect(a.out()).toContain(`http://127.0.0.1:${PORT}`);
    expect(a.out()).toContain('inspector@demo.example');
    expect(a.out()).toContain('hoodline-demo');
    const pgconf = fs.readFileSync(path.join(state, 'pg', 'postgresql.conf'), 'utf8');
    expect(pgconf).not.toMatch(/^fsync = off/m); // people's records: fsync stays on
    const login = await api('/api/auth/login', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'admin@demo.example', password: 'hoodline-demo' }) });
    expect(login.status).toBe(200);
    const cookie = login.headers.getSetCookie()[0].split(';')[0];
    const made = await api('/api/people', { method: 'POST', headers: { 'content-type': 'application/json', cookie }, body: JSON.stringify({ email: 'kept@demo.example', name: 'Kept Across Restarts', role: 'engineer', password: 'kept-password-1' }) });
    expect(made.status).toBe(201);

    const b = await start();
    const code = await b.exit;
    expect(code).not.toBe(0);
    expect(b.out()).toMatch(/already running from this folder/);
    expect((await api('/api/health')).status).toBe(200); // the first copy is unharmed

    a.proc.kill('SIGINT');
    expect(await a.exit).toBe(0);
    expect(spawnSync('bash', ['scripts/pg.sh', 'status'], { env }).status).toBe(1); // stopped

    const c = await start();
    await until(() => c.out().includes('Hoodline is running'));
    expect(c.out()).not.toContain('Seeded the demo railroad');
    const again = await api('/api/auth/login', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'kept@demo.example', password: 'kept-password-1' }) });
    expect(again.status).toBe(200);
    c.proc.kill('SIGINT');
    expect(await c.exit).toBe(0);
  }, 300_000);
});
