import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import pg from 'pg';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import * as schema from './schema';

export type Db = NodePgDatabase<typeof schema>;
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
export type DbOrTx = Db | Tx;

// DATE columns come back as 'YYYY-MM-DD' strings, never shifted by the server's zone.
pg.types.setTypeParser(1082, (v) => v);

export function createDb(url: string, max = Number(process.env.DB_POOL_MAX ?? 20)): { db: Db; pool: pg.Pool } {
  const pool = new pg.Pool({ connectionString: url, max });
  pool.on('error', () => {
    /* idle client errors (e.g. server restart) are retried by the next query */
  });
  return { db: drizzle(pool, { schema }), pool };
}

const here = path.dirname(fileURLToPath(import.meta.url));
export const MIGRATIONS_DIR = path.resolve(here, '../../drizzle');

export async function migrateDb(db: Db): Promise<void> {
  await migrate(db, { migrationsFolder: MIGRATIONS_DIR });
}
