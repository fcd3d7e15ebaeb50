import { useQuery } from '@tanstack/react-query';
import type { SortingState } from '@tanstack/react-table';
import { useCallback, useMemo, useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { can } from '../../../../shared/domain/roles';
import { dueStatesQuery } from '../api/due-flags';
import { meQuery } from '../api/me';
import { unitsQuery, yardsQuery } from '../api/pickers';
import { QUEUE_FILTER_KEYS, queueCsvHref, queueQuery, queueSearch, type QueueFilterKey, type QueueFilters } from '../api/queue';
import { settingsQuery } from '../api/settings';
import { QueueFilterBar } from './queue-filters';
import { QueueTable } from './queue-table';
import { TagsToClear } from './tags-to-clear';

export function QueuePage() {
  const [params, setParams] = useSearchParams();
  const filters = useMemo<QueueFilters>(() => Object.fromEntries(QUEUE_FILTER_KEYS.map((k) => [k, params.get(k) ?? '']).filter(([, v]) => v)), [params]);
  const me = useQuery(meQuery());
  const settings = useQuery(settingsQuery());
  const yards = useQuery(yardsQuery());
  const units = useQuery(unitsQuery());
  const queue = useQuery(queueQuery(filters));
  // Everyone who has work in the queue, for the "assigned to" filter, whatever the current filters.
  const all = useQuery(queueQuery({}));
  const overdue = useQuery(dueStatesQuery());
  const [sorting, setSorting] = useState<SortingState>([]);
  const setFilter = useCallback(
    (key: QueueFilterKey, value: string) =>
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
  const people = useMemo(() => {
    const m = new Map<string, string>();
    for (const i of all.data?.items ?? []) if (i.assignedTo && i.assigneeName) m.set(i.assignedTo, i.assigneeName);
    return [...m].map(([id, name]) => ({ id, name })).sort((a, b) => a.name.localeCompare(b.name));
  }, [all.data]);
  const items = queue.data?.items ?? [];
  const toVerify = (all.data?.items ?? []).filter((i) => i.state === 'repaired').length;
  const ncUnits = new Set(items.filter((i) => i.nonComplying).map((i) => i.unitId)).size;
  const filtered = Object.keys(filters).length > 0;
  const tz = settings.data?.timeZone;
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end gap-3">
        <div className="mr-auto">
          <h1 className="text-3xl font-bold">Repair queue</h1>
          {queue.data && (
            <p className="text-graphite-2" aria-live="polite">
              {items.length} finding{items.length === 1 ? '' : 's'}
              {ncUnits > 0 && ` · ${ncUnits} non-complying unit${ncUnits === 1 ? '' : 's'} first`}
            </p>
          )}
        </div>
        <a className="btn" href={queueCsvHref(filters)} download>
          Export CSV
        </a>
      </div>
      {me.data && can(me.data.role, 'repair') && <TagsToClear timeZone={tz} />}
      {me.data && me.data.role === 'inspector' && toVerify > 0 && filters.state !== 'repaired' && (
        <button type="button" className="btn-primary" onClick={() => setFilter('state', 'repaired')}>
          Show the {toVerify} repair{toVerify === 1 ? '' : 's'} waiting to be verified
        </button>
      )}
      <QueueFilterBar
        filters={filters}
        onChange={setFilter}
        onClear={() => setParams(new URLSearchParams(), { replace: true })}
        yards={yards.data?.items ?? []}
        units={(units.data?.items ?? []).map((u) => ({ id: u.id, roadNumber: u.roadNumber }))}
        people={people}
      />
      {queue.isPending && <p>Loading the queue…</p>}
      {queue.isError && (
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
          <QueueTable items={items} sorting={sorting} onSortingChange={setSorting} timeZone={tz} backSearch={queueSearch(filters)} overdue={overdue.data} />
        </div>
      )}
    </div>
  );
}
