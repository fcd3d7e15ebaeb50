import { useInfiniteQuery, useQuery } from '@tanstack/react-query';
import type { SortingState } from '@tanstack/react-table';
import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import { can } from '../../../../shared/domain/roles';
import { dueStatesQuery } from '../api/due-flags';
import { meQuery } from '../api/me';
import { unitsQuery, yardsQuery } from '../api/pickers';
import { parseQueueSort, QUEUE_FILTER_KEYS, queueCsvHref, queueItems, queueQuery, queueSearch, type QueueFilterKey, type QueueFilters } from '../api/queue';
import { settingsQuery } from '../api/settings';
import { QueueFilterBar } from './queue-filters';
import { QueueTable } from './queue-table';
import { TagsToClear } from './tags-to-clear';

const count = (n: number) => n.toLocaleString('en-US');

export function QueuePage() {
  const [params, setParams] = useSearchParams();
  const filters = useMemo<QueueFilters>(() => Object.fromEntries(QUEUE_FILTER_KEYS.map((k) => [k, params.get(k) ?? '']).filter(([, v]) => v)), [params]);
  const me = useQuery(meQuery());
  const settings = useQuery(settingsQuery());
  const yards = useQuery(yardsQuery());
  const units = useQuery(unitsQuery());
  // The sort lives in the address like the filters, so a sorted queue can be shared, reloaded and exported as it is.
  const sort = parseQueueSort(params.get('sort'));
  const queue = useInfiniteQuery(queueQuery(filters, sort));
  const overdue = useQuery(dueStatesQuery());
  const setParam = useCallback(
    (key: QueueFilterKey | 'sort', value: string) =>
      setParams(
        (p) => {
          const n = new URLSearchParams(p);
          if (value) n.set(key, value);
          else n.delete(key);
          return n;
        },
        { replace: true },
      ),
    [setParams],
  );
  const sorting = useMemo<SortingState>(() => (sort ? [{ id: sort.split('.')[0], desc: sort.endsWith('.desc') }] : []), [sort]);
  const setSorting = useCallback((s: SortingState) => setParam('sort', s[0] ? `${s[0].id}.${s[0].desc ? 'desc' : 'asc'}` : ''), [setParam]);
  const items = useMemo(() => queueItems(queue.data?.pages), [queue.data]);
  // Totals and the filter-independent summary from the newest page loaded.
  const last = queue.data?.pages.at(-1);
  const total = last?.total ?? 0;
  const toVerify = last?.toVerify ?? 0;
  const filtered = Object.keys(filters).length > 0;
  const tz = settings.data?.timeZone;
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end gap-3">
        <div className="mr-auto">
          <h1 className="text-3xl font-bold">Repair queue</h1>
          {queue.data && (
            <p className="text-graphite-2" aria-live="polite">
              {items.length < total ? `Showing ${count(items.length)} of ${count(total)} findings` : `${count(total)} finding${total === 1 ? '' : 's'}`}
              {items[0]?.nonComplying && ' · non-complying units first'}
            </p>
          )}
        </div>
        <a className="btn" href={queueCsvHref(filters, sort)} download>
          Export CSV
        </a>
      </div>
      {me.data && can(me.data.role, 'repair') && last && <TagsToClear units={last.tagsToClear} timeZone={tz} />}
      {me.data && me.data.role === 'inspector' && toVerify > 0 && filters.state !== 'repaired' && (
        <button type="button" className="btn-primary" onClick={() => setParam('state', 'repaired')}>
          Show the {toVerify} repair{toVerify === 1 ? '' : 's'} waiting to be verified
        </button>
      )}
      <QueueFilterBar
        filters={filters}
        onChange={setParam}
        onClear={() => setParams((p) => new URLSearchParams(p.get('sort') ? { sort: p.get('sort')! } : {}), { replace: true })}
        yards={yards.data?.items ?? []}
        units={(units.data?.items ?? []).map((u) => ({ id: u.id, roadNumber: u.roadNumber }))}
        people={last?.assignees ?? []}
      />
      {queue.isPending && <p>Loading the queue…</p>}
      {queue.isError && !queue.isFetchNextPageError && (
        <p role="alert" className="card border-federal p-3 font-bold text-federal">
          The queue could not be loaded: {queue.error.message}
        </p>
      )}
      {queue.data && items.length === 0 && (
        <section className="card space-y-2 p-6 text-center">
          <p className="text-2xl font-bold">{filtered ? 'No findings match these filters' : 'No open findings — nothing to repair'}</p>
          {filtered && <p className="text-graphite-2">Clear a filter to see more of the queue.</p>}
        </section>
      )}
      {items.length > 0 && (
        <div className={queue.isPlaceholderData ? 'opacity-60' : ''}>
          <QueueTable items={items} sorting={sorting} onSortingChange={setSorting} timeZone={tz} backSearch={queueSearch(filters, { sort })} overdue={overdue.data} />
        </div>
      )}
      {queue.isFetchNextPageError && (
        <p role="alert" className="card border-federal p-3 font-bold text-federal">
          More of the queue could not be loaded: {queue.error?.message}
        </p>
      )}
      {queue.hasNextPage && !queue.isPlaceholderData && (
        <div className="flex flex-wrap items-center gap-3">
          <button type="button" className="btn min-w-48" disabled={queue.isFetchingNextPage} onClick={() => void queue.fetchNextPage()}>
            {queue.isFetchingNextPage ? 'Loading more…' : 'Show more'}
          </button>
          <span className="text-graphite-2">
            {count(total - items.length)} more finding{total - items.length === 1 ? '' : 's'}
          </span>
        </div>
      )}
    </div>
  );
}
