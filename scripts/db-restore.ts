/**
 * `npm run db:restore <file>`: restores a dump made by db:backup into the Hoodline database, replacing
 * what is there (--clean --if-exists), in one transaction so a failed restore leaves the old data.
 * Stop Hoodline first.
 */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import { pgBin, privateDatabaseUrl } from './lib/pg-tools';

const file = process.argv[2];
if (!file || !fs.existsSync(file)) {
  console.error('Usage: npm run db:restore -- <backup file>');
  process.exit(2);
}
const url = process.env.DATABASE_URL ?? privateDatabaseUrl();
const r = spawnSync(pgBin('pg_restore'), ['--clean', '--if-exists', '--no-owner', '--no-privileges', '--single-transaction', '--exit-on-error', `--dbname=${url}`, file], { stdio: 'inherit' });
if (r.status !== 0) {
  console.error('pg_restore failed; the database was left as it was.');
  process.exit(1);
}
console.log(`Restored ${file}.`);
