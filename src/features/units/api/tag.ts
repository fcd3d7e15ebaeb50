import { queryOptions } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export interface UnitTag {
  open: boolean;
  unit: { id: string; roadNumber: string; yardName: string | null };
  tag: { id: string; openedAt: string; openedBy: string; place: string | null; destination: string | null; restrictions: string | null } | null;
  defects: { id: string; label: string; defect: string; rule: string | null; createdAt: string; state: string }[];
}

/** The unit's non-complying tag (the same key the walkaround uses for this endpoint). */
export const tagQuery = (unitId: string) =>
  queryOptions({ queryKey: ['units', 'tag', unitId], queryFn: ({ signal }) => api<UnitTag>(`/units/${encodeURIComponent(unitId)}/tag`, { signal }) });
