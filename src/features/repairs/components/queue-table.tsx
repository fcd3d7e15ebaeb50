import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import type { QueueItem, QueueSortColumn } from '../../../../shared/api/repairs';
import { ageWords, formatWhen } from '../lib/format';
import { T } from '../lib/table-classes';
import { NonComplyingBadge, OverdueBadge, StateBadge } from './badges';
import { WeightMark } from '../../../components/weight-mark';

const col = createColumnHelper<QueueItem>();
// Column ids are the server's sort columns: the server sorts (always under "non-complying units first").
const ID: { [K in QueueSortColumn]: K } = { unit: 'unit', finding: 'finding', weight: 'weight', state: 'state', assignee: 'assignee', age: 'age' };

interface Props {
  items: QueueItem[];
  /** At most one column; the rows arrive in this order from the server. */
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
      col.accessor('roadNumber', {
        id: ID.unit,
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
        id: ID.finding,
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
      col.accessor('weight', { id: ID.weight, header: 'Weight', cell: (c) => <WeightMark weight={c.getValue()} /> }),
      col.accessor('state', { id: ID.state, header: 'State', cell: (c) => <StateBadge state={c.getValue()} /> }),
      col.accessor((r) => r.assigneeName ?? '', {
        id: ID.assignee,
        header: 'Assigned to',
        cell: (c) => (c.getValue() ? <span>{c.getValue()}</span> : <span className="text-graphite-2">Nobody yet</span>),
      }),
      col.accessor('ageDays', {
        id: ID.age,
        header: 'Found',
        // The first tap on an age puts the oldest first.
        sortDescFirst: true,
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
  const state = useMemo(() => ({ sorting }), [sorting]);
  const table = useReactTable({
    data: items,
    columns,
    state,
    manualSorting: true,
    onSortingChange: (u) => onSortingChange(typeof u === 'function' ? u(sorting) : u),
    enableMultiSort: false,
    getCoreRowModel: getCoreRowModel(),
    // Rows keep their identity as more pages arrive.
    getRowId: (r) => r.id,
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
