import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { FindingState, FindingWeight } from '../../../../shared/domain/states';
import type { FindingAction } from '../../../../shared/repairs/transitions';
import { api } from '../../../lib/api-client';
import { repairKeys } from './queue';

export interface FindingEvent {
  id: string;
  kind: string;
  fromState: FindingState | null;
  toState: FindingState | null;
  at: string;
  actor: string;
  details: Record<string, unknown> | null;
}

export interface FindingDetail {
  id: string;
  unitId: string;
  roadNumber: string;
  inspectionId: string;
  label: string;
  partLabel: string | null;
  defectType: string;
  defectLabel: string;
  weight: FindingWeight;
  rule: string | null;
  measurement: { value: number; unit: string; inches: number | null } | null;
  checkResult: { result?: string; limit?: string; source?: string; message?: string } | null;
  note: string | null;
  state: FindingState;
  voidReason: string | null;
  assignedTo: string | null;
  assigneeName: string | null;
  createdByName: string;
  createdAt: string;
  version: number;
  events: FindingEvent[];
  photos: { id: string; eventId: string | null; thumb: string; full: string }[];
}

export interface ActionResult {
  id: string;
  state: FindingState;
  version: number;
  eventId: string;
  unitId: string;
  /** Federal findings still needing work on the unit (only for a federal finding). */
  federalOpenOnUnit: number | null;
}

export const findingQuery = (id: string) =>
  queryOptions({ queryKey: repairKeys.finding(id), queryFn: ({ signal }) => api<FindingDetail>(`/findings/${id}`, { signal }) });

export type ActionBody =
  | { action: 'assign'; version: number; assigneeId: string }
  | { action: 'repair'; version: number; whatDone: string; partsUsed?: string; minutes?: number }
  | { action: 'verify'; version: number }
  | { action: 'send_back'; version: number; reason: string }
  | { action: 'void'; version: number; reason: string };

export const actionPath = (id: string, action: FindingAction) => `/findings/${id}/${action.replace('_', '-')}`;

/** One change of a finding, sent with the version it was based on; the queue, tags and due board refresh after. */
export function useFindingAction(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ action, ...body }: ActionBody) => api<ActionResult>(actionPath(id, action), { method: 'POST', body }),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: repairKeys.all });
      void qc.invalidateQueries({ queryKey: ['due'] });
      void qc.invalidateQueries({ queryKey: ['units'] });
    },
  });
}
