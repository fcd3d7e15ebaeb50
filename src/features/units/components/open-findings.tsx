import { Link } from 'react-router-dom';
import type { QueueItem } from '../../../../shared/api/repairs';
import type { FrontEnd } from '../../../../shared/domain/frames';
import type { UnitLayout } from '../../../../shared/layout/unit-layout';
import type { FindingPinDetail } from '../api/findings';
import { FINDING_STATE_WORDS, HOOD_WORDS, formatWhen } from '../lib/format';
import { WeightMark } from '../../../components/weight-mark';

/**
 * The unit's open findings (open, in repair, repaired and not yet verified), each with the name it
 * was given when pinned; a pin made under the other front end says so and gives today's name.
 */
export function OpenFindings({
  items,
  total = items.length,
  details,
  frontEnd,
  layout,
  timeZone,
  onShow,
}: {
  items: readonly QueueItem[];
  /** How many open findings the unit has in all (the page holds at most 500). */
  total?: number;
  details: ReadonlyMap<string, FindingPinDetail>;
  frontEnd: FrontEnd;
  layout?: UnitLayout;
  timeZone?: string;
  onShow(f: FindingPinDetail): void;
}) {
  return (
    <section aria-labelledby="open-findings-title" className="card space-y-2 p-3">
      <h2 id="open-findings-title" className="text-xl font-bold">
        Open findings
      </h2>
      {items.length === 0 ? (
        <p className="text-graphite-2">No open finding on this unit.</p>
      ) : (
        <ul className="divide-y divide-rule">
          {items.map((f) => {
            const d = details.get(f.id);
            const other = d && d.frontEnd !== frontEnd;
            const now = other && layout ? layout.parts.find((p) => p.partId === d.partId)?.label : undefined;
            return (
              <li key={f.id} className="flex flex-wrap items-start gap-x-3 gap-y-1 py-2" data-finding={f.id}>
                <div className="min-w-0 flex-1 space-y-0.5">
                  <p className="flex flex-wrap items-center gap-x-2">
                    <WeightMark weight={f.weight} size={16} />
                    <Link to={`/repairs/findings/${f.id}`} className="inline-flex min-h-12 items-center text-lg font-bold underline decoration-2 underline-offset-4">
                      {f.label}
                    </Link>
                  </p>
                  <p>
                    {f.defectLabel}
                    {f.rule && <span className="text-graphite-2"> · {f.rule}</span>}
                  </p>
                  <p className="text-sm text-graphite-2">
                    {FINDING_STATE_WORDS[f.state]} · found {formatWhen(f.createdAt, timeZone)} by {f.createdByName}
                    {f.assigneeName && ` · with ${f.assigneeName}`}
                  </p>
                  {other && (
                    <p className="text-sm font-bold" data-testid="pinned-other-end">
                      Pinned when the F was on the {HOOD_WORDS[d.frontEnd]}.{now && now !== f.label ? ` With the F on the ${HOOD_WORDS[frontEnd]} this part is “${now}”.` : ''}
                    </p>
                  )}
                </div>
                {d && (
                  <button type="button" className="btn px-3 text-base" onClick={() => onShow(d)}>
                    Show on drawing
                  </button>
                )}
              </li>
            );
          })}
        </ul>
      )}
      {total > items.length && (
        <p className="font-bold" data-testid="open-findings-more">
          Showing {items.length.toLocaleString('en-US')} of {total.toLocaleString('en-US')} open findings.{' '}
          <Link to={`/repairs?unit=${encodeURIComponent(items[0]?.unitId ?? '')}`} className="inline-flex min-h-12 items-center underline decoration-2 underline-offset-4">
            See them all in the repair queue
          </Link>
        </p>
      )}
    </section>
  );
}
