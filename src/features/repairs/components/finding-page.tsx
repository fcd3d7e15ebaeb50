import { assignableQuery } from '../api/assignable';
import { useQuery } from '@tanstack/react-query';
import { useMemo, useState, type ReactNode } from 'react';
import { Link, useLocation, useParams } from 'react-router-dom';
import type { Me } from '../../../../shared/api/auth';
import { can } from '../../../../shared/domain/roles';
import { findingQuery, type FindingDetail } from '../api/finding';
import { meQuery } from '../api/me';
import { queueSummaryQuery } from '../api/queue';
import { settingsQuery } from '../api/settings';
import { eventWords, formatWhen } from '../lib/format';
import { dueStatesQuery } from '../api/due-flags';
import { OverdueBadge, StateBadge } from './badges';
import { FindingActions } from './finding-actions';
import { PhotoPicker, UploadList, useRepairUploads } from './repair-photos';
import { TagPanel } from './tag-panel';
import { WeightMark } from '../../../components/weight-mark';

export function FindingPage() {
  const { id = '' } = useParams();
  const location = useLocation();
  const back = (location.state as { back?: string } | null)?.back ?? '';
  const finding = useQuery(findingQuery(id));
  const me = useQuery(meQuery());
  const settings = useQuery(settingsQuery());
  const tz = settings.data?.timeZone;
  return (
    <div className="mx-auto max-w-5xl space-y-4">
      <Link to={`/repairs${back}`} className="btn">
        ← Repair queue
      </Link>
      {finding.isPending && <p>Loading the finding…</p>}
      {finding.isError && (
        <p role="alert" className="card border-federal p-3 font-bold text-federal">
          {finding.error.message}
        </p>
      )}
      {finding.data && me.data && <FindingView f={finding.data} me={me.data} tz={tz} />}
    </div>
  );
}

function FindingView({ f, me, tz }: { f: FindingDetail; me: Me; tz?: string }) {
  const uploads = useRepairUploads(f.id);
  const foreman = can(me.role, 'repair');
  const acts = can(me.role, 'inspect');
  const queue = useQuery(queueSummaryQuery());
  const [extra, setExtra] = useState<File[]>([]);
  const overdue = useQuery(dueStatesQuery());
  const assignable = useQuery(assignableQuery(foreman));
  // Everyone a repair can go to, plus whoever already holds work (names for the history).
  const people = useMemo(() => {
    const m = new Map<string, string>([[me.id, `${me.name} (you)`]]);
    for (const p of assignable.data?.items ?? []) if (!m.has(p.id)) m.set(p.id, `${p.name} (${p.role})`);
    for (const p of queue.data?.assignees ?? []) if (!m.has(p.id)) m.set(p.id, p.name);
    for (const e of f.events) {
      const d = e.details ?? {};
      if (e.kind === 'assigned' && typeof d.assigneeId === 'string' && typeof d.assigneeName === 'string' && !m.has(d.assigneeId)) m.set(d.assigneeId, d.assigneeName);
    }
    return [...m].map(([id, name]) => ({ id, name }));
  }, [me, queue.data, f.events, assignable.data]);
  const photosOf = (eventId: string | null) => f.photos.filter((p) => p.eventId === eventId);
  const created = f.events.find((e) => e.kind === 'created');
  return (
    <article className="space-y-4" aria-labelledby="finding-title">
      <header className="card space-y-2 p-4">
        <div className="flex flex-wrap items-center gap-3">
          <span className="text-2xl font-bold">{f.roadNumber}</span>
          <WeightMark weight={f.weight} size={22} />
          <StateBadge state={f.state} />
          {overdue.data?.has(f.unitId) && <OverdueBadge />}
        </div>
        <h1 id="finding-title" className="text-3xl font-bold">
          {f.label}
        </h1>
        <p className="text-xl">{f.defectLabel}</p>
        <dl className="grid gap-x-6 gap-y-1 sm:grid-cols-2">
          {f.rule && <Item term="Rule">{f.rule}</Item>}
          {f.measurement && (
            <Item term="Reading">
              {f.measurement.value} {f.measurement.unit}
              {f.checkResult?.limit ? ` — limit ${f.checkResult.limit}${f.checkResult.source ? ` (${f.checkResult.source})` : ''}` : ''}
            </Item>
          )}
          <Item term="Found">
            {formatWhen(f.createdAt, tz)} by {f.createdByName}
          </Item>
          <Item term="Assigned to">{f.assigneeName ?? 'Nobody yet'}</Item>
          {f.note && <Item term="Note">{f.note}</Item>}
          {f.voidReason && <Item term="Voided because">{f.voidReason}</Item>}
        </dl>
      </header>

      {f.weight === 'federal' && <TagPanel unitId={f.unitId} roadNumber={f.roadNumber} canClear={foreman} timeZone={tz} />}

      {acts && (
        <section aria-labelledby="actions-title" className="card space-y-3 p-4">
          <h2 id="actions-title" className="text-2xl font-bold">
            What to do
          </h2>
          <FindingActions finding={f} me={me} people={people} onRepaired={uploads.send} />
          {/* While in repair, photos go with the repair form; once repaired, more can be added to that repair. */}
          {foreman && f.state === 'repaired' && (
            <div className="space-y-2 border-t border-rule pt-3">
              <PhotoPicker files={extra} onChange={setExtra} label="Add repair photos" />
              {extra.length > 0 && (
                <button
                  type="button"
                  className="btn-primary"
                  onClick={() => {
                    uploads.send(extra);
                    setExtra([]);
                  }}
                >
                  Send {extra.length} photo{extra.length === 1 ? '' : 's'}
                </button>
              )}
            </div>
          )}
          <UploadList jobs={uploads.jobs} onRetry={uploads.retry} />
        </section>
      )}

      <section aria-labelledby="events-title" className="space-y-2">
        <h2 id="events-title" className="text-2xl font-bold">
          History
        </h2>
        <ol className="space-y-2" aria-label="Events, newest first">
          {f.events.map((e) => {
            const w = eventWords(e, (pid) => (pid === f.assignedTo && f.assigneeName) || (pid === me.id ? me.name : people.find((p) => p.id === pid)?.name));
            const pics = e === created ? [...photosOf(e.id), ...photosOf(null)] : photosOf(e.id);
            return (
              <li key={e.id} className="card p-3">
                <p>
                  <span className="font-bold">{e.actor}</span> · <time dateTime={e.at}>{formatWhen(e.at, tz)}</time>
                </p>
                <p className="text-lg">{w.what}</p>
                {w.more.map((m) => (
                  <p key={m} className="text-graphite-2">
                    {m}
                  </p>
                ))}
                {pics.length > 0 && <Photos photos={pics} />}
              </li>
            );
          })}
        </ol>
        {!created && photosOf(null).length > 0 && <Photos photos={photosOf(null)} />}
      </section>
    </article>
  );
}

function Item({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="flex gap-2">
      <dt className="font-bold text-graphite-2">{term}:</dt>
      <dd>{children}</dd>
    </div>
  );
}

function Photos({ photos }: { photos: FindingDetail['photos'] }) {
  return (
    <ul className="mt-2 flex flex-wrap gap-2" aria-label="Photos">
      {photos.map((p, i) => (
        <li key={p.id}>
          <a href={p.full} target="_blank" rel="noreferrer" className="block rounded-md border-2 border-rule focus-visible:outline-3 focus-visible:outline-accent">
            <img src={p.thumb} alt={`Photo ${i + 1}`} className="h-24 w-24 rounded object-cover" loading="lazy" />
          </a>
        </li>
      ))}
    </ul>
  );
}
