import { useQuery } from '@tanstack/react-query';
import { useId, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import type { DueItem } from '../../../../shared/due/board';
import { DUE_FILTER_KEYS, dueCsvHref, dueQuery, yardsQuery, type DueFilters, type DueUnit } from '../api/due';
import { civilDateWords, daysWords } from '../lib/due-words';
import { StatusMark, StatusShape } from './status-mark';

// Fixed columns in the order a foreman reads them; anything else a railroad tracks goes under "Other".
const COLUMNS = [
  { key: 'daily', title: 'Daily' },
  { key: 'periodic', title: 'Periodic' },
  { key: 'cm_33_day', title: '33-day' },
  { key: 'annual', title: 'Annual' },
  { key: 'main_reservoir', title: 'Main reservoir' },
  { key: 'hand_brake', title: 'Hand brake' },
] as const;

const td =
  'flex gap-3 py-1 before:w-32 before:shrink-0 before:text-sm before:font-bold before:tracking-wider before:text-graphite-2 before:uppercase before:content-[attr(data-label)] md:table-cell md:px-2 md:py-2 md:align-top md:before:hidden';

export function DueBoardPage() {
  const id = useId();
  const [params, setParams] = useSearchParams();
  const filters = useMemo<DueFilters>(() => Object.fromEntries(DUE_FILTER_KEYS.map((k) => [k, params.get(k) ?? '']).filter(([, v]) => v)), [params]);
  const board = useQuery(dueQuery(filters));
  const yards = useQuery(yardsQuery());
  const set = (k: (typeof DUE_FILTER_KEYS)[number], v: string) =>
    setParams(
      (p) => {
        const n = new URLSearchParams(p);
        if (v) n.set(k, v);
        else n.delete(k);
        return n;
      },
      { replace: true },
    );
  const units = board.data?.items ?? [];
  const columns = COLUMNS.filter((c) => c.key !== 'cm_33_day' || units.some((u) => u.items.some((i) => i.key === c.key)));
  const hasOther = units.some((u) => u.items.some((i) => i.key.startsWith('custom:')));
  const sourceOf = (key: string) => units.flatMap((u) => u.items).find((i) => i.key === key && i.source)?.source ?? null;
  const count = (s: DueUnit['state']) => units.filter((u) => u.state === s).length;
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end gap-3">
        <div className="mr-auto">
          <h1 className="text-3xl font-bold">Due board</h1>
          {board.data && (
            <p className="text-lg" data-testid="due-computed-for">
              Computed for <strong>{civilDateWords(board.data.on)}</strong> in the railroad’s time zone, <strong>{board.data.timeZone}</strong>
            </p>
          )}
        </div>
        <a className="btn" href={dueCsvHref(filters)} download>
          Export CSV
        </a>
      </div>
      <form className="grid grid-cols-2 gap-3 md:grid-cols-4" aria-label="Filter the due board" onSubmit={(e) => e.preventDefault()}>
        <div>
          <label className="label" htmlFor={`${id}-yard`}>
            Yard
          </label>
          <select id={`${id}-yard`} className="field" value={filters.yard ?? ''} onChange={(e) => set('yard', e.target.value)}>
            <option value="">All yards</option>
            {(yards.data?.items ?? []).map((y) => (
              <option key={y.id} value={y.id}>
                {y.name}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label className="label" htmlFor={`${id}-state`}>
            State
          </label>
          <select id={`${id}-state`} className="field" value={filters.state ?? ''} onChange={(e) => set('state', e.target.value)}>
            <option value="">Every unit</option>
            <option value="overdue">Overdue on anything</option>
            <option value="due_soon">Due soon</option>
            <option value="good">All good</option>
          </select>
        </div>
        <div>
          <label className="label" htmlFor={`${id}-on`}>
            Look ahead to
          </label>
          <input id={`${id}-on`} type="date" className="field" value={filters.on ?? ''} onChange={(e) => set('on', e.target.value)} />
        </div>
        {filters.on && (
          <div className="flex items-end">
            <button type="button" className="btn" onClick={() => set('on', '')}>
              Back to today
            </button>
          </div>
        )}
      </form>
      {board.isPending && <p>Loading the due board…</p>}
      {board.isError && (
        <p role="alert" className="card border-federal p-3 font-bold text-federal">
          The due board could not be loaded: {board.error.message}
        </p>
      )}
      {board.data && (
        <p className="flex flex-wrap gap-x-5 gap-y-1 text-lg" aria-live="polite" data-testid="due-summary">
          <span className="inline-flex items-center gap-1.5">
            <span className="text-federal"><StatusShape status="overdue" /></span>
            <strong>{count('overdue')}</strong> unit{count('overdue') === 1 ? '' : 's'} overdue on something
          </span>
          <span className="inline-flex items-center gap-1.5">
            <span className="text-shop"><StatusShape status="due_soon" /></span>
            <strong>{count('due_soon')}</strong> due within 7 days
          </span>
          <span className="inline-flex items-center gap-1.5">
            <span className="text-ok"><StatusShape status="good" /></span>
            <strong>{count('good')}</strong> all good
          </span>
        </p>
      )}
      {board.data && units.length === 0 && (
        <section className="card p-6 text-center text-2xl font-bold">{Object.keys(filters).length ? 'No unit matches these filters' : 'No units on the roster yet'}</section>
      )}
      {units.length > 0 && (
        <table className={`w-full border-collapse text-left ${board.isPlaceholderData ? 'opacity-60' : ''}`} aria-label="Due board">
          <thead className="hidden md:table-header-group">
            <tr>
              <th className="border-b-2 border-graphite px-2 py-1 align-bottom text-sm font-bold tracking-wider text-graphite-2 uppercase">Unit</th>
              {columns.map((c) => (
                <th key={c.key} className="border-b-2 border-graphite px-2 py-1 align-bottom text-sm font-bold tracking-wider text-graphite-2 uppercase">
                  {c.title}
                  {sourceOf(c.key) && <span className="block text-xs font-normal tracking-normal normal-case">{sourceOf(c.key)}</span>}
                </th>
              ))}
              {hasOther && <th className="border-b-2 border-graphite px-2 py-1 align-bottom text-sm font-bold tracking-wider text-graphite-2 uppercase">Other</th>}
            </tr>
          </thead>
          <tbody className="block md:table-row-group">
            {units.map((u) => (
              <tr
                key={u.unitId}
                data-testid="due-row"
                data-unit={u.roadNumber}
                data-state={u.state}
                className={`card mb-3 block p-2 md:mb-0 md:table-row md:rounded-none md:border-0 md:border-b md:border-rule md:p-0 ${u.state === 'overdue' ? 'border-l-8 border-l-federal md:border-l-8 md:border-l-federal' : ''}`}
              >
                <td className={td} data-label="Unit">
                  <UnitCell u={u} />
                </td>
                {columns.map((c) => {
                  const item = u.items.find((i) => i.key === c.key);
                  return (
                    <td key={c.key} className={item ? td : `${td} max-md:hidden`} data-label={c.title} data-item={c.key}>
                      {item ? <ItemCell item={item} /> : <span className="text-graphite-2">—</span>}
                    </td>
                  );
                })}
                {hasOther && (
                  <td className={td} data-label="Other">
                    <ul className="space-y-2">
                      {u.items
                        .filter((i) => i.key.startsWith('custom:'))
                        .map((i) => (
                          <li key={i.key}>
                            <span className="block text-sm font-bold">{i.label}</span>
                            <ItemCell item={i} />
                          </li>
                        ))}
                    </ul>
                  </td>
                )}
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </div>
  );
}

function UnitCell({ u }: { u: DueUnit }) {
  const bad = u.items.filter((i) => i.status === 'overdue' || i.status === 'missing').length;
  return (
    <div className="space-y-1">
      <div className="text-xl font-bold whitespace-nowrap">{u.roadNumber}</div>
      <div className="text-base text-graphite-2">
        {u.yardName ?? 'No yard'}
        {u.serviceState !== 'in_service' && ` · ${u.serviceState.replace(/_/g, ' ')}`}
      </div>
      {u.state === 'overdue' && (
        <span className="inline-block rounded border-2 border-federal px-1.5 py-0.5 text-sm leading-none font-bold whitespace-nowrap text-federal">
          Overdue on {bad} item{bad === 1 ? '' : 's'}
        </span>
      )}
      {u.nonComplying && (
        <span className="ml-1 inline-block rounded border-2 border-federal bg-federal px-1.5 py-0.5 text-sm leading-none font-bold tracking-wider text-paper" data-testid="due-nc">
          NON-COMPLYING
        </span>
      )}
    </div>
  );
}

function ItemCell({ item }: { item: DueItem }) {
  return (
    <div data-status={item.status} className="flex flex-wrap items-baseline gap-x-2 md:block">
      <StatusMark status={item.status} />
      <span className="text-base md:block">{daysWords(item)}</span>
      <span className="w-full text-sm text-graphite-2 md:block">
        {item.lastDone && item.status !== 'not_in_use' && `last ${item.lastDone}`}
        {item.key === 'periodic' && /184/.test(item.label) && <span className="block">184 days (condition monitoring)</span>}
        {item.source && <span className="md:hidden"> · {item.source}</span>}
      </span>
    </div>
  );
}
