import { useQuery } from '@tanstack/react-query';
import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import type { UnitDueState } from '../../../../shared/due/board';
import { dueBoardQuery } from '../api/due';
import { unitTypesQuery, yardsQuery } from '../api/pickers';
import { rosterQuery } from '../api/roster';
import { filtersFromSearch, type RosterFilterKey } from '../lib/filters';
import { plural } from '../lib/format';
import { RosterFilterBar } from './roster-filters';
import { RosterCards, RosterTable } from './roster-list';

/** The roster: every unit with its type, F end, yard and state, non-complying units first. */
export function RosterPage() {
  const [params, setParams] = useSearchParams();
  const filters = useMemo(() => filtersFromSearch(params), [params]);
  const roster = useQuery(rosterQuery(filters));
  const yards = useQuery(yardsQuery());
  const types = useQuery(unitTypesQuery());
  const due = useQuery(dueBoardQuery());
  const dueByUnit = useMemo(() => new Map<string, UnitDueState>((due.data?.items ?? []).map((r) => [r.unitId, r.state])), [due.data]);

  const setFilter = useCallback(
    (key: RosterFilterKey, value: string) =>
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

  const units = roster.data?.items ?? [];
  const filtered = Object.keys(filters).length > 0;
  const nc = units.filter((u) => u.nonComplying).length;
  const overdue = units.filter((u) => dueByUnit.get(u.id) === 'overdue').length;

  return (
    <div className="space-y-4">
      <div>
        <h1 className="text-3xl font-bold">Units</h1>
        {roster.data && (
          <p className="text-graphite-2" aria-live="polite" data-testid="roster-count">
            {plural(units.length, 'unit')}
            {filtered && ' match'}
            {nc > 0 && ` · ${nc} non-complying, listed first`}
            {overdue > 0 && ` · ${overdue} overdue on the due board`}
          </p>
        )}
      </div>
      <RosterFilterBar
        filters={filters}
        onChange={setFilter}
        onClear={() => setParams(new URLSearchParams(), { replace: true })}
        yards={yards.data?.items ?? []}
        unitTypes={types.data?.items ?? []}
      />
      {roster.isPending && <p>Loading the roster…</p>}
      {roster.isError && (
        <p role="alert" className="card border-federal p-3 font-bold text-federal">
          The roster could not be loaded: {roster.error.message}
        </p>
      )}
      {roster.data && units.length === 0 && (
        <section className="card space-y-3 p-6 text-center">
          <p className="text-2xl font-bold">{filtered ? 'No unit matches these filters' : 'No units on the roster yet'}</p>
          <p>{filtered ? 'Try another road number, or clear the filters to see every unit.' : 'An admin adds units; they will be listed here.'}</p>
          {filtered && (
            <button type="button" className="btn" onClick={() => setParams(new URLSearchParams(), { replace: true })}>
              Clear filters
            </button>
          )}
        </section>
      )}
      {units.length > 0 && (
        <div className={roster.isPlaceholderData ? 'opacity-60' : ''} aria-busy={roster.isFetching}>
          <RosterTable units={units} due={dueByUnit} />
          <RosterCards units={units} due={dueByUnit} />
        </div>
      )}
    </div>
  );
}
