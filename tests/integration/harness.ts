import type { Server } from 'node:http';
import { sql } from 'drizzle-orm';
import { createApp, type AppHandle } from '../../server/app';
import { loadConfig, type Config } from '../../server/config';
import { createDb, migrateDb, type Db } from '../../server/db/client';
import { loadDrawingsFromDir } from '../../server/drawings/load';
import { seedDemo } from '../../server/seed/demo';
import type pg from 'pg';
import type { Mailer } from '../../server/mail/mailer';

export const TEST_DB_URL = process.env.TEST_DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54339/hoodline_test';
export const DEMO_PASSWORD = 'hoodline-demo';
export type DemoRole = 'inspector' | 'foreman' | 'engineer' | 'trainer' | 'admin';

export interface Res<T = any> {
  status: number;
  body: T;
  headers: Headers;
}

/** A browser-like client: keeps its own cookie, sends JSON from the app's own origin by default. */
export class Client {
  cookie = '';
  constructor(readonly base: string) {}
  async req<T = any>(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<Res<T>> {
    const h: Record<string, string> = { ...headers };
    if (this.cookie) h.cookie = this.cookie;
    let payload: BodyInit | undefined;
    if (body instanceof FormData) payload = body;
    else if (typeof body === 'string') payload = body;
    else if (body !== undefined) {
      payload = JSON.stringify(body);
      h['content-type'] ??= 'application/json';
    }
    const res = await fetch(this.base + path, { method, headers: h, body: payload, redirect: 'manual' });
    const set = res.headers.getSetCookie?.() ?? [];
    for (const c of set) if (c.startsWith('hoodline.sid=')) this.cookie = c.split(';')[0];
    const text = await res.text();
    let parsed: unknown = text;
    try {
      parsed = text ? JSON.parse(text) : undefined;
    } catch {
      /* CSV, HTML */
    }
    return { status: res.status, body: parsed as T, headers: res.headers };
  }
  get<T = any>(path: string) {
    return this.req<T>('GET', path);
  }
  post<T = any>(path: string, body?: unknown, headers?: Record<string, string>) {
    return this.req<T>('POST', path, body, headers);
  }
  patch<T = any>(path: string, body?: unknown) {
    return this.req<T>('PATCH', path, body);
  }
  async login(email: string, password = DEMO_PASSWORD) {
    return this.post('/api/auth/login', { email, password });
  }
}

export interface TestApp {
  url: string;
  db: Db;
  pool: pg.Pool;
  handle: AppHandle;
  client(): Client;
  as(role: DemoRole): Promise<Client>;
  close(): Promise<void>;
}

/** Empties every table (the migrations stay), so each test file starts from the demo railroad alone. */
export async function resetDb(db: Db) {
  const rows = await db.execute<{ tablename: string }>(sql`select tablename from pg_tables where schemaname = 'public'`);
  const names = rows.rows.map((r) => `"${r.tablename}"`).join(', ');
  if (names) await db.execute(sql.raw(`truncate ${names} restart identity cascade`));
}

export async function startTestApp(env: Record<string, string> = {}, opts: { fresh?: boolean; mailer?: Mailer; historyDays?: number } = {}): Promise<TestApp> {
  const config: Config = loadConfig({ ...process.env, NODE_ENV: 'test', DATABASE_URL: TEST_DB_URL, PORT: '0', FAKE_SMTP: '0', WORKERS: '0', LOGIN_RATE_LIMIT: '1000', ...env });
  const { db, pool } = createDb(TEST_DB_URL);
  const drawings = loadDrawingsFromDir('diagrams');
  if (opts.fresh !== false) {
    await migrateDb(db);
    await resetDb(db);
    await seedDemo(db, drawings, { historyDays: opts.historyDays ?? 0 });
  }
  const handle = createApp({ db, pool, config, drawings, mailer: opts.mailer });
  await handle.start();
  const server: Server = await new Promise((r) => {
    const s = handle.app.listen(0, '127.0.0.1', () => r(s));
  });
  const addr = server.address();
  const url = `http://127.0.0.1:${typeof addr === 'object' && addr ? addr.port : 0}`;
  return {
    url,
    db,
    pool,
    handle,
    client: () => new Client(url),
    async as(role) {
      const c = new Client(url);
      const r = await c.login(`${role}@demo.example`);
      if (r.status !== 200) throw new Error(`demo ${role} could not sign in: ${r.status} ${JSON.stringify(r.body)}`);
      return c;
    },
    async close() {
      server.closeAllConnections();
      await new Promise<void>((r) => server.close(() => r()));
      await handle.close();
      await pool.end();
    },
  };
}

export async function count(db: Db, table: string): Promise<number> {
  const r = await db.execute<{ n: string }>(sql.raw(`select count(*)::text as n from "${table}"`));
  return Number(r.rows[0].n);
}

/** Starts a daily inspection on a unit and pins one finding; returns both. */
export async function pinFinding(c: Client, roadNumber: string, body: Record<string, unknown>) {
  const units = (await c.get(`/api/units?q=${encodeURIComponent(roadNumber)}`)).body.items;
  const unit = units.find((u: any) => u.roadNumber === roadNumber);
  const insp = await c.post('/api/inspections', { unitId: unit.id, kind: 'daily', frontEndSeen: unit.frontEnd });
  const f = await c.post(`/api/inspections/${insp.body.id}/findings`, body);
  if (f.status !== 201) throw new Error(`pin failed: ${f.status} ${JSON.stringify(f.body)}`);
  return { unit, inspection: insp.body, finding: f.body };
}
