import { queryOptions, useQuery } from '@tanstack/react-query';
import type { FrontEnd } from '../../../../shared/domain/frames';
import type { UnitLayout } from '../../../../shared/layout/unit-layout';
import { api } from '../../../lib/api-client';

/** The derived labels of one unit (its recorded front end). */
export const unitLayoutQuery = (unitId: string) =>
  queryOptions({
    queryKey: ['units', 'layout', unitId],
    queryFn: ({ signal }) => api<UnitLayout>(`/units/${encodeURIComponent(unitId)}/layout`, { signal }),
  });

/** The labels of a unit type for one front end (the lab, or a unit whose F was seen on the other end). */
export const unitTypeLayoutQuery = (unitTypeKey: string, frontEnd: FrontEnd) =>
  queryOptions({
    queryKey: ['unit-types', unitTypeKey, 'layout', frontEnd],
    queryFn: ({ signal }) => api<UnitLayout>(`/unit-types/${encodeURIComponent(unitTypeKey)}/layout/${frontEnd}`, { signal }),
    staleTime: Infinity,
  });

export const useUnitLayout = (unitId: string) => useQuery(unitLayoutQuery(unitId));
export const useUnitTypeLayout = (unitTypeKey: string, frontEnd: FrontEnd) => useQuery(unitTypeLayoutQuery(unitTypeKey, frontEnd));
