import { useQuery } from '@tanstack/react-query';
import { useId, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { can } from '../../../../shared/domain/roles';
import { ApiError } from '../../../lib/api-client';
import { meQuery } from '../api/me';
import { tagQuery, useUpdateTag, type UnitTag } from '../api/tag';
import { formatInZone } from '../lib/format';
import './print.css';

function TagEditor({ unitId, tag }: { unitId: string; tag: NonNullable<UnitTag['tag']> }) {
  const save = useUpdateTag(unitId);
  const [destination, setDestination] = useState(tag.destination ?? '');
  const [restrictions, setRestrictions] = useState(tag.restrictions ?? '');
  const ids = { d: useId(), r: useId() };
  const err = save.error instanceof ApiError ? save.error : null;
  return (
    <form
      className="card no-print space-y-3 p-4"
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate({ destination, restrictions });
      }}
    >
      <h2 className="text-xl font-bold">Movement (foreman)</h2>
      <div>
        <label htmlFor={ids.d} className="label">
          Destination (nearest place repairs can be made)
        </label>
        <input id={ids.d} className="field" maxLength={200} value={destination} onChange={(e) => setDestination(e.target.value)} />
        {err?.fields?.destination && <p className="field-error">{err.fields.destination}</p>}
      </div>
      <div>
        <label htmlFor={ids.r} className="label">
          Movement restrictions
        </label>
        <textarea id={ids.r} className="field py-2" rows={3} maxLength={500} value={restrictions} onChange={(e) => setRestrictions(e.target.value)} />
        {err?.fields?.restrictions && <p className="field-error">{err.fields.restrictions}</p>}
      </div>
      {err && (
        <p role="alert" className="field-error">
          {err.message}
        </p>
      )}
      {save.isSuccess && <p role="status">Saved on the tag.</p>}
      <button type="submit" className="btn-primary" disabled={save.isPending}>
        Save on the tag
      </button>
    </form>
  );
}

/** The tag 49 CFR 229.9 asks for, to print and fix at the control stand. */
export function TagPage() {
  const { unitId = '' } = useParams();
  const q = useQuery(tagQuery(unitId));
  const me = useQuery(meQuery());
  if (q.isPending) return <p className="text-xl">Loading the tag…</p>;
  if (q.isError)
    return (
      <p role="alert" className="field-error">
        {q.error.message}
      </p>
    );
  const t = q.data;
  const foreman = !!me.data && can(me.data.role, 'repair');
  return (
    <div className="print-sheet mx-auto max-w-3xl space-y-4">
      <div className="no-print flex flex-wrap gap-2">
        <button type="button" className="btn" onClick={() => history.back()}>
          ← Back
        </button>
        {t.open && (
          <button type="button" className="btn-primary" onClick={() => window.print()}>
            Print the tag
          </button>
        )}
      </div>
      {!t.open || !t.tag ? (
        <p className="card p-4 text-lg">
          {t.unit.roadNumber} has no open non-complying tag. <Link to="/walkaround">Back to the walkaround</Link>
        </p>
      ) : (
        <>
          <article className="space-y-4 border-8 border-double border-graphite p-5" aria-labelledby="tag-h" data-testid="tag">
            <h1 id="tag-h" className="text-center text-4xl font-bold tracking-wider">
              NON-COMPLYING LOCOMOTIVE
            </h1>
            <p className="text-center text-base">49 CFR 229.9 — to be placed at the control stand of the unit</p>
            <dl className="grid grid-cols-[max-content_1fr] gap-x-6 gap-y-1 text-lg">
              <dt className="font-bold">Unit</dt>
              <dd className="text-2xl font-bold">{t.unit.roadNumber}</dd>
              <dt className="font-bold">Inspecting railroad</dt>
              <dd>
                {t.railroad.name} ({t.railroad.reportingMark})
              </dd>
              <dt className="font-bold">Place</dt>
              <dd>{t.tag.place || t.unit.yardName || '—'}</dd>
              <dt className="font-bold">Date</dt>
              <dd>{formatInZone(t.tag.openedAt, t.railroad.timeZone)}</dd>
              <dt className="font-bold">Tagged by</dt>
              <dd>{t.tag.openedBy}</dd>
            </dl>
            <section className="space-y-1">
              <h2 className="text-2xl font-bold">Defects</h2>
              <ol className="list-decimal space-y-1 pl-6 text-lg">
                {t.defects.map((d) => (
                  <li key={d.id} data-testid="tag-defect">
                    <strong>{d.label}</strong>: {d.defect}
                    {d.rule && ` (${d.rule})`} — found {formatInZone(d.createdAt, t.railroad.timeZone, 'd MMM yyyy', false)}
                  </li>
                ))}
              </ol>
            </section>
            <dl className="space-y-2 text-lg">
              <div>
                <dt className="font-bold">Movement restrictions</dt>
                <dd className="min-h-10 border-b-2 border-graphite whitespace-pre-wrap" data-testid="tag-restrictions">
                  {t.tag.restrictions || ' '}
                </dd>
              </div>
              <div>
                <dt className="font-bold">Destination</dt>
                <dd className="min-h-10 border-b-2 border-graphite" data-testid="tag-destination">
                  {t.tag.destination || ' '}
                </dd>
              </div>
            </dl>
            <div className="grid gap-6 pt-6 sm:grid-cols-[2fr_1fr]">
              <div>
                <div className="h-12 border-b-2 border-graphite" />
                <p className="text-base">Signature of the qualified person</p>
              </div>
              <div>
                <div className="h-12 border-b-2 border-graphite" />
                <p className="text-base">Date and time</p>
              </div>
            </div>
          </article>
          {foreman && <TagEditor unitId={t.unit.id} tag={t.tag} />}
        </>
      )}
    </div>
  );
}
