import { createColumnHelper, flexRender, getCoreRowModel, getSortedRowModel, useReactTable, type SortingFn, type SortingState } from '@tanstack/react-table';
import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import type { QueueItem } from '../../../../shared/api/repairs';
import { FINDING_STATES, FINDING_WEIGHTS } from '../../../../shared/domain/states';
import { ageWords, formatWhen } from '../lib/format';
import { T } from '../lib/table-classes';
import { NonComplyingBadge, OverdueBadge, StateBadge } from './badges';
import { WeightMark } from './weight-mark';

const col = createColumnHelper<QueueItem>();
const byOrder =
  (order: readonly string[], key: 'weight' | 'state'): SortingFn<QueueItem> =>
  (a, b) =>
    order.indexOf(a.original[key]) - order.indexOf(b.original[key]);

/** The user's sort always sits under "non-complying units first". */
const NC_FIRST = { id: 'nonComplying', desc: true };
const HIDDEN = { nonComplying: false };

interface Props {
  items: QueueItem[];
  sorting: SortingState;
  onSortingChange: (s: SortingState) => void;
  timeZone?: string;
  backSearch: string;
  /** Units overdue on any interval of the due board. */
  overdue?: ReadonlySet<string>;
}

export function QueueTable({ items, sorting, onSortingChange, timeZone, backSearch, overdue }: Props) {
  const columns = useMemo(
    () => [
      col.accessor((r) => (r.nonComplying ? 1 : 0), { id: 'nonComplying', header: 'Non-complying' }),
      col.accessor('roadNumber', {
        header: 'Unit',
        cell: (c) => (
          <div className="space-y-1">
            <div className="text-xl font-bold whitespace-nowrap">{c.getValue()}</div>
            <div className="text-base text-graphite-2">{c.row.original.yardName ?? 'No yard'}</div>
            <div className="flex flex-wrap gap-1">
              {c.row.original.nonComplying && <NonComplyingBadge />}
              {overdue?.has(c.row.original.unitId) && <OverdueBadge />}
            </div>
          </div>
        ),
      }),
      col.accessor('label', {
        header: 'Finding',
        cell: (c) => {
          const r = c.row.original;
          return (
            <Link to={`/repairs/findings/${r.id}`} state={{ back: backSearch }} className="block min-h-12 rounded-md py-1 hover:bg-paper-2 focus-visible:outline-3 focus-visible:outline-accent">
              <span className="block font-bold underline decoration-rule decoration-2 underline-offset-4">{r.label}</span>
              <span className="block">{r.defectLabel}</span>
              {r.rule && <span className="block text-sm text-graphite-2">{r.rule}</span>}
            </Link>
          );
        },
      }),
      col.accessor('weight', { header: 'Weight', sortingFn: byOrder(FINDING_WEIGHTS, 'weight'), cell: (c) => <WeightMark weight={c.getValue()} /> }),
      col.accessor('state', { header: 'State', sortingFn: byOrder(FINDING_STATES, 'state'), cell: (c) => <StateBadge state={c.getValue()} /> }),
      col.accessor((r) => r.assigneeName ?? '', {
        id: 'assignee',
        header: 'Assigned to',
        cell: (c) => (c.getValue() ? <span>{c.getValue()}</span> : <span className="text-graphite-2">Nobody yet</span>),
      }),
      col.accessor('ageDays', {
        header: 'Found',
        cell: (c) => (
          <div>
            <div className="font-bold">{ageWords(c.getValue())}</div>
            <div className="text-sm text-graphite-2">
              {formatWhen(c.row.original.createdAt, timeZone)} · {c.row.original.createdByName}
            </div>
          </div>
        ),
      }),
    ],
    [timeZone, backSearch, overdue],
  );
  // Stable state objects: a fresh array each render would recompute the sorted rows, whose auto-reset
  // schedules a table state update, which renders again, without end.
  const state = useMemo(() => ({ sorting: [NC_FIRST, ...sorting], columnVisibility: HIDDEN }), [sorting]);
  const table = useReactTable({
    data: items,
    columns,
    state,
    onSortingChange: (u) => {
      const next = typeof u === 'function' ? u(state.sorting) : u;
      onSortingChange(next.filter((s) => s.id !== NC_FIRST.id));
    },
    enableMultiSort: false,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  return (
    <table className={T.table} aria-label="Repair queue">
      <thead className={T.thead}>
        {table.getHeaderGroups().map((g) => (
          <tr key={g.id}>
            {g.headers.map((h) => {
              const dir = h.column.getIsSorted();
              return (
                <th key={h.id} className={T.th} aria-sort={dir === 'asc' ? 'ascending' : dir === 'desc' ? 'descending' : 'none'}>
                  <button type="button" className="inline-flex min-h-12 items-center gap-1 uppercase hover:text-graphite" onClick={h.column.getToggleSortingHandler()}>
                    {flexRender(h.column.columnDef.header, h.getContext())}
                    <span aria-hidden="true" className="w-4 text-graphite">
                      {dir === 'asc' ? '▲' : dir === 'desc' ? '▼' : ''}
                    </span>
                    <span className="sr-only">{dir ? `, sorted ${dir === 'asc' ? 'ascending' : 'descending'}` : ', sort'}</span>
                  </button>
                </th>
              );
            })}
          </tr>
        ))}
      </thead>
      <tbody className={T.tbody}>
        {table.getRowModel().rows.map((row) => (
          <tr key={row.id} className={`${T.tr} ${row.original.nonComplying ? 'border-l-8 border-l-federal md:border-l-8 md:border-l-federal' : ''}`} data-testid="queue-row" data-nc={row.original.nonComplying || undefined}>
            {row.getVisibleCells().map((cell) => (
              <td key={cell.id} className={T.td} data-label={String(cell.column.columnDef.header)}>
                <div className="min-w-0">{flexRender(cell.column.columnDef.cell, cell.getContext())}</div>
              </td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}
