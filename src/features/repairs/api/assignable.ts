import { queryOptions } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export interface Assignable {
  id: string;
  name: string;
  role: 'foreman' | 'inspector';
  yardId: string | null;
}

/** Active foremen and inspectors a repair can go to (foremen only may ask). */
export const assignableQuery = (enabled: boolean) =>
  queryOptions({ queryKey: ['people', 'assignable'], queryFn: () => api<{ items: Assignable[] }>('/people/assignable'), enabled, staleTime: 300_000 });
