import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Drawing } from '../../../../shared/drawings/types';
import { api } from '../../../lib/api-client';

/** A unit type's drawing; drawings change only with a release, so they stay fresh for the session. */
export const drawingQuery = (unitTypeKey: string) =>
  queryOptions({
    queryKey: ['unit-types', unitTypeKey, 'drawing'],
    queryFn: ({ signal }) => api<Drawing>(`/unit-types/${encodeURIComponent(unitTypeKey)}`, { signal }),
    staleTime: Infinity,
  });

export const useDrawing = (unitTypeKey: string) => useQuery(drawingQuery(unitTypeKey));
