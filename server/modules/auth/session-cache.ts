import type { SessionData, Store } from 'express-session';

/**
 * Every API request reads its session; a tablet's burst of requests (a screen loads four or five at once)
 * then costs one query instead of five. Wraps the store in place: what this process writes or destroys
 * (sign-in, sign-out) is seen at once; a sign-out handled by another process reaches this one within
 * `ttlMs`, as a change of role does through the person cache. Entries are kept as JSON so no request
 * shares an object with another, and an entry past its cookie's expiry is never served.
 */
export function cacheSessions(store: Store, ttlMs: number) {
  const entries = new Map<string, { json: string | null; until: number }>();
  const remember = (sid: string, sess: SessionData | null | undefined) => {
    if (ttlMs <= 0) return;
    if (entries.size > 10_000) entries.clear();
    entries.set(sid, { json: sess ? JSON.stringify(sess) : null, until: Date.now() + ttlMs });
  };
  const get = store.get.bind(store);
  const set = store.set.bind(store);
  const destroy = store.destroy.bind(store);
  store.get = (sid, cb) => {
    const hit = entries.get(sid);
    if (hit && hit.until > Date.now()) {
      const sess = hit.json === null ? null : (JSON.parse(hit.json) as SessionData);
      const expires = sess?.cookie?.expires;
      if (!expires || new Date(expires).getTime() > Date.now()) return cb(null, sess);
    }
    entries.delete(sid);
    get(sid, (err, sess) => {
      if (!err) remember(sid, sess);
      cb(err, sess);
    });
  };
  store.set = (sid, sess, cb) => {
    entries.delete(sid);
    set(sid, sess, (err?: unknown) => {
      if (!err) remember(sid, sess);
      cb?.(err);
    });
  };
  store.destroy = (sid, cb) => {
    entries.delete(sid);
    destroy(sid, (err?: unknown) => {
      entries.delete(sid);
      cb?.(err);
    });
  };
  return {
    /** A person's sessions, after their stored ones were deleted (sign-out everywhere, deactivation). */
    forgetPerson(personId: string) {
      for (const [sid, e] of entries) if (e.json?.includes(personId)) entries.delete(sid);
    },
  };
}
