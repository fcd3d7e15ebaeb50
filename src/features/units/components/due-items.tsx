import type { DueItem } from '../../../../shared/due/board';
import { formatDay } from '../lib/format';

const STATUS: Record<DueItem['status'], { word: string; cls: string }> = {
  good: { word: 'Good', cls: 'border-ok text-ok' },
  due_soon: { word: 'Due soon', cls: 'border-dashed border-graphite text-graphite' },
  overdue: { word: 'Overdue', cls: 'border-graphite bg-graphite text-paper' },
  missing: { word: 'No date on record', cls: 'border-graphite bg-graphite text-paper' },
  not_in_use: { word: 'Not in use', cls: 'border-rule text-graphite-2' },
};

function daysWords(i: DueItem): string {
  if (i.status === 'missing') return 'Counts as overdue until a date is recorded';
  if (i.status === 'not_in_use') return 'No daily inspection while the unit is not in use';
  if (i.daysLeft === null) return '';
  // The daily done yesterday is due today, not yet missed (the due board's own rule).
  if (i.daysLeft < 0 && i.status !== 'overdue') return 'Due today';
  if (i.daysLeft < 0) return `Overdue by ${-i.daysLeft} day${i.daysLeft === -1 ? '' : 's'}`;
  if (i.daysLeft === 0) return 'Last good day is today';
  return `${i.daysLeft} day${i.daysLeft === 1 ? '' : 's'} left`;
}

/** The unit's line of the due board: each interval with its state, days left and rule. */
export function DueItems({ items, on }: { items?: readonly DueItem[]; on?: string }) {
  return (
    <section aria-labelledby="due-title" className="card space-y-2 p-3">
      <h2 id="due-title" className="text-xl font-bold">
        Due {on && <span className="text-base font-normal text-graphite-2">on {formatDay(on)}</span>}
      </h2>
      {!items ? (
        <p className="text-graphite-2">Loading the due board…</p>
      ) : (
        <ul className="divide-y divide-rule">
          {items.map((i) => (
            <li key={i.key} className="space-y-0.5 py-2" data-due={i.key} data-status={i.status}>
              <p className="flex flex-wrap items-center justify-between gap-2">
                <span className="font-bold">{i.label}</span>
                <span className={`rounded border-2 px-1.5 py-0.5 text-sm leading-none font-bold whitespace-nowrap uppercase ${STATUS[i.status].cls}`}>{STATUS[i.status].word}</span>
              </p>
              <p className="text-sm">{daysWords(i)}</p>
              <p className="text-sm text-graphite-2">
                Last done {formatDay(i.lastDone)}
                {i.lastGoodDay && ` · good through ${formatDay(i.lastGoodDay)}`}
                {i.source && ` · ${i.source === 'railroad' ? 'railroad’s own item' : i.source}`}
              </p>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
