import type { CoverageBody, FindingBody } from '../../../../shared/api/walkaround';
import type { z } from 'zod';

/**
 * The walkaround's offline queue: findings pinned and coverage marks made without a connection,
 * kept in one order and sent when it returns. Free of React and of the browser's storage so it can
 * be tested with an in-memory store.
 */

/** What the pin shows while the finding waits (the same fields as the online optimistic pin). */
export interface QueuedPreview {
  partId: string;
  instanceId: string;
  partKind: string;
  view: string;
  body: { x: number; y: number; z: number };
  label: string;
  partLabel: string;
  defectLabel: string;
  weight: string;
  rule: string | null;
}

export interface QueuedPhoto {
  blob: Blob;
  name: string;
}

export interface QueuedFinding {
  /** Absent on entries kept by an older version of the queue, which held findings only. */
  kind?: 'finding';
  /** The idempotency key: the same on every retry, so the server makes the finding once. */
  key: string;
  inspectionId: string;
  body: FindingBody & { idempotencyKey: string };
  preview: QueuedPreview;
  photos: QueuedPhoto[];
  queuedAt: string;
  /** Set once the server accepted the finding; its photos follow. */
  findingId?: string;
  photosSent: number;
}

export type CoverageMarkBody = z.infer<typeof CoverageBody>;

/** A part (or several) marked passed, not applicable, back to do, or a gap with its reason. */
export interface QueuedMark {
  kind: 'coverage';
  /** Sent as the Idempotency-Key header: a retry after a lost answer is answered, not run again. */
  key: string;
  inspectionId: string;
  body: CoverageMarkBody;
  /** The parts' names as the inspector saw them, and the area they were passed from (if a whole area). */
  preview: { parts: string[]; area: string | null };
  queuedAt: string;
}

export type QueuedEntry = QueuedFinding | QueuedMark;

export const isMark = (e: QueuedEntry): e is QueuedMark => e.kind === 'coverage';
export const isFinding = (e: QueuedEntry): e is QueuedFinding => e.kind !== 'coverage';

export interface FailedEntry {
  entry: QueuedEntry;
  status: number;
  code: string;
  message: string;
  failedAt: string;
}
/** @deprecated the failed list holds marks too; kept for older imports. */
export type FailedFinding = FailedEntry;

export interface QueueState {
  pending: QueuedEntry[];
  failed: FailedEntry[];
}

/** Where the queue lives: IndexedDB in the browser, memory in tests. */
export interface QueueStore {
  read(): Promise<QueueState | undefined>;
  write(s: QueueState): Promise<void>;
}

/** An error as the API helpers throw it (ApiError): status 0 means no connection. */
export interface SendError {
  status: number;
  code: string;
  message: string;
}

export interface QueueSender {
  postFinding(inspectionId: string, body: QueuedFinding['body']): Promise<{ id: string }>;
  uploadPhoto(findingId: string, photo: QueuedPhoto): Promise<unknown>;
  postCoverage(inspectionId: string, body: CoverageMarkBody, idempotencyKey: string): Promise<unknown>;
}

/** `signed_out`: the session ended (401); nothing more is tried until the inspector signs in again. */
export type FlushResult = { outcome: 'done' | 'offline' | 'retry' | 'signed_out'; sent: string[]; failed: string[] };

const isSendError = (e: unknown): e is SendError =>
  typeof e === 'object' && e !== null && typeof (e as SendError).status === 'number' && typeof (e as SendError).message === 'string';

/**
 * A refusal that a retry cannot change: the record was signed meanwhile (409), the unit or part
 * changed (400/422), gone (404), not allowed (403), a photo the server will not take (413/415).
 * No connection, a busy server (429) or a server error (5xx) are retried instead, and so is the
 * idempotency layer's own 409 for a copy of the same request still running (a send whose answer was
 * lost, retried at once): the first copy finishes, and the retry then gets its answer.
 */
export function isPermanent(e: SendError) {
  if (e.status === 409 && e.code === 'in_progress') return false;
  return e.status >= 400 && e.status < 500 && e.status !== 401 && e.status !== 408 && e.status !== 429;
}

export function createMemoryStore(initial?: QueueState): QueueStore & { state: QueueState | undefined } {
  const s = {
    state: initial,
    read: async () => s.state && structuredClone(s.state),
    write: async (v: QueueState) => {
      s.state = structuredClone(v);
    },
  };
  return s;
}

export type NewFinding = Omit<QueuedFinding, 'queuedAt' | 'photosSent' | 'key' | 'kind'> & { queuedAt?: string };
export type NewMark = Omit<QueuedMark, 'queuedAt' | 'kind'> & { queuedAt?: string };

export class OfflineQueue {
  private state: QueueState = { pending: [], failed: [] };
  private loaded: Promise<void> | null = null;
  private chain: Promise<unknown> = Promise.resolve();
  private flushing: Promise<FlushResult> | null = null;
  private listeners = new Set<() => void>();

  constructor(private readonly store: QueueStore) {}

  /** The last state read or written; stable between changes (for useSyncExternalStore). */
  snapshot(): QueueState {
    return this.state;
  }

  subscribe(cb: () => void) {
    this.listeners.add(cb);
    return () => void this.listeners.delete(cb);
  }

  load(): Promise<void> {
    this.loaded ??= this.store.read().then((s) => {
      if (s) this.set(s);
    });
    return this.loaded;
  }

  /** Whether anything for this inspection waits: a new change must then queue behind it, never overtake it. */
  hasWaiting(inspectionId: string) {
    return this.state.pending.some((p) => p.inspectionId === inspectionId);
  }

  /** True while a send is running (single flight). */
  get sending() {
    return this.flushing !== null;
  }

  /** One change at a time, written through before the next, so two tabs of work never interleave. */
  private change(fn: (s: QueueState) => QueueState): Promise<QueueState> {
    const next = this.chain.then(async () => {
      await this.load();
      const s = fn(this.state);
      await this.store.write(s);
      this.set(s);
      return s;
    });
    this.chain = next.catch(() => undefined);
    return next;
  }

  private set(s: QueueState) {
    this.state = s;
    for (const l of this.listeners) l();
  }

  private add(entry: QueuedEntry) {
    // The same key twice (a double tap) is one entry.
    return this.change((s) => (s.pending.some((p) => p.key === entry.key) ? s : { ...s, pending: [...s.pending, entry] }));
  }

  enqueue(e: NewFinding): Promise<QueueState> {
    return this.add({ ...e, kind: 'finding', key: e.body.idempotencyKey, queuedAt: e.queuedAt ?? new Date().toISOString(), photosSent: 0 });
  }

  enqueueMark(e: NewMark): Promise<QueueState> {
    return this.add({ ...e, kind: 'coverage', queuedAt: e.queuedAt ?? new Date().toISOString() });
  }

  dismiss(key: string): Promise<QueueState> {
    return this.change((s) => ({ ...s, failed: s.failed.filter((f) => f.entry.key !== key) }));
  }

  /** Puts a refused entry back at the end of the queue, changed (a passed reading kept as a note). */
  requeue(key: string, fn: (e: QueuedEntry) => QueuedEntry): Promise<QueueState> {
    return this.change((s) => {
      const f = s.failed.find((x) => x.entry.key === key);
      if (!f) return s;
      return { pending: [...s.pending, fn(f.entry)], failed: s.failed.filter((x) => x !== f) };
    });
  }

  /**
   * Sends the waiting entries oldest first; stops at the first one that must wait, so none overtakes
   * another. Single flight: a call while a send runs joins it instead of starting a second one.
   */
  flush(sender: QueueSender): Promise<FlushResult> {
    this.flushing ??= this.run(sender).finally(() => {
      this.flushing = null;
    });
    return this.flushing;
  }

  private patchHead(key: string, patch: Partial<QueuedFinding>) {
    return this.change((s) => ({ ...s, pending: s.pending.map((p) => (p.key === key ? ({ ...p, ...patch } as QueuedEntry) : p)) }));
  }

  private async sendOne(sender: QueueSender, head: QueuedEntry) {
    if (isMark(head)) {
      await sender.postCoverage(head.inspectionId, head.body, head.key);
      return;
    }
    let findingId = head.findingId;
    if (!findingId) {
      findingId = (await sender.postFinding(head.inspectionId, head.body)).id;
      await this.patchHead(head.key, { findingId });
    }
    for (let i = head.photosSent; i < head.photos.length; i++) {
      await sender.uploadPhoto(findingId, head.photos[i]);
      await this.patchHead(head.key, { photosSent: i + 1 });
    }
  }

  private async run(sender: QueueSender): Promise<FlushResult> {
    await this.load();
    const sent: string[] = [];
    const failed: string[] = [];
    for (;;) {
      await this.chain;
      const head = this.state.pending[0];
      if (!head) return { outcome: 'done', sent, failed };
      try {
        await this.sendOne(sender, head);
        await this.change((s) => ({ ...s, pending: s.pending.filter((p) => p.key !== head.key) }));
        sent.push(head.key);
      } catch (e) {
        const err: SendError = isSendError(e) ? e : { status: -1, code: 'unknown', message: String((e as Error)?.message ?? e) };
        if (err.status === 0) return { outcome: 'offline', sent, failed };
        if (err.status === 401) return { outcome: 'signed_out', sent, failed };
        if (!isPermanent(err)) return { outcome: 'retry', sent, failed };
        const current = this.state.pending.find((p) => p.key === head.key) ?? head;
        await this.change((s) => ({
          pending: s.pending.filter((p) => p.key !== head.key),
          failed: [...s.failed, { entry: current, status: err.status, code: err.code, message: refusalText(current, err), failedAt: new Date().toISOString() }],
        }));
        failed.push(head.key);
      }
    }
  }
}

/** The server's refusal in the inspector's words: what did not reach the record, and why. */
function refusalText(entry: QueuedEntry, err: SendError) {
  if (isFinding(entry) && entry.findingId) return `The finding was stored, but a photo was not: ${err.message}`;
  if (isMark(entry)) return `This mark is not on the record: ${err.message}`;
  return err.message;
}

/** Backoff between retries after a server error: 2 s, 4 s, 8 s … up to a minute. */
export function retryDelay(attempt: number) {
  return Math.min(60_000, 2000 * 2 ** Math.max(0, attempt));
}

/** A mark as one line: what was done to which parts. */
export function markText(m: Pick<QueuedMark, 'body' | 'preview'>) {
  const { parts, area } = m.preview;
  const n = m.body.instanceIds.length;
  const what = n <= 3 && parts.length === n ? parts.join(', ') : area ? `${n} parts of ${area}` : `${n} parts`;
  switch (m.body.state) {
    case 'passed':
      return `Passed: ${what}`;
    case 'not_applicable':
      return `Not applicable: ${what}${m.body.reason ? ` (${m.body.reason})` : ''}`;
    case 'gap':
      return m.body.reason ? `Left out: ${what} (${m.body.reason})` : `Back to do: ${what}`;
  }
}

/** An entry's title line in the panel. */
export function entryTitle(e: QueuedEntry) {
  return isMark(e) ? markText(e) : `${e.preview.label}: ${e.preview.defectLabel}`;
}

/** The note as the inspector would copy it from a refused entry. */
export function noteText(f: FailedEntry) {
  const e = f.entry;
  if (isMark(e)) return [markText(e), `Marked ${e.queuedAt}; not sent: ${f.message}`].join('\n');
  const lines = [entryTitle(e)];
  const m = e.body.measurement;
  if (m) lines.push(`Reading: ${m.value} ${m.unit}`);
  if (e.body.lastDone) lines.push(`Date: ${e.body.lastDone}`);
  if (e.body.note) lines.push(`Note: ${e.body.note}`);
  lines.push(`Pinned ${e.queuedAt}; not sent: ${f.message}`);
  return lines.join('\n');
}
