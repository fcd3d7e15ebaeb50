import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import type { QueueItem } from '../../../../shared/api/repairs';
import type { FrontEnd } from '../../../../shared/domain/frames';
import type { UnitLayout } from '../../../../shared/layout/unit-layout';
import { openFindingsQuery, type FindingPinDetail } from '../api/findings';
import { FINDING_STATE_WORDS, HOOD_WORDS, formatWhen } from '../lib/format';
import { WeightMark } from './flags';

/**
 * The unit's open findings (open, in repair, repaired and not yet verified), each with the name it
 * was given when pinned; a pin made under the other front end says so and gives today's name.
 */
export function OpenFindings({
  items,
  details,
  frontEnd,
  layout,
  timeZone,
  onShow,
}: {
  items: readonly QueueItem[];
  details: ReadonlyMap<string, FindingPinDetail>;
  frontEnd: FrontEnd;
  layout?: UnitLayout;
  timeZone?: string;
  onShow(f: FindingPinDetail): void;
}) {
  // How many the unit has in all, read from the cached page the items came from (at most 500 a page);
  // reading it must not fetch the page again.
  const unitId = items[0]?.unitId ?? '';
  const total = useQuery({ ...openFindingsQuery(unitId), enabled: !!unitId, refetchOnMount: false }).data?.total ?? items.length;
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
                    <WeightMark weight={f.weight} />
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
          <Link to={`/repairs?unit=${encodeURIComponent(unitId)}`} className="inline-flex min-h-12 items-center underline decoration-2 underline-offset-4">
            See them all in the repair queue
          </Link>
        </p>
      )}
    </section>
  );
}
