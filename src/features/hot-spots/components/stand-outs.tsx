import type { HotSpotRow, HotSpotsResponse } from '../../../../shared/api/hot-spots';
import { formatCount, formatProbability } from '../../../../shared/hot-spots/rates';

const expected = (e: number) => (e >= 10 ? e.toFixed(0) : e.toFixed(1));

/** "What stands out": the flagged parts with the figures behind each flag, and how the test works. */
export function StandOuts({ data, onSelect }: { data: HotSpotsResponse; onSelect(label: string): void }) {
  const flagged: HotSpotRow[] = data.rows.filter((r) => r.standOut?.standsOut).sort((a, b) => a.standOut!.p - b.standOut!.p);
  return (
    <section className="card space-y-2 p-3" aria-labelledby="hs-stand-title">
      <h2 id="hs-stand-title" className="text-xl font-bold">What stands out</h2>
      {flagged.length === 0 ? (
        <p>No part stands out against the fleet in this selection.</p>
      ) : (
        <ul className="space-y-2">
          {flagged.slice(0, 6).map((r) => (
            <li key={r.label}>
              <button type="button" className="w-full rounded-md border-2 border-rule p-2 text-left hover:bg-paper-2" onClick={() => onSelect(r.label)}>
                <span className="block font-bold">{r.label}</span>
                <span className="block text-base">
                  {formatCount(r.findings)} findings where about {expected(r.standOut!.expected)} were expected at the fleet rate; chance{' '}
                  {formatProbability(r.standOut!.p)}.
                </span>
              </button>
            </li>
          ))}
        </ul>
      )}
      {flagged.length > 6 && <p className="text-base">{flagged.length - 6} more in the table, marked "Stands out".</p>}
      {flagged.length > 0 && <p className="text-sm text-graphite-2">Pick one to see the figures in full.</p>}
      <details className="text-base">
        <summary className="flex min-h-12 cursor-pointer items-center font-bold">How a part is judged</summary>
        <p>{data.test.description}</p>
        <p className="mt-1">
          {data.test.tested} parts were tested; at 0.01 about {data.test.chanceFlags.toFixed(1)} of them could be flagged by chance alone, so read a flag as a
          place to look, not a verdict.
        </p>
      </details>
    </section>
  );
}
