import { queryOptions, useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { CoverageBody, FindingBody, FindingView, InspectionView, StartInspectionBody } from '../../../../shared/api/walkaround';
import { coverageOf } from '../../../../shared/walkaround/routine';
import type { z } from 'zod';
import { api, ApiError } from '../../../lib/api-client';
import { mustQueue, queueMark, withQueued } from '../offline/sync';

export interface InspectionListItem {
  id: string;
  kind: 'daily' | 'periodic';
  status: 'in_progress' | 'signed';
  startedAt: string;
  signedAt: string | null;
  unitId: string;
  roadNumber: string;
  inspector: string;
  correctsId: string | null;
}

/** A finding as the client holds it: the server's, or one placed here and not yet stored. */
export type ClientFinding = FindingView & { pending?: boolean };
/** A part's coverage as the client holds it; `pending` while the change waits on this device to be sent. */
export type ClientItem = InspectionView['items'][number] & { pending?: boolean };
export type ClientInspection = Omit<InspectionView, 'findings' | 'items'> & { findings: ClientFinding[]; items: ClientItem[] };

export const inspectionKeys = {
  all: ['inspections'] as const,
  mineOpen: () => ['inspections', 'list', { mine: true, status: 'in_progress' }] as const,
  one: (id: string) => ['inspections', 'one', id] as const,
};

export const openInspectionsQuery = () =>
  queryOptions({
    queryKey: inspectionKeys.mineOpen(),
    queryFn: ({ signal }) => api<{ items: InspectionListItem[] }>('/inspections?mine=1&status=in_progress', { signal }),
  });

export const inspectionQuery = (id: string) =>
  queryOptions({
    queryKey: inspectionKeys.one(id),
    // Findings still waiting in the offline queue are shown with the stored ones.
    queryFn: async ({ signal }) => withQueued(await api<ClientInspection>(`/inspections/${id}`, { signal })),
  });

/** Coverage as the server would count it, for an optimistic change. */
function withItems(insp: ClientInspection, items: ClientInspection['items']): ClientInspection {
  const c = coverageOf(
    insp.routine.areas,
    items.map((i) => ({ instanceId: i.instanceId, state: i.state as 'passed' | 'finding' | 'not_applicable' | 'gap', reason: i.reason })),
  );
  return { ...insp, items, coverage: c };
}

function setItems(insp: ClientInspection, ids: readonly string[], state: string, reason: string | null): ClientInspection {
  const byId = new Map(insp.items.map((i) => [i.instanceId, i]));
  for (const id of ids) {
    // A part with a finding stays a finding, as on the server.
    if (byId.get(id)?.state === 'finding' && state !== 'finding') continue;
    byId.set(id, { instanceId: id, state, reason });
  }
  return withItems(insp, [...byId.values()]);
}

export function useStartInspection() {
  const qc = useQueryClient();
  return useMutation({
    networkMode: 'always',
    mutationFn: (body: StartInspectionBody) => api<ClientInspection>('/inspections', { method: 'POST', body }),
    onSuccess: (insp) => {
      qc.setQueryData(inspectionKeys.one(insp.id), insp);
      void qc.invalidateQueries({ queryKey: inspectionKeys.mineOpen() });
    },
  });
}

async function optimistic(qc: QueryClient, id: string, change: (i: ClientInspection) => ClientInspection) {
  const key = inspectionKeys.one(id);
  await qc.cancelQueries({ queryKey: key });
  const before = qc.getQueryData<ClientInspection>(key);
  if (before) qc.setQueryData<ClientInspection>(key, change(before));
  return { before };
}

export const newIdempotencyKey = () =>
  typeof crypto !== 'undefined' && 'randomUUID' in crypto ? crypto.randomUUID() : `k${Date.now()}${Math.random().toString(36).slice(2)}`;

export interface CoverageMarkInput {
  body: z.infer<typeof CoverageBody>;
  /** The parts' names and the area, for the waiting list should the mark have to wait on the device. */
  parts?: string[];
  area?: string | null;
}

/**
 * Marks parts passed, not applicable, back to do, or a gap with its reason. Each mark carries its own
 * Idempotency-Key. Without a connection (or while earlier changes to this inspection still wait) it is
 * kept in the offline queue, in order, and shown as waiting; the screen does not roll it back.
 */
export function useSetCoverage(id: string) {
  const qc = useQueryClient();
  const key = inspectionKeys.one(id);
  return useMutation({
    networkMode: 'always',
    mutationFn: async ({ body, parts = [], area = null }: CoverageMarkInput): Promise<{ queued: true } | { queued: false; inspection: ClientInspection }> => {
      const idem = newIdempotencyKey();
      const queue = () =>
        queueMark(qc, { key: idem, inspectionId: id, body, preview: { parts, area } }).then(
          () => ({ queued: true as const }),
          () => {
            throw new ApiError(0, 'not_kept', 'No connection, and this device could not keep the mark; mark it again when the connection returns');
          },
        );
      if (mustQueue(id)) return queue();
      try {
        const inspection = await api<ClientInspection>(`/inspections/${id}/coverage`, { method: 'POST', body, headers: { 'Idempotency-Key': idem } });
        return { queued: false, inspection };
      } catch (e) {
        if (e instanceof ApiError && e.status === 0) return queue();
        throw e;
      }
    },
    onMutate: ({ body }) => optimistic(qc, id, (i) => setItems(i, body.instanceIds, body.state, body.reason ?? null)),
    onError: (_e, _b, ctx) => ctx?.before && qc.setQueryData(key, ctx.before),
    onSuccess: (r) => {
      // A queued mark is already laid over the cached inspection, flagged as waiting.
      if (!r.queued) qc.setQueryData(key, withQueued(r.inspection));
    },
  });
}

export interface AddFindingInput {
  body: FindingBody;
  /** What the pin shows until the server answers. */
  preview: Pick<FindingView, 'partId' | 'instanceId' | 'partKind' | 'view' | 'body' | 'label' | 'partLabel' | 'defectLabel' | 'weight' | 'rule'>;
}

/** Pins a finding; the pin appears at once and goes again if the server refuses it. */
export function useAddFinding(id: string) {
  const qc = useQueryClient();
  const key = inspectionKeys.one(id);
  return useMutation({
    networkMode: 'always',
    mutationFn: ({ body }: AddFindingInput) =>
      api<FindingView>(`/inspections/${id}/findings`, {
        method: 'POST',
        body,
        headers: body.idempotencyKey ? { 'Idempotency-Key': body.idempotencyKey } : undefined,
      }),
    onMutate: ({ body, preview }) =>
      optimistic(qc, id, (i) => {
        const pin: ClientFinding = {
          ...preview,
          id: `pending-${body.idempotencyKey ?? Math.random().toString(36).slice(2)}`,
          inspectionId: id,
          unitId: i.unit.id,
          front: { along: 0, left: 0 },
          frontEnd: i.frontEndSeen,
          side: '',
          endRole: null,
          number: null,
          defectType: body.defectType,
          measurement: body.measurement ? { value: body.measurement.value, unit: body.measurement.unit, inches: NaN } : null,
          checkResult: null,
          note: body.note ?? null,
          state: 'open',
          assignedTo: null,
          createdBy: '',
          createdAt: new Date().toISOString(),
          version: 0,
          photos: [],
          pending: true,
        };
        return setItems({ ...i, findings: [...i.findings, pin] }, [preview.instanceId], 'finding', null);
      }),
    onError: (_e, _v, ctx) => ctx?.before && qc.setQueryData(key, ctx.before),
    onSuccess: (finding, { body }) => {
      qc.setQueryData<ClientInspection>(key, (i) =>
        i && { ...i, findings: [...i.findings.filter((f) => f.id !== `pending-${body.idempotencyKey}` && f.id !== finding.id), finding] },
      );
    },
    // The server adds what only it knows (coverage, tag, the labels it derived).
    onSettled: () => qc.invalidateQueries({ queryKey: key }),
  });
}

export function useSign(id: string) {
  const qc = useQueryClient();
  return useMutation({
    networkMode: 'always',
    mutationFn: (password: string) => api<ClientInspection>(`/inspections/${id}/sign`, { method: 'POST', body: { password } }),
    onSuccess: (insp) => {
      qc.setQueryData(inspectionKeys.one(id), insp);
      void qc.invalidateQueries({ queryKey: inspectionKeys.mineOpen() });
    },
  });
}

export function useAddCorrection(id: string) {
  const qc = useQueryClient();
  return useMutation({
    networkMode: 'always',
    mutationFn: (body: { note: string; password: string }) =>
      api<{ id: string; correctsId: string }>(`/inspections/${id}/corrections`, { method: 'POST', body }),
    onSuccess: () => qc.invalidateQueries({ queryKey: inspectionKeys.one(id) }),
  });
}
