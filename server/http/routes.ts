import type { NextFunction, Request, RequestHandler, Response, Router } from 'express';
import type { z, ZodType } from 'zod';
import type { Role } from '../../shared/domain/roles';
import { AppError, zodFields } from './errors';

/** Who may call a route: anyone, any signed-in person, or the listed roles. Declared beside each route. */
export type Access = 'public' | 'signed_in' | readonly Role[];

export interface Person {
  id: string;
  email: string;
  name: string;
  role: Role;
  yardId: string | null;
}

export interface RouteContext<B, Q, P> {
  req: Request;
  res: Response;
  body: B;
  query: Q;
  params: P;
  /** Null only on public routes. */
  person: Person;
  ip: string;
}

export type RouteResult = { status?: number; body?: unknown } | void;

type Infer<S> = S extends ZodType ? z.infer<S> : undefined;

export interface RouteDef<BS extends ZodType | undefined = any, QS extends ZodType | undefined = any, PS extends ZodType | undefined = any> {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: string;
  access: Access;
  summary: string;
  body?: BS;
  query?: QS;
  params?: PS;
  /** The route takes multipart/form-data instead of JSON. */
  multipart?: RequestHandler;
  /** The route keeps its own idempotency inside its transaction; skip the generic Idempotency-Key layer. */
  selfIdempotent?: boolean;
  /** Extra middleware run after the access check, before the body is read (e.g. a rate limiter). */
  before?: RequestHandler[];
  handler: (ctx: RouteContext<Infer<BS>, Infer<QS>, Infer<PS>>) => Promise<RouteResult> | RouteResult;
}

/** Typed constructor so handlers see the parsed body, query and params. */
export function route<BS extends ZodType | undefined = undefined, QS extends ZodType | undefined = undefined, PS extends ZodType | undefined = undefined>(
  def: RouteDef<BS, QS, PS>,
): RouteDef<BS, QS, PS> {
  return def;
}

const STATE_CHANGING = new Set(['post', 'put', 'patch', 'delete']);

export function isAllowed(access: Access, person: Person | null): 'ok' | 'unauthenticated' | 'forbidden' {
  if (access === 'public') return 'ok';
  if (!person) return 'unauthenticated';
  if (access === 'signed_in') return 'ok';
  return access.includes(person.role) ? 'ok' : 'forbidden';
}

/**
 * A cross-site page must not act for a signed-in person: browsers send Sec-Fetch-Site and Origin on
 * state-changing requests, and we accept only our own origin. Requests with neither (curl, other
 * railroad tools using the API) carry no ambient browser credentials from another site.
 */
export function checkSameOrigin(req: Request): boolean {
  const site = req.get('sec-fetch-site');
  if (site && site !== 'same-origin' && site !== 'none') return false;
  const origin = req.get('origin');
  if (origin) {
    try {
      const host = req.get('x-forwarded-host') && req.app.get('trust proxy') ? req.get('x-forwarded-host') : req.get('host');
      return new URL(origin).host === host;
    } catch {
      return false;
    }
  }
  return true;
}

function parsePart<S extends ZodType | undefined>(schema: S, value: unknown, where: string): Infer<S> {
  if (!schema) return undefined as Infer<S>;
  const r = schema.safeParse(value);
  if (!r.success) throw new AppError('validation', `The ${where} is not valid`, zodFields(r.error));
  return r.data as Infer<S>;
}

export interface MountOptions {
  /** Runs on every state-changing route after the access check (rate limit per person). */
  writeLimiter?: RequestHandler;
  /** The Idempotency-Key layer for state-changing routes. */
  idempotency?: RequestHandler;
}

/** Mounts route definitions with the one access mechanism, origin check, content-type check and validation. */
export function mountRoutes(router: Router, defs: readonly RouteDef[], opts: MountOptions = {}): void {
  for (const def of defs) {
    const chain: RequestHandler[] = [];
    const changing = STATE_CHANGING.has(def.method);
    if (changing) {
      chain.push((req, _res, next) => (checkSameOrigin(req) ? next() : next(new AppError('forbidden', 'Requests from another site are refused'))));
    }
    // Who may call comes before what they sent: a stranger learns nothing from a 415 or a 400.
    chain.push((req, _res, next) => {
      const verdict = isAllowed(def.access, req.person ?? null);
      if (verdict === 'unauthenticated') return next(new AppError('unauthenticated', 'Sign in first'));
      if (verdict === 'forbidden') return next(new AppError('forbidden', 'Your role cannot do this'));
      next();
    });
    if (changing) {
      chain.push((req, _res, next) => {
        const len = Number(req.get('content-length') ?? 0);
        const hasBody = len > 0 || req.get('transfer-encoding') !== undefined;
        const ok = def.multipart ? req.is('multipart/form-data') : req.is('application/json');
        if (hasBody && !ok) {
          return next(new AppError('unsupported_media_type', def.multipart ? 'Send the file as multipart/form-data' : 'Send the body as application/json'));
        }
        next();
      });
      if (opts.writeLimiter) chain.push(opts.writeLimiter);
      if (opts.idempotency && !def.selfIdempotent) chain.push(opts.idempotency);
    }
    chain.push(...(def.before ?? []));
    if (def.multipart) chain.push(def.multipart);
    chain.push(async (req: Request, res: Response, next: NextFunction) => {
      try {
        const params = parsePart(def.params, req.params, 'address');
        const query = parsePart(def.query, req.query, 'query');
        const body = parsePart(def.body, def.body ? (req.body ?? {}) : undefined, 'request body');
        const result = await def.handler({ req, res, body, query, params, person: req.person as Person, ip: req.ip ?? '' });
        if (res.headersSent) return;
        if (!result) return void res.status(204).end();
        res.status(result.status ?? 200).json(result.body ?? {});
      } catch (err) {
        next(err);
      }
    });
    router[def.method](def.path, ...chain);
  }
}

declare module 'express-serve-static-core' {
  interface Request {
    person?: Person | null;
  }
}
