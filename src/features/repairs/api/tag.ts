import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { repairKeys } from './queue';

export interface UnitTag {
  open: boolean;
  railroad: { name: string; reportingMark: string; timeZone: string };
  unit: { id: string; roadNumber: string; yardName: string | null };
  tag: { id: string; openedAt: string; openedBy: string; place: string | null; destination: string | null; restrictions: string | null } | null;
  /** Federal findings on the unit still open or in repair. */
  defects: { id: string; label: string; defect: string; rule: string | null; createdAt: string; state: string }[];
}

export interface TagCleared {
  unitId: string;
  tagId: string;
  clearedBy: string;
  clearedAt: string;
}

export interface HistoryItem {
  kind: string;
  at: string;
  actor: string | null;
  ref: string;
  text: string;
  weight: string | null;
}

export const unitTagQuery = (unitId: string) =>
  queryOptions({ queryKey: repairKeys.tag(unitId), queryFn: ({ signal }) => api<UnitTag>(`/units/${unitId}/tag`, { signal }) });

/** Newest first; the latest tag_cleared entry says who cleared the tag and when. */
export const unitHistoryQuery = (unitId: string) =>
  queryOptions({ queryKey: repairKeys.history(unitId), queryFn: ({ signal }) => api<{ items: HistoryItem[] }>(`/units/${unitId}/history`, { signal }) });

export function useClearTag() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (unitId: string) => api<TagCleared>(`/units/${unitId}/tag/clear`, { method: 'POST' }),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: repairKeys.all });
      void qc.invalidateQueries({ queryKey: ['due'] });
      void qc.invalidateQueries({ queryKey: ['units'] });
    },
  });
}
