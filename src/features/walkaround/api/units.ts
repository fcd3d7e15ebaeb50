import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { UnitRow } from '../../../../shared/api/units';
import { api } from '../../../lib/api-client';

export const unitsQuery = (q: string) =>
  queryOptions({
    queryKey: ['walkaround', 'units', q],
    queryFn: ({ signal }) => api<{ items: UnitRow[] }>(`/units${q ? `?q=${encodeURIComponent(q)}` : ''}`, { signal }),
    placeholderData: keepPreviousData,
  });

export const unitQuery = (id: string) =>
  queryOptions({ queryKey: ['walkaround', 'unit', id], queryFn: ({ signal }) => api<UnitRow>(`/units/${id}`, { signal }) });

/** A unit type's drawing: the canvas feature's own query, so both share one cache entry. */
export { drawingQuery } from '../../drawing/api/get-drawing';
