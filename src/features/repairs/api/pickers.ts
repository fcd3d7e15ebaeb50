import { queryOptions } from '@tanstack/react-query';
import type { UnitRow } from '../../../../shared/api/units';
import { api } from '../../../lib/api-client';

export interface Yard {
  id: string;
  code: string;
  name: string;
}

export const yardsQuery = () =>
  queryOptions({ queryKey: ['yards'], queryFn: ({ signal }) => api<{ items: Yard[] }>('/yards', { signal }), staleTime: 300_000 });

/** The roster, for the unit filter and for units still tagged. */
export const unitsQuery = () =>
  queryOptions({ queryKey: ['units', 'list'], queryFn: ({ signal }) => api<{ items: UnitRow[] }>('/units', { signal }), staleTime: 30_000 });
