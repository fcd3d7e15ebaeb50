import { useQuery } from '@tanstack/react-query';
import { useEffect, useMemo, useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import type { FrontEnd, ViewKey } from '../../../../shared/domain/frames';
import { PART_KINDS, type PartKind } from '../../../../shared/domain/parts';
import type { Drawing } from '../../../../shared/drawings/types';
import { bothNames, flipSteps, labelChanges } from '../../../../shared/lab/flip-steps';
import { END_NAME } from '../../../../shared/lab/words';
import { unitLayout } from '../../../../shared/layout/unit-layout';
import { flipFrontEnd } from '../../../../shared/orientation';
import { BlueSignalCaution } from '../../../components/blue-signal-caution';
import { DrawingCanvas, OrientationLegend } from '../../drawing';
import { drawingQuery } from '../../drawing/api/get-drawing';
import { useUnitTypes } from '../api/unit-types';

export const DEMO_VIEWS: { key: ViewKey; title: string }[] = [
  { key: 'plan', title: 'Plan' },
  { key: 'side_plus_y', title: 'Side (+y)' },
  { key: 'side_minus_y', title: 'Side (−y)' },
  { key: 'end_short_hood', title: 'Short hood end' },
  { key: 'end_long_hood', title: 'Long hood end' },
];

/** Which unit type is on show; the first one the server has when none is chosen. */
export function useDemoDrawing(initial?: string) {
  const types = useUnitTypes();
  const [key, setKey] = useState<string | undefined>(initial);
  const chosen = key ?? types.data?.items[0]?.key;
  const drawing = useQuery({ ...drawingQuery(chosen ?? ''), enabled: chosen !== undefined });
  return { types, key: chosen, setKey, drawing };
}

/** Plays a short highlight when `value` changes (a name re-derived), unless motion is reduced. */
function useFlash(value: string) {
  const ref = useRef<HTMLSpanElement>(null);
  const first = useRef(true);
  useEffect(() => {
    if (first.current) {
      first.current = false;
      return;
    }
    const el = ref.current;
    if (!el || typeof el.animate !== 'function') return;
    if (window.matchMedia?.('(prefers-reduced-motion: reduce)').matches) return;
    el.animate(
      [
        { backgroundColor: 'var(--color-accent-soft)', transform: 'translateY(-0.4em)', opacity: 0.2 },
        { backgroundColor: 'var(--color-accent-soft)', transform: 'translateY(0)', opacity: 1, offset: 0.35 },
        { backgroundColor: 'transparent' },
      ],
      { duration: 1100, easing: 'ease-out' },
    );
  }, [value]);
  return ref;
}

function NameCell({ label, changes }: { label: string; changes: boolean }) {
  const ref = useFlash(label);
  return (
    <span ref={ref} className={`inline-block rounded px-1 ${changes ? 'font-bold' : ''}`}>
      {label}
    </span>
  );
}

const FILTERS: { key: string; title: string; kinds?: PartKind[] }[] = [
  { key: 'running', title: 'Running gear', kinds: ['truck', 'axle', 'traction_motor', 'wheel'] },
  { key: 'ends', title: 'Ends', kinds: ['coupler', 'pilot', 'uncoupling_lever', 'mu_receptacle', 'air_hose', 'ditch_light', 'headlight', 'step'] },
  { key: 'sides', title: 'Sides', kinds: ['sand_box', 'walkway', 'handrail', 'battery_box', 'cab_door'] },
  { key: 'all', title: 'Every part' },
];

/** Every part's name under the F shown, re-derived when the F moves; what stays the same is marked. */
export function LabelTable({ drawing, frontEnd, pinned, onPin }: { drawing: Drawing; frontEnd: FrontEnd; pinned: string | null; onPin(id: string): void }) {
  const [filter, setFilter] = useState('running');
  const changes = useMemo(() => labelChanges(drawing), [drawing]);
  const current = useMemo(() => new Map(unitLayout(drawing, frontEnd).parts.map((p) => [p.instanceId, p])), [drawing, frontEnd]);
  const kinds = FILTERS.find((f) => f.key === filter)?.kinds;
  const rows = [...changes.values()]
    .filter((c) => c.kind !== 'front_marking' && (!kinds || kinds.includes(c.kind)))
    .sort((a, b) => (current.get(a.instanceId)?.along ?? 0) - (current.get(b.instanceId)?.along ?? 0) || a.instanceId.localeCompare(b.instanceId));
  const changed = rows.filter((r) => r.changes).length;
  return (
    <section aria-labelledby="names-heading" className="space-y-2">
      <div className="flex flex-wrap items-center gap-2">
        <h2 id="names-heading" className="text-xl font-bold">
          What each part is called
        </h2>
        <div role="group" aria-label="Which parts" className="ml-auto flex flex-wrap gap-1">
          {FILTERS.map((f) => (
            <button key={f.key} type="button" className={`btn px-3 text-base ${filter === f.key ? 'bg-graphite text-paper hover:bg-graphite-2' : ''}`} aria-pressed={filter === f.key} onClick={() => setFilter(f.key)}>
              {f.title}
            </button>
          ))}
        </div>
      </div>
      <p className="text-base text-graphite-2">
        {changed} of {rows.length} names change when the F moves; the rest stay. Listed from the front.
      </p>
      <div className="max-h-96 overflow-auto rounded-md border-2 border-rule">
        <table className="w-full border-collapse text-left text-base">
          <thead className="sticky top-0 bg-paper-2">
            <tr>
              <th className="px-2 py-1">Part</th>
              <th className={`px-2 py-1 ${frontEnd === 'short_hood' ? 'bg-accent-soft' : ''}`}>F on the short hood</th>
              <th className={`px-2 py-1 ${frontEnd === 'long_hood' ? 'bg-accent-soft' : ''}`}>F on the long hood</th>
              <th className="px-2 py-1">
                <span className="sr-only">Pin</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.instanceId} className={`border-t border-rule ${pinned === r.instanceId ? 'bg-accent-soft' : ''}`} data-instance={r.instanceId}>
                <td className="px-2 py-1 text-graphite-2">{PART_KINDS[r.kind].label}</td>
                <td className={`px-2 py-1 ${frontEnd === 'short_hood' ? '' : 'text-graphite-2'}`}>
                  <NameCell label={r.shortHood} changes={r.changes && frontEnd === 'short_hood'} />
                </td>
                <td className={`px-2 py-1 ${frontEnd === 'long_hood' ? '' : 'text-graphite-2'}`}>
                  <NameCell label={r.longHood} changes={r.changes && frontEnd === 'long_hood'} />
                </td>
                <td className="px-2 py-1 text-right">
                  {r.changes ? (
                    <button type="button" className="btn min-h-10 px-2 text-base" onClick={() => onPin(r.instanceId)} aria-label={`Pin ${frontEnd === 'short_hood' ? r.shortHood : r.longHood}`}>
                      Pin
                    </button>
                  ) : (
                    <span className="text-sm text-graphite-2">stays</span>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}

/** The same physical part, shown under both F positions side by side. */
export function PinnedBothWays({ drawing, instanceId, view, onClear }: { drawing: Drawing; instanceId: string; view: ViewKey; onClear(): void }) {
  const names = bothNames(drawing, instanceId);
  const shortLayout = useMemo(() => unitLayout(drawing, 'short_hood'), [drawing]);
  const longLayout = useMemo(() => unitLayout(drawing, 'long_hood'), [drawing]);
  if (!names) return null;
  const inView = drawing.views.find((v) => v.key === view)?.parts.some((p) => p.instanceId === instanceId);
  const showView: ViewKey = inView ? view : (drawing.instances.find((i) => i.instanceId === instanceId)?.views[0] ?? 'plan');
  const partId = drawing.views.find((v) => v.key === showView)?.parts.find((p) => p.instanceId === instanceId)?.id ?? null;
  return (
    <section aria-labelledby="pinned-heading" className="card space-y-3 p-3" data-testid="pinned">
      <div className="flex flex-wrap items-center gap-2">
        <h2 id="pinned-heading" className="text-xl font-bold">
          Same part, two names
        </h2>
        <button type="button" className="btn ml-auto px-3" onClick={onClear}>
          Unpin
        </button>
      </div>
      <div className="grid gap-3 md:grid-cols-2">
        {(
          [
            ['short_hood', names.shortHood, shortLayout],
            ['long_hood', names.longHood, longLayout],
          ] as const
        ).map(([fe, label, layout]) => (
          <figure key={fe} className="space-y-1">
            <figcaption className="text-base">
              <span className="label block">F on the {END_NAME[fe]}</span>
              <span className="text-2xl font-bold" data-testid={`pinned-${fe}`}>
                {label}
              </span>
            </figcaption>
            <DrawingCanvas drawing={drawing} layout={layout} view={showView} mode="as_built" selectedPartId={partId} onSelectPart={() => {}} height={200} />
          </figure>
        ))}
      </div>
      <p className="text-base">{names.changes ? 'The part has not moved; only its name follows the F.' : 'This part has no side, end or number, so its name stays.'}</p>
    </section>
  );
}

/** The rule one step at a time, with the part each step is about selected on the drawing. */
export function StepPanel({ drawing, frontEnd, pinned, step, setStep, onFlip }: { drawing: Drawing; frontEnd: FrontEnd; pinned: string | null; step: number; setStep(n: number): void; onFlip(): void }) {
  const steps = flipSteps(drawing, frontEnd, pinned ?? undefined);
  const i = Math.min(step, steps.length - 1);
  const s = steps[i];
  return (
    <section aria-labelledby="step-heading" className="card space-y-2 p-4" data-testid="step-panel">
      <p className="label">
        Step {i + 1} of {steps.length}
      </p>
      <h2 id="step-heading" className="text-2xl font-bold">
        {s.title}
      </h2>
      <p className="text-lg" aria-live="polite">
        {s.body}
      </p>
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn" onClick={() => setStep(Math.max(0, i - 1))} disabled={i === 0}>
          Back
        </button>
        <button type="button" className="btn-primary" onClick={() => setStep(Math.min(steps.length - 1, i + 1))} disabled={i === steps.length - 1}>
          Next step
        </button>
        {s.key === 'move-f' && (
          <button type="button" className="btn" onClick={onFlip}>
            Move the F now
          </button>
        )}
      </div>
    </section>
  );
}

/** The flip demonstration: the F moves end to end and every name re-derives while the class watches. */
export function FlipDemo() {
  const { types, key, setKey, drawing } = useDemoDrawing();
  const [frontEnd, setFrontEnd] = useState<FrontEnd>('short_hood');
  const [view, setView] = useState<ViewKey>('plan');
  const [pinned, setPinned] = useState<string | null>(null);
  const [stepMode, setStepMode] = useState(false);
  const [step, setStep] = useState(0);
  const d = drawing.data;
  const layout = useMemo(() => (d ? unitLayout(d, frontEnd) : undefined), [d, frontEnd]);
  const flip = () => setFrontEnd((f) => flipFrontEnd(f));
  const steps = d ? flipSteps(d, frontEnd, pinned ?? undefined) : [];
  const stepPart = stepMode ? steps[Math.min(step, steps.length - 1)]?.partIds.find((id) => d?.views.find((v) => v.key === view)?.parts.some((p) => p.id === id)) : undefined;
  const pinnedPart = pinned ? d?.views.find((v) => v.key === view)?.parts.find((p) => p.instanceId === pinned)?.id : undefined;
  const views = DEMO_VIEWS.filter((v) => d?.views.some((dv) => dv.key === v.key));

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="text-3xl font-bold">Flip demonstration</h1>
        <Link to="/lab/present" className="btn ml-auto">
          Presenter mode
        </Link>
        <Link to="/lab" className="btn">
          Back to the lab
        </Link>
      </div>
      <div className="flex flex-wrap items-end gap-3">
        <div>
          <label htmlFor="demo-type" className="label">
            Unit type
          </label>
          <select
            id="demo-type"
            className="field"
            value={key ?? ''}
            onChange={(e) => {
              setKey(e.target.value);
              setPinned(null);
            }}
          >
            {types.data?.items.map((t) => (
              <option key={t.key} value={t.key}>
                {t.name}
              </option>
            ))}
          </select>
        </div>
        <button type="button" className="btn-primary" onClick={flip} data-testid="move-f">
          Move the F to the {END_NAME[flipFrontEnd(frontEnd)]} end
        </button>
        <p className="text-lg" aria-live="polite" data-testid="demo-front-end">
          The F is on the <strong>{END_NAME[frontEnd]}</strong> end.
        </p>
        <label className="flex min-h-12 items-center gap-2 text-base">
          <input type="checkbox" className="size-5" checked={stepMode} onChange={(e) => setStepMode(e.target.checked)} />
          Step by step
        </label>
      </div>
      {drawing.isError && <p role="alert">{drawing.error.message}</p>}
      {d && layout && (
        <div className="grid gap-4 xl:grid-cols-[minmax(0,1fr)_26rem]">
          <div className="space-y-3">
            <div role="tablist" aria-label="View" className="flex flex-wrap gap-1">
              {views.map((v) => (
                <button key={v.key} type="button" role="tab" aria-selected={view === v.key} className={`btn px-3 text-base ${view === v.key ? 'bg-graphite text-paper hover:bg-graphite-2' : ''}`} onClick={() => setView(v.key)}>
                  {v.title}
                </button>
              ))}
            </div>
            <DrawingCanvas
              drawing={d}
              layout={layout}
              view={view}
              mode="as_built"
              selectedPartId={stepPart ?? pinnedPart ?? null}
              onSelectPart={(part) => part.kind !== 'front_marking' && setPinned(part.instanceId)}
              height={view === 'plan' ? 300 : 280}
            />
            <p className="text-base text-graphite-2">Tap a part to pin it and see its name under both F positions.</p>
            {pinned && <PinnedBothWays drawing={d} instanceId={pinned} view={view} onClear={() => setPinned(null)} />}
          </div>
          <div className="space-y-4">
            {stepMode ? <StepPanel drawing={d} frontEnd={frontEnd} pinned={pinned} step={step} setStep={setStep} onFlip={flip} /> : <OrientationLegend compact />}
            <LabelTable drawing={d} frontEnd={frontEnd} pinned={pinned} onPin={setPinned} />
            <div className="space-y-1">
              <p className="text-base text-graphite-2">Practising at a real unit in the yard:</p>
              <BlueSignalCaution compact />
            </div>
          </div>
        </div>
      )}
    </div>
  );
}
