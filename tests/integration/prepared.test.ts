import { sql } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb } from '../../server/db/client';
import { TEST_DB_URL } from './harness';

// The server's connections keep each parameterised statement prepared (server/db/client.ts), so
// PostgreSQL plans it once per connection. One connection here, so every call lands on the same one.
const { db, pool } = createDb(TEST_DB_URL, 1);
afterAll(() => pool.end());

const prepared = async () => (await pool.query(`select statement from pg_prepared_statements`)).rows.map((r) => r.statement as string);

describe('statements kept prepared on each connection', () => {
  it('prepares a parameterised statement once and answers it as before', async () => {
    const text = 'select $1::int + 1 as n';
    expect((await pool.query(text, [1])).rows).toEqual([{ n: 2 }]);
    expect((await pool.query(text, [41])).rows).toEqual([{ n: 42 }]);
    expect((await prepared()).filter((s) => s === text)).toHaveLength(1);
  });

  it('does the same for the ORM and for query objects, with their row modes', async () => {
    const r = await db.execute(sql`select ${'F'}::text || 'ront' as word`);
    expect(r.rows).toEqual([{ word: 'Front' }]);
    const arrays = await pool.query({ text: 'select $1::int as a, $2::text as b', values: [6, 'axle'], rowMode: 'array' });
    expect(arrays.rows).toEqual([[6, 'axle']]);
    expect(await prepared()).toEqual(expect.arrayContaining(['select $1::int as a, $2::text as b']));
  });

  it('sends statements without parameters as they are (DDL, scripts of several statements)', async () => {
    await pool.query('create temp table t_prepared (n int); insert into t_prepared values (1), (2)');
    expect((await pool.query('select count(*)::int as n from t_prepared')).rows).toEqual([{ n: 2 }]);
    expect((await prepared()).some((s) => s.includes('t_prepared'))).toBe(false);
  });

  it('plans a statement that selects * on every call, so a column added by a migration never breaks it', async () => {
    await pool.query('create table if not exists prepared_wide (n int)');
    await pool.query('insert into prepared_wide values ($1)', [1]);
    const text = 'select w.* from prepared_wide w where w.n = $1';
    expect((await pool.query(text, [1])).rows).toEqual([{ n: 1 }]);
    await pool.query('alter table prepared_wide add column note text');
    expect((await pool.query(text, [1])).rows).toEqual([{ n: 1, note: null }]);
    expect((await prepared()).some((s) => s.includes('prepared_wide w'))).toBe(false);
    expect((await pool.query('select count(*)::int as n from prepared_wide where n = $1', [1])).rows).toEqual([{ n: 1 }]);
    await pool.query('drop table prepared_wide');
  });

  it('reports an error in a statement as before, and the connection goes on working', async () => {
    await expect(pool.query('select 1 / $1::int as n', [0])).rejects.toThrow(/division by zero/);
    expect((await pool.query('select 1 / $1::int as n', [1])).rows).toEqual([{ n: 1 }]);
    await expect(pool.query('select from where $1', [1])).rejects.toThrow(/syntax error/);
    expect((await pool.query('select $1::text as ok', ['yes'])).rows).toEqual([{ ok: 'yes' }]);
  });

  it('follows a table that is dropped and made again (a restore), planning afresh', async () => {
    await pool.query('create table if not exists prepared_probe (n int)');
    await pool.query('insert into prepared_probe values ($1)', [7]);
    expect((await pool.query('select n from prepared_probe where n = $1', [7])).rows).toEqual([{ n: 7 }]);
    await pool.query('drop table prepared_probe; create table prepared_probe (n int); insert into prepared_probe values (8)');
    expect((await pool.query('select n from prepared_probe where n = $1', [8])).rows).toEqual([{ n: 8 }]);
    await pool.query('drop table prepared_probe');
  });
});
