import { useQuery } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { inspectionQuery, type HistoryItem } from '../api/history';
import { formatSpan, formatWhen, plural } from '../lib/format';
import { historyEntries, type HistoryGroup } from '../lib/history';
import { WeightMark } from '../../../components/weight-mark';

const PAGE = 40;
// Links in a list are still finger targets: at least 48 px tall.
const LINK = 'inline-flex min-h-12 items-center text-left underline decoration-1 underline-offset-4';
const GROUPS: { key: HistoryGroup | 'all'; label: string }[] = [
  { key: 'all', label: 'Everything' },
  { key: 'finding', label: 'Findings and repairs' },
  { key: 'inspection', label: 'Inspections' },
  { key: 'tag', label: 'Tags' },
  { key: 'unit', label: 'Unit changes' },
];

/** For roles that do not walk units (no walkaround screen): the signed record's facts, read in place. */
function InspectionInline({ id, timeZone }: { id: string; timeZone?: string }) {
  const q = useQuery(inspectionQuery(id));
  if (q.isPending) return <p className="text-sm">Loading the record…</p>;
  if (q.isError) return <p className="text-sm font-bold text-federal">The record could not be loaded: {q.error.message}</p>;
  const r = q.data;
  return (
    <div className="mt-1 space-y-0.5 rounded-md bg-paper-2 p-2 text-sm" data-testid="inspection-inline">
      <p>
        {r.kind === 'periodic' ? 'Periodic' : 'Daily'} inspection by {r.inspector.name}
        {r.place && ` at ${r.place}`}, started {formatWhen(r.startedAt, timeZone)}
        {r.signedAt ? `, signed ${formatWhen(r.signedAt, timeZone)}` : ', not signed'}.
      </p>
      <p>
        {r.coverage.done} of {r.coverage.total} parts covered: {r.coverage.passed} passed, {plural(r.coverage.findings, 'finding')}, {r.coverage.notApplicable} not applicable.
      </p>
      {r.findings.length > 0 && (
        <ul className="list-disc pl-5">
          {r.findings.map((f) => (
            <li key={f.id}>
              <Link to={`/repairs/findings/${f.id}`} className={LINK}>
                {f.label}
              </Link>{' '}
              — {f.defectLabel}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

/** Everything that happened to the unit, newest first, a page at a time, with links to the findings and records. */
export function HistoryList({ items, canOpenRecords, timeZone }: { items: readonly HistoryItem[]; canOpenRecords: boolean; timeZone?: string }) {
  const [group, setGroup] = useState<HistoryGroup | 'all'>('all');
  const [shown, setShown] = useState(PAGE);
  const [open, setOpen] = useState<ReadonlySet<string>>(new Set());
  const entries = useMemo(() => historyEntries(items).map(({ item: h, entry: e }, i) => ({ h, e, key: `${h.kind}:${h.ref}:${h.at}:${i}` })), [items]);
  const filtered = group === 'all' ? entries : entries.filter((x) => x.e.group === group);
  const page = filtered.slice(0, shown);
  const toggle = (k: string) =>
    setOpen((s) => {
      const n = new Set(s);
      if (n.has(k)) n.delete(k);
      else n.add(k);
      return n;
    });

  return (
    <section aria-labelledby="history-title" className="card space-y-3 p-3">
      <div className="flex flex-wrap items-baseline gap-x-3">
        <h2 id="history-title" className="text-xl font-bold">
          History
        </h2>
        <span className="text-graphite-2">newest first · {plural(filtered.length, 'entry', 'entries')}</span>
      </div>
      <div role="radiogroup" aria-label="Show" className="flex flex-wrap gap-1.5">
        {GROUPS.map((g) => (
          <button
            key={g.key}
            type="button"
            role="radio"
            aria-checked={group === g.key}
            onClick={() => {
              setGroup(g.key);
              setShown(PAGE);
            }}
            className={`btn px-3 text-base ${group === g.key ? 'bg-graphite text-paper hover:bg-graphite-2' : ''}`}
          >
            {g.label}
          </button>
        ))}
      </div>
      {filtered.length === 0 ? (
        <p className="text-graphite-2">Nothing of this kind on record.</p>
      ) : (
        <ol className="divide-y divide-rule" data-testid="history">
          {page.map(({ h, e, key }) => (
            <li key={key} className="grid grid-cols-[1fr_auto] items-start gap-x-3 py-1.5 sm:grid-cols-[12rem_1fr_auto]" data-kind={h.kind}>
              <time dateTime={h.at} className="col-start-1 text-sm text-graphite-2 sm:col-start-auto sm:pt-3">
                {e.startedAt ? formatSpan(e.startedAt, h.at, timeZone) : formatWhen(h.at, timeZone)}
              </time>
              <div className="col-start-1 min-w-0 sm:col-start-auto sm:py-2.5">
                <p className="flex flex-wrap items-center gap-x-2">
                  <span className="font-bold">{e.title}</span>
                  {h.weight && e.group === 'finding' && <WeightMark weight={h.weight} size={16} />}
                  {h.actor && <span className="text-graphite-2">· {h.actor}</span>}
                </p>
                {e.detail &&
                  (e.findingId ? (
                    <Link to={`/repairs/findings/${e.findingId}`} className={LINK}>
                      {e.detail}
                    </Link>
                  ) : (
                    <p>{e.detail}</p>
                  ))}
                {e.inspectionId && !canOpenRecords && open.has(key) && <InspectionInline id={e.inspectionId} timeZone={timeZone} />}
              </div>
              {e.inspectionId && (
                <div className="col-start-2 row-span-2 row-start-1 self-center sm:col-start-auto sm:row-span-1 sm:row-start-auto sm:self-start">
                  {canOpenRecords ? (
                    <Link to={`/walkaround/inspections/${e.inspectionId}/record`} className={LINK}>
                      {h.kind === 'correction' ? 'Corrected record' : 'Record'}
                    </Link>
                  ) : (
                    <button type="button" className={LINK} aria-expanded={open.has(key)} onClick={() => toggle(key)}>
                      {open.has(key) ? 'Hide record' : 'Show record'}
                    </button>
                  )}
                </div>
              )}
            </li>
          ))}
        </ol>
      )}
      {filtered.length > shown && (
        <button type="button" className="btn" onClick={() => setShown((n) => n + PAGE)}>
          Show {Math.min(PAGE, filtered.length - shown)} older
        </button>
      )}
    </section>
  );
}
