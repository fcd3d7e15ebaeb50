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
  startServer(config, { seed: process.env.SEED_DEMO === '1' })
    .then((r) => {
      console.log(`Hoodline API listening on ${r.url}`);
      const shut = () => void r.stop().then(() => process.exit(0));
      process.once('SIGINT', shut);
      process.once('SIGTERM', shut);
    })
    .catch((e) => {
      console.error(`Hoodline did not start: ${e instanceof Error ? e.message : e}`);
      process.exit(1);
    });
}
