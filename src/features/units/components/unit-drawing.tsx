import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect, useMemo, useRef, useState, useSyncExternalStore, type RefObject } from 'react';
import type { UnitRow } from '../../../../shared/api/units';
import type { ViewKey } from '../../../../shared/domain/frames';
import type { DrawingMode } from '../../../../shared/drawings/screen';
import type { LayoutPart, UnitLayout } from '../../../../shared/layout/unit-layout';
import { flipFrontEnd } from '../../../../shared/orientation';
import { DrawingCanvas, preloadDrawingCanvas, type DrawingCanvasHandle } from '../../drawing';
import { drawingQuery } from '../../drawing/api/get-drawing';
import { unitTypeLayoutQuery } from '../../drawing/api/get-unit-layout';
import type { FindingPinDetail } from '../api/findings';
import { HOOD_WORDS, feetInches } from '../lib/format';
import { pinsForView } from '../lib/pins';
import { flipExample, viewName } from '../lib/views';
import { ChangeFrontEndDialog } from './change-front-end-dialog';

const WIDE = '(min-width: 768px)';
function useWide(): boolean {
  return useSyncExternalStore(
    (cb) => {
      if (typeof window.matchMedia !== 'function') return () => {};
      const m = window.matchMedia(WIDE);
      m.addEventListener('change', cb);
      return () => m.removeEventListener('change', cb);
    },
    () => (typeof window.matchMedia === 'function' ? window.matchMedia(WIDE).matches : true),
  );
}

/**
 * Writes the canvas's camera onto the wrapper as data-camera="scale ox oy" after anything that can
 * move it (a render, a gesture, a key, a resize), so a test or an outside tool can turn a drawing
 * point into a screen point with shared/drawings/screen.ts instead of guessing pixels. Event-driven:
 * no frame loop runs while nobody touches the drawing.
 */
function useCameraAttribute(handle: RefObject<DrawingCanvasHandle | null>, box: RefObject<HTMLDivElement | null>) {
  const pending = useRef(0);
  const retry = useRef(0);
  const read = () => {
    cancelAnimationFrame(pending.current);
    clearTimeout(retry.current);
    // Two frames: the canvas applies a gesture's camera in the render after the event.
    pending.current = requestAnimationFrame(() => {
      pending.current = requestAnimationFrame(() => {
        const c = handle.current?.camera();
        if (c && box.current) box.current.dataset.camera = `${c.scale} ${c.ox} ${c.oy}`;
        // The canvas chunk may still be loading: look again shortly.
        else retry.current = window.setTimeout(read, 150);
      });
    });
  };
  useEffect(read);
  useEffect(() => {
    const el = box.current;
    const ro = typeof ResizeObserver === 'function' && el ? new ResizeObserver(() => read()) : null;
    if (ro && el) ro.observe(el);
    window.addEventListener('resize', read);
    return () => {
      ro?.disconnect();
      window.removeEventListener('resize', read);
      cancelAnimationFrame(pending.current);
      clearTimeout(retry.current);
    };
  }, []);
  return read;
}

export interface UnitDrawingProps {
  id?: string;
  unit: UnitRow;
  findings: readonly FindingPinDetail[];
  canChangeFrontEnd: boolean;
  selectedPartId: string | null;
  onSelectPart(partId: string | null): void;
  view: ViewKey;
  onViewChange(view: ViewKey): void;
}

/** The unit's drawing with its open findings pinned, the view and mode switches, the what-if preview and (admin) the F change. */
export function UnitDrawing({ id, unit, findings, canChangeFrontEnd, selectedPartId, onSelectPart, view, onViewChange }: UnitDrawingProps) {
  const qc = useQueryClient();
  const wide = useWide();
  const [mode, setMode] = useState<DrawingMode>('as_built');
  const [preview, setPreview] = useState(false);
  const [dialog, setDialog] = useState(false);
  const [notice, setNotice] = useState('');
  const handle = useRef<DrawingCanvasHandle | null>(null);
  const box = useRef<HTMLDivElement>(null);
  const readCamera = useCameraAttribute(handle, box);

  const otherEnd = flipFrontEnd(unit.frontEnd);
  const shownEnd = preview ? otherEnd : unit.frontEnd;
  const drawing = useQuery(drawingQuery(unit.unitTypeKey));
  const actual = useQuery(unitTypeLayoutQuery(unit.unitTypeKey, unit.frontEnd));
  const flipped = useQuery(unitTypeLayoutQuery(unit.unitTypeKey, otherEnd));
  const layout: UnitLayout | undefined = preview ? flipped.data : actual.data;

  useEffect(() => void preloadDrawingCanvas(), []);
  // A flip (real or previewed) should not wait for the network: both label sets are fetched up front.
  useEffect(() => void qc.prefetchQuery(unitTypeLayoutQuery(unit.unitTypeKey, otherEnd)), [qc, unit.unitTypeKey, otherEnd]);

  const pins = useMemo(() => (drawing.data ? pinsForView(findings, view, drawing.data.lengthIn) : []), [findings, view, drawing.data]);
  const row = useMemo(() => (layout && selectedPartId ? layout.parts.find((p) => p.partId === selectedPartId) : undefined), [layout, selectedPartId]);
  const actualRow = useMemo(() => (actual.data && selectedPartId ? actual.data.parts.find((p) => p.partId === selectedPartId) : undefined), [actual.data, selectedPartId]);
  const findingsHere = useMemo(() => {
    if (!row || !layout) return [];
    const ids = new Set(layout.parts.filter((p) => p.instanceId === row.instanceId).map((p) => p.partId));
    return findings.filter((f) => ids.has(f.partId));
  }, [row, layout, findings]);
  const example = actual.data && flipped.data ? flipExample(actual.data, flipped.data) : null;

  if (drawing.isError || actual.isError) {
    return (
      <p role="alert" className="card border-federal p-3 font-bold text-federal">
        The drawing could not be loaded: {(drawing.error ?? actual.error)?.message}
      </p>
    );
  }
  const height = wide ? 420 : 260;

  return (
    <section id={id} aria-label="Drawing" className="scroll-mt-20 space-y-2">
      <div className="flex flex-wrap items-center gap-2">
        <div role="radiogroup" aria-label="View" className="-mx-1 flex max-w-full gap-1.5 overflow-x-auto px-1 pb-1">
          {(drawing.data?.views ?? []).map((v) => (
            <button
              key={v.key}
              type="button"
              role="radio"
              aria-checked={view === v.key}
              onClick={() => onViewChange(v.key)}
              className={`btn shrink-0 px-3 text-base whitespace-nowrap ${view === v.key ? 'bg-graphite text-paper hover:bg-graphite-2' : ''}`}
            >
              {viewName(v.key, shownEnd)}
            </button>
          ))}
        </div>
        <div className="flex flex-wrap gap-2">
          <button
            type="button"
            className="btn px-3 text-base"
            aria-pressed={mode === 'front_first'}
            onClick={() => setMode((m) => (m === 'front_first' ? 'as_built' : 'front_first'))}
            title="As built draws the short hood at the left; front first draws the front end at the left"
          >
            {mode === 'front_first' ? 'Front first' : 'As built'}
          </button>
          <button
            type="button"
            className={`btn px-3 text-base ${preview ? 'border-accent bg-accent-soft' : ''}`}
            aria-pressed={preview}
            onClick={() => setPreview((p) => !p)}
          >
            <span className="sm:hidden">F on the other end?</span>
            <span className="max-sm:hidden">What if the F were on the other end?</span>
          </button>
          {canChangeFrontEnd && (
            <button type="button" className="btn px-3 text-base" onClick={() => setDialog(true)} disabled={!actual.data}>
              Change F end…
            </button>
          )}
        </div>
      </div>

      {preview && (
        <p className="rounded-md border-2 border-dashed border-accent bg-accent-soft p-2 font-bold" data-testid="preview-banner">
          Preview only: every name below is worked out as if the F were on the {HOOD_WORDS[otherEnd]}. {unit.roadNumber} carries it on the{' '}
          {HOOD_WORDS[unit.frontEnd]}; nothing is saved.
        </p>
      )}

      <div
        ref={box}
        data-testid="unit-canvas"
        data-view={view}
        data-mode={mode}
        data-front-end={shownEnd}
        data-unit-type={unit.unitTypeKey}
        onPointerUpCapture={readCamera}
        onPointerMoveCapture={(e) => e.buttons && readCamera()}
        onWheelCapture={readCamera}
        onKeyUpCapture={readCamera}
        onClickCapture={readCamera}
        style={{ minHeight: height }}
      >
        {drawing.data && layout ? (
          <DrawingCanvas
            ref={handle}
            drawing={drawing.data}
            layout={layout}
            view={view}
            mode={mode}
            pins={pins}
            selectedPartId={selectedPartId}
            onSelectPart={(p: LayoutPart) => onSelectPart(p.partId)}
            onTapEmpty={() => onSelectPart(null)}
            height={height}
          />
        ) : (
          <div className="flex items-center justify-center rounded-md border-2 border-rule bg-paper-2 text-lg" style={{ height }} aria-busy="true">
            Loading the drawing…
          </div>
        )}
      </div>

      <p role="status" className="empty:hidden font-bold">
        {notice}
      </p>

      <div className="card p-3" data-testid="selected-part">
        {row ? (
          <div className="space-y-1">
            <p className="label">Selected part{preview ? ' (preview)' : ''}</p>
            <p className="text-2xl font-bold" data-testid="selected-part-label">
              {row.label}
            </p>
            <p className="text-graphite-2">
              {row.number !== undefined && row.count !== undefined && `${row.number} of ${row.count} counted from the front · `}
              {feetInches(row.along)} from the front coupler face
              {Math.abs(row.left) >= 1 && ` · ${feetInches(row.left)} ${row.left > 0 ? 'left' : 'right'} of the centreline`}
            </p>
            {preview && actualRow && actualRow.label !== row.label && (
              <p>
                On {unit.roadNumber} as it is (F on the {HOOD_WORDS[unit.frontEnd]}) this part is <strong>{actualRow.label}</strong>.
              </p>
            )}
            {findingsHere.length > 0 && (
              <p className="font-bold">
                {findingsHere.length === 1 ? 'One open finding' : `${findingsHere.length} open findings`} on this part: {findingsHere.map((f) => f.defectLabel).join('; ')}
              </p>
            )}
          </div>
        ) : (
          <p className="text-graphite-2">Tap or click a part of the drawing (or Tab to it and press Enter) to see its name.</p>
        )}
      </div>

      {dialog && actual.data && (
        <ChangeFrontEndDialog
          unit={unit}
          example={example}
          onClose={() => setDialog(false)}
          onChanged={(u) => {
            setDialog(false);
            setPreview(false);
            setNotice(`The F is now on the ${HOOD_WORDS[u.frontEnd]} of ${u.roadNumber}; every name on the drawing has been worked out again.`);
          }}
        />
      )}
    </section>
  );
}
