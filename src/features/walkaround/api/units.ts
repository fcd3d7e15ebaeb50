import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { UnitRow } from '../../../../shared/api/units';
import type { Drawing } from '../../../../shared/drawings/types';
import { api } from '../../../lib/api-client';

export const unitsQuery = (q: string) =>
  queryOptions({
    queryKey: ['walkaround', 'units', q],
    queryFn: ({ signal }) => api<{ items: UnitRow[] }>(`/units${q ? `?q=${encodeURIComponent(q)}` : ''}`, { signal }),
    placeholderData: keepPreviousData,
  });

export const unitQuery = (id: string) =>
  queryOptions({ queryKey: ['walkaround', 'unit', id], queryFn: ({ signal }) => api<UnitRow>(`/units/${id}`, { signal }) });

/** A unit type's drawing; it never changes while the app runs. */
export const drawingQuery = (key: string) =>
  queryOptions({ queryKey: ['unit-types', key], queryFn: ({ signal }) => api<Drawing>(`/unit-types/${key}`, { signal }), staleTime: Infinity });
