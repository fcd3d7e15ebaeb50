import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { Routine, RoutineBody } from '../../../../shared/api/walkaround';
import { api } from '../../../lib/api-client';

export const routineQuery = (unitTypeKey: string) =>
  queryOptions({ queryKey: ['routines', unitTypeKey], queryFn: ({ signal }) => api<Routine>(`/routines/${unitTypeKey}`, { signal }) });

export function useSaveRoutine(unitTypeKey: string) {
  const qc = useQueryClient();
  return useMutation({
    networkMode: 'always',
    mutationFn: (body: RoutineBody) => api<Routine>(`/routines/${unitTypeKey}`, { method: 'PUT', body }),
    onSuccess: (r) => qc.setQueryData(routineQuery(unitTypeKey).queryKey, r),
  });
}
