import fs from 'node:fs';
import { ensurePackages, pg } from './system';

/** The server-version binary (pg_dump must not be older than the server). */
export function pgBin(name: 'pg_dump' | 'pg_restore'): string {
  const versions = fs.existsSync('/usr/lib/postgresql') ? fs.readdirSync('/usr/lib/postgresql').sort((a, b) => Number(b) - Number(a)) : [];
  for (const v of versions) if (fs.existsSync(`/usr/lib/postgresql/${v}/bin/${name}`)) return `/usr/lib/postgresql/${v}/bin/${name}`;
  return name;
}

/** Starts the private cluster if needed and returns its URL. */
export function privateDatabaseUrl(): string {
  ensurePackages(['postgresql']);
  const port = process.env.PGPORT ?? '54329';
  if (pg('start', { PGPORT: port, PG_FSYNC: 'on', PG_DATABASES: 'hoodline' }) !== 0) process.exit(1);
  return `postgres://postgres@127.0.0.1:${port}/hoodline`;
}
