import connectPgSimple from 'connect-pg-simple';
import express, { type Express } from 'express';
import session from 'express-session';
import helmet from 'helmet';
import fs from 'node:fs';
import path from 'node:path';
import type pg from 'pg';
import type { Drawing } from '../shared/drawings/types';
import type { Config } from './config';
import type { Db } from './db/client';
import { buildServices, buildStorage, type Deps } from './deps';
import { smtpMailer, startFakeSmtp, type Mailer, type ReceivedMail } from './mail/mailer';
import { rateLimit, ipKeyGenerator } from 'express-rate-limit';
import { AppError, errorBody, errorHandler } from './http/errors';
import { idempotency } from './http/idempotency';
import { mountRoutes, type RouteDef } from './http/routes';
import { checksRoutes } from './modules/checks/routes';
import { dueRoutes } from './modules/due/routes';
import { foldSummary } from './modules/hot-spots/repository';
import { hotSpotsRoutes } from './modules/hot-spots/routes';
import { labRoutes } from './modules/lab/routes';
import { outboxRoutes } from './modules/outbox/routes';
import { repairsRoutes } from './modules/repairs/routes';
import { walkaroundRoutes } from './modules/walkaround/routes';
import { authRoutes } from './modules/auth/routes';
import { toPerson } from './modules/auth/service';
import { cacheSessions } from './modules/auth/session-cache';
import { peopleRoutes } from './modules/people/routes';
import { settingsRoutes } from './modules/settings/routes';
import { unitsRoutes } from './modules/units/routes';

export interface AppHandle {
  app: Express;
  deps: Deps;
  /** Every API route with its declared access, for tests and docs. */
  routeTable: readonly Pick<RouteDef, 'method' | 'path' | 'access' | 'summary'>[];
  /** Starts background workers (outbox, digest) when the config asks for them. */
  start(): Promise<void>;
  close(): Promise<void>;
}

export function createApp(opts: { db: Db; pool: pg.Pool; config: Config; drawings: ReadonlyMap<string, Drawing>; distDir?: string; mailer?: Mailer }): AppHandle {
  const { db, pool, config, drawings } = opts;
  // The SMTP port is known only once the fake server listens (port 0 picks a free one).
  let smtpPort = config.SMTP_PORT;
  let received: ReceivedMail[] | null = null;
  const mailer: Mailer = opts.mailer ?? { send: (m) => smtpMailer({ host: config.SMTP_HOST, port: smtpPort, from: config.MAIL_FROM }).send(m) };
  const deps: Deps = {
    db,
    pool,
    config,
    drawings,
    services: buildServices(db, config, drawings, mailer),
    storage: buildStorage(config),
    mailbox: () => received,
  };
  const stoppers: (() => Promise<void> | void)[] = [];
  const app = express();
  app.disable('x-powered-by');

  app.set('trust proxy', config.TRUST_PROXY ? 1 : false);
  app.set('query parser', 'simple');

  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          'default-src': ["'self'"],
          'script-src': ["'self'"],
          'style-src': ["'self'", "'unsafe-inline'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'font-src': ["'self'"],
          'connect-src': ["'self'"],
          'worker-src': ["'self'"],
          'manifest-src': ["'self'"],
          'object-src': ["'none'"],
          'base-uri': ["'self'"],
          'form-action': ["'self'"],
          'frame-ancestors': ["'none'"],
        },
      },
      strictTransportSecurity: config.TRUST_PROXY,
    }),
  );

  const PgStore = connectPgSimple(session);
  // A session lasts one 12-hour shift from sign-in; not touching it on every request saves a write per request.
  const store = new PgStore({ pool, tableName: 'session', createTableIfMissing: false, disableTouch: true, pruneSessionInterval: config.NODE_ENV === 'test' ? false : 900 });
  const sessions = cacheSessions(store, config.PERSON_CACHE_MS);
  deps.services.signedIn.onForget((id) => sessions.forgetPerson(id));
  app.use(
    '/api',
    session({
      name: 'hoodline.sid',
      secret: config.SESSION_SECRET,
      store,
      resave: false,
      saveUninitialized: false,
      rolling: false,
      cookie: { httpOnly: true, sameSite: 'lax', secure: config.TRUST_PROXY, maxAge: 12 * 3600 * 1000 },
    }),
  );
  app.use('/api', express.json({ limit: '256kb' }));

  // Load the signed-in person on every API request; a deactivated person or a session issued before
  // "sign out everywhere" counts as signed out.
  app.use('/api', async (req, _res, next) => {
    req.person = null;
    const id = req.session?.personId;
    if (!id) return next();
    try {
      const p = await deps.services.signedIn.get(id);
      const issuedAt = req.session.issuedAt ?? 0;
      if (p && p.active && !(p.sessionsValidAfter && p.sessionsValidAfter.getTime() > issuedAt)) {
        req.person = toPerson(p);
      } else {
        delete req.session.personId;
      }
      next();
    } catch (e) {
      next(e);
    }
  });

  // Each feature module declares its routes with their access rule; this is the whole API.
  const defs: RouteDef[] = [
    ...settingsRoutes(deps),
    ...authRoutes(deps),
    ...peopleRoutes(deps),
    ...unitsRoutes(deps),
    ...checksRoutes(deps),
    ...walkaroundRoutes(deps),
    ...repairsRoutes(deps),
    ...dueRoutes(deps),
    ...hotSpotsRoutes(deps),
    ...labRoutes(deps),
    ...outboxRoutes(deps),
  ];
  const api = express.Router();
  const writeLimiter = rateLimit({
    windowMs: 60_000,
    limit: config.WRITE_RATE_LIMIT,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    // Per person when signed in (a yard's tablets may share one address), else per address.
    keyGenerator: (req) => (req.person ? `p:${req.person.id}` : `ip:${ipKeyGenerator(req.ip ?? '')}`),
    handler: (_req, res) => void res.status(429).json(errorBody('rate_limited', 'Too many changes in a minute; wait a moment and try again')),
  });
  mountRoutes(api, defs, { writeLimiter, idempotency: idempotency(db) });
  app.use('/api', api);
  app.use('/api', (_req, _res, next) => next(new AppError('not_found', 'No such API route')));

  const distDir = opts.distDir;
  if (distDir && fs.existsSync(path.join(distDir, 'index.html'))) {
    app.use(express.static(distDir, { index: false, maxAge: '1h', setHeaders: (res, p) => { if (p.includes(`${path.sep}assets${path.sep}`)) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable'); } }));
    app.get(/^(?!\/api\/).*/, (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(path.join(distDir, 'index.html'));
    });
  }
  app.use(errorHandler);

  return {
    app,
    deps,
    routeTable: defs.map(({ method, path: p, access, summary }) => ({ method, path: `/api${p}`, access, summary })),
    async start() {
      if (config.FAKE_SMTP && !opts.mailer) {
        const fake = await startFakeSmtp(config.SMTP_PORT, config.SMTP_HOST);
        smtpPort = fake.port;
        received = fake.received;
        stoppers.push(() => fake.close());
      }
      if (config.WORKERS) {
        let busy = false;
        const tick = async () => {
          if (busy) return;
          busy = true;
          try {
            await foldSummary(pool);
            await deps.services.due.runDigest();
            await deps.services.outbox.runOnce();
          } catch (e) {
            console.error('[hoodline] outbox worker:', e instanceof Error ? e.message : e);
          } finally {
            busy = false;
          }
        };
        const timer = setInterval(() => void tick(), config.OUTBOX_POLL_MS);
        timer.unref();
        stoppers.push(() => clearInterval(timer));
      }
    },
    async close() {
      for (const stop of stoppers.reverse()) await stop();
      store.close();
    },
  };
}
