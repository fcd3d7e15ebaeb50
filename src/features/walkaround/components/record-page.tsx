import { useQuery } from '@tanstack/react-query';
import { useId, useMemo, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { unitLayout } from '../../../../shared/layout/unit-layout';
import { ApiError } from '../../../lib/api-client';
import { inspectionQuery, useAddCorrection, type ClientInspection } from '../api/inspections';
import { tagQuery } from '../api/tag';
import { drawingQuery } from '../api/units';
import { endName, formatInZone, kindName, measurementText } from '../lib/format';
import { instanceLabels } from '../lib/walk';
import { WeightMark } from '../../../components/weight-mark';
import './print.css';

function Correction({ insp }: { insp: ClientInspection }) {
  const add = useAddCorrection(insp.id);
  const [note, setNote] = useState('');
  const [password, setPassword] = useState('');
  const ids = { note: useId(), pw: useId() };
  const err = add.error instanceof ApiError ? add.error : null;
  return (
    <form
      className="card no-print space-y-3 p-4"
      onSubmit={(e) => {
        e.preventDefault();
        add.mutate(
          { note, password },
          {
            onSuccess: () => {
              setNote('');
              setPassword('');
            },
          },
        );
      }}
    >
      <h2 className="text-xl font-bold">Add a correction</h2>
      <p>The signed record stays as it is; the correction is a new signed entry linked to it.</p>
      <div>
        <label htmlFor={ids.note} className="label">
          What is corrected
        </label>
        <textarea id={ids.note} className="field py-2" rows={3} value={note} onChange={(e) => setNote(e.target.value)} />
        {err?.fields?.note && <p className="field-error">{err.fields.note}</p>}
      </div>
      <div>
        <label htmlFor={ids.pw} className="label">
          Your password
        </label>
        <input id={ids.pw} type="password" autoComplete="current-password" className="field max-w-sm" value={password} onChange={(e) => setPassword(e.target.value)} />
        {err?.fields?.password && <p className="field-error">{err.fields.password}</p>}
      </div>
      {err && !err.fields && (
        <p role="alert" className="field-error">
          {err.message}
        </p>
      )}
      {add.isSuccess && <p role="status">Correction signed and linked.</p>}
      <button type="submit" className="btn" disabled={add.isPending || note.trim().length < 3 || !password}>
        Sign the correction
      </button>
    </form>
  );
}

export function RecordPage() {
  const { id = '' } = useParams();
  const q = useQuery(inspectionQuery(id));
  const insp = q.data;
  const drawing = useQuery({ ...drawingQuery(insp?.unit.unitTypeKey ?? ''), enabled: !!insp });
  const tag = useQuery({ ...tagQuery(insp?.unit.id ?? ''), enabled: !!insp });
  const labels = useMemo(() => (drawing.data && insp ? instanceLabels(unitLayout(drawing.data, insp.frontEndSeen)) : new Map()), [drawing.data, insp]);

  if (q.isPending) return <p className="text-xl">Loading the record…</p>;
  if (q.isError || !insp)
    return (
      <p role="alert" className="field-error">
        {q.error?.message}
      </p>
    );
  const tz = insp.railroad.timeZone;
  const c = insp.coverage;
  const na = insp.items.filter((i) => i.state === 'not_applicable');

  return (
    <article className="print-sheet mx-auto max-w-4xl space-y-5" aria-labelledby="rec-h">
      <div className="no-print flex flex-wrap gap-2">
        {insp.status === 'in_progress' ? (
          <Link to="../" relative="path" className="btn">
            ← Back to the walk
          </Link>
        ) : (
          <Link to="/walkaround" className="btn">
            ← Walkaround
          </Link>
        )}
        <button type="button" className="btn-primary" onClick={() => window.print()}>
          Print
        </button>
        {tag.data?.open && (
          <Link to={`/walkaround/units/${insp.unit.id}/tag`} className="btn-danger">
            Non-complying tag →
          </Link>
        )}
      </div>

      <header className="space-y-1 border-b-4 border-graphite pb-3">
        <p className="text-lg font-bold tracking-wide uppercase">
          {insp.railroad.name} ({insp.railroad.reportingMark})
        </p>
        <h1 id="rec-h" className="text-3xl font-bold">
          {kindName(insp.kind)} record: {insp.unit.roadNumber}
        </h1>
        {insp.status === 'in_progress' && <p className="font-bold text-federal">Not signed yet: this is a draft of the record.</p>}
      </header>

      <dl className="grid grid-cols-[max-content_1fr] gap-x-6 gap-y-1 text-lg" data-testid="record-facts">
        <dt className="font-bold">Unit</dt>
        <dd>{insp.unit.roadNumber}</dd>
        <dt className="font-bold">Place</dt>
        <dd>{insp.place ?? 'No yard recorded'}</dd>
        <dt className="font-bold">Started</dt>
        <dd>{formatInZone(insp.startedAt, tz)}</dd>
        <dt className="font-bold">Signed</dt>
        <dd>{insp.signedAt ? formatInZone(insp.signedAt, tz) : 'not signed'}</dd>
        <dt className="font-bold">Inspector</dt>
        <dd>{insp.inspector.name}</dd>
        <dt className="font-bold">F on the</dt>
        <dd>
          {endName(insp.frontEndSeen)}
          {insp.frontEndSeen !== insp.frontEndRecorded && ` (seen; the unit record said ${endName(insp.frontEndRecorded)})`}
        </dd>
        <dt className="font-bold">Coverage</dt>
        <dd>
          {c.done} of {c.total} parts: {c.passed} passed, {c.findings} with a finding, {c.notApplicable} not applicable
          {c.gaps.length ? `, ${c.gaps.length} not inspected` : ''}
        </dd>
      </dl>

      <section aria-labelledby="rf-h" className="space-y-2">
        <h2 id="rf-h" className="text-2xl font-bold">
          Findings ({insp.findings.length})
        </h2>
        {insp.findings.length === 0 ? (
          <p>No findings.</p>
        ) : (
          <table className="w-full border-collapse text-left text-base">
            <thead>
              <tr className="border-b-2 border-graphite">
                <th className="py-1 pr-2">Part</th>
                <th className="py-1 pr-2">Defect</th>
                <th className="py-1 pr-2">Weight</th>
                <th className="py-1 pr-2">Rule</th>
                <th className="py-1">Measurement</th>
              </tr>
            </thead>
            <tbody>
              {insp.findings.map((f) => {
                const chk = f.checkResult as { result?: string; limit?: string; source?: string } | null;
                return (
                  <tr key={f.id} className="border-b border-rule align-top" data-testid="record-finding">
                    <td className="py-1 pr-2 font-bold">{f.label}</td>
                    <td className="py-1 pr-2">
                      {f.defectLabel}
                      {f.note && <span className="block text-graphite-2">Note: {f.note}</span>}
                      {f.state === 'voided' && <span className="block font-bold">Voided</span>}
                    </td>
                    <td className="py-1 pr-2">
                      <WeightMark weight={f.weight} size={14} />
                    </td>
                    <td className="py-1 pr-2">{f.rule ?? '—'}</td>
                    <td className="py-1">
                      {f.measurement ? measurementText(f.measurement) : '—'}
                      {chk?.limit && (
                        <span className="block text-graphite-2">
                          {chk.result === 'pass' ? 'within' : 'out of'} limit: {chk.limit} ({chk.source})
                        </span>
                      )}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        )}
      </section>

      {(c.gaps.length > 0 || na.length > 0) && (
        <section aria-labelledby="rg-h" className="space-y-1">
          <h2 id="rg-h" className="text-2xl font-bold">
            Not inspected or not applicable
          </h2>
          <ul className="list-disc pl-6">
            {c.gaps.map((g) => (
              <li key={g.instanceId}>
                {labels.get(g.instanceId)?.label ?? g.instanceId}: not inspected — {g.reason ?? 'no reason given'}
              </li>
            ))}
            {na.map((i) => (
              <li key={i.instanceId}>
                {labels.get(i.instanceId)?.label ?? i.instanceId}: not applicable — {i.reason}
              </li>
            ))}
          </ul>
        </section>
      )}

      <section aria-labelledby="rc-h" className="space-y-1">
        <h2 id="rc-h" className="text-2xl font-bold">
          Corrections
        </h2>
        {insp.corrections.length === 0 ? (
          <p>None.</p>
        ) : (
          <ul className="space-y-1">
            {insp.corrections.map((x) => (
              <li key={x.id}>
                {formatInZone(x.signedAt, tz)}, {x.by}: {x.note}
              </li>
            ))}
          </ul>
        )}
      </section>

      <p className="border-t-2 border-graphite pt-2 text-base">
        Signed electronically by {insp.inspector.name}
        {insp.signedAt ? ` on ${formatInZone(insp.signedAt, tz)}` : ' (not yet signed)'}.
      </p>

      {insp.status === 'signed' && <Correction insp={insp} />}
    </article>
  );
}
