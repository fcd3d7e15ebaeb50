import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CreateGroupBody, GroupRow, LabPerson, UpdateGroupBody } from '../../../../shared/api/lab';
import { api } from '../../../lib/api-client';

export const groupsQuery = () => queryOptions({ queryKey: ['lab', 'groups'], queryFn: ({ signal }) => api<{ items: GroupRow[] }>('/lab/groups', { signal }) });
export const labPeopleQuery = () =>
  queryOptions({ queryKey: ['lab', 'people'], queryFn: ({ signal }) => api<{ items: LabPerson[] }>('/lab/people', { signal }), staleTime: 60_000 });

export const useGroups = () => useQuery(groupsQuery());
export const useLabPeople = () => useQuery(labPeopleQuery());

export function useCreateGroup() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateGroupBody) => api<GroupRow>('/lab/groups', { method: 'POST', body }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['lab'] }),
  });
}

export function useUpdateGroup() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...body }: UpdateGroupBody & { id: string }) => api<GroupRow>(`/lab/groups/${id}`, { method: 'PATCH', body }),
    onSettled: () => qc.invalidateQueries({ queryKey: ['lab'] }),
  });
}
