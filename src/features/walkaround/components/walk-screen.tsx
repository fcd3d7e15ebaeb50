import { useQuery } from '@tanstack/react-query';
import { useCallback, useEffect, useMemo, useRef, useState, useSyncExternalStore } from 'react';
import { Link, Navigate, useLocation, useParams, useSearchParams } from 'react-router-dom';
import { VIEW_KEYS, type ViewKey } from '../../../../shared/domain/frames';
import type { DrawingMode } from '../../../../shared/drawings/screen';
import type { ViewCoord } from '../../../../shared/drawings/types';
import { unitLayout, type LayoutPart } from '../../../../shared/layout/unit-layout';
import { ApiError } from '../../../lib/api-client';
import { inspectionQuery, useSetCoverage, type ClientInspection } from '../api/inspections';
import { drawingQuery, unitQuery } from '../api/units';
import { readDraft, writeDraft } from '../lib/draft';
import { endName, kindName } from '../lib/format';
import { readAcks, writeAck } from '../lib/hazard-acks';
import { areaProgress, instanceLabels, itemStates, partInView, pinsForView, preferredView } from '../lib/walk';
import { AreaPanel, HazardGate } from './area-panel';
import { CoverageBar } from './coverage-bar';
import { FindingForm, type FindingDraft, type FindingTarget } from './finding-form';
import { OfflineBanner } from './offline-banner';
import { UnitCanvas } from './unit-canvas';

const WIDE = '(min-width: 1024px)';
function useWide() {
  return useSyncExternalStore(
    (cb) => {
      if (typeof window.matchMedia !== 'function') return () => {};
      const mq = window.matchMedia(WIDE);
      mq.addEventListener?.('change', cb);
      return () => mq.removeEventListener?.('change', cb);
    },
    () => typeof window.matchMedia === 'function' && window.matchMedia(WIDE).matches,
    () => true,
  );
}

function useElementHeight(ref: React.RefObject<HTMLElement | null>, active: boolean) {
  const [h, setH] = useState(0);
  useEffect(() => {
    const el = ref.current;
    if (!el || !active) return;
    const m = () => setH(el.clientHeight);
    m();
    const ro = typeof ResizeObserver === 'function' ? new ResizeObserver(m) : null;
    ro?.observe(el);
    return () => ro?.disconnect();
  }, [ref, active]);
  return h;
}

/** The shell's sticky header height, so our own sticky bar sits just under it. */
function useHeaderHeight() {
  const [h, setH] = useState(0);
  useEffect(() => {
    const el = document.querySelector('header');
    if (!el) return;
    const m = () => setH(el.getBoundingClientRect().height);
    m();
    const ro = typeof ResizeObserver === 'function' ? new ResizeObserver(m) : null;
    ro?.observe(el);
    return () => ro?.disconnect();
  }, []);
  return h;
}

export function WalkScreen() {
  const { id = '' } = useParams();
  const insp = useQuery(inspectionQuery(id));
  if (insp.isPending) return <p className="text-xl">Loading the inspection…</p>;
  if (insp.isError)
    return (
      <div className="space-y-3">
        <OfflineBanner failed={insp.error instanceof ApiError && insp.error.status === 0} />
        <p role="alert" className="field-error">
          {insp.error.message}
        </p>
        <Link to="/walkaround" className="btn">
          Back to the start
        </Link>
      </div>
    );
  if (insp.data.status === 'signed') return <Navigate to="record" replace />;
  return <Walk insp={insp.data} />;
}

function Walk({ insp }: { insp: ClientInspection }) {
  const drawingQ = useQuery(drawingQuery(insp.unit.unitTypeKey));
  const unitQ = useQuery(unitQuery(insp.unit.id));
  const coverage = useSetCoverage(insp.id);
  const wide = useWide();
  const headerH = useHeaderHeight();
  const [params, setParams] = useSearchParams();
  const [acks, setAcks] = useState(() => readAcks(insp.id));
  // The unsent form lives in sessionStorage; a ref (not state) so typing does not redraw the canvas.
  const draft = useRef<FindingDraft | null>(null);
  const [target, setTarget] = useState<FindingTarget | null>(() => (draft.current = readDraft(insp.id))?.target ?? null);
  const [pending, setPending] = useState<FindingTarget | null>(null);

  const areas = insp.routine.areas;
  const areaIndex = Math.min(Math.max(0, Number(params.get('area') ?? 0) || 0), areas.length - 1);
  const area = areas[areaIndex];
  const mode: DrawingMode = params.get('mode') === 'as_built' ? 'as_built' : 'front_first';
  const setParam = useCallback(
    (patch: Record<string, string | null>) =>
      setParams(
        (p) => {
          const n = new URLSearchParams(p);
          for (const [k, v] of Object.entries(patch)) v === null ? n.delete(k) : n.set(k, v);
          return n;
        },
        { replace: true },
      ),
    [setParams],
  );

  const drawing = drawingQ.data;
  const layout = useMemo(() => (drawing ? unitLayout(drawing, insp.frontEndSeen) : null), [drawing, insp.frontEndSeen]);
  const labels = useMemo(() => (layout ? instanceLabels(layout) : new Map<string, { label: string; kind: string }>()), [layout]);
  const states = useMemo(() => itemStates(insp), [insp]);
  const areaOf = useMemo(() => {
    const m = new Map<string, number>();
    areas.forEach((a, i) => a.instanceIds.forEach((id) => m.set(id, i)));
    return m;
  }, [areas]);

  const viewParam = params.get('view') as ViewKey | null;
  const view: ViewKey | null = drawing
    ? viewParam && VIEW_KEYS.includes(viewParam) && drawing.views.some((v) => v.key === viewParam)
      ? viewParam
      : preferredView(drawing, area)
    : null;
  const pins = useMemo(() => (drawing && view ? pinsForView(insp.findings, view, drawing.lengthIn) : []), [insp.findings, view, drawing]);

  const acked = !area.hazard || acks.includes(area.key);
  const goArea = (i: number) => {
    setParam({ area: String(i), view: drawing ? preferredView(drawing, areas[i]) : null });
    setTarget(null);
  };

  const saveDraft = useCallback(
    (d: FindingDraft | null) => {
      writeDraft(insp.id, d);
      draft.current = d;
    },
    [insp.id],
  );

  const openForm = (t: FindingTarget) => {
    const i = areaOf.get(t.instanceId);
    if (i !== undefined && i !== areaIndex) setParam({ area: String(i) });
    const a = i !== undefined ? areas[i] : undefined;
    if (a?.hazard && !acks.includes(a.key)) {
      setPending(t);
      setTarget(null);
      return;
    }
    saveDraft(null);
    setTarget(t);
  };

  const onSelectPart = (part: LayoutPart, at: ViewCoord) =>
    openForm({ partId: part.partId, instanceId: part.instanceId, kind: part.kind, label: part.label, view: part.view, at, centre: { x: part.x, y: part.y, z: part.z } });

  const onDefect = (instanceId: string) => {
    if (!drawing || !layout || !view) return;
    const where = partInView(drawing, instanceId, view);
    if (!where) return;
    const lp = layout.parts.find((p) => p.partId === where.part.id);
    if (!lp) return;
    if (where.view !== view) setParam({ view: where.view });
    onSelectPart(lp, where.part.centre);
  };

  // Keyboard users keep their place when a panel they were in goes away.
  const focusSoon = (id: string) => requestAnimationFrame(() => document.getElementById(id)?.focus());

  const ack = () => {
    setAcks(writeAck(insp.id, area.key));
    if (pending) {
      setTarget(pending);
      setPending(null);
    } else focusSoon('walk-pass-rest');
  };

  const closeForm = () => {
    setTarget(null);
    saveDraft(null);
    focusSoon(`walk-area-${areaIndex}`);
  };

  // The parts' names go with the mark, for the waiting list if it has to wait on the device.
  const mark = (ids: string[], state: 'passed' | 'not_applicable' | 'gap', reason?: string) =>
    coverage.mutate({
      body: { instanceIds: ids, state, ...(reason ? { reason } : {}) },
      parts: ids.map((i) => labels.get(i)?.label ?? i),
      area: ids.length > 1 ? area.label : null,
    });

  const coverageError = coverage.error instanceof ApiError ? coverage.error : null;
  const busy = coverage.isPending;
  const differs = insp.frontEndSeen !== insp.frontEndRecorded;
  const resumedWith = (useLocation().state as { resumedWith?: string } | null)?.resumedWith;
  const leftCol = useRef<HTMLDivElement>(null);
  const leftH = useElementHeight(leftCol, wide);
  // Wide screens: the drawing takes the height left under the bar; phones: a fixed strip on top.
  const canvasHeight = wide ? Math.max(300, Math.min(720, leftH - 64)) : 300;

  const panel = !acked ? (
    <HazardGate area={area} onAck={ack} />
  ) : target ? (
    <FindingForm
      key={`${target.partId}:${target.at.u}:${target.at.v}`}
      inspectionId={insp.id}
      target={target}
      humpStencilled={unitQ.data?.humpStencilled ?? false}
      timeZone={insp.railroad.timeZone}
      draft={draft.current && draft.current.target.partId === target.partId ? draft.current : null}
      onDraft={saveDraft}
      onClose={closeForm}
    />
  ) : (
    <AreaPanel
      area={area}
      inspectionId={insp.id}
      states={states}
      labels={labels}
      findings={insp.findings}
      busy={busy}
      onPass={(ids) => mark(ids, 'passed')}
      onNotApplicable={(iid, reason) => mark([iid], 'not_applicable', reason)}
      onUndo={(iid) => mark([iid], 'gap')}
      onDefect={onDefect}
      next={areaIndex < areas.length - 1 ? { label: areas[areaIndex + 1].label, go: () => goArea(areaIndex + 1) } : undefined}
    />
  );

  return (
    <div
      className="mx-auto flex max-w-7xl flex-col gap-3 lg:h-[calc(100dvh-var(--walk-header)-2rem)]"
      style={{ ['--walk-header' as string]: `${headerH}px` }}
    >
      <div className="sticky z-10 -mx-3 space-y-2 border-b-2 border-rule bg-paper px-3 pt-1 pb-2 sm:-mx-4 sm:px-4 lg:static" style={{ top: headerH }}>
        <div className="flex flex-wrap items-center gap-x-4 gap-y-1">
          <h1 className="text-2xl font-bold">
            {insp.unit.roadNumber} <span className="font-normal">· {kindName(insp.kind)}</span>
          </h1>
          <span className="hidden text-base sm:inline">
            F on the <strong>{endName(insp.frontEndSeen)}</strong>
          </span>
          <Link to="sign" className="btn-primary ml-auto px-3">
            <span className="sm:hidden">Sign →</span>
            <span className="hidden sm:inline">Review and sign →</span>
          </Link>
        </div>
        <CoverageBar coverage={insp.coverage} waiting={insp.items.filter((i) => i.pending).length} />
      </div>

      <OfflineBanner failed={coverageError?.status === 0} />
      {resumedWith && (
        <p role="status" className="rounded-md border-l-8 border-shop bg-paper-2 p-2 text-base">
          This is your open inspection of {insp.unit.roadNumber}, resumed as you started it: it keeps the F on the {endName(insp.frontEndSeen)}, the end you
          confirmed then.
        </p>
      )}
      {differs && (
        <p className="rounded-md border-l-8 border-shop bg-paper-2 p-2 text-base">
          You saw the F on the {endName(insp.frontEndSeen)}; the record says {endName(insp.frontEndRecorded)}. The foreman and admin have been told; this
          inspection uses what you saw.
        </p>
      )}
      {coverageError && (coverageError.status !== 0 || coverageError.code === 'not_kept') && (
        <p role="alert" className="field-error">
          Not saved: {coverageError.message}
        </p>
      )}

      <div className="grid gap-4 lg:min-h-0 lg:flex-1 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)] lg:grid-rows-[minmax(0,1fr)]">
        <div className="min-w-0 lg:min-h-0" ref={leftCol}>
          {drawingQ.isError && (
            <p role="alert" className="field-error">
              The drawing could not be loaded: {drawingQ.error.message}
            </p>
          )}
          {drawing && layout && view ? (
            <UnitCanvas
              drawing={drawing}
              layout={layout}
              view={view}
              onViewChange={(v) => setParam({ view: v })}
              mode={mode}
              onModeChange={(m) => setParam({ mode: m === 'front_first' ? null : m })}
              pins={pins}
              selectedPartId={target?.partId ?? null}
              emphasis={area.instanceIds}
              states={states}
              onSelectPart={onSelectPart}
              height={canvasHeight}
            />
          ) : (
            !drawingQ.isError && <div className="flex items-center justify-center rounded-md border-2 border-rule text-lg" style={{ height: canvasHeight + 56 }}>Loading the drawing…</div>
          )}
        </div>

        <div className="relative min-w-0 space-y-3 lg:min-h-0 lg:overflow-y-auto lg:pr-1" data-testid="walk-panel">
          <nav aria-label="Routine">
            <ol className="space-y-1.5">
              {areas.map((a, i) => {
                const p = areaProgress(a, states);
                const current = i === areaIndex;
                return (
                  <li key={a.key}>
                    <button
                      type="button"
                      id={`walk-area-${i}`}
                      aria-current={current ? 'step' : undefined}
                      onClick={() => goArea(i)}
                      className={`flex min-h-12 w-full items-center gap-2 rounded-md border-2 px-3 py-1 text-left text-lg font-bold focus-visible:outline-3 focus-visible:outline-offset-2 focus-visible:outline-accent ${
                        current ? 'border-accent bg-accent-soft' : 'border-rule hover:bg-paper-2'
                      }`}
                    >
                      <span className="w-6 shrink-0 text-graphite-2">{i + 1}</span>
                      <span className="flex-1 leading-tight">{a.label}</span>
                      {a.hazard && (
                        <span className="shrink-0 rounded border-2 border-bluesignal px-1 text-sm text-bluesignal" title="Blue-signal protection needed">
                          Blue signal
                        </span>
                      )}
                      <span className={`shrink-0 tabular-nums ${p.done === p.total ? 'text-ok' : ''}`}>
                        {p.done}/{p.total}
                      </span>
                    </button>
                    {current && <div className="mt-2 mb-4 rounded-md border-l-4 border-accent pl-3">{panel}</div>}
                  </li>
                );
              })}
            </ol>
          </nav>
        </div>
      </div>
    </div>
  );
}
