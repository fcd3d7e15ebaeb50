import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { createHash } from 'node:crypto';
import pg from 'pg';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import * as schema from './schema';

export type Db = NodePgDatabase<typeof schema>;
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
export type DbOrTx = Db | Tx;

// DATE columns come back as 'YYYY-MM-DD' strings, never shifted by the server's zone.
pg.types.setTypeParser(1082, (v) => v);

/**
 * Every parameterised statement a connection runs is kept prepared, named by a hash of its text:
 * PostgreSQL then plans a statement once per connection instead of on every request (planning was a third
 * of its work under load), and goes on planning each call only where that gives a better plan. The text
 * decides the name, so two statements never share one. Statements without parameters (DDL, scripts), and
 * those that select `*`, are sent as they are.
 */
function preparing(client: pg.PoolClient) {
  const query = client.query.bind(client) as (...args: unknown[]) => unknown;
  (client as { query: unknown }).query = (config: unknown, values?: unknown, callback?: unknown) => {
    if (typeof config === 'string' && Array.isArray(values) && values.length && keepable(config)) return query({ text: config, values, name: statementName(config) }, callback);
    if (config && typeof config === 'object' && !('submit' in config) && !('name' in config && config.name)) {
      const c = config as pg.QueryConfig;
      const v = Array.isArray(values) ? values : c.values;
      if (typeof c.text === 'string' && v?.length && keepable(c.text)) return query({ ...c, values: v, name: statementName(c.text) }, typeof values === 'function' ? values : callback);
    }
    return query(config, values, callback);
  };
}
// A statement that selects `*` has the table's columns: kept prepared, it would fail on a running server once a
// migration adds one ("cached plan must not change result type"), so it is planned on every call.
const SELECTS_ALL = /(?:\bselect|\.)\s*\*/i;
const keepable = (text: string) => !SELECTS_ALL.test(text);
const names = new Map<string, string>();
function statementName(text: string): string {
  let n = names.get(text);
  if (!n) {
    n = `h${createHash('sha1').update(text).digest('hex').slice(0, 24)}`;
    if (names.size > 5000) names.clear();
    names.set(text, n);
  }
  return n;
}

export function createDb(url: string, max = Number(process.env.DB_POOL_MAX ?? 20)): { db: Db; pool: pg.Pool } {
  // Connections idle for less than five minutes are kept: a new one re-plans its statements and recompiles
  // the triggers' functions (tens of ms for the first pin on it), which a quiet spell in a yard would otherwise cost.
  const pool = new pg.Pool({ connectionString: url, max, idleTimeoutMillis: 300_000 });
  pool.on('connect', preparing);
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
