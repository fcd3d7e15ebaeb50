import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { LoginBody, Me } from '../../../../shared/api/auth';
import { api, ApiError } from '../../../lib/api-client';

export const meQuery = () =>
  queryOptions({
    queryKey: ['auth', 'me'],
    queryFn: async (): Promise<Me | null> => {
      try {
        return await api<Me>('/auth/me');
      } catch (e) {
        if (e instanceof ApiError && e.status === 401) return null;
        throw e;
      }
    },
    staleTime: 60_000,
  });

export const useMe = () => useQuery(meQuery());

export function useLogin() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: LoginBody) => api<Me>('/auth/login', { method: 'POST', body }),
    onSuccess: (me) => {
      qc.clear();
      qc.setQueryData(meQuery().queryKey, me);
    },
  });
}

export function useLogout() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (everywhere: boolean) => api<void>(everywhere ? '/auth/logout-everywhere' : '/auth/logout', { method: 'POST' }),
    onSettled: () => {
      qc.clear();
      qc.setQueryData(meQuery().queryKey, null);
    },
  });
}

export function useChangePassword() {
  return useMutation({
    mutationFn: (body: { currentPassword: string; newPassword: string }) => api<void>('/auth/password', { method: 'POST', body }),
  });
}
