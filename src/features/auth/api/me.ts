import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { LoginBody, Me } from '../../../../shared/api/auth';
import { api, ApiError } from '../../../lib/api-client';

// The last signed-in person, so a walkaround reloaded in a yard with no signal still opens; the server
// checks the session again on every request once the connection is back.
const LAST_ME = 'hoodline.lastMe';
const remember = (me: Me | null) => (me ? localStorage.setItem(LAST_ME, JSON.stringify(me)) : localStorage.removeItem(LAST_ME));

export const meQuery = () =>
  queryOptions({
    queryKey: ['auth', 'me'],
    queryFn: async (): Promise<Me | null> => {
      try {
        const me = await api<Me>('/auth/me');
        remember(me);
        return me;
      } catch (e) {
        if (e instanceof ApiError && e.status === 401) {
          remember(null);
          return null;
        }
        const last = e instanceof ApiError && e.status === 0 ? localStorage.getItem(LAST_ME) : null;
        if (last) return JSON.parse(last) as Me;
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
      remember(me);
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
      remember(null);
      qc.setQueryData(meQuery().queryKey, null);
    },
  });
}

export function useChangePassword() {
  return useMutation({
    mutationFn: (body: { currentPassword: string; newPassword: string }) => api<void>('/auth/password', { method: 'POST', body }),
  });
}
