/**
 * `npm run db:backup [file]`: a consistent pg_dump (custom format) of the Hoodline database. Uses
 * DATABASE_URL when set, otherwise the private cluster under .data/ (started if needed).
 * Photos on local disk live in PHOTO_DIR (.data/photos): copy that folder beside the dump.
 */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { pgBin, privateDatabaseUrl } from './lib/pg-tools';

const url = process.env.DATABASE_URL ?? privateDatabaseUrl();
const stamp = new Date().toISOString().replace(/[:.]/g, '-').slice(0, 19);
const file = path.resolve(process.argv[2] ?? `backups/hoodline-${stamp}.dump`);
fs.mkdirSync(path.dirname(file), { recursive: true });
const r = spawnSync(pgBin('pg_dump'), ['--format=custom', '--no-owner', '--no-privileges', `--file=${file}`, url], { stdio: 'inherit' });
if (r.status !== 0) {
  console.error('pg_dump failed; nothing was written.');
  fs.rmSync(file, { force: true });
  process.exit(1);
}
console.log(`Backup written: ${file} (${(fs.statSync(file).size / 1024).toFixed(0)} KB)`);
