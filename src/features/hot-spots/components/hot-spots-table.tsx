import type { HotSpotRow } from '../../../../shared/api/hot-spots';
import { formatCount, formatRate } from '../../../../shared/hot-spots/rates';

/** The table by part as a person names it; a row is a button that selects its part. */
export function HotSpotsTable({ rows, selected, onSelect, inspections }: {
  rows: HotSpotRow[];
  selected: string | null;
  onSelect(label: string | null): void;
  inspections: number;
}) {
  if (!rows.length) return <p className="card p-4 text-lg">No findings on this unit type with these filters.</p>;
  return (
    <div className="card overflow-x-auto">
      <table className="w-full border-collapse text-left text-base" aria-label="Findings by part">
        <thead>
          <tr className="border-b-2 border-graphite">
            <th scope="col" className="p-2">Part</th>
            <th scope="col" className="p-2 text-right">Findings</th>
            <th scope="col" className="p-2 text-right" title={`Per 100 inspections of this unit type (${formatCount(inspections)} in the range)`}>
              Per 100 insp.
            </th>
            <th scope="col" className="hidden p-2 text-right sm:table-cell">Units</th>
            <th scope="col" className="p-2 text-right">Repeats</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => {
            const on = r.label === selected;
            return (
              <tr
                key={r.label}
                aria-selected={on}
                data-testid="hot-spot-row"
                data-label={r.label}
                className={`cursor-pointer border-b border-rule ${on ? 'bg-accent-soft' : 'hover:bg-paper-2'}`}
                onClick={() => onSelect(on ? null : r.label)}
              >
                <th scope="row" className="p-0 font-normal">
                  <button
                    type="button"
                    className={`flex min-h-12 w-full items-center gap-2 px-2 text-left ${on ? 'font-bold text-accent' : ''}`}
                    aria-pressed={on}
                    onClick={(e) => {
                      e.stopPropagation();
                      onSelect(on ? null : r.label);
                    }}
                  >
                    {r.standOut?.standsOut && (
                      <span className="rounded border-2 border-graphite px-1 text-xs font-bold tracking-wider uppercase" title="Stands out against the fleet (p < 0.01)">
                        Stands out
                      </span>
                    )}
                    <span>{r.label}</span>
                  </button>
                </th>
                <td className="p-2 text-right tabular-nums">{formatCount(r.findings)}</td>
                <td className="p-2 text-right tabular-nums">{formatRate(r.ratePer100)}</td>
                <td className="hidden p-2 text-right tabular-nums sm:table-cell">{formatCount(r.units)}</td>
                <td className="p-2 text-right tabular-nums">{formatCount(r.repeats)}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
