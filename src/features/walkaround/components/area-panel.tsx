import { useId, useState } from 'react';
import type { RoutineArea } from '../../../../shared/api/walkaround';
import { BlueSignalCaution } from '../../../components/blue-signal-caution';
import type { ClientFinding } from '../api/inspections';
import type { PartState } from '../lib/walk';
import { FindingList } from './finding-list';

const STATE_TEXT: Record<PartState, string> = { passed: 'Passed', finding: 'Finding', not_applicable: 'N.a.', todo: 'To do' };

function StateChip({ state }: { state: PartState }) {
  const cls =
    state === 'passed'
      ? 'bg-ok text-paper'
      : state === 'finding'
        ? 'bg-graphite text-paper'
        : state === 'not_applicable'
          ? 'border-2 border-graphite-2 text-graphite'
          : 'border-2 border-dashed border-graphite text-graphite';
  return <span className={`inline-flex min-w-16 justify-center rounded px-1.5 py-0.5 text-base font-bold ${cls}`}>{STATE_TEXT[state]}</span>;
}

/** The blue-signal caution before an area on, under or between equipment; asked once per inspection per area. */
export function HazardGate({ area, onAck }: { area: Pick<RoutineArea, 'label'>; onAck(): void }) {
  return (
    <div className="space-y-3" data-testid="hazard-gate">
      <p className="text-lg">
        <strong>{area.label}</strong> takes you on, under or between equipment.
      </p>
      <BlueSignalCaution />
      <button type="button" className="btn w-full border-bluesignal text-xl" onClick={onAck}>
        Blue signal is up — continue
      </button>
    </div>
  );
}

export interface AreaPanelProps {
  area: RoutineArea;
  inspectionId: string;
  states: Map<string, { state: PartState; reason: string | null; pending?: boolean }>;
  labels: Map<string, { label: string; kind: string }>;
  findings: readonly ClientFinding[];
  busy: boolean;
  onPass(ids: string[]): void;
  onNotApplicable(id: string, reason: string): void;
  onUndo(id: string): void;
  onDefect(id: string): void;
  next?: { label: string; go(): void };
}

export function AreaPanel({ area, inspectionId, states, labels, findings, busy, onPass, onNotApplicable, onUndo, onDefect, next }: AreaPanelProps) {
  const [naFor, setNaFor] = useState<string | null>(null);
  const [reason, setReason] = useState('');
  const reasonId = useId();
  const todo = area.instanceIds.filter((id) => (states.get(id)?.state ?? 'todo') === 'todo');
  const mine = findings.filter((f) => area.instanceIds.includes(f.instanceId));

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap gap-2">
        <button type="button" id="walk-pass-rest" className="btn-primary flex-1" disabled={!todo.length || busy} onClick={() => onPass(todo)}>
          Pass the rest of this area{todo.length ? ` (${todo.length})` : ''}
        </button>
        {next && !todo.length && (
          <button type="button" className="btn flex-1" onClick={next.go}>
            Next: {next.label} →
          </button>
        )}
      </div>
      <ol className="divide-y-2 divide-rule rounded-md border-2 border-rule" aria-label={`Parts of ${area.label}`}>
        {area.instanceIds.map((id) => {
          const s: { state: PartState; reason: string | null; pending?: boolean } = states.get(id) ?? { state: 'todo', reason: null };
          const label = labels.get(id)?.label ?? id;
          return (
            <li key={id} className="space-y-2 p-2" data-instance={id} data-state={s.state} data-pending={s.pending ? 'true' : undefined}>
              <div className="flex flex-wrap items-center gap-2">
                <StateChip state={s.state} />
                <span className="min-w-32 flex-1 text-lg leading-tight">
                  {label}
                  {s.pending && (
                    <span className="mt-1 block w-fit rounded border-2 border-dashed border-shop px-1.5 text-base leading-snug">Waiting to send</span>
                  )}
                </span>
                <div className="flex gap-1.5">
                  {s.state === 'todo' && (
                    <>
                      <button type="button" className="btn px-3" disabled={busy} onClick={() => onPass([id])} aria-label={`Pass ${label}`}>
                        Pass
                      </button>
                      <button
                        type="button"
                        className="btn px-3"
                        aria-expanded={naFor === id}
                        onClick={() => {
                          setNaFor(naFor === id ? null : id);
                          setReason('');
                        }}
                        aria-label={`Not applicable: ${label}`}
                      >
                        N.a.
                      </button>
                    </>
                  )}
                  {(s.state === 'passed' || s.state === 'not_applicable') && (
                    <button type="button" className="btn px-3" disabled={busy} onClick={() => onUndo(id)} aria-label={`Undo ${label}`}>
                      Undo
                    </button>
                  )}
                  <button type="button" className="btn px-3" onClick={() => onDefect(id)} aria-label={`Report a defect on ${label}`}>
                    Defect…
                  </button>
                </div>
              </div>
              {s.state === 'not_applicable' && s.reason && <p className="text-base text-graphite-2">Not applicable: {s.reason}</p>}
              {naFor === id && (
                <form
                  className="flex flex-wrap items-end gap-2"
                  onSubmit={(e) => {
                    e.preventDefault();
                    if (!reason.trim()) return;
                    onNotApplicable(id, reason.trim());
                    setNaFor(null);
                  }}
                >
                  <div className="min-w-48 flex-1">
                    <label htmlFor={`${reasonId}-${id}`} className="label">
                      Why it does not apply
                    </label>
                    <input id={`${reasonId}-${id}`} className="field" value={reason} maxLength={300} onChange={(e) => setReason(e.target.value)} autoFocus required />
                  </div>
                  <button type="submit" className="btn" disabled={!reason.trim() || busy}>
                    Mark n.a.
                  </button>
                </form>
              )}
            </li>
          );
        })}
      </ol>
      <section aria-label={`Findings in ${area.label}`} className="space-y-2">
        <h3 className="text-xl font-bold">Findings in this area</h3>
        <FindingList findings={mine} inspectionId={inspectionId} editable empty="None yet. Tap a part on the drawing, or Defect… beside it." />
      </section>
    </div>
  );
}
