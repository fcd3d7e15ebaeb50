import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export interface UnitTypeItem {
  key: string;
  name: string;
  lengthIn: number;
  widthIn: number;
  axleCount: number;
  views: string[];
}

export const unitTypesQuery = () =>
  queryOptions({ queryKey: ['unit-types'], queryFn: ({ signal }) => api<{ items: UnitTypeItem[] }>('/unit-types', { signal }), staleTime: Infinity });
export const yardsQuery = () =>
  queryOptions({ queryKey: ['yards'], queryFn: ({ signal }) => api<{ items: { id: string; code: string; name: string }[] }>('/yards', { signal }), staleTime: 300_000 });

export const useUnitTypes = () => useQuery(unitTypesQuery());
export const useYards = () => useQuery(yardsQuery());
