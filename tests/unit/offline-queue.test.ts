import { describe, expect, it } from 'vitest';
import {
  OfflineQueue,
  createMemoryStore,
  isFinding,
  isPermanent,
  markText,
  noteText,
  retryDelay,
  type NewFinding,
  type NewMark,
  type QueueSender,
  type QueuedFinding,
} from '../../src/features/walkaround/offline/queue';

// The queue's contract is the server's idempotency rule (one finding per key, replayed on retry) and
// HTTP status semantics (RFC 9110: 4xx = the request itself is refused, 5xx/no answer = try again).

function entry(n: number, photos = 0): NewFinding {
  return {
    inspectionId: 'insp-1',
    body: { partId: `part-${n}`, view: 'plan', x: n, y: 0, defectType: 'leak', idempotencyKey: `key-${n}` },
    preview: { partId: `part-${n}`, instanceId: `inst-${n}`, partKind: 'k', view: 'plan', body: { x: n, y: 0, z: 0 }, label: `Part ${n}`, partLabel: `Part ${n}`, defectLabel: 'Leak', weight: 'shop', rule: null },
    photos: Array.from({ length: photos }, (_, i) => ({ blob: new Blob([new Uint8Array([n, i])], { type: 'image/png' }), name: `p${n}-${i}.png` })),
  };
}

function mark(key: string, state: 'passed' | 'not_applicable' | 'gap', ids: string[], reason?: string, inspectionId = 'insp-1'): NewMark {
  return { key, inspectionId, body: { instanceIds: ids, state, ...(reason ? { reason } : {}) }, preview: { parts: ids.map((i) => `Part ${i.slice(5)}`), area: ids.length > 1 ? 'Front end' : null } };
}

/**
 * A fake server that keeps findings by idempotency key, as POST /api/inspections/:id/findings does,
 * and coverage marks as POST /api/inspections/:id/coverage does behind the generic Idempotency-Key
 * layer (a key seen before is answered again, not run again; a part with a finding stays a finding).
 */
function fakeServer() {
  const byKey = new Map<string, string>();
  const log: string[] = [];
  const state = { online: true, signed: new Set<string>(), failNextPost: 0 as number, refuseCoverage: null as null | { status: number; code: string; message: string } };
  const items = new Map<string, { state: string; reason: string | null }>();
  const findingParts = new Set<string>();
  const coverageKeys = new Set<string>();
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
      const inst = body.partId.replace('part-', 'inst-');
      findingParts.add(inst);
      items.set(inst, { state: 'finding', reason: null });
      return { id };
    },
    async postCoverage(inspectionId, body, key) {
      log.push(`coverage ${key}`);
      if (!state.online) throw { status: 0, code: 'offline', message: 'No connection' };
      if (state.failNextPost > 0) {
        state.failNextPost--;
        throw { status: 503, code: 'http_503', message: 'busy' };
      }
      if (state.refuseCoverage) throw state.refuseCoverage;
      if (state.signed.has(inspectionId)) throw { status: 409, code: 'conflict', message: 'This record is signed and can no longer change; add a correction instead' };
      if (!coverageKeys.has(key)) {
        coverageKeys.add(key);
        for (const i of body.instanceIds) if (!findingParts.has(i)) items.set(i, { state: body.state, reason: body.reason ?? null });
      }
      return { items: [...items] };
    },
    async uploadPhoto(findingId, p) {
      log.push(`photo ${findingId} ${p.name}`);
      if (!state.online) throw { status: 0, code: 'offline', message: 'No connection' };
      return { id: `ph-${p.name}` };
    },
  };
  return { byKey, log, state, sender, items };
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
    const head = q.snapshot().pending[0];
    expect(isFinding(head) && head.findingId).toBe('f-1');
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
    const head = b.snapshot().pending[0] as QueuedFinding;
    expect(head.photos[0].blob.size).toBe(2);
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

describe('coverage marks in the same queue', () => {
  it('sends findings and marks in the one order they were made, each with its own key', async () => {
    const q = new OfflineQueue(createMemoryStore());
    const s = fakeServer();
    await q.enqueue(entry(1));
    await q.enqueueMark(mark('m-1', 'not_applicable', ['inst-2'], 'No plow on this end'));
    await q.enqueue(entry(3));
    await q.enqueueMark(mark('m-2', 'passed', ['inst-1', 'inst-4', 'inst-5']));
    expect(q.snapshot().pending.map((p) => `${p.kind}:${p.key}`)).toEqual(['finding:key-1', 'coverage:m-1', 'finding:key-3', 'coverage:m-2']);
    const r = await q.flush(s.sender);
    expect(r).toEqual({ outcome: 'done', sent: ['key-1', 'm-1', 'key-3', 'm-2'], failed: [] });
    expect(s.log).toEqual(['post key-1', 'coverage m-1', 'post key-3', 'coverage m-2']);
    // As the server counts it: the part with a finding stays a finding although the area was passed after it.
    expect(Object.fromEntries(s.items)).toEqual({
      'inst-1': { state: 'finding', reason: null },
      'inst-2': { state: 'not_applicable', reason: 'No plow on this end' },
      'inst-3': { state: 'finding', reason: null },
      'inst-4': { state: 'passed', reason: null },
      'inst-5': { state: 'passed', reason: null },
    });
  });

  it('an undo made offline is sent after the mark it undoes, never before (last one wins on the server)', async () => {
    const q = new OfflineQueue(createMemoryStore());
    const s = fakeServer();
    await q.enqueueMark(mark('m-1', 'passed', ['inst-7']));
    await q.enqueueMark(mark('m-2', 'gap', ['inst-7']));
    s.state.online = false;
    expect((await q.flush(s.sender)).outcome).toBe('offline');
    s.state.online = true;
    s.state.failNextPost = 1;
    expect((await q.flush(s.sender)).outcome).toBe('retry');
    expect((await q.flush(s.sender)).outcome).toBe('done');
    // Every try of the first mark carried its own key; the undo only once the mark was in.
    expect(s.log).toEqual(['coverage m-1', 'coverage m-1', 'coverage m-1', 'coverage m-2']);
    expect(s.items.get('inst-7')).toEqual({ state: 'gap', reason: null });
  });

  it('a mark refused because the record was signed meanwhile goes to the refused list in plain words; the rest go on', async () => {
    const q = new OfflineQueue(createMemoryStore());
    const s = fakeServer();
    await q.enqueueMark(mark('m-1', 'passed', ['inst-1', 'inst-2'], undefined, 'insp-signed'));
    await q.enqueue(entry(3));
    s.state.signed.add('insp-signed');
    const r = await q.flush(s.sender);
    expect(r).toEqual({ outcome: 'done', sent: ['key-3'], failed: ['m-1'] });
    const [f] = q.snapshot().failed;
    expect(f).toMatchObject({ status: 409, code: 'conflict' });
    expect(f.message).toBe('This mark is not on the record: This record is signed and can no longer change; add a correction instead');
    expect(noteText(f)).toMatch(/^Passed: Part 1, Part 2\nMarked .*; not sent: This mark is not on the record/);
  });

  it('any other 4xx refusal of a mark is kept too; a 5xx is retried with the same key', async () => {
    const q = new OfflineQueue(createMemoryStore());
    const s = fakeServer();
    await q.enqueueMark(mark('m-1', 'not_applicable', ['inst-9'], 'Not fitted'));
    s.state.refuseCoverage = { status: 503, code: 'http_503', message: 'busy' };
    expect((await q.flush(s.sender)).outcome).toBe('retry');
    expect(q.snapshot().pending).toHaveLength(1);
    s.state.refuseCoverage = { status: 400, code: 'validation', message: "Not in this inspection's routine: inst-9" };
    expect((await q.flush(s.sender)).failed).toEqual(['m-1']);
    expect(q.snapshot().failed[0].message).toBe("This mark is not on the record: Not in this inspection's routine: inst-9");
    expect(s.log).toEqual(['coverage m-1', 'coverage m-1']);
  });

  it('a finding refused because its reading is within the limit can be kept as a note: back in the queue, sent with its own key', async () => {
    const q = new OfflineQueue(createMemoryStore());
    const bodies: unknown[] = [];
    const sender: QueueSender = {
      async postFinding(_i, body) {
        bodies.push(body);
        if (!body.keepAsNote) throw { status: 409, code: 'check_passed', message: 'The reading is within the limit (3 in minimum, 6 in maximum above the top of rail, 49 CFR 229.123(a)). Keep it as a note, or drop it.' };
        return { id: 'f-1' };
      },
      uploadPhoto: async () => ({}),
      postCoverage: async () => ({}),
    };
    await q.enqueue(entry(1));
    await q.flush(sender);
    expect(q.snapshot().failed[0].code).toBe('check_passed');
    await q.requeue('key-1', (e) => (isFinding(e) ? { ...e, body: { ...e.body, keepAsNote: true } } : e));
    expect(q.snapshot().failed).toEqual([]);
    expect((await q.flush(sender)).sent).toEqual(['key-1']);
    expect(bodies).toEqual([expect.objectContaining({ idempotencyKey: 'key-1' }), expect.objectContaining({ idempotencyKey: 'key-1', keepAsNote: true })]);
  });

  it("the idempotency layer's 409 for a copy still running is retried, not refused", () => {
    expect(isPermanent({ status: 409, code: 'in_progress', message: 'The same request is still being processed; retry in a moment' })).toBe(false);
    expect(isPermanent({ status: 409, code: 'conflict', message: 'This record was signed meanwhile' })).toBe(true);
    expect(isPermanent({ status: 409, code: 'conflict', message: 'This Idempotency-Key was already used for another request' })).toBe(true);
  });

  it('reads a mark as the inspector made it', () => {
    expect(markText(mark('a', 'passed', ['inst-1']))).toBe('Passed: Part 1');
    expect(markText(mark('a', 'passed', ['inst-1', 'inst-2', 'inst-3', 'inst-4']))).toBe('Passed: 4 parts of Front end');
    expect(markText(mark('a', 'not_applicable', ['inst-2'], 'No plow on this end'))).toBe('Not applicable: Part 2 (No plow on this end)');
    expect(markText(mark('a', 'gap', ['inst-2']))).toBe('Back to do: Part 2');
    expect(markText(mark('a', 'gap', ['inst-2'], 'Track flooded'))).toBe('Left out: Part 2 (Track flooded)');
  });

  it('reads an entry kept by the findings-only queue as a finding', async () => {
    const old = entry(1) as NewFinding & { key: string; queuedAt: string; photosSent: number };
    const store = createMemoryStore({ pending: [{ ...old, key: 'key-1', queuedAt: '2026-03-02T14:00:00Z', photosSent: 0 }], failed: [] });
    const q = new OfflineQueue(store);
    const s = fakeServer();
    expect((await q.flush(s.sender)).sent).toEqual(['key-1']);
    expect(s.log).toEqual(['post key-1']);
  });
});
