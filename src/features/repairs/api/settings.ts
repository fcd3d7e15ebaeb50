import { queryOptions } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export interface RailroadSettings {
  name: string;
  reportingMark: string;
  timeZone: string;
}

/** The railroad's zone: times on records are shown in it, whatever the device's zone. */
export const settingsQuery = () =>
  queryOptions({ queryKey: ['settings'], queryFn: ({ signal }) => api<RailroadSettings>('/settings', { signal }), staleTime: 300_000 });
