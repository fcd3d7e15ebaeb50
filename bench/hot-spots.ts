/**
 * `npm run bench:hot-spots`: the hot spots API against 1,000,000 findings.
 *
 * In its own database (hoodline_bench on the test cluster, port 54339, started here with the test
 * settings when it is not running), seeds 500 units, 50,000 inspections over two years and
 * 1,000,000 findings, then times, in the same run and through real HTTP against createApp:
 *   - the hot spots screen for a typical query (one unit type, the last 12 months: the screen's default),
 *   - the same for the last 90 days,
 *   - a bare `select count(*) from findings`,
 * each as the median of several runs after a warm-up, and prints both and their ratio. The screen reads
 * whole months from the hot spots summary (drizzle/0005); the bench also times the same screen computed
 * from findings alone (the statement filtered queries use) and checks that both give the same answer.
 *
 * Flags: --reuse (keep an already seeded bench database), --runs=N (default 7),
 *        --proposed-index (also time with the covering index proposed to the lead, created in the
 *        bench database only and dropped afterwards).
 */
import { spawnSync } from 'node:child_process';
import type { Server } from 'node:http';
import { createApp } from '../server/app';
import { loadConfig } from '../server/config';
import { createDb, migrateDb } from '../server/db/client';
import { loadDrawingsFromDir } from '../server/drawings/load';
import { hotSpotsService } from '../server/modules/hot-spots/service';
import { HotSpotsQuery } from '../shared/api/hot-spots';
import { BENCH_ENGINEER, BENCH_PASSWORD, seedBench, type BenchSize } from './hot-spots-seed';

const PORT = process.env.BENCH_PGPORT ?? '54339';
const URL = `postgres://postgres@127.0.0.1:${PORT}/hoodline_bench`;
const SIZE: BenchSize = { units: 500, inspections: 50_000, findings: 1_000_000, days: 730 };
const args = process.argv.slice(2);
const RUNS = Number(args.find((a) => a.startsWith('--runs='))?.slice(7) ?? 7);
const REUSE = args.includes('--reuse');
const PROPOSED = args.includes('--proposed-index');
export const PROPOSED_INDEX =
  'create index findings_hot_spots on findings (unit_type_key, created_at) include (part_kind, label, part_label, unit_id, instance_id, defect_type, weight, state, front_along, front_left)';

const pgEnv = {
  PGPORT: PORT,
  PG_DATA_DIR: `${process.cwd()}/.data/test-pg`,
  PG_RUN_DIR: `${process.cwd()}/.data/test-pg-run`,
  PG_FSYNC: 'off',
  PG_DATABASES: 'hoodline_test hoodline_e2e hoodline_bench',
};

function ensureCluster() {
  const st = spawnSync('bash', ['scripts/pg.sh', 'status'], { env: { ...process.env, ...pgEnv }, encoding: 'utf8' });
  // Start (or just create the missing databases) with the test settings; pg.sh is idempotent.
  if (st.status !== 0) console.log(`Starting the test PostgreSQL cluster on port ${PORT} ...`);
  const r = spawnSync('bash', ['scripts/pg.sh', 'start'], { env: { ...process.env, ...pgEnv }, stdio: 'inherit' });
  if (r.status !== 0) throw new Error('could not start the test PostgreSQL cluster (scripts/pg.sh start)');
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};
const civil = (d: Date) => d.toISOString().slice(0, 10);
const ms = (x: number) => `${x.toFixed(0)} ms`;

async function main() {
  ensureCluster();
  const drawings = loadDrawingsFromDir('diagrams');
  const { db, pool } = createDb(URL, 4);
  await migrateDb(db);
  const have = await pool.query<{ n: string; name: string | null }>(
    `select (select count(*) from findings)::text as n, (select name from railroad_settings where id = 1) as name`,
  );
  if (REUSE && Number(have.rows[0].n) === SIZE.findings && have.rows[0].name === 'Bench Railroad') {
    console.log('Reusing the seeded bench database.');
  } else {
    console.log(`Seeding ${SIZE.findings.toLocaleString('en-US')} findings over ${SIZE.units} units and ${SIZE.inspections.toLocaleString('en-US')} inspections ...`);
    const t = performance.now();
    await seedBench(pool, drawings, SIZE, (s) => console.log(s));
    console.log(`  seeded in ${((performance.now() - t) / 1000).toFixed(1)} s`);
  }

  const config = loadConfig({ ...process.env, NODE_ENV: 'test', DATABASE_URL: URL, FAKE_SMTP: '0', WORKERS: '0', LOGIN_RATE_LIMIT: '1000' });
  const handle = createApp({ db, pool, config, drawings });
  const server: Server = await new Promise((r) => {
    const s = handle.app.listen(0, '127.0.0.1', () => r(s));
  });
  const addr = server.address();
  const base = `http://127.0.0.1:${typeof addr === 'object' && addr ? addr.port : 0}`;
  const login = await fetch(`${base}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: BENCH_ENGINEER, password: BENCH_PASSWORD }) });
  if (login.status !== 200) throw new Error(`bench engineer could not sign in: ${login.status}`);
  const cookie = login.headers.getSetCookie()[0].split(';')[0];

  const type = drawings.has('six_axle_road') ? 'six_axle_road' : [...drawings.keys()][0];
  const today = new Date();
  const query = (days: number) => `/api/hot-spots?unitType=${type}&from=${civil(new Date(today.getTime() - (days - 1) * 86_400_000))}&to=${civil(today)}`;
  const api = async (path: string) => {
    const t = performance.now();
    const r = await fetch(base + path, { headers: { cookie } });
    const body = (await r.json()) as { totals?: { findings: number; repeats: number }; rows?: unknown[]; error?: unknown };
    if (r.status !== 200) throw new Error(`${path} answered ${r.status}: ${JSON.stringify(body.error)}`);
    return { ms: performance.now() - t, body };
  };
  const count = async () => {
    const t = performance.now();
    await pool.query('select count(*) from findings');
    return performance.now() - t;
  };

  async function measure(label: string) {
    const year = query(365);
    const quarter = query(90);
    const first = await api(year); // warm-up (also caches the settings)
    await api(quarter);
    await count();
    const a: number[] = [];
    const q: number[] = [];
    const c: number[] = [];
    // Interleaved so a change in machine load hits all three alike.
    for (let i = 0; i < RUNS; i++) {
      a.push((await api(year)).ms);
      c.push(await count());
      q.push((await api(quarter)).ms);
    }
    const [ma, mq, mc] = [median(a), median(q), median(c)];
    console.log(`\n${label}`);
    console.log(`  typical query: ${year}`);
    console.log(`    ${first.body.totals?.findings.toLocaleString('en-US')} findings of ${type} in the range, ${first.body.rows?.length} rows, ${first.body.totals?.repeats.toLocaleString('en-US')} repeats`);
    console.log(`  hot spots API, last 12 months (median of ${RUNS}): ${ms(ma)}   [runs: ${a.map((x) => x.toFixed(0)).join(', ')}]`);
    console.log(`  hot spots API, last 90 days   (median of ${RUNS}): ${ms(mq)}   [runs: ${q.map((x) => x.toFixed(0)).join(', ')}]`);
    console.log(`  select count(*) from findings (median of ${RUNS}): ${ms(mc)}   [runs: ${c.map((x) => x.toFixed(0)).join(', ')}]`);
    console.log(`  ratio, 12 months / count(*): ${(ma / mc).toFixed(2)}   (goal ≤ 3 and under 1 s: ${ma / mc <= 3 && ma < 1000 ? 'met' : 'not met'})`);
    console.log(`  ratio, 90 days / count(*):   ${(mq / mc).toFixed(2)}   (goal ≤ 3 and under 1 s: ${mq / mc <= 3 && mq < 1000 ? 'met' : 'not met'})`);

    // The same screens from findings alone, in process (no HTTP), and whether they agree with the API's.
    const raw = hotSpotsService(pool, drawings, { summary: false });
    // The query as the route parses it, so both answers are built from the same input.
    const screen = (path: string) => raw.screen(HotSpotsQuery.parse(Object.fromEntries(new globalThis.URL(path, base).searchParams)));
    const r: number[] = [];
    for (let i = 0; i < Math.min(RUNS, 3); i++) {
      const t = performance.now();
      await screen(year);
      r.push(performance.now() - t);
    }
    console.log(`  from findings alone, last 12 months (median of ${r.length}): ${ms(median(r))}   [runs: ${r.map((x) => x.toFixed(0)).join(', ')}]`);
    // Counts must agree exactly; mean positions to float precision (the raw statement adds float8 in its own order).
    type Row = { along: number; left: number };
    const rows = (x: unknown) => (x as { rows: Row[] }).rows;
    const withoutPositions = (x: unknown) => JSON.stringify({ ...(x as object), rows: rows(x).map((r) => ({ ...r, along: 0, left: 0 })) });
    for (const [name, path] of [['12 months', year], ['90 days', quarter]] as const) {
      const a = (await api(path)).body;
      const b = await screen(path);
      const gap = Math.max(0, ...rows(a).flatMap((r, i) => [Math.abs(r.along - rows(b)[i].along), Math.abs(r.left - rows(b)[i].left)]));
      const same = withoutPositions(a) === withoutPositions(b) && gap < 1e-9;
      console.log(`  ${name}: the API (summary) and findings alone give ${same ? 'the same answer' : 'DIFFERENT answers'} (largest gap in a mean position: ${gap.toExponential(1)} in)`);
      if (!same) process.exitCode = 1;
    }
  }

  try {
    const load = (await import('node:os')).loadavg()[0];
    console.log(`\nMachine: ${(await import('node:os')).cpus().length} cores, load average ${load.toFixed(2)} at the start of timing.`);
    await measure('With the schema as it is:');
    if (PROPOSED) {
      console.log(`\nCreating the proposed index in the bench database only:\n  ${PROPOSED_INDEX}`);
      await pool.query('drop index if exists findings_hot_spots');
      await pool.query(PROPOSED_INDEX);
      await pool.query('vacuum (analyze) findings');
      try {
        await measure('With the proposed covering index:');
      } finally {
        await pool.query('drop index if exists findings_hot_spots');
      }
    }
  } finally {
    server.closeAllConnections();
    await new Promise<void>((r) => server.close(() => r()));
    await handle.close();
    await pool.end();
  }
}

main().catch((e) => {
  console.error(e instanceof Error ? e.message : e);
  process.exit(1);
});
