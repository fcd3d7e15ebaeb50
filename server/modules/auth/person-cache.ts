import type { Db } from '../../db/client';
import { authRepository } from './repository';

type PersonRow = NonNullable<Awaited<ReturnType<ReturnType<typeof authRepository>['byId']>>>;

/**
 * Who is signed in is looked up on every API request; a tablet's burst of requests (a screen loads four or
 * five at once) then costs one query. Changes made through this process forget the row at once; another
 * process sees a change of role or yard within `ttlMs`. Signing out and deactivation do not depend on it:
 * both delete the stored sessions, which are read fresh on every request.
 */
export function personCache(db: Db, ttlMs = 2000) {
  const repo = authRepository(db);
  const rows = new Map<string, { row: PersonRow | null; until: number }>();
  const listeners: ((id: string) => void)[] = [];
  return {
    async get(id: string): Promise<PersonRow | null> {
      const now = Date.now();
      const hit = rows.get(id);
      if (hit && hit.until > now) return hit.row;
      const row = await repo.byId(id);
      if (rows.size > 10_000) rows.clear();
      rows.set(id, { row, until: now + ttlMs });
      return row;
    },
    forget(id: string) {
      rows.delete(id);
      for (const fn of listeners) fn(id);
    },
    /** Also forget something else kept per person (the session cache) whenever a person is forgotten. */
    onForget(fn: (id: string) => void) {
      listeners.push(fn);
    },
  };
}
export type PersonCache = ReturnType<typeof personCache>;
