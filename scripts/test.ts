/**
 * `npm test`: a throwaway PostgreSQL cluster (own data dir and port, fsync off), every vitest suite
 * (unit, component, integration), a production client build, the Chromium end-to-end flows, then one
 * closing line `N passed, N failed` summing all suites. Exits non-zero on any failure.
 */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import { ensurePackages, pg } from './lib/system';

const args = process.argv.slice(2);
const only = args.find((a) => a.startsWith('--only='))?.slice(7); // vitest | e2e
const PGPORT = process.env.TEST_PGPORT ?? '54339';
// TEST_PG_DIR lets a second run (another checkout, a developer's own loop) keep out of this one's way.
const dir = process.env.TEST_PG_DIR ?? `${process.cwd()}/.data/test-pg`;
const pgEnv = {
  PGPORT,
  PG_DATA_DIR: dir,
  PG_RUN_DIR: `${dir}-run`,
  PG_FSYNC: 'off',
  PG_DATABASES: 'hoodline_test hoodline_e2e hoodline_bench',
};

ensurePackages(only === 'vitest' ? ['postgresql'] : ['postgresql', 'chromium']);
pg('destroy', pgEnv);
if (pg('start', pgEnv) !== 0) process.exit(1);

const env = {
  ...process.env,
  NODE_ENV: 'test',
  TEST_DATABASE_URL: `postgres://postgres@127.0.0.1:${PGPORT}/hoodline_test`,
  E2E_DATABASE_URL: `postgres://postgres@127.0.0.1:${PGPORT}/hoodline_e2e`,
};
fs.mkdirSync('.tmp', { recursive: true });
let passed = 0;
let failed = 0;
let broken = false;

if (only !== 'e2e') {
  fs.rmSync('.tmp/vitest-results.json', { force: true });
  const r = spawnSync('npx', ['vitest', 'run', ...args.filter((a) => !a.startsWith('--only='))], { stdio: 'inherit', env });
  try {
    const j = JSON.parse(fs.readFileSync('.tmp/vitest-results.json', 'utf8'));
    passed += j.numPassedTests;
    failed += j.numFailedTests;
    if (r.status !== 0 && j.numFailedTests === 0) broken = true; // e.g. a suite that failed to load
  } catch {
    broken = true;
  }
}

if (only !== 'vitest') {
  const b = spawnSync('npx', ['vite', 'build', '--logLevel', 'warn'], { stdio: 'inherit', env });
  if (b.status !== 0) {
    console.error('Client build failed; end-to-end flows not run.');
    broken = true;
  } else {
    fs.rmSync('.tmp/e2e-results.json', { force: true });
    const r = spawnSync('npx', ['playwright', 'test'], { stdio: 'inherit', env: { ...env, PLAYWRIGHT_JSON_OUTPUT_NAME: '.tmp/e2e-results.json' } });
    try {
      const j = JSON.parse(fs.readFileSync('.tmp/e2e-results.json', 'utf8'));
      passed += j.stats.expected + (j.stats.flaky ?? 0);
      failed += j.stats.unexpected;
      if (r.status !== 0 && j.stats.unexpected === 0) broken = true;
    } catch {
      broken = true;
    }
  }
}

pg('destroy', pgEnv);
if (broken) failed = Math.max(failed, 1);
console.log(`\n${passed} passed, ${failed} failed`);
process.exit(failed > 0 ? 1 : 0);
