import type { QueryClient } from '@tanstack/react-query';
import { get, set } from 'idb-keyval';
import { useSyncExternalStore } from 'react';
import { coverageOf } from '../../../../shared/walkaround/routine';
import { api } from '../../../lib/api-client';
import type { ClientFinding, ClientInspection } from '../api/inspections';
import { uploadPhoto } from '../api/photos';
import { OfflineQueue, retryDelay, type QueueSender, type QueueState, type QueueStore, type QueuedFinding } from './queue';

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

/** The inspection with its waiting findings added (and none already stored shown twice). */
export function withQueued(insp: ClientInspection, state: QueueState = offlineQueue.snapshot()): ClientInspection {
  const mine = state.pending.filter((q) => q.inspectionId === insp.id && !q.findingId);
  const base = insp.findings.filter((f) => !f.id.startsWith('queued-'));
  if (mine.length === 0 && base.length === insp.findings.length) return insp;
  const ids = new Set(mine.map((q) => q.preview.instanceId));
  const items = [...insp.items.filter((i) => !ids.has(i.instanceId)), ...[...ids].map((id) => ({ instanceId: id, state: 'finding', reason: null }))];
  // Counted as the server will count it once the finding arrives (a part with a finding is covered).
  const coverage = coverageOf(
    insp.routine.areas,
    items.map((i) => ({ instanceId: i.instanceId, state: i.state as 'passed' | 'finding' | 'not_applicable' | 'gap', reason: i.reason })),
  );
  return { ...insp, findings: [...base, ...mine.map((q) => queuedAsFinding(q, insp))], items, coverage: { ...insp.coverage, ...coverage } };
}

const inspectionKey = (id: string) => ['inspections', 'one', id] as const;

/** Keeps a finding the network refused to carry; its pin stays, marked as waiting. */
export async function queueFinding(qc: QueryClient, e: Omit<QueuedFinding, 'queuedAt' | 'photosSent' | 'key'>) {
  const s = await offlineQueue.enqueue(e);
  qc.setQueryData<ClientInspection>(inspectionKey(e.inspectionId), (i) => i && withQueued(i, s));
  scheduleRetry(0);
}

let client: QueryClient | null = null;
let timer: ReturnType<typeof setTimeout> | null = null;
let attempt = 0;

function scheduleRetry(delay: number) {
  if (timer) clearTimeout(timer);
  timer = setTimeout(() => {
    timer = null;
    void flushNow();
  }, delay);
}

export async function flushNow() {
  if (!client) return;
  const qc = client;
  const before = offlineQueue.snapshot();
  const r = await offlineQueue.flush(sender);
  const touched = new Set([...before.pending, ...offlineQueue.snapshot().failed.map((f) => f.entry)].map((q) => q.inspectionId));
  if (r.sent.length || r.failed.length) for (const id of touched) void qc.invalidateQueries({ queryKey: inspectionKey(id) });
  if (r.outcome === 'done') {
    attempt = 0;
    return;
  }
  scheduleRetry(retryDelay(attempt++));
}

/** Starts sending: now (app start), whenever the connection returns, and on a backoff timer. Returns a stop function. */
export function startOfflineSync(qc: QueryClient) {
  client = qc;
  const online = () => {
    attempt = 0;
    void flushNow();
  };
  window.addEventListener('online', online);
  void offlineQueue.load().then(() => {
    // Pins from a queue kept across a reload.
    for (const q of offlineQueue.snapshot().pending) qc.setQueryData<ClientInspection>(inspectionKey(q.inspectionId), (i) => i && withQueued(i));
    return flushNow();
  });
  return () => {
    window.removeEventListener('online', online);
    if (timer) clearTimeout(timer);
    timer = null;
    client = null;
  };
}

export const useOfflineQueue = () =>
  useSyncExternalStore(
    (cb) => offlineQueue.subscribe(cb),
    () => offlineQueue.snapshot(),
    () => offlineQueue.snapshot(),
  );
