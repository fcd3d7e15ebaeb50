import { infiniteQueryOptions, keepPreviousData, queryOptions } from '@tanstack/react-query';
import { QueueSort, type QueueItem, type QueuePage } from '../../../../shared/api/repairs';
import { api } from '../../../lib/api-client';

export const QUEUE_FILTER_KEYS = ['yard', 'unit', 'state', 'weight', 'assignee', 'q'] as const;
export type QueueFilterKey = (typeof QUEUE_FILTER_KEYS)[number];
export type QueueFilters = Partial<Record<QueueFilterKey, string>>;

/** The sort in the address, or none when it is missing or not one the server knows. */
export const parseQueueSort = (v: string | null | undefined): QueueSort | undefined => QueueSort.safeParse(v ?? undefined).data;

/** Only the filters that are set, in a fixed order, then the sort and any page parameters, so keys and links are stable. */
export function queueSearch(f: QueueFilters, more: { sort?: QueueSort; limit?: number; cursor?: string | null } = {}): string {
  const p = new URLSearchParams();
  for (const k of QUEUE_FILTER_KEYS) {
    const v = f[k]?.trim();
    if (v) p.set(k, v);
  }
  if (more.sort) p.set('sort', more.sort);
  if (more.limit) p.set('limit', String(more.limit));
  if (more.cursor) p.set('cursor', more.cursor);
  const s = p.toString();
  return s ? `?${s}` : '';
}

export const repairKeys = {
  all: ['repairs'] as const,
  queue: (f: QueueFilters, sort?: QueueSort) => ['repairs', 'queue', queueSearch(f, { sort })] as const,
  summary: () => ['repairs', 'queue-summary'] as const,
  finding: (id: string) => ['repairs', 'finding', id] as const,
  tag: (unitId: string) => ['repairs', 'tag', unitId] as const,
  history: (unitId: string) => ['repairs', 'history', unitId] as const,
};

/** The queue a page at a time ("Show more" fetches the next page after the last row shown). */
export const queueQuery = (f: QueueFilters, sort?: QueueSort) =>
  infiniteQueryOptions({
    queryKey: repairKeys.queue(f, sort),
    queryFn: ({ signal, pageParam }) => api<QueuePage>(`/repairs${queueSearch(f, { sort, cursor: pageParam })}`, { signal }),
    initialPageParam: null as string | null,
    getNextPageParam: (last) => last.nextCursor,
    placeholderData: keepPreviousData,
  });

/** The loaded pages as one list; a row that moved between two page loads is shown once, where it was first. */
export function queueItems(pages: readonly QueuePage[] | undefined): QueueItem[] {
  const seen = new Set<string>();
  const out: QueueItem[] = [];
  for (const p of pages ?? []) for (const i of p.items) if (!seen.has(i.id)) (seen.add(i.id), out.push(i));
  return out;
}

/** Only what holds whatever the filters (assignees, repairs to verify, tags to clear): one row is the smallest page. */
export const queueSummaryQuery = () =>
  queryOptions({
    queryKey: repairKeys.summary(),
    queryFn: ({ signal }) => api<QueuePage>(`/repairs?limit=1`, { signal }),
    staleTime: 30_000,
  });

/** The CSV export of exactly what the screen is filtered and sorted to (every row, not only the pages shown). */
export const queueCsvHref = (f: QueueFilters, sort?: QueueSort) => `/api/repairs.csv${queueSearch(f, { sort })}`;
