import { sql } from 'drizzle-orm';
import type { RequestHandler } from 'express';
import { IdempotencyKey } from '../../shared/api/walkaround';
import type { Db } from '../db/client';
import { AppError } from './errors';

/** A claim older than this belongs to a request that died (crash, kill); a retry may take it over. */
const ABANDONED_AFTER_S = 30;

/**
 * Idempotency-Key for any state-changing route: the first request with a key runs, its answer is kept,
 * and a retry with the same key gets the same answer without running again. A key is claimed before
 * the handler runs, so two copies racing never both run.
 */
export function idempotency(db: Db): RequestHandler {
  return async (req, res, next) => {
    const raw = req.get('idempotency-key');
    if (raw === undefined || !req.person) return next();
    const parsed = IdempotencyKey.safeParse(raw);
    if (!parsed.success) return next(new AppError('validation', 'The Idempotency-Key header is not valid', { 'Idempotency-Key': parsed.error.issues[0].message }));
    const key = parsed.data;
    const personId = req.person.id;
    const path = req.originalUrl.split('?')[0];
    try {
      const claimed = await db.execute(sql`
        insert into idempotency_keys (person_id, key, method, path, status) values (${personId}, ${key}, ${req.method}, ${path}, 0)
        on conflict (person_id, key) do update set created_at = now(), status = 0, response = null, method = excluded.method, path = excluded.path
          where idempotency_keys.status = 0 and idempotency_keys.created_at < now() - make_interval(secs => ${ABANDONED_AFTER_S})
        returning key`);
      if (!claimed.rows.length) {
        const prior = await db.execute<{ method: string; path: string; status: number; response: unknown }>(
          sql`select method, path, status, response from idempotency_keys where person_id = ${personId} and key = ${key}`,
        );
        const p = prior.rows[0];
        if (!p) return next(new AppError('in_progress', 'Retry the request'));
        if (p.method !== req.method || p.path !== path) {
          return next(new AppError('conflict', 'This Idempotency-Key was already used for another request'));
        }
        if (p.status === 0) return next(new AppError('in_progress', 'The same request is still being processed; retry in a moment'));
        res.setHeader('Idempotent-Replayed', 'true');
        if (p.status === 204) return void res.status(204).end();
        return void res.status(p.status).json(p.response);
      }
      // Keep answers that are final; release the key after a server error, a rate limit or a stale
      // version, so that a retry runs again. The answer is stored before it is sent, so a client that
      // retries at once already finds it.
      const keep = (st: number, b: unknown) => !(st >= 500 || st === 429 || (st === 409 && (b as { error?: { code?: string } })?.error?.code === 'stale'));
      const store = (st: number, b: unknown) =>
        db.execute(
          keep(st, b)
            ? sql`update idempotency_keys set status = ${st}, response = ${JSON.stringify(b ?? null)}::jsonb where person_id = ${personId} and key = ${key}`
            : sql`delete from idempotency_keys where person_id = ${personId} and key = ${key}`,
        );
      const json = res.json.bind(res);
      res.json = ((b: unknown) => {
        void store(res.statusCode, b).catch(() => undefined).finally(() => json(b));
        return res;
      }) as typeof res.json;
      res.on('finish', () => {
        if (res.statusCode === 204) void store(204, null).catch(() => undefined);
      });
      next();
    } catch (e) {
      next(e);
    }
  };
}
