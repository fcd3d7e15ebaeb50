import { queryOptions } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

/** The due board's verdict per unit, so a unit overdue on any interval is flagged in the queue too. */
export const dueStatesQuery = () =>
  queryOptions({
    // Same key and endpoint as the due board's unfiltered view, so the two screens share one fetch.
    queryKey: ['due', 'board', ''],
    queryFn: ({ signal }) => api<{ on: string; timeZone: string; items: { unitId: string; state: 'overdue' | 'due_soon' | 'good' }[] }>('/due', { signal }),
    staleTime: 60_000,
    select: (d) => new Set(d.items.filter((u) => u.state === 'overdue').map((u) => u.unitId)),
  });
