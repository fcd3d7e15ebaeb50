/**
 * `npm run bench:load`: 50 connections for 20 s of mixed reads and finding writes, on loopback, against
 * the production build served by one Hoodline process, in its own database on the throwaway cluster.
 * Prints requests per second, p50/p99 latency and the error count (goal: 0 errors, p99 < 100 ms).
 */
import autocannon from 'autocannon';
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import pg from 'pg';
import { ensurePackages, pg as pgctl } from '../scripts/lib/system';
import { defectTypesFor } from '../shared/defects/catalogue';
import type { Drawing } from '../shared/drawings/types';

const PGPORT = process.env.TEST_PGPORT ?? '54339';
const DB = 'hoodline_load';
const PORT = Number(process.env.BENCH_PORT ?? 3177);
const DURATION = Number(process.env.BENCH_SECONDS ?? 20);
const WARMUP = Number(process.env.BENCH_WARMUP_SECONDS ?? 3);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 50);
// Server processes sharing the port (WEB_CONCURRENCY), as production runs one per core.
const PROCESSES = Number(process.env.BENCH_PROCESSES ?? 1);
// Requests a second each connection sends in the paced run (0 skips it); BENCH_PACED_ONLY=1 skips the saturation run.
const RATE = Number(process.env.BENCH_RATE ?? 2);
const ONLY_PACED = process.env.BENCH_PACED_ONLY === '1';
const url = `postgres://postgres@127.0.0.1:${PGPORT}/${DB}`;

async function main() {
  ensurePackages(['postgresql']);
  const env = { PGPORT, PG_DATA_DIR: `${process.cwd()}/.data/test-pg`, PG_RUN_DIR: `${process.cwd()}/.data/test-pg-run`, PG_FSYNC: 'off', PG_DATABASES: 'postgres' };
  if (pgctl('start', env) !== 0) process.exit(1);
  const admin = new pg.Client({ connectionString: `postgres://postgres@127.0.0.1:${PGPORT}/postgres` });
  await admin.connect();
  await admin.query(`drop database if exists ${DB} with (force)`);
  await admin.query(`create database ${DB}`);
  await admin.end();
  if (!fs.existsSync('dist/index.html')) spawnSync('npx', ['vite', 'build', '--logLevel', 'warn'], { stdio: 'inherit' });

  // The production server: migrates and seeds the demo railroad (with its history) on start.
  const server = spawn(process.execPath, [...(process.env.BENCH_PROFILE ? ['--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_PROFILE}`] : []), '--import', 'tsx', 'server/index.ts'], {
    env: { ...process.env, NODE_ENV: 'production', DATABASE_URL: url, PORT: String(PORT), SERVE_DIST: '1', SEED_DEMO: '1', FAKE_SMTP: '0', WORKERS: '0', WEB_CONCURRENCY: String(PROCESSES), WRITE_RATE_LIMIT: '1000000', SESSION_SECRET: 'bench-only-secret-0123456789' },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  await new Promise<void>((resolve, reject) => {
    const t = setTimeout(() => reject(new Error('server did not start')), 120_000);
    let up = 0;
    server.stdout!.on('data', (d) => (up += String(d).split('listening').length - 1) >= PROCESSES && (clearTimeout(t), resolve()));
    server.on('exit', (c) => reject(new Error(`server exited ${c}`)));
  });
  const base = `http://127.0.0.1:${PORT}`;
  try {
    const login = await fetch(`${base}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'inspector@demo.example', password: 'hoodline-demo' }) });
    const cookie = login.headers.getSetCookie()[0].split(';')[0];
    const h = { cookie, 'content-type': 'application/json' };
    // A yard with 50 inspectors at once, each walking their own unit: the bench adds 50 units of the six-axle
    // type to its own database (half with the F at each end) so that writes do not queue on a few records.
    const db = new pg.Client({ connectionString: url });
    await db.connect();
    await db.query(`insert into units (road_number, unit_type_key, front_end, yard_id, last_periodic_on, last_annual_on)
      select 'LOAD ' || g, u.unit_type_key, case when g % 2 = 0 then 'short_hood' else 'long_hood' end, u.yard_id, u.last_periodic_on, u.last_annual_on
        from generate_series(1, ${CONNECTIONS}) g, (select * from units where unit_type_key = 'six_axle_road' order by road_number limit 1) u`);
    await db.end();
    const units = (await (await fetch(`${base}/api/units`, { headers: h })).json()).items as { id: string; roadNumber: string; frontEnd: string }[];
    const walked = units.filter((u) => u.roadNumber.startsWith('LOAD '));
    const inspections: { id: string; unitId: string }[] = [];
    for (const u of walked) {
      const r = await fetch(`${base}/api/inspections`, { method: 'POST', headers: h, body: JSON.stringify({ unitId: u.id, kind: 'periodic', frontEndSeen: u.frontEnd }) });
      if (!r.ok) throw new Error(`could not start an inspection of ${u.roadNumber}: ${r.status} ${await r.text()}`);
      inspections.push({ ...(await r.json()), unitId: u.id });
    }
    // Each pass through the mix is one inspector's round: their unit's list, drawing layout, the queue, their
    // inspection and one finding on it. Passes are handed out in turn, so the 50 connections spread over the 50 inspections.
    // Pins spread over the parts of the plan view, as a yard's findings are: each on a part's centre with a
    // defect of that part's kind, never a federal one (those open a tag and mail the foremen) nor a gauged one.
    const drawing = (await (await fetch(`${base}/api/unit-types/six_axle_road`, { headers: h })).json()) as Drawing;
    const pins = drawing.views
      .find((v) => v.key === 'plan')!
      .parts.flatMap((p) => {
        const d = defectTypesFor(p.kind).find((t) => t.weight !== 'federal' && !t.check);
        return d ? [{ partId: p.id, x: (p.bbox.umin + p.bbox.umax) / 2, y: (p.bbox.vmin + p.bbox.vmax) / 2, defectType: d.key }] : [];
      });
    let pass = 0;
    let n = 0;
    type Ctx = { i?: number; t?: number };
    const mine = (c: Ctx) => inspections[c.i ?? 0];
    const allKinds: { name: string; method: 'GET' | 'POST'; path(c: Ctx): string }[] = [
      { name: 'GET /api/units', method: 'GET', path: () => '/api/units' },
      // A tablet that has walked a unit before holds its layout and revalidates it (If-None-Match → 304), as a browser does.
      { name: 'GET /api/units/:id/layout (revalidated)', method: 'GET', path: (c) => `/api/units/${mine(c).unitId}/layout` },
      { name: 'GET /api/repairs', method: 'GET', path: () => '/api/repairs' },
      { name: 'GET /api/inspections/:id', method: 'GET', path: (c) => `/api/inspections/${mine(c).id}` },
      { name: 'POST /api/inspections/:id/findings', method: 'POST', path: (c) => `/api/inspections/${mine(c).id}/findings` },
    ];
    // BENCH_ONLY=layout,units sends only the kinds whose names contain one of the words, to cost each alone.
    const only = process.env.BENCH_ONLY?.split(',').filter(Boolean);
    const kinds = only ? allKinds.filter((k) => only.some((w) => k.name.includes(w))) : allKinds;
    // Latency per kind of request, for finding where the time goes (a connection sends one request at a time).
    const samples = new Map<string, { at: number; ms: number }[]>(kinds.map((k) => [k.name, []]));
    const bytes = new Map<string, number>();
    let revalidated = 0;
    const etags = new Map<string, string>();
    for (const i of inspections) etags.set(i.unitId, (await fetch(`${base}/api/units/${i.unitId}/layout`, { headers: h })).headers.get('etag') ?? '');
    const mix = (duration: number, connections: number, rate?: number) => autocannon({
      url: base,
      connections,
      duration,
      headers: h,
      ...(rate ? { connectionRate: rate } : {}),
      requests: kinds.map((k, idx) => ({
        method: k.method,
        path: '/',
        setupRequest: (req: autocannon.Request, c: Ctx) => {
          if (idx === 0) c.i = pass++ % inspections.length;
          c.t = performance.now();
          if (k.name.includes('revalidated')) return { ...req, path: k.path(c), headers: { ...h, 'if-none-match': etags.get(mine(c).unitId) ?? '' } };
          if (k.method === 'GET') return { ...req, path: k.path(c) };
          n++;
          return { ...req, path: k.path(c), headers: { ...h, 'idempotency-key': `bench-${process.pid}-${n}` }, body: JSON.stringify({ ...pins[(n * 7) % pins.length], view: 'plan', note: `load ${n}` }) };
        },
        onResponse: (status: number, body: string, c: Ctx) => {
          samples.get(k.name)!.push({ at: c.t ?? 0, ms: performance.now() - (c.t ?? 0) });
          bytes.set(k.name, (bytes.get(k.name) ?? 0) + (body?.length ?? 0));
          if (status === 304) revalidated++;
        },
      })),
    });
    // The worker folds what pins leave waiting for the hot spots summary every few seconds (server/app.ts);
    // the bench runs it the same way, so its cost is in the figures.
    const folder = new pg.Client({ connectionString: url });
    await folder.connect();
    let folds = 0;
    const fold = setInterval(() => void folder.query('select hot_spots_fold()').then(() => folds++), 3000);
    const pct = (xs: number[], q: number) => (xs.length ? [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(q * xs.length))] : 0);
    let failed = false;
    /**
     * One run of the mix; the first WARMUP seconds are not counted in the per-request figures (the server opens
     * its database connections and compiles its code paths, and all 50 connections start at once, which a running
     * yard never sees). Errors are counted over the whole run, warm-up included.
     */
    async function phase(title: string, rate: number | undefined, goal: boolean) {
      for (const xs of samples.values()) xs.length = 0;
      bytes.clear();
      revalidated = 0;
      const written = n;
      const t0 = performance.now();
      // Paced: one autocannon per tablet, started spread over a second. autocannon counts a connection's
      // requests per whole second from when it starts, so 50 connections started together would all send
      // at the top of each second, a burst no yard makes.
      const runs = rate
        ? await Promise.all(Array.from({ length: CONNECTIONS }, (_, i) => new Promise<autocannon.Result>((ok) => setTimeout(() => ok(mix(WARMUP + DURATION, 1, rate)), (i * 1000) / CONNECTIONS))))
        : [await mix(WARMUP + DURATION, CONNECTIONS)];
      const sum = (f: (r: autocannon.Result) => number) => runs.reduce((a, r) => a + f(r), 0);
      const result = { errors: sum((r) => r.errors), timeouts: sum((r) => r.timeouts), non2xx: sum((r) => r.non2xx), requests: { total: sum((r) => r.requests.total) }, latency: runs[0].latency };
      const counted = (xs: { at: number; ms: number }[]) => xs.filter((x) => x.at >= t0 + WARMUP * 1000).map((x) => x.ms);
      const all = [...samples.values()].flatMap(counted);
      if (process.env.BENCH_SLOW_LOG) fs.writeFileSync(process.env.BENCH_SLOW_LOG, [...samples].flatMap(([k, xs]) => xs.filter((x) => x.ms > 60).map((x) => `${((x.at - t0) / 1000).toFixed(2)} ${x.ms.toFixed(0)} ${k}`)).sort((a, b) => parseFloat(a) - parseFloat(b)).join('\n'));
      // 304 Not Modified is the answer a revalidating tablet wants, not an error.
      const errors = result.errors + result.timeouts + result.non2xx - revalidated;
      const p99 = pct(all, 0.99);
      // The whole run, warm-up included, from the bench's own clock.
      const whole = [...samples.values()].flatMap((xs) => xs.map((x) => x.ms));
      console.log(`\n${title}`);
      console.log(`requests/s: ${(all.length / DURATION).toFixed(0)}  (counted ${all.length}; ${result.requests.total} in all)`);
      console.log(`latency p50: ${pct(all, 0.5).toFixed(0)} ms  p99: ${p99.toFixed(0)} ms  [whole run with the warm-up: p50 ${pct(whole, 0.5).toFixed(0)} ms, p99 ${pct(whole, 0.99).toFixed(0)} ms]`);
      console.log(`errors: ${errors} (connection ${result.errors}, timeouts ${result.timeouts}, non-2xx other than 304 ${result.non2xx - revalidated})`);
      console.log(`findings written: ${n - written}, over ${pins.length} parts of the plan view; the hot spots summary folded ${folds} times so far`);
      console.log('by request (counted):');
      for (const [name, xs] of samples) {
        const c = counted(xs);
        console.log(`  ${name.padEnd(48)} n ${String(c.length).padStart(5)}  p50 ${pct(c, 0.5).toFixed(0).padStart(4)} ms  p99 ${pct(c, 0.99).toFixed(0).padStart(5)} ms  ${((bytes.get(name) ?? 0) / Math.max(1, xs.length) / 1024).toFixed(1)} KB each`);
      }
      if (goal) {
        const met = errors === 0 && p99 < 100;
        failed ||= !met;
        console.log(`goal (0 errors, p99 < 100 ms): ${met ? 'met' : 'NOT met'} — ${errors} errors, p99 ${p99.toFixed(0)} ms`);
      } else if (errors) {
        failed = true;
        console.log(`errors at saturation: ${errors} (goal 0)`);
      }
    }
    const head = `${CONNECTIONS} connections, ${DURATION} s counted after a ${WARMUP} s warm-up, mixed reads and finding writes (1 write in 5), loopback, production build, ${PROCESSES} server process${PROCESSES === 1 ? '' : 'es'}`;
    // Saturation first: every connection sends its next request the moment the last is answered, so the server is
    // always behind by construction and latency is the 50 connections divided by the throughput (Little's law). It
    // measures how much the machine can take, not how long a tablet waits, and leaves the server as a shift finds
    // it: every pooled connection open, its statements prepared and the triggers compiled, inspections with findings.
    if (!ONLY_PACED) await phase(`bench:load, saturation — ${head}, no pause between requests (capacity)`, undefined, false);
    // A yard's pace: each tablet sends RATE requests a second (a screen's worth every 2.5 s at the default of 2),
    // several times what an inspector walking between parts sends; this is the run the goal is judged on.
    if (RATE > 0) await phase(`bench:load, a yard's pace — ${head}, each connection at most ${RATE} requests/s (${RATE * CONNECTIONS} requests/s offered)`, RATE, true);
    clearInterval(fold);
    await folder.end();
    if (failed) process.exitCode = 1;
  } finally {
    server.kill('SIGTERM');
  }
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
