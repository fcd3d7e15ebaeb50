import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { DueItem, UnitDueState } from '../../../../shared/due/board';
import { api } from '../../../lib/api-client';

export interface DueUnit {
  unitId: string;
  roadNumber: string;
  unitTypeKey: string;
  yardId: string | null;
  yardName: string | null;
  serviceState: string;
  nonComplying: boolean;
  state: UnitDueState;
  items: DueItem[];
}

export interface DueBoard {
  /** The calendar day (YYYY-MM-DD) in the railroad's zone the board is computed for. */
  on: string;
  timeZone: string;
  items: DueUnit[];
}

export const DUE_FILTER_KEYS = ['yard', 'state', 'on'] as const;
export type DueFilters = Partial<Record<(typeof DUE_FILTER_KEYS)[number], string>>;

export function dueSearch(f: DueFilters): string {
  const p = new URLSearchParams();
  for (const k of DUE_FILTER_KEYS) if (f[k]) p.set(k, f[k]!);
  const s = p.toString();
  return s ? `?${s}` : '';
}

export const dueQuery = (f: DueFilters) =>
  queryOptions({
    queryKey: ['due', 'board', dueSearch(f)],
    queryFn: ({ signal }) => api<DueBoard>(`/due${dueSearch(f)}`, { signal }),
    placeholderData: keepPreviousData,
  });

export const dueCsvHref = (f: DueFilters) => `/api/due.csv${dueSearch(f)}`;

export const yardsQuery = () =>
  queryOptions({ queryKey: ['yards'], queryFn: ({ signal }) => api<{ items: { id: string; code: string; name: string }[] }>('/yards', { signal }), staleTime: 300_000 });
