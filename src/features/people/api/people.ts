import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CreatePersonBody, PersonRow, UpdatePersonBody } from '../../../../shared/api/people';
import { api } from '../../../lib/api-client';

export const peopleQuery = () => queryOptions({ queryKey: ['people'], queryFn: () => api<{ items: PersonRow[] }>('/people') });
export const yardsQuery = () => queryOptions({ queryKey: ['yards'], queryFn: () => api<{ items: { id: string; code: string; name: string }[] }>('/yards'), staleTime: 300_000 });

export const usePeople = () => useQuery(peopleQuery());
export const useYards = () => useQuery(yardsQuery());

export function useCreatePerson() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: CreatePersonBody) => api<PersonRow>('/people', { method: 'POST', body }),
    onSuccess: () => qc.invalidateQueries({ queryKey: peopleQuery().queryKey }),
  });
}

export function useUpdatePerson() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...body }: UpdatePersonBody & { id: string }) => api<PersonRow>(`/people/${id}`, { method: 'PATCH', body }),
    onSettled: () => qc.invalidateQueries({ queryKey: peopleQuery().queryKey }),
  });
}

export function useUnlockPerson() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api<PersonRow>(`/people/${id}/unlock`, { method: 'POST' }),
    onSettled: () => qc.invalidateQueries({ queryKey: peopleQuery().queryKey }),
  });
}
