import cluster from 'node:cluster';
import type { Server } from 'node:http';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { createApp, type AppHandle } from './app';
import { loadConfig, type Config } from './config';
import { createDb, migrateDb } from './db/client';
import { loadDrawingsFromDir } from './drawings/load';
import { seedDemo } from './seed/demo';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

export interface Running {
  handle: AppHandle;
  server: Server;
  url: string;
  stop(): Promise<void>;
}

/** Migrates, seeds when asked, checks every drawing, then listens. Refuses to start on a broken drawing. */
export async function startServer(config: Config, opts: { seed: boolean; log?: (s: string) => void } = { seed: false }): Promise<Running> {
  const log = opts.log ?? ((s: string) => console.log(s));
  const drawings = loadDrawingsFromDir(path.resolve(ROOT, config.DIAGRAMS_DIR));
  const { db, pool } = createDb(config.DATABASE_URL);
  try {
    await migrateDb(db);
    if (opts.seed) {
      if (await seedDemo(db, drawings)) log('Seeded the demo railroad with four months of history.');
    }
  } catch (e) {
    await pool.end();
    throw e;
  }
  const handle = createApp({ db, pool, config, drawings, distDir: config.SERVE_DIST ? path.join(ROOT, 'dist') : undefined });
  await handle.start();
  const server = await new Promise<Server>((resolve, reject) => {
    const s = handle.app.listen(config.PORT, config.HOST, () => resolve(s));
    s.once('error', reject);
  });
  const addr = server.address();
  const port = typeof addr === 'object' && addr ? addr.port : config.PORT;
  const url = `http://${config.HOST === '0.0.0.0' ? '127.0.0.1' : config.HOST}:${port}`;
  return {
    handle,
    server,
    url,
    async stop() {
      // Stop taking requests, let the ones in flight finish, then close the database.
      const closed = new Promise<void>((r) => server.close(() => r()));
      server.closeIdleConnections();
      await Promise.race([closed, new Promise((r) => setTimeout(r, 5000))]);
      server.closeAllConnections();
      // A client that hung up leaves its handler running: let the queries still out finish before the pool goes.
      const busy = () => pool.waitingCount > 0 || pool.totalCount > pool.idleCount;
      for (let waited = 0; busy() && waited < 5000; waited += 20) await new Promise((r) => setTimeout(r, 20));
      await handle.close();
      await pool.end();
    },
  };
}

const isMain = process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (isMain) {
  const config = loadConfig();
  const fail = (e: unknown) => {
    console.error(`Hoodline did not start: ${e instanceof Error ? e.message : e}`);
    process.exit(1);
  };
  const serve = (c: Config, seed: boolean) =>
    startServer(c, { seed }).then((r) => {
      console.log(`Hoodline API listening on ${r.url}${cluster.isWorker ? ` (process ${process.env.HOODLINE_PROCESS} of ${config.WEB_CONCURRENCY}, pid ${process.pid})` : ''}`);
      const shut = () => void r.stop().then(() => process.exit(0));
      process.once('SIGINT', shut);
      process.once('SIGTERM', shut);
    });
  if (config.WEB_CONCURRENCY <= 1) serve(config, process.env.SEED_DEMO === '1').catch(fail);
  else if (cluster.isPrimary) {
    // Several processes share the port (node:cluster); the first migrates and seeds before the others start,
    // and only it runs the fake SMTP server, so dev mail lands in one mailbox.
    const numbers = new Map<number, number>();
    const fork = (n: number) => {
      const w = cluster.fork({ HOODLINE_PROCESS: String(n) });
      numbers.set(w.id, n);
      return w;
    };
    let stopping = false;
    const first = fork(1);
    first.once('listening', () => {
      for (let i = 2; i <= config.WEB_CONCURRENCY; i++) fork(i);
    });
    cluster.on('exit', (w, code) => {
      if (stopping) return;
      console.error(`Hoodline process ${w.process.pid} exited (${code}); starting another`);
      fork(numbers.get(w.id) ?? 2);
    });
    const shut = () => {
      stopping = true;
      for (const w of Object.values(cluster.workers ?? {})) w?.process.kill('SIGTERM');
      let left = Object.keys(cluster.workers ?? {}).length;
      if (!left) process.exit(0);
      cluster.on('exit', () => --left <= 0 && process.exit(0));
    };
    process.once('SIGINT', shut);
    process.once('SIGTERM', shut);
  } else {
    const first = process.env.HOODLINE_PROCESS === '1';
    serve({ ...config, FAKE_SMTP: first && config.FAKE_SMTP }, first && process.env.SEED_DEMO === '1').catch(fail);
  }
}
