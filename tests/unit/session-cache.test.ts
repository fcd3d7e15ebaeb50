import { MemoryStore, type SessionData } from 'express-session';
import { describe, expect, it } from 'vitest';
import { cacheSessions } from '../../server/modules/auth/session-cache';

/** A store that counts its reads, standing in for the PostgreSQL one. */
function countingStore() {
  const store = new MemoryStore();
  const read = store.get.bind(store);
  const counts = { reads: 0 };
  store.get = (sid, cb) => {
    counts.reads++;
    read(sid, cb);
  };
  return { store, counts };
}
const sessionFor = (personId: string, expiresInMs = 3_600_000) =>
  ({ personId, issuedAt: Date.now(), cookie: { originalMaxAge: expiresInMs, expires: new Date(Date.now() + expiresInMs), httpOnly: true, path: '/' } }) as unknown as SessionData;
const get = (store: MemoryStore, sid: string) => new Promise<SessionData | null | undefined>((ok, fail) => store.get(sid, (e, s) => (e ? fail(e) : ok(s))));
const set = (store: MemoryStore, sid: string, s: SessionData) => new Promise<void>((ok, fail) => store.set(sid, s, (e) => (e ? fail(e) : ok())));
const destroy = (store: MemoryStore, sid: string) => new Promise<void>((ok, fail) => store.destroy(sid, (e) => (e ? fail(e) : ok())));

describe('the session cache', () => {
  it('reads a session once for a burst of requests, and gives each request its own copy', async () => {
    const { store, counts } = countingStore();
    cacheSessions(store, 60_000);
    await set(store, 'a', sessionFor('p1'));
    const [x, y] = [await get(store, 'a'), await get(store, 'a')];
    expect(counts.reads).toBe(0); // the write filled it
    expect(x).toEqual(y);
    expect(x).not.toBe(y);
    (x as any).personId = 'changed';
    expect((await get(store, 'a'))?.personId).toBe('p1');
  });

  it('forgets a session this process destroys (sign-out) at once', async () => {
    const { store } = countingStore();
    cacheSessions(store, 60_000);
    await set(store, 'a', sessionFor('p1'));
    await get(store, 'a');
    await destroy(store, 'a');
    expect(await get(store, 'a')).toBeFalsy();
  });

  it("forgets a person's sessions whose stored rows were deleted elsewhere in this process (sign-out everywhere)", async () => {
    const { store, counts } = countingStore();
    const cache = cacheSessions(store, 60_000);
    await set(store, 'a', sessionFor('p1'));
    await set(store, 'b', sessionFor('p2'));
    cache.forgetPerson('p1');
    await get(store, 'a');
    await get(store, 'b');
    expect(counts.reads).toBe(1); // only p1's was read again
  });

  it('re-reads after the time to live, and never serves a session past its cookie expiry', async () => {
    const { store, counts } = countingStore();
    cacheSessions(store, 30);
    await set(store, 'a', sessionFor('p1'));
    await new Promise((r) => setTimeout(r, 50));
    await get(store, 'a');
    expect(counts.reads).toBe(1);
    const { store: s2 } = countingStore();
    cacheSessions(s2, 60_000);
    await set(s2, 'old', sessionFor('p1', 20));
    await new Promise((r) => setTimeout(r, 40));
    expect(await get(s2, 'old')).toBeFalsy(); // the memory store drops it too once expired
  });

  it('is off with a time to live of 0', async () => {
    const { store, counts } = countingStore();
    cacheSessions(store, 0);
    await set(store, 'a', sessionFor('p1'));
    await get(store, 'a');
    await get(store, 'a');
    expect(counts.reads).toBe(2);
  });
});
