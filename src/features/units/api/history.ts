import { queryOptions } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { unitKeys } from './roster';

export interface HistoryItem {
  kind: string;
  at: string;
  actor: string | null;
  /** The finding, inspection, tag or unit the entry is about. */
  ref: string;
  text: string;
  weight: 'federal' | 'shop' | 'note' | null;
}

export const historyQuery = (unitId: string) =>
  queryOptions({ queryKey: unitKeys.history(unitId), queryFn: ({ signal }) => api<{ items: HistoryItem[] }>(`/units/${encodeURIComponent(unitId)}/history`, { signal }) });

export interface InspectionSummary {
  id: string;
  kind: string;
  status: string;
  inspector: { id: string; name: string };
  startedAt: string;
  signedAt: string | null;
  place: string | null;
  frontEndSeen: string;
  coverage: { total: number; done: number; passed: number; findings: number; notApplicable: number; complete: boolean };
  findings: { id: string; label: string; defectLabel: string; weight: string; state: string }[];
}

export const inspectionQuery = (id: string) =>
  queryOptions({ queryKey: unitKeys.inspection(id), queryFn: ({ signal }) => api<InspectionSummary>(`/inspections/${encodeURIComponent(id)}`, { signal }), staleTime: Infinity });
