import { useQuery } from '@tanstack/react-query';
import { format } from 'date-fns';
import { useId, useRef, useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import type { UnitRow } from '../../../../shared/api/units';
import type { FrontEnd } from '../../../../shared/domain/frames';
import { ApiError } from '../../../lib/api-client';
import { preloadDrawingCanvas } from '../../drawing';
import { openInspectionsQuery, useStartInspection } from '../api/inspections';
import { unitsQuery } from '../api/units';
import { endName, kindName } from '../lib/format';
import { OfflineBanner } from './offline-banner';
import { UnitSketch } from './unit-sketch';

function OpenInspections() {
  const q = useQuery(openInspectionsQuery());
  if (q.isPending) return <p>Loading your open inspections…</p>;
  if (q.isError) return <p role="alert" className="field-error">{q.error.message}</p>;
  if (!q.data.items.length) return <p className="text-graphite-2">None open. Start one below.</p>;
  return (
    <ul className="grid gap-2 sm:grid-cols-2">
      {q.data.items.map((i) => (
        <li key={i.id}>
          <Link to={`inspections/${i.id}`} className="btn w-full justify-between text-left" aria-label={`Resume ${kindName(i.kind).toLowerCase()} of ${i.roadNumber}`}>
            <span>
              <span className="block text-xl">{i.roadNumber}</span>
              <span className="block text-sm font-normal">
                {kindName(i.kind)}, started {format(new Date(i.startedAt), 'EEE d MMM, HH:mm')}
              </span>
            </span>
            <span>Resume →</span>
          </Link>
        </li>
      ))}
    </ul>
  );
}

function UnitPicker({ value, onPick }: { value: UnitRow | null; onPick: (u: UnitRow) => void }) {
  const [q, setQ] = useState('');
  const id = useId();
  const units = useQuery(unitsQuery(q.trim()));
  return (
    <div className="space-y-2">
      <label htmlFor={id} className="label">
        Road number
      </label>
      <input id={id} className="field max-w-md" type="search" inputMode="search" autoComplete="off" placeholder="e.g. 4101" value={q} onChange={(e) => setQ(e.target.value)} />
      {units.isError && <p role="alert" className="field-error">{units.error.message}</p>}
      <div role="radiogroup" aria-label="Unit" className="grid grid-cols-2 gap-2 sm:grid-cols-3 lg:grid-cols-4">
        {units.data?.items.map((u) => {
          const on = value?.id === u.id;
          return (
            <button
              key={u.id}
              type="button"
              role="radio"
              aria-checked={on}
              onClick={() => onPick(u)}
              className={`btn h-auto min-h-16 flex-col items-start justify-center py-2 text-left ${on ? 'bg-graphite text-paper hover:bg-graphite-2' : ''}`}
            >
              <span className="text-xl">{u.roadNumber}</span>
              <span className="text-sm font-normal">
                {u.yardName ?? 'No yard'} · {u.unitTypeName.split(',')[0]}
              </span>
              {u.nonComplying && (
                <span className={`rounded px-1 text-sm font-bold ${on ? 'bg-paper text-federal' : 'bg-federal text-paper'}`}>Non-complying</span>
              )}
            </button>
          );
        })}
      </div>
      {units.data && !units.data.items.length && <p>No unit matches “{q}”.</p>}
    </div>
  );
}

export function FrontEndChoice({ recorded, value, onChange }: { recorded: FrontEnd; value: FrontEnd; onChange: (e: FrontEnd) => void }) {
  return (
    <div className="space-y-3">
      <div role="radiogroup" aria-label="End carrying the F" className="grid gap-3 sm:grid-cols-2">
        {(['short_hood', 'long_hood'] as const).map((end) => {
          const on = value === end;
          return (
            <button
              key={end}
              type="button"
              role="radio"
              aria-checked={on}
              onClick={() => onChange(end)}
              className={`flex min-h-24 flex-col items-center gap-2 rounded-lg border-4 p-3 text-xl font-bold focus-visible:outline-3 focus-visible:outline-offset-2 focus-visible:outline-accent ${
                on ? 'border-accent bg-accent-soft' : 'border-rule bg-paper hover:bg-paper-2'
              }`}
            >
              <UnitSketch frontEnd={end} />
              <span>F on the {endName(end)}</span>
              {recorded === end && <span className="text-base font-normal">The unit record says this</span>}
            </button>
          );
        })}
      </div>
      {value !== recorded && (
        <p role="alert" className="rounded-md border-l-8 border-shop bg-paper-2 p-3 text-lg">
          <strong>This differs from the unit record</strong> (F on the {endName(recorded)}). The foreman and admin will be told; this inspection uses
          what you saw.
        </p>
      )}
    </div>
  );
}

export function StartScreen() {
  const navigate = useNavigate();
  const start = useStartInspection();
  const [unit, setUnit] = useState<UnitRow | null>(null);
  const [kind, setKind] = useState<'daily' | 'periodic'>('daily');
  const [seen, setSeen] = useState<FrontEnd>('short_hood');
  const idem = useRef<string>(crypto.randomUUID());

  const pick = (u: UnitRow) => {
    // The walk opens on the drawing: fetch the canvas code while the inspector confirms the F.
    void preloadDrawingCanvas();
    setUnit(u);
    setSeen(u.frontEnd);
    start.reset();
    idem.current = crypto.randomUUID();
  };

  const go = () => {
    if (!unit) return;
    start.mutate(
      { unitId: unit.id, kind, frontEndSeen: seen, idempotencyKey: idem.current },
      {
        // An open inspection of the same kind is resumed as it was started, F end included.
        onSuccess: (insp) => navigate(`inspections/${insp.id}`, { state: insp.frontEndSeen !== seen ? { resumedWith: insp.frontEndSeen } : null }),
      },
    );
  };

  return (
    <div className="mx-auto max-w-5xl space-y-6">
      <h1 className="text-3xl font-bold">Walkaround</h1>
      <OfflineBanner failed={start.error instanceof ApiError && start.error.status === 0} />
      <section aria-labelledby="open-h" className="space-y-2">
        <h2 id="open-h" className="text-2xl font-bold">
          Your open inspections
        </h2>
        <OpenInspections />
      </section>

      <section aria-labelledby="start-h" className="card space-y-5 p-4">
        <h2 id="start-h" className="text-2xl font-bold">
          Start an inspection
        </h2>
        <div>
          <h3 className="mb-2 text-xl font-bold">1. Unit</h3>
          <UnitPicker value={unit} onPick={pick} />
        </div>
        {unit && (
          <>
            <div>
              <h3 className="mb-2 text-xl font-bold">2. Kind</h3>
              <div role="radiogroup" aria-label="Kind of inspection" className="flex flex-wrap gap-2">
                {(['daily', 'periodic'] as const).map((k) => (
                  <button
                    key={k}
                    type="button"
                    role="radio"
                    aria-checked={kind === k}
                    onClick={() => setKind(k)}
                    className={`btn min-w-40 ${kind === k ? 'bg-graphite text-paper hover:bg-graphite-2' : ''}`}
                  >
                    {k === 'daily' ? 'Daily' : 'Periodic (92-day)'}
                  </button>
                ))}
              </div>
            </div>
            <p className="text-base">
              The walk follows your routine for this unit type.{' '}
              <Link to={`routines/${unit.unitTypeKey}`} className="btn ml-2 px-3 text-base">
                Change the routine
              </Link>
            </p>
            <div>
              <h3 className="mb-1 text-xl font-bold">3. Which end carries the F on {unit.roadNumber} in front of you?</h3>
              <p className="mb-3 text-graphite-2">Look at the unit, not the record. Front, left, right and every number follow the F.</p>
              <FrontEndChoice recorded={unit.frontEnd} value={seen} onChange={setSeen} />
            </div>
            {start.error && (
              <p role="alert" className="field-error">
                {start.error.message}
              </p>
            )}
            <button type="button" className="btn-primary w-full text-xl sm:w-auto" onClick={go} disabled={start.isPending}>
              {start.isPending ? 'Starting…' : `Confirm F on the ${endName(seen)} and start`}
            </button>
          </>
        )}
      </section>
    </div>
  );
}
