import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { OfflineQueue, createMemoryStore, type NewFinding, type QueueSender } from '../../src/features/walkaround/offline/queue';
import { SendScheduler } from '../../src/features/walkaround/offline/scheduler';

// When the queue is sent. Sources: the HTTP status classes (RFC 9110: no answer or 5xx = try again
// later) and the browser's online event (HTML Living Standard, "navigator.onLine"), which says the
// connection is back, so nothing should wait out a backoff meant for a failing server.

function entry(n: number): NewFinding {
  return {
    inspectionId: 'insp-1',
    body: { partId: `part-${n}`, view: 'plan', x: n, y: 0, defectType: 'leak', idempotencyKey: `key-${n}` },
    preview: { partId: `part-${n}`, instanceId: `inst-${n}`, partKind: 'k', view: 'plan', body: { x: n, y: 0, z: 0 }, label: `Part ${n}`, partLabel: `Part ${n}`, defectLabel: 'Leak', weight: 'shop', rule: null },
    photos: [],
  };
}

type Mode = 'ok' | 'offline' | '503' | '401';

/** A server whose answers the test sets; it counts the requests in flight at once. */
function server() {
  const s = { mode: 'ok' as Mode, log: [] as string[], inFlight: 0, maxInFlight: 0, hold: null as null | Promise<void> };
  const answer = async (what: string) => {
    s.log.push(what);
    // The answer is decided when the request goes out (a request sent without a connection fails).
    const mode = s.mode;
    s.inFlight++;
    s.maxInFlight = Math.max(s.maxInFlight, s.inFlight);
    try {
      if (s.hold) await s.hold;
      if (mode === 'offline') throw { status: 0, code: 'offline', message: 'No connection' };
      if (mode === '503') throw { status: 503, code: 'http_503', message: 'busy' };
      if (mode === '401') throw { status: 401, code: 'unauthenticated', message: 'Sign in first' };
    } finally {
      s.inFlight--;
    }
  };
  const sender: QueueSender = {
    postFinding: async (_i, body) => (await answer(`post ${body.idempotencyKey}`), { id: body.idempotencyKey }),
    uploadPhoto: async () => ({}),
    postCoverage: async (_i, _b, key) => answer(`coverage ${key}`),
  };
  return { s, sender };
}

/** Lets the queue's chained promises settle (no timers involved). */
const settle = async () => {
  for (let i = 0; i < 50; i++) await Promise.resolve();
};

beforeEach(() => {
  vi.useFakeTimers();
});
afterEach(() => {
  vi.useRealTimers();
});

describe('send scheduler', () => {
  it('stops trying when the session has ended (401), keeps everything, and sends it all once signed in again', async () => {
    const q = new OfflineQueue(createMemoryStore());
    const { s, sender } = server();
    const results: string[] = [];
    const sch = new SendScheduler(q, sender, { onFlushed: (r) => results.push(r.outcome) });
    await q.enqueue(entry(1));
    await q.enqueue(entry(2));
    s.mode = '401';
    await sch.sendNow();
    // 401 is neither a refusal of the finding (it is not dropped to "could not be sent") nor worth a timer.
    expect(results).toEqual(['signed_out']);
    expect(q.snapshot().pending.map((p) => p.key)).toEqual(['key-1', 'key-2']);
    expect(q.snapshot().failed).toEqual([]);
    expect(sch.nextDelay).toBeNull();
    await vi.advanceTimersByTimeAsync(120_000);
    expect(s.log).toEqual(['post key-1']);
    // Signed in again: the app starts the queue, which sends both in order.
    s.mode = 'ok';
    await sch.sendNow();
    expect(results.at(-1)).toBe('done');
    expect(s.log).toEqual(['post key-1', 'post key-1', 'post key-2']);
    expect(q.snapshot().pending).toEqual([]);
  });

  it('backs off 2 s, 4 s, 8 s while the server fails, and sends at once when the connection returns, the backoff started again', async () => {
    const q = new OfflineQueue(createMemoryStore());
    const { s, sender } = server();
    const sch = new SendScheduler(q, sender);
    await q.enqueue(entry(1));
    s.mode = '503';
    await sch.sendNow();
    expect(sch.nextDelay).toBe(2000);
    await vi.advanceTimersByTimeAsync(2000);
    expect(sch.nextDelay).toBe(4000);
    await vi.advanceTimersByTimeAsync(4000);
    expect(sch.nextDelay).toBe(8000);
    expect(s.log).toEqual(['post key-1', 'post key-1', 'post key-1']);

    // The connection returns (the online event): sent now, not 8 s later; the server still fails,
    // and the next try is 2 s away again, not 16 s.
    await sch.sendNow();
    expect(s.log).toHaveLength(4);
    expect(sch.nextDelay).toBe(2000);
    s.mode = 'ok';
    await sch.sendNow();
    expect(s.log).toHaveLength(5);
    expect(q.snapshot().pending).toEqual([]);
    expect(sch.nextDelay).toBeNull();

    // The next failure starts the backoff from its first step again.
    await q.enqueue(entry(2));
    s.mode = '503';
    await sch.kick();
    expect(sch.nextDelay).toBe(2000);
    sch.stop();
  });

  it('never runs two sends at once: requests during a send run once, after it, and nothing is posted twice', async () => {
    const q = new OfflineQueue(createMemoryStore());
    const { s, sender } = server();
    const sch = new SendScheduler(q, sender);
    for (const n of [1, 2, 3]) await q.enqueue(entry(n));
    let release!: () => void;
    s.hold = new Promise<void>((r) => (release = r));
    // App start, the online event and the page shown again, all at once.
    const runs = [sch.sendNow(), sch.sendNow(), sch.kick(), sch.sendNow()];
    await settle();
    expect(s.inFlight).toBe(1);
    // Queued while the send runs: taken by the same send, in order.
    await q.enqueue(entry(4));
    s.hold = null;
    release();
    await Promise.all(runs);
    expect(s.maxInFlight).toBe(1);
    expect(s.log).toEqual(['post key-1', 'post key-2', 'post key-3', 'post key-4']);
    expect(q.snapshot().pending).toEqual([]);
  });

  it('a send asked for while one is ending with "no connection" runs again right after it (the online event is not lost)', async () => {
    const q = new OfflineQueue(createMemoryStore());
    const { s, sender } = server();
    const sch = new SendScheduler(q, sender);
    await q.enqueue(entry(1));
    s.mode = 'offline';
    let release!: () => void;
    s.hold = new Promise<void>((r) => (release = r));
    const first = sch.sendNow();
    await settle();
    // The connection returns while the failing request is still out.
    s.mode = 'ok';
    const second = sch.sendNow();
    s.hold = null;
    release();
    await Promise.all([first, second]);
    // Not left to a backoff timer: the retry already went, and nothing waits.
    expect(s.log).toEqual(['post key-1', 'post key-1']);
    expect(q.snapshot().pending).toEqual([]);
    expect(sch.nextDelay).toBeNull();
  });

  it('a new entry during a backoff wait waits with it (a failing server is not hammered), and goes when the wait ends', async () => {
    const q = new OfflineQueue(createMemoryStore());
    const { s, sender } = server();
    const sch = new SendScheduler(q, sender);
    await q.enqueue(entry(1));
    s.mode = '503';
    await sch.sendNow();
    await q.enqueue(entry(2));
    await sch.kick();
    expect(s.log).toEqual(['post key-1']);
    s.mode = 'ok';
    await vi.advanceTimersByTimeAsync(2000);
    expect(s.log).toEqual(['post key-1', 'post key-1', 'post key-2']);
    expect(q.snapshot().pending).toEqual([]);
  });

  it('an entry queued as a send reports its result is still sent, by the same single flight', async () => {
    const q = new OfflineQueue(createMemoryStore());
    const { s, sender } = server();
    let once = true;
    const sch: SendScheduler = new SendScheduler(q, sender, {
      onFlushed: () => {
        // The finding form queues a finding just as the send that found nothing ends.
        if (once) void q.enqueue(entry(1)).then(() => sch.kick());
        once = false;
      },
    });
    await sch.sendNow();
    await settle();
    await vi.waitFor(() => expect(s.log).toEqual(['post key-1']));
    expect(q.snapshot().pending).toEqual([]);
    expect(s.maxInFlight).toBe(1);
  });
});
