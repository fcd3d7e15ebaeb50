import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { count, startTestApp, TEST_DB_URL, type TestApp } from './harness';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(() => t.close());

describe('db:backup and db:restore', () => {
  it('restores exactly what was backed up, undoing later changes', async () => {
    const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'hoodline-bk-')), 'b.dump');
    const env = { ...process.env, DATABASE_URL: TEST_DB_URL };
    const people = await count(t.db, 'people');
    const b = spawnSync('npx', ['tsx', 'scripts/db-backup.ts', file], { env, encoding: 'utf8' });
    expect(b.status, b.stderr).toBe(0);
    expect(fs.statSync(file).size).toBeGreaterThan(10_000);
    await t.pool.query(`insert into yards (code, name) values ('TMP', 'Temporary Yard')`);
    // Close our pool's idle connections so the restore is not blocked by them.
    const r = spawnSync('npx', ['tsx', 'scripts/db-restore.ts', file], { env, encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    expect((await t.pool.query(`select count(*)::int n from yards where code = 'TMP'`)).rows[0].n).toBe(0);
    expect(await count(t.db, 'people')).toBe(people);
    const bad = spawnSync('npx', ['tsx', 'scripts/db-restore.ts', '/nonexistent.dump'], { env, encoding: 'utf8' });
    expect(bad.status).toBe(2);
  }, 60_000);
});
