import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export interface UnitTag {
  open: boolean;
  railroad: { name: string; reportingMark: string; timeZone: string };
  unit: { id: string; roadNumber: string; yardName: string | null };
  tag: { id: string; openedAt: string; openedBy: string; place: string | null; destination: string | null; restrictions: string | null } | null;
  defects: { id: string; label: string; defect: string; rule: string | null; createdAt: string; state: string }[];
}

export const tagQuery = (unitId: string) =>
  queryOptions({ queryKey: ['units', 'tag', unitId], queryFn: ({ signal }) => api<UnitTag>(`/units/${unitId}/tag`, { signal }) });

export function useUpdateTag(unitId: string) {
  const qc = useQueryClient();
  return useMutation({
    networkMode: 'always',
    mutationFn: (body: { destination?: string; restrictions?: string }) =>
      api<{ id: string; destination: string | null; restrictions: string | null }>(`/units/${unitId}/tag`, { method: 'PATCH', body }),
    onSuccess: () => qc.invalidateQueries({ queryKey: tagQuery(unitId).queryKey }),
  });
}
