import { queryOptions } from '@tanstack/react-query';
import type { Me } from '../../../../shared/api/auth';
import { api, ApiError } from '../../../lib/api-client';

/** Who is signed in (the shell's key, so it comes from the cache). */
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
