import { queryOptions } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export interface Yard {
  id: string;
  code: string;
  name: string;
}

export interface UnitTypeSummary {
  key: string;
  name: string;
  lengthIn: number;
  widthIn: number;
  axleCount: number;
  views: string[];
}

export interface RailroadSettings {
  name: string;
  reportingMark: string;
  timeZone: string;
}

export const yardsQuery = () =>
  queryOptions({ queryKey: ['yards'], queryFn: ({ signal }) => api<{ items: Yard[] }>('/yards', { signal }), staleTime: 300_000 });

export const unitTypesQuery = () =>
  queryOptions({ queryKey: ['unit-types'], queryFn: ({ signal }) => api<{ items: UnitTypeSummary[] }>('/unit-types', { signal }), staleTime: Infinity });

/** The railroad's zone: record times read in the yard's time, whatever the device's zone. */
export const settingsQuery = () =>
  queryOptions({ queryKey: ['settings'], queryFn: ({ signal }) => api<RailroadSettings>('/settings', { signal }), staleTime: 300_000 });
