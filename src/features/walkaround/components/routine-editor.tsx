import { useQuery } from '@tanstack/react-query';
import { useId, useMemo, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import type { Routine, RoutineArea } from '../../../../shared/api/walkaround';
import { unitLayout } from '../../../../shared/layout/unit-layout';
import { areaLabel } from '../../../../shared/walkaround/routine';
import { ApiError } from '../../../lib/api-client';
import { routineQuery, useSaveRoutine } from '../api/routines';
import { drawingQuery } from '../api/units';
import { instanceLabels } from '../lib/walk';

const move = <T,>(xs: readonly T[], i: number, by: -1 | 1): T[] => {
  const j = i + by;
  if (j < 0 || j >= xs.length) return [...xs];
  const out = [...xs];
  [out[i], out[j]] = [out[j], out[i]];
  return out;
};

function UpDown({ label, i, n, onMove }: { label: string; i: number; n: number; onMove(by: -1 | 1): void }) {
  return (
    <span className="flex shrink-0 gap-1">
      <button type="button" className="btn min-w-12 px-2" disabled={i === 0} onClick={() => onMove(-1)} aria-label={`Move ${label} earlier`}>
        ↑
      </button>
      <button type="button" className="btn min-w-12 px-2" disabled={i === n - 1} onClick={() => onMove(1)} aria-label={`Move ${label} later`}>
        ↓
      </button>
    </span>
  );
}

/** The inspector's own walk for a unit type: the order of the areas and of the parts in each. */
export function RoutineEditor() {
  const { unitTypeKey = '' } = useParams();
  const routine = useQuery(routineQuery(unitTypeKey));
  const drawing = useQuery(drawingQuery(unitTypeKey));
  // Held here: a save gives a new version, which starts the form afresh, and the "Saved" note must outlive that.
  const save = useSaveRoutine(unitTypeKey);
  if (routine.isPending || drawing.isPending) return <p className="text-xl">Loading the routine…</p>;
  if (routine.isError || drawing.isError)
    return (
      <p role="alert" className="field-error">
        {(routine.error ?? drawing.error)?.message}
      </p>
    );
  return (
    <Editor
      key={`${routine.data.id}-${routine.data.version}`}
      routine={routine.data}
      labels={instanceLabels(unitLayout(drawing.data, 'short_hood'))}
      name={drawing.data.name}
      save={save}
    />
  );
}

function Editor({ routine, labels, name: typeName, save }: { routine: Routine; labels: Map<string, { label: string }>; name: string; save: ReturnType<typeof useSaveRoutine> }) {
  const [name, setName] = useState(routine.name);
  const [startPoint, setStartPoint] = useState(routine.startPoint);
  const [direction, setDirection] = useState(routine.direction);
  const [areas, setAreas] = useState<RoutineArea[]>(routine.areas);
  const [open, setOpen] = useState<string | null>(null);
  const ids = { name: useId(), start: useId() };
  const err = save.error instanceof ApiError ? save.error : null;
  const dirty = useMemo(
    () => JSON.stringify({ name, startPoint, direction, areas }) !== JSON.stringify({ name: routine.name, startPoint: routine.startPoint, direction: routine.direction, areas: routine.areas }),
    [name, startPoint, direction, areas, routine],
  );

  return (
    <form
      className="mx-auto max-w-3xl space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate({ name, startPoint, direction, areas, ...(routine.id ? { version: routine.version } : {}) });
      }}
    >
      <Link to="/walkaround" className="btn">
        ← Walkaround
      </Link>
      <h1 className="text-3xl font-bold">Your routine: {typeName}</h1>
      <p>
        {routine.personal ? 'Your own routine.' : 'The default routine; saving makes it your own.'} Inspections already started keep the routine they began with. Sides
        and ends are named here as for the F on the short hood; the walk names them for the F you confirm.
      </p>
      <div className="grid gap-3 sm:grid-cols-2">
        <div>
          <label htmlFor={ids.name} className="label">
            Name
          </label>
          <input id={ids.name} className="field" value={name} maxLength={80} onChange={(e) => setName(e.target.value)} />
          {err?.fields?.name && <p className="field-error">{err.fields.name}</p>}
        </div>
        <div>
          <label htmlFor={ids.start} className="label">
            Start point
          </label>
          <input id={ids.start} className="field" value={startPoint} maxLength={80} onChange={(e) => setStartPoint(e.target.value)} />
          {err?.fields?.startPoint && <p className="field-error">{err.fields.startPoint}</p>}
        </div>
      </div>
      <div role="radiogroup" aria-label="Direction" className="flex flex-wrap gap-2">
        {(['clockwise', 'counterclockwise'] as const).map((d) => (
          <button key={d} type="button" role="radio" aria-checked={direction === d} onClick={() => setDirection(d)} className={`btn ${direction === d ? 'bg-graphite text-paper hover:bg-graphite-2' : ''}`}>
            {d === 'clockwise' ? 'Clockwise' : 'Counterclockwise'}
          </button>
        ))}
      </div>
      <ol className="space-y-2" aria-label="Areas in walking order">
        {areas.map((a, i) => {
          const label = areaLabel(a.key, 'short_hood', a.label);
          return (
            <li key={a.key} className="card space-y-2 p-2">
              <div className="flex flex-wrap items-center gap-2">
                <span className="w-6 text-lg font-bold text-graphite-2">{i + 1}</span>
                <span className="min-w-40 flex-1 text-lg font-bold">
                  {label}
                  {a.hazard && <span className="ml-2 rounded border-2 border-bluesignal px-1 text-sm text-bluesignal">Blue signal</span>}
                </span>
                <button type="button" className="btn px-3" aria-expanded={open === a.key} onClick={() => setOpen(open === a.key ? null : a.key)}>
                  Parts ({a.instanceIds.length})
                </button>
                <UpDown label={label} i={i} n={areas.length} onMove={(by) => setAreas((x) => move(x, i, by))} />
              </div>
              {open === a.key && (
                <ol className="divide-y-2 divide-rule border-t-2 border-rule" aria-label={`Parts of ${label} in order`}>
                  {a.instanceIds.map((id, j) => {
                    const pl = labels.get(id)?.label ?? id;
                    return (
                      <li key={id} className="flex items-center gap-2 py-1">
                        <span className="flex-1">{pl}</span>
                        <UpDown
                          label={pl}
                          i={j}
                          n={a.instanceIds.length}
                          onMove={(by) => setAreas((x) => x.map((y, k) => (k === i ? { ...y, instanceIds: move(y.instanceIds, j, by) } : y)))}
                        />
                      </li>
                    );
                  })}
                </ol>
              )}
            </li>
          );
        })}
      </ol>
      {err && (
        <p role="alert" className="field-error">
          {err.message}
        </p>
      )}
      {save.isSuccess && !dirty && <p role="status">Saved. Your next inspection of this unit type follows it.</p>}
      <button type="submit" className="btn-primary" disabled={save.isPending || !dirty}>
        {save.isPending ? 'Saving…' : 'Save my routine'}
      </button>
    </form>
  );
}
