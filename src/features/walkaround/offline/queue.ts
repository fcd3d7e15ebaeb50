import type { FindingBody } from '../../../../shared/api/walkaround';

/**
 * The walkaround's offline queue: findings pinned without a connection, kept in order, sent when it
 * returns. Free of React and of the browser's storage so it can be tested with an in-memory store.
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

export interface FailedFinding {
  entry: QueuedFinding;
  status: number;
  code: string;
  message: string;
  failedAt: string;
}

export interface QueueState {
  pending: QueuedFinding[];
  failed: FailedFinding[];
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
}

export type FlushResult = { outcome: 'done' | 'offline' | 'retry'; sent: string[]; failed: string[] };

const isSendError = (e: unknown): e is SendError =>
  typeof e === 'object' && e !== null && typeof (e as SendError).status === 'number' && typeof (e as SendError).message === 'string';

/**
 * A refusal that a retry cannot change: the record was signed meanwhile (409), the unit or part
 * changed (400/422), gone (404), not allowed (403), a photo the server will not take (413/415).
 * No connection, a busy server (429) or a server error (5xx) are retried instead.
 */
export function isPermanent(e: SendError) {
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

  enqueue(e: Omit<QueuedFinding, 'queuedAt' | 'photosSent' | 'key'> & { queuedAt?: string }): Promise<QueueState> {
    const entry: QueuedFinding = { ...e, key: e.body.idempotencyKey, queuedAt: e.queuedAt ?? new Date().toISOString(), photosSent: 0 };
    // The same key twice (a double tap) is one finding.
    return this.change((s) => (s.pending.some((p) => p.key === entry.key) ? s : { ...s, pending: [...s.pending, entry] }));
  }

  dismiss(key: string): Promise<QueueState> {
    return this.change((s) => ({ ...s, failed: s.failed.filter((f) => f.entry.key !== key) }));
  }

  /** Sends the waiting findings oldest first; stops at the first one that must wait, so none overtakes another. */
  flush(sender: QueueSender): Promise<FlushResult> {
    this.flushing ??= this.run(sender).finally(() => {
      this.flushing = null;
    });
    return this.flushing;
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
        let findingId = head.findingId;
        if (!findingId) {
          findingId = (await sender.postFinding(head.inspectionId, head.body)).id;
          const id = findingId;
          await this.change((s) => ({ ...s, pending: s.pending.map((p) => (p.key === head.key ? { ...p, findingId: id } : p)) }));
        }
        for (let i = head.photosSent; i < head.photos.length; i++) {
          await sender.uploadPhoto(findingId, head.photos[i]);
          await this.change((s) => ({ ...s, pending: s.pending.map((p) => (p.key === head.key ? { ...p, photosSent: i + 1 } : p)) }));
        }
        await this.change((s) => ({ ...s, pending: s.pending.filter((p) => p.key !== head.key) }));
        sent.push(head.key);
      } catch (e) {
        const err: SendError = isSendError(e) ? e : { status: -1, code: 'unknown', message: String((e as Error)?.message ?? e) };
        if (err.status === 0) return { outcome: 'offline', sent, failed };
        if (!isPermanent(err)) return { outcome: 'retry', sent, failed };
        const current = this.state.pending.find((p) => p.key === head.key) ?? head;
        const message = current.findingId
          ? `The finding was stored, but a photo was not: ${err.message}`
          : err.message;
        await this.change((s) => ({
          pending: s.pending.filter((p) => p.key !== head.key),
          failed: [...s.failed, { entry: current, status: err.status, code: err.code, message, failedAt: new Date().toISOString() }],
        }));
        failed.push(head.key);
      }
    }
  }
}

/** Backoff between retries: 2 s, 4 s, 8 s … up to a minute. */
export function retryDelay(attempt: number) {
  return Math.min(60_000, 2000 * 2 ** Math.max(0, attempt));
}

/** The note as the inspector would copy it from a refused finding. */
export function noteText(f: FailedFinding) {
  const p = f.entry.preview;
  const lines = [`${p.label}: ${p.defectLabel}`];
  const m = f.entry.body.measurement;
  if (m) lines.push(`Reading: ${m.value} ${m.unit}`);
  if (f.entry.body.lastDone) lines.push(`Date: ${f.entry.body.lastDone}`);
  if (f.entry.body.note) lines.push(`Note: ${f.entry.body.note}`);
  lines.push(`Pinned ${f.entry.queuedAt}; not sent: ${f.message}`);
  return lines.join('\n');
}
