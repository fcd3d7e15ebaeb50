import { useQuery } from '@tanstack/react-query';
import { useId, useMemo, useState } from 'react';
import { Link, Navigate, useNavigate, useParams } from 'react-router-dom';
import { unitLayout } from '../../../../shared/layout/unit-layout';
import { ApiError } from '../../../lib/api-client';
import { inspectionQuery, useSetCoverage, useSign, type ClientInspection } from '../api/inspections';
import { drawingQuery } from '../api/units';
import { useOfflineQueue } from '../offline/sync';
import { endName, kindName } from '../lib/format';
import { instanceLabels } from '../lib/walk';
import { CoverageBar } from './coverage-bar';
import { FindingList } from './finding-list';
import { OfflineBanner } from './offline-banner';

function GapReason({ label, reason, onSave, busy }: { label: string; reason: string | null; onSave(r: string): void; busy: boolean }) {
  const [text, setText] = useState(reason ?? '');
  const id = useId();
  const saved = !!reason && reason === text.trim();
  return (
    <form
      className="flex flex-wrap items-end gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        if (text.trim()) onSave(text.trim());
      }}
    >
      <div className="min-w-48 flex-1">
        <label htmlFor={id} className="label">
          Why was “{label}” not inspected?
        </label>
        <input id={id} className="field" value={text} maxLength={300} onChange={(e) => setText(e.target.value)} aria-invalid={!reason || undefined} />
      </div>
      <button type="submit" className="btn" disabled={busy || !text.trim() || saved}>
        {saved ? 'Reason saved' : 'Save reason'}
      </button>
    </form>
  );
}

export function SignScreen() {
  const { id = '' } = useParams();
  const insp = useQuery(inspectionQuery(id));
  if (insp.isPending) return <p className="text-xl">Loading…</p>;
  if (insp.isError)
    return (
      <p role="alert" className="field-error">
        {insp.error.message}
      </p>
    );
  if (insp.data.status === 'signed') return <Navigate to="../record" relative="path" replace />;
  return <Sign insp={insp.data} />;
}

function Sign({ insp }: { insp: ClientInspection }) {
  const navigate = useNavigate();
  const drawing = useQuery(drawingQuery(insp.unit.unitTypeKey));
  const labels = useMemo(() => (drawing.data ? instanceLabels(unitLayout(drawing.data, insp.frontEndSeen)) : new Map()), [drawing.data, insp.frontEndSeen]);
  const coverage = useSetCoverage(insp.id);
  const sign = useSign(insp.id);
  const [password, setPassword] = useState('');
  const pwId = useId();
  const gaps = insp.coverage.gaps;
  const open = gaps.filter((g) => !g.reason);
  const signError = sign.error instanceof ApiError ? sign.error : null;
  const pwError = signError?.fields?.password;
  // Signed first, the changes still on this device would arrive at a closed record and be refused.
  const waiting = useOfflineQueue().pending.filter((p) => p.inspectionId === insp.id).length;

  return (
    <div className="mx-auto max-w-3xl space-y-5">
      <Link to={`../`} relative="path" className="btn no-print">
        ← Back to the walk
      </Link>
      <h1 className="text-3xl font-bold">
        Sign: {insp.unit.roadNumber}, {kindName(insp.kind).toLowerCase()}
      </h1>
      <OfflineBanner failed={signError?.status === 0 || (coverage.error instanceof ApiError && coverage.error.status === 0)} />
      <section aria-labelledby="sum-h" className="card space-y-3 p-4">
        <h2 id="sum-h" className="text-2xl font-bold">
          Summary
        </h2>
        <p>
          F on the {endName(insp.frontEndSeen)} · {insp.place ?? 'no yard'} · routine “{insp.routine.name}”
        </p>
        <CoverageBar coverage={insp.coverage} waiting={insp.items.filter((i) => i.pending).length} />
        <p className="text-lg">
          {insp.coverage.done} of {insp.coverage.total} parts done: {insp.coverage.passed} passed, {insp.coverage.findings} with a finding,{' '}
          {insp.coverage.notApplicable} not applicable, {gaps.length} left.
        </p>
      </section>

      <section aria-labelledby="gaps-h" className="space-y-3">
        <h2 id="gaps-h" className="text-2xl font-bold">
          Gaps
        </h2>
        {gaps.length === 0 ? (
          <p className="text-ok font-bold">None: every part of the routine is done.</p>
        ) : (
          <>
            <p>
              {open.length
                ? `${open.length} part${open.length === 1 ? '' : 's'} still need${open.length === 1 ? 's' : ''} a result or a reason. Go back and finish the walk, or say why each one was left.`
                : 'Each gap has its reason; it will be on the record.'}
            </p>
            <ul className="space-y-3">
              {gaps.map((g) => (
                <li key={g.instanceId} className="card p-3" data-testid="gap">
                  <GapReason
                    label={labels.get(g.instanceId)?.label ?? g.instanceId}
                    reason={g.reason}
                    busy={coverage.isPending}
                    onSave={(reason) =>
                      coverage.mutate({ body: { instanceIds: [g.instanceId], state: 'gap', reason }, parts: [labels.get(g.instanceId)?.label ?? g.instanceId] })
                    }
                  />
                </li>
              ))}
            </ul>
            {coverage.error && (
              <p role="alert" className="field-error">
                {coverage.error.message}
              </p>
            )}
          </>
        )}
      </section>

      <section aria-labelledby="find-h" className="space-y-3">
        <h2 id="find-h" className="text-2xl font-bold">
          Findings ({insp.findings.length})
        </h2>
        <FindingList findings={insp.findings} inspectionId={insp.id} />
      </section>

      <form
        className="card space-y-3 p-4"
        aria-labelledby="signform-h"
        onSubmit={(e) => {
          e.preventDefault();
          sign.mutate(password, { onSuccess: () => navigate('../record', { relative: 'path' }) });
        }}
      >
        <h2 id="signform-h" className="text-2xl font-bold">
          Sign the record
        </h2>
        <p>Signing says you made this inspection as recorded. The record then never changes; a correction is a new, linked entry.</p>
        <div>
          <label htmlFor={pwId} className="label">
            Your password
          </label>
          <input
            id={pwId}
            type="password"
            autoComplete="current-password"
            className="field max-w-sm"
            value={password}
            onChange={(e) => setPassword(e.target.value)}
            aria-invalid={pwError ? true : undefined}
            aria-describedby={pwError ? `${pwId}-error` : undefined}
          />
          {pwError && (
            <p id={`${pwId}-error`} className="field-error">
              {pwError}
            </p>
          )}
        </div>
        {signError && (
          <p role="alert" className="field-error">
            {signError.message}
          </p>
        )}
        <button type="submit" className="btn-primary w-full text-xl sm:w-auto" disabled={sign.isPending || !password || open.length > 0 || waiting > 0}>
          {sign.isPending ? 'Signing…' : 'Sign the record'}
        </button>
        {open.length > 0 && <p className="text-base text-graphite-2">Signing opens once every gap has a reason.</p>}
        {waiting > 0 && (
          <p className="text-base font-bold" data-testid="sign-waiting">
            {waiting} {waiting === 1 ? 'change is' : 'changes are'} still waiting on this device to be sent; signing opens once {waiting === 1 ? 'it has' : 'they have'}{' '}
            arrived.
          </p>
        )}
      </form>
    </div>
  );
}
