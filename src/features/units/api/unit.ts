import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { UnitRow } from '../../../../shared/api/units';
import type { FrontEnd } from '../../../../shared/domain/frames';
import { api } from '../../../lib/api-client';
import { unitTypeLayoutQuery } from '../../drawing/api/get-unit-layout';
import { unitKeys } from './roster';

export const unitQuery = (id: string) =>
  queryOptions({ queryKey: unitKeys.one(id), queryFn: ({ signal }) => api<UnitRow>(`/units/${encodeURIComponent(id)}`, { signal }) });

/**
 * The admin's change of the end that carries the F, based on the version on screen. The new
 * labels are fetched before the unit is replaced in the cache, so every label changes in the same
 * frame (and the canvas animates once) instead of the F moving before the numbers do.
 */
export function useChangeFrontEnd(unit: Pick<UnitRow, 'id' | 'unitTypeKey'>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (v: { version: number; frontEnd: FrontEnd; reason: string }) => {
      const updated = await api<UnitRow>(`/units/${encodeURIComponent(unit.id)}`, { method: 'PATCH', body: v });
      await qc.ensureQueryData(unitTypeLayoutQuery(updated.unitTypeKey, updated.frontEnd));
      return updated;
    },
    onSuccess: (updated) => {
      qc.setQueryData(unitKeys.one(unit.id), updated);
      void qc.invalidateQueries({ queryKey: ['units'], predicate: (q) => q.queryKey[1] !== 'one' || q.queryKey[2] !== unit.id });
    },
  });
}
