import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export interface UnitTypeSummary {
  key: string;
  name: string;
  lengthIn: number;
  widthIn: number;
  axleCount: number;
  views: string[];
}

export const unitTypesQuery = () =>
  queryOptions({ queryKey: ['unit-types'], queryFn: ({ signal }) => api<{ items: UnitTypeSummary[] }>('/unit-types', { signal }), staleTime: Infinity });
export const useUnitTypes = () => useQuery(unitTypesQuery());
