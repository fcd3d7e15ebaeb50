import { describe, expect, it } from 'vitest';
import { OfflineQueue, createMemoryStore, isPermanent, noteText, retryDelay, type QueueSender, type QueuedFinding } from '../../src/features/walkaround/offline/queue';

// The queue's contract is the server's idempotency rule (one finding per key, replayed on retry) and
// HTTP status semantics (RFC 9110: 4xx = the request itself is refused, 5xx/no answer = try again).

function entry(n: number, photos = 0): Omit<QueuedFinding, 'queuedAt' | 'photosSent' | 'key'> {
  return {
    inspectionId: 'insp-1',
    body: { partId: `part-${n}`, view: 'plan', x: n, y: 0, defectType: 'leak', idempotencyKey: `key-${n}` },
    preview: { partId: `part-${n}`, instanceId: `inst-${n}`, partKind: 'k', view: 'plan', body: { x: n, y: 0, z: 0 }, label: `Part ${n}`, partLabel: `Part ${n}`, defectLabel: 'Leak', weight: 'shop', rule: null },
    photos: Array.from({ length: photos }, (_, i) => ({ blob: new Blob([new Uint8Array([n, i])], { type: 'image/png' }), name: `p${n}-${i}.png` })),
  };
}

/** A fake server that keeps findings by idempotency key, as POST /api/inspections/:id/findings does. */
function fakeServer() {
  const byKey = new Map<string, string>();
  const log: string[] = [];
  const state = { online: true, signed: new Set<string>(), failNextPost: 0 as number };
  const sender: QueueSender = {
    async postFinding(inspectionId, body) {
      log.push(`post ${body.idempotencyKey}`);
      if (!state.online) throw { status: 0, code: 'offline', message: 'No connection' };
      if (state.failNextPost > 0) {
        state.failNextPost--;
        throw { status: 503, code: 'http_503', message: 'busy' };
      }
      if (state.signed.has(inspectionId)) throw { status: 409, code: 'conflict', message: 'This record was signed meanwhile; start a new inspection' };
      const id = byKey.get(body.idempotencyKey) ?? `f-${byKey.size + 1}`;
      byKey.set(body.idempotencyKey, id);
      return { id };
    },
    async uploadPhoto(findingId, p) {
      log.push(`photo ${findingId} ${p.name}`);
      if (!state.online) throw { status: 0, code: 'offline', message: 'No connection' };
      return { id: `ph-${p.name}` };
    },
  };
  return { byKey, log, state, sender };
}

describe('offline finding queue', () => {
  it('sends waiting findings in the order pinned, each once', async () => {
    const q = new OfflineQueue(createMemoryStore());
    const s = fakeServer();
    for (const n of [1, 2, 3]) await q.enqueue(entry(n));
    const r = await q.flush(s.sender);
    expect(r).toEqual({ outcome: 'done', sent: ['key-1', 'key-2', 'key-3'], failed: [] });
    expect(s.log).toEqual(['post key-1', 'post key-2', 'post key-3']);
    expect(q.snapshot().pending).toEqual([]);
    expect(s.byKey.size).toBe(3);
  });

  it('a double tap (the same key twice) is one entry', async () => {
    const q = new OfflineQueue(createMemoryStore());
    await q.enqueue(entry(1));
    await q.enqueue(entry(1));
    expect(q.snapshot().pending.map((p) => p.key)).toEqual(['key-1']);
  });

  it('stops at the first finding that cannot go yet, so none overtakes it, and retries with the same key', async () => {
    const q = new OfflineQueue(createMemoryStore());
    const s = fakeServer();
    for (const n of [1, 2]) await q.enqueue(entry(n));
    s.state.online = false;
    expect((await q.flush(s.sender)).outcome).toBe('offline');
    s.state.online = true;
    s.state.failNextPost = 1;
    expect((await q.flush(s.sender)).outcome).toBe('retry');
    expect(q.snapshot().pending.map((p) => p.key)).toEqual(['key-1', 'key-2']);
    expect((await q.flush(s.sender)).outcome).toBe('done');
    // Three tries of the first, all with its own key; the second only once the first was in.
    expect(s.log).toEqual(['post key-1', 'post key-1', 'post key-1', 'post key-2']);
    expect([...s.byKey.keys()]).toEqual(['key-1', 'key-2']);
  });

  it('a retry after the answer was lost makes no second finding (the server replays by key)', async () => {
    const q = new OfflineQueue(createMemoryStore());
    const s = fakeServer();
    await q.enqueue(entry(1, 1));
    // The finding gets in, then the connection drops before the photo.
    const orig = s.sender.uploadPhoto;
    s.sender.uploadPhoto = async () => {
      throw { status: 0, code: 'offline', message: 'No connection' };
    };
    expect((await q.flush(s.sender)).outcome).toBe('offline');
    expect(q.snapshot().pending[0].findingId).toBe('f-1');
    s.sender.uploadPhoto = orig;
    expect((await q.flush(s.sender)).outcome).toBe('done');
    expect(s.byKey.size).toBe(1);
    // Not posted again: the stored id was kept and the photo went to it.
    expect(s.log.filter((l) => l.startsWith('post'))).toEqual(['post key-1']);
    expect(s.log).toContain('photo f-1 p1-0.png');
  });

  it('uploads photos only after their finding was accepted, to that finding', async () => {
    const q = new OfflineQueue(createMemoryStore());
    const s = fakeServer();
    await q.enqueue(entry(1, 2));
    await q.enqueue(entry(2, 1));
    await q.flush(s.sender);
    expect(s.log).toEqual(['post key-1', 'photo f-1 p1-0.png', 'photo f-1 p1-1.png', 'post key-2', 'photo f-2 p2-0.png']);
  });

  it('keeps a conflict (record signed meanwhile) with the server message, goes on with the rest, and dismisses only on request', async () => {
    const q = new OfflineQueue(createMemoryStore());
    const s = fakeServer();
    await q.enqueue(entry(1));
    await q.enqueue({ ...entry(2), inspectionId: 'insp-signed' });
    await q.enqueue(entry(3));
    s.state.signed.add('insp-signed');
    const r = await q.flush(s.sender);
    expect(r).toEqual({ outcome: 'done', sent: ['key-1', 'key-3'], failed: ['key-2'] });
    const failed = q.snapshot().failed;
    expect(failed).toHaveLength(1);
    expect(failed[0]).toMatchObject({ status: 409, code: 'conflict', message: 'This record was signed meanwhile; start a new inspection' });
    expect(noteText(failed[0])).toContain('Part 2: Leak');
    // Another flush does not drop it.
    await q.flush(s.sender);
    expect(q.snapshot().failed).toHaveLength(1);
    await q.dismiss('key-2');
    expect(q.snapshot().failed).toEqual([]);
  });

  it('survives a reload: a new queue on the same store sees the waiting findings and their photos', async () => {
    const store = createMemoryStore();
    const a = new OfflineQueue(store);
    await a.enqueue(entry(1, 1));
    const b = new OfflineQueue(store);
    await b.load();
    expect(b.snapshot().pending.map((p) => p.key)).toEqual(['key-1']);
    expect(b.snapshot().pending[0].photos[0].blob.size).toBe(2);
  });

  it('tells refusals from errors worth retrying (RFC 9110 status classes)', () => {
    expect(isPermanent({ status: 409, code: 'conflict', message: '' })).toBe(true);
    expect(isPermanent({ status: 400, code: 'validation', message: '' })).toBe(true);
    expect(isPermanent({ status: 0, code: 'offline', message: '' })).toBe(false);
    expect(isPermanent({ status: 429, code: 'rate_limited', message: '' })).toBe(false);
    expect(isPermanent({ status: 503, code: 'x', message: '' })).toBe(false);
    expect(isPermanent({ status: 401, code: 'x', message: '' })).toBe(false);
  });

  it('backs off 2 s, 4 s, 8 s … capped at a minute', () => {
    expect([0, 1, 2, 3, 10].map(retryDelay)).toEqual([2000, 4000, 8000, 16000, 60000]);
  });
});
