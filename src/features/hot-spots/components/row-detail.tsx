import { useEffect, useRef } from 'react';
import { Link } from 'react-router-dom';
import type { HotSpotRow, HotSpotsParams } from '../../../../shared/api/hot-spots';
import { formatCount, formatRate } from '../../../../shared/hot-spots/rates';
import { findingsCsvHref, useRowFindings } from '../api/hot-spots';
import { WeightMark } from '../../../components/weight-mark';

const STATE_WORD = { open: 'Open', in_repair: 'In repair', repaired: 'Repaired', verified: 'Verified', voided: 'Voided' } as const;

const when = (iso: string, timeZone: string) =>
  new Intl.DateTimeFormat('en-US', { timeZone, year: 'numeric', month: 'short', day: 'numeric' }).format(new Date(iso));

/** The selected part: its figures, why it stands out or not, and its findings with links to them. */
export function RowDetail({ row, filters, timeZone, repeatWindowDays, onClose }: {
  row: HotSpotRow;
  filters: HotSpotsParams;
  timeZone: string;
  repeatWindowDays: number;
  onClose(): void;
}) {
  const list = useRowFindings(filters, row.label);
  const ref = useRef<HTMLElement>(null);
  // On a narrow screen the detail sits below the table: bring it into view when a row is picked.
  useEffect(() => {
    if (!window.matchMedia('(min-width: 1024px)').matches) ref.current?.scrollIntoView({ block: 'start' });
  }, [row.label]);
  return (
    <section ref={ref} className="card scroll-mt-20 space-y-3 p-3" aria-labelledby="hs-row-title" data-testid="row-detail">
      <div className="flex flex-wrap items-start gap-2">
        <h2 id="hs-row-title" className="mr-auto text-2xl font-bold">{row.label}</h2>
        <a className="btn" href={findingsCsvHref(filters, row.label)} download>
          Export these findings (CSV)
        </a>
        <button type="button" className="btn" onClick={onClose}>Close</button>
      </div>
      <p className="text-lg">
        {formatCount(row.findings)} finding{row.findings === 1 ? '' : 's'} on {formatCount(row.units)} unit{row.units === 1 ? '' : 's'},{' '}
        {formatRate(row.ratePer100)} per 100 inspections, {formatCount(row.repeats)} repeat{row.repeats === 1 ? '' : 's'} (same unit, part and defect
        within {repeatWindowDays} days of a repair).
      </p>
      {row.standOut && (
        <p className={`rounded-md border-l-4 p-2 ${row.standOut.standsOut ? 'border-federal bg-paper-2' : 'border-rule'}`}>{row.standOut.words}</p>
      )}
      {list.isPending && <p>Loading the findings…</p>}
      {list.isError && <p role="alert">The findings could not be loaded: {list.error.message}</p>}
      {list.data && (
        <>
          <p className="text-sm text-graphite-2">
            {list.data.total > list.data.items.length ? `The newest ${list.data.items.length} of ${formatCount(list.data.total)}; the export has them all.` : 'Newest first.'}
          </p>
          <ul className="relative divide-y divide-rule lg:max-h-[28rem] lg:overflow-y-auto" aria-label={`Findings on ${row.label}`}>
            {list.data.items.map((f) => (
              <li key={f.id}>
                <Link to={`/repairs/findings/${f.id}`} className="flex min-h-12 flex-wrap items-center gap-x-3 gap-y-1 px-1 py-2 hover:bg-paper-2">
                  <span className="inline-flex items-center gap-1 font-bold">
                    <WeightMark weight={f.weight} size={16} word="hidden" />
                    {f.roadNumber}
                  </span>
                  <span>{f.defectLabel}</span>
                  <span className="text-graphite-2">{when(f.createdAt, timeZone)}</span>
                  <span className="text-graphite-2">{STATE_WORD[f.state]}</span>
                  {f.repeat && <span className="rounded border-2 border-shop px-1 text-sm font-bold text-shop">Repeat</span>}
                  {f.frontEnd === 'long_hood' && <span className="text-sm text-graphite-2">F on the long hood</span>}
                </Link>
              </li>
            ))}
          </ul>
        </>
      )}
    </section>
  );
}
