import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { QueueItem } from '../../../../shared/api/repairs';
import { api } from '../../../lib/api-client';

export const QUEUE_FILTER_KEYS = ['yard', 'unit', 'state', 'weight', 'assignee', 'q'] as const;
export type QueueFilterKey = (typeof QUEUE_FILTER_KEYS)[number];
export type QueueFilters = Partial<Record<QueueFilterKey, string>>;

/** Only the filters that are set, in a fixed order, so keys and links are stable. */
export function queueSearch(f: QueueFilters): string {
  const p = new URLSearchParams();
  for (const k of QUEUE_FILTER_KEYS) {
    const v = f[k]?.trim();
    if (v) p.set(k, v);
  }
  const s = p.toString();
  return s ? `?${s}` : '';
}

export const repairKeys = {
  all: ['repairs'] as const,
  queue: (f: QueueFilters) => ['repairs', 'queue', queueSearch(f)] as const,
  finding: (id: string) => ['repairs', 'finding', id] as const,
  tag: (unitId: string) => ['repairs', 'tag', unitId] as const,
  history: (unitId: string) => ['repairs', 'history', unitId] as const,
};

export const queueQuery = (f: QueueFilters) =>
  queryOptions({
    queryKey: repairKeys.queue(f),
    queryFn: ({ signal }) => api<{ items: QueueItem[] }>(`/repairs${queueSearch(f)}`, { signal }),
    placeholderData: keepPreviousData,
  });

/** The CSV export of exactly what the screen is filtered to. */
export const queueCsvHref = (f: QueueFilters) => `/api/repairs.csv${queueSearch(f)}`;
