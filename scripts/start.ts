/**
 * `npm start`: private PostgreSQL under .data/ (fsync on), migrations, demo data once, a fresh client
 * build when the sources changed, then the app and API on one port. `npm run dev` (--dev) runs Vite's
 * hot reload with the API behind it instead.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { ensurePackages, newestMtime, pg } from './lib/system';

const dev = process.argv.includes('--dev');
const external = !!process.env.DATABASE_URL;
const PGPORT = process.env.PGPORT ?? '54329';
// PG_DATA_DIR / PG_RUN_DIR move the private cluster (tests use this to run a second copy elsewhere).
const DATA_DIR = path.resolve(process.env.PG_DATA_DIR ?? '.data/pg');
const STATE_DIR = path.dirname(DATA_DIR);
const pgEnv = { PGPORT, PG_FSYNC: 'on', PG_DATABASES: 'hoodline', PG_DATA_DIR: DATA_DIR, PG_RUN_DIR: process.env.PG_RUN_DIR ?? path.join(STATE_DIR, 'pg-run') };
const LOCK = path.join(STATE_DIR, 'hoodline.lock');

function takeLock() {
  fs.mkdirSync(STATE_DIR, { recursive: true });
  for (let attempt = 0; attempt < 2; attempt++) {
    try {
      const fd = fs.openSync(LOCK, 'wx');
      fs.writeSync(fd, String(process.pid));
      fs.closeSync(fd);
      return;
    } catch {
      const pid = Number(fs.readFileSync(LOCK, 'utf8'));
      let alive = false;
      try {
        process.kill(pid, 0);
        alive = pid > 0;
      } catch {
        alive = false;
      }
      if (alive) {
        console.error(`Hoodline is already running from this folder (process ${pid}).\nStop that one first (Ctrl-C in its terminal); two copies must not share one database cluster.`);
        process.exit(1);
      }
      fs.rmSync(LOCK, { force: true }); // left by a copy that died; take it over
    }
  }
}
const releaseLock = () => {
  try {
    if (Number(fs.readFileSync(LOCK, 'utf8')) === process.pid) fs.rmSync(LOCK);
  } catch {
    /* already gone */
  }
};

function buildIfStale() {
  if (process.env.SKIP_CLIENT_BUILD === '1') return; // API-only runs (tests of this script)
  const built = fs.existsSync('dist/index.html') ? fs.statSync('dist/index.html').mtimeMs : 0;
  const sources = newestMtime(['src', 'shared', 'index.html', 'vite.config.ts', 'package-lock.json', 'public']);
  if (built >= sources) return;
  console.log('Building the client (sources changed since the last build) ...');
  const r = spawnSync('npx', ['vite', 'build', '--logLevel', 'warn'], { stdio: 'inherit' });
  if (r.status !== 0) throw new Error('the client build failed');
}

function printWelcome(url: string) {
  console.log(`\nHoodline is running at ${url}\n`);
  if (!external || process.env.SEED_DEMO === '1') {
    console.log('Demo sign-ins (password for all: hoodline-demo):');
    for (const r of ['inspector', 'foreman', 'engineer', 'trainer', 'admin']) console.log(`  ${r.padEnd(10)} ${r}@demo.example`);
  }
  console.log('\nPress Ctrl-C to stop (PostgreSQL stops with it).\n');
}

async function main() {
  if (!external) {
    ensurePackages(['postgresql']);
    takeLock();
    if (pg('start', pgEnv) !== 0) {
      releaseLock();
      process.exit(1);
    }
    process.env.DATABASE_URL = `postgres://postgres@127.0.0.1:${PGPORT}/hoodline`;
  }
  if (!process.env.SESSION_SECRET) {
    // A secret kept beside the data, so sessions survive a restart and no default ships to production.
    const f = path.join(STATE_DIR, 'session-secret');
    fs.mkdirSync(STATE_DIR, { recursive: true });
    if (!fs.existsSync(f)) fs.writeFileSync(f, (await import('node:crypto')).randomBytes(32).toString('hex'), { mode: 0o600 });
    process.env.SESSION_SECRET = fs.readFileSync(f, 'utf8').trim();
  }
  const seed = !external || process.env.SEED_DEMO === '1';
  let stopping = false;
  const children: ChildProcess[] = [];
  let stopServer: (() => Promise<void>) | null = null;
  const shutdown = async (code = 0) => {
    if (stopping) return;
    stopping = true;
    console.log('\nStopping Hoodline ...');
    for (const c of children) c.kill('SIGTERM');
    await stopServer?.().catch(() => undefined);
    if (!external) {
      pg('stop', pgEnv);
      releaseLock();
    }
    process.exit(code);
  };
  process.on('SIGINT', () => void shutdown(0));
  process.on('SIGTERM', () => void shutdown(0));

  if (dev) {
    const env = { ...process.env, PORT: '3001', SEED_DEMO: seed ? '1' : '0', NODE_ENV: 'development' };
    children.push(spawn('npx', ['tsx', 'watch', '--clear-screen=false', 'server/index.ts'], { stdio: 'inherit', env }));
    children.push(spawn('npx', ['vite', '--port', process.env.PORT ?? '5173', '--strictPort'], { stdio: 'inherit', env: process.env }));
    for (const c of children) c.on('exit', (code) => void shutdown(code ?? 0));
    printWelcome(`http://127.0.0.1:${process.env.PORT ?? '5173'}`);
    return;
  }

  process.env.SERVE_DIST = '1';
  process.env.NODE_ENV ??= 'production';
  try {
    buildIfStale();
    const { loadConfig } = await import('../server/config');
    const { startServer } = await import('../server/index');
    const running = await startServer(loadConfig(), { seed });
    stopServer = running.stop;
    printWelcome(running.url);
  } catch (e) {
    console.error(`Hoodline did not start: ${e instanceof Error ? e.message : e}`);
    await shutdown(1);
  }
}

void main();
