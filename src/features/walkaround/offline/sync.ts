import type { QueryClient } from '@tanstack/react-query';
import { get, set } from 'idb-keyval';
import { useSyncExternalStore } from 'react';
import { coverageOf } from '../../../../shared/walkaround/routine';
import { api } from '../../../lib/api-client';
import type { ClientFinding, ClientInspection } from '../api/inspections';
import { uploadPhoto } from '../api/photos';
import { OfflineQueue, isFinding, isMark, type NewFinding, type NewMark, type QueueSender, type QueueState, type QueueStore, type QueuedEntry, type QueuedFinding } from './queue';
import { SendScheduler } from './scheduler';

const STORE_KEY = 'hoodline.walkaround.offline-queue';

/** IndexedDB through idb-keyval: Blobs (photos) are stored as they are. */
const idbStore: QueueStore = {
  read: () => get<QueueState>(STORE_KEY),
  write: (s) => set(STORE_KEY, s),
};

export const offlineQueue = new OfflineQueue(idbStore);

const sender: QueueSender = {
  postFinding: (inspectionId, body) =>
    api<{ id: string }>(`/inspections/${inspectionId}/findings`, { method: 'POST', body, headers: { 'Idempotency-Key': body.idempotencyKey } }),
  uploadPhoto: (findingId, p) => uploadPhoto(findingId, p.blob, p.name, () => {}),
  postCoverage: (inspectionId, body, key) => api(`/inspections/${inspectionId}/coverage`, { method: 'POST', body, headers: { 'Idempotency-Key': key } }),
};

export const queuedId = (key: string) => `queued-${key}`;

/** A waiting finding as a pin and a list row (pending: true). */
export function queuedAsFinding(q: QueuedFinding, insp: Pick<ClientInspection, 'unit' | 'frontEndSeen'>): ClientFinding {
  const p = q.preview;
  return {
    ...p,
    view: p.view as ClientFinding['view'],
    weight: p.weight as ClientFinding['weight'],
    id: queuedId(q.key),
    inspectionId: q.inspectionId,
    unitId: insp.unit.id,
    front: { along: 0, left: 0 },
    frontEnd: insp.frontEndSeen,
    side: '',
    endRole: null,
    number: null,
    defectType: q.body.defectType,
    measurement: q.body.measurement ? { value: q.body.measurement.value, unit: q.body.measurement.unit, inches: NaN } : null,
    checkResult: null,
    note: q.body.note ?? null,
    state: 'open',
    assignedTo: null,
    createdBy: '',
    createdAt: q.queuedAt,
    version: 0,
    photos: [],
    pending: true,
  } as ClientFinding;
}

type Item = ClientInspection['items'][number];

/**
 * The inspection with what waits on this device laid over it, in the order it will be sent: waiting
 * findings as pins, waiting marks on their parts, each changed part flagged `pending`. Counted as
 * the server will count it once they arrive (a part with a finding is covered and stays a finding
 * whatever is marked on it).
 */
export function withQueued(insp: ClientInspection, state: QueueState = offlineQueue.snapshot()): ClientInspection {
  // A signed record is shown as it was signed: what still waits for it will be refused, not added.
  if (insp.status === 'signed') return insp;
  const mine = state.pending.filter((q) => q.inspectionId === insp.id && !(isFinding(q) && q.findingId));
  const base = insp.findings.filter((f) => !f.id.startsWith('queued-'));
  if (mine.length === 0 && base.length === insp.findings.length) return insp;
  const byId = new Map<string, Item>(insp.items.map((i) => [i.instanceId, i]));
  for (const q of mine) {
    if (isMark(q)) {
      for (const id of q.body.instanceIds) {
        if (byId.get(id)?.state === 'finding') continue;
        byId.set(id, { instanceId: id, state: q.body.state, reason: q.body.reason ?? null, pending: true });
      }
    } else byId.set(q.preview.instanceId, { instanceId: q.preview.instanceId, state: 'finding', reason: null, pending: true });
  }
  const items = [...byId.values()];
  const coverage = coverageOf(
    insp.routine.areas,
    items.map((i) => ({ instanceId: i.instanceId, state: i.state as 'passed' | 'finding' | 'not_applicable' | 'gap', reason: i.reason })),
  );
  const findings = [...base, ...mine.filter(isFinding).map((q) => queuedAsFinding(q, insp))];
  return { ...insp, findings, items, coverage: { ...insp.coverage, ...coverage } };
}

const inspectionKey = (id: string) => ['inspections', 'one', id] as const;

let client: QueryClient | null = null;

/** Lays the queue over every open copy of an inspection in the cache. */
function showQueued(qc: QueryClient | null, inspectionId: string, s: QueueState = offlineQueue.snapshot()) {
  qc?.setQueryData<ClientInspection>(inspectionKey(inspectionId), (i) => i && withQueued(i, s));
}

// Whether the last send found the session ended: the panel then asks the inspector to sign in again.
let signedOut = false;
const signedOutListeners = new Set<() => void>();
function setSignedOut(v: boolean) {
  if (v === signedOut) return;
  signedOut = v;
  for (const l of signedOutListeners) l();
}
export const useQueueSignedOut = () =>
  useSyncExternalStore(
    (cb) => (signedOutListeners.add(cb), () => void signedOutListeners.delete(cb)),
    () => signedOut,
    () => signedOut,
  );

const scheduler = new SendScheduler(offlineQueue, sender, {
  onFlushed: (r, before) => {
    if (r.outcome === 'signed_out') setSignedOut(true);
    else if (r.outcome === 'done' || r.sent.length) setSignedOut(false);
    const qc = client;
    if (!qc || (!r.sent.length && !r.failed.length)) return;
    // The server adds what only it knows (labels, coverage, the tag); the rest still waiting is laid over it again.
    const touched = new Set([...before.pending, ...offlineQueue.snapshot().failed.map((f) => f.entry)].map((q) => q.inspectionId));
    for (const id of touched) void qc.invalidateQueries({ queryKey: inspectionKey(id) });
  },
});

/** Whether a new change to this inspection must queue behind what already waits (so it cannot overtake it). */
export const mustQueue = (inspectionId: string) => offlineQueue.hasWaiting(inspectionId);

/** Keeps a finding the network refused to carry; its pin stays, marked as waiting. */
export async function queueFinding(qc: QueryClient, e: NewFinding) {
  const s = await offlineQueue.enqueue(e);
  showQueued(qc, e.inspectionId, s);
  void scheduler.kick();
}

/** Keeps a coverage mark made without a connection; the part shows it, marked as waiting. */
export async function queueMark(qc: QueryClient, e: NewMark) {
  const s = await offlineQueue.enqueueMark(e);
  showQueued(qc, e.inspectionId, s);
  void scheduler.kick();
}

/** A finding refused because its reading is within the limit: kept as a note after all, sent again. */
export async function keepRefusedAsNote(key: string) {
  const s = await offlineQueue.requeue(key, (e: QueuedEntry) =>
    isFinding(e) ? { ...e, body: { ...e.body, keepAsNote: true }, preview: { ...e.preview, weight: 'note' } } : e,
  );
  const back = s.pending.find((p) => p.key === key);
  if (back) showQueued(client, back.inspectionId, s);
  void scheduler.kick();
}

/** Sends now, with the backoff started again (the inspector's "Send now"). */
export const flushNow = () => scheduler.sendNow();

/**
 * Starts sending: now (app start), the moment the connection returns or the page is shown again
 * (no waiting out a backoff), and on a backoff timer while the server fails. Returns a stop function.
 */
export function startOfflineSync(qc: QueryClient) {
  client = qc;
  const now = () => void scheduler.sendNow();
  const visible = () => {
    if (document.visibilityState === 'visible') now();
  };
  window.addEventListener('online', now);
  document.addEventListener('visibilitychange', visible);
  void offlineQueue.load().then(() => {
    // Pins and marks from a queue kept across a reload.
    for (const id of new Set(offlineQueue.snapshot().pending.map((q) => q.inspectionId))) showQueued(qc, id);
    return scheduler.sendNow();
  });
  return () => {
    window.removeEventListener('online', now);
    document.removeEventListener('visibilitychange', visible);
    scheduler.stop();
    if (client === qc) client = null;
  };
}

export const useOfflineQueue = () =>
  useSyncExternalStore(
    (cb) => offlineQueue.subscribe(cb),
    () => offlineQueue.snapshot(),
    () => offlineQueue.snapshot(),
  );
