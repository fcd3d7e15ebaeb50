import { Link } from 'react-router-dom';
import type { HotSpotsResponse } from '../../../../shared/api/hot-spots';
import { formatCount } from '../../../../shared/hot-spots/rates';

/** Units with the most repeats in the selection. */
export function RepeatUnits({ data }: { data: HotSpotsResponse }) {
  return (
    <section className="card space-y-2 p-3" aria-labelledby="hs-rep-title">
      <h2 id="hs-rep-title" className="text-xl font-bold">Units with the most repeats</h2>
      <p className="text-sm text-graphite-2">A repeat: the same unit, part and defect type had a finding repaired within the previous {data.repeatWindowDays} days.</p>
      {data.repeatUnits.length === 0 ? (
        <p>No repeats in this selection.</p>
      ) : (
        <ol className="divide-y divide-rule">
          {data.repeatUnits.map((u) => (
            <li key={u.unitId}>
              <Link to={`/units/${u.unitId}`} className="flex min-h-12 items-center gap-3 px-1 hover:bg-paper-2">
                <span className="font-bold">{u.roadNumber}</span>
                <span className="text-sm text-graphite-2">F on the {u.frontEnd === 'short_hood' ? 'short' : 'long'} hood</span>
                <span className="ml-auto tabular-nums">
                  {formatCount(u.repeats)} repeat{u.repeats === 1 ? '' : 's'} of {formatCount(u.findings)}
                </span>
              </Link>
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}
