import { useEffect, useMemo, useRef, useState } from 'react';
import type { FrontEnd, ViewKey } from '../../../../shared/domain/frames';
import { boxToScreen, viewOrientation, type Camera, type DrawingMode } from '../../../../shared/drawings/screen';
import type { Drawing, ViewCoord } from '../../../../shared/drawings/types';
import type { LayoutPart, UnitLayout } from '../../../../shared/layout/unit-layout';
import { DrawingCanvas, type DrawingCanvasHandle, type DrawingPin } from '../../drawing';
import type { PartState } from '../lib/walk';
import { viewLabel } from '../lib/walk';

export interface UnitCanvasProps {
  drawing: Drawing;
  layout: UnitLayout;
  view: ViewKey;
  onViewChange(view: ViewKey): void;
  mode: DrawingMode;
  onModeChange(mode: DrawingMode): void;
  pins: readonly DrawingPin[];
  selectedPartId: string | null;
  /** Parts of the area being walked, drawn outlined over the drawing with their state. */
  emphasis: readonly string[];
  states: Map<string, { state: PartState }>;
  onSelectPart(part: LayoutPart, at: ViewCoord): void;
  height: number;
}

const sameCam = (a: Camera | null, b: Camera) => !!a && a.scale === b.scale && a.ox === b.ox && a.oy === b.oy;

/**
 * Follows the canvas's camera (pan and zoom happen inside it) by reading it once a frame; cheap,
 * and it keeps the outline layer in step without the canvas having to tell anyone.
 */
function useCamera(handle: React.RefObject<DrawingCanvasHandle | null>) {
  const [cam, setCam] = useState<Camera | null>(null);
  const last = useRef<Camera | null>(null);
  useEffect(() => {
    let raf = 0;
    const tick = () => {
      const c = handle.current?.camera();
      if (c && !sameCam(last.current, c)) {
        last.current = c;
        setCam(c);
      }
      raf = requestAnimationFrame(tick);
    };
    raf = requestAnimationFrame(tick);
    return () => cancelAnimationFrame(raf);
  }, [handle]);
  return cam;
}

function AreaOutlines({ drawing, view, mode, frontEnd, camera, emphasis, states, width, height, selectedPartId }: {
  selectedPartId: string | null;
  drawing: Drawing;
  view: ViewKey;
  mode: DrawingMode;
  frontEnd: FrontEnd;
  camera: Camera;
  emphasis: readonly string[];
  states: Map<string, { state: PartState }>;
  width: number;
  height: number;
}) {
  const v = drawing.views.find((x) => x.key === view);
  const ids = useMemo(() => new Set(emphasis), [emphasis]);
  if (!v) return null;
  const orient = viewOrientation(v, mode, frontEnd);
  // The selected part carries the canvas's own highlight and label; an outline would hide them.
  const parts = v.parts.filter((p) => ids.has(p.instanceId) && p.id !== selectedPartId);
  return (
    <svg className="pointer-events-none absolute inset-0" width={width} height={height} aria-hidden="true" data-testid="area-outlines">
      {parts.map((p) => {
        const r = boxToScreen(p.bbox, orient, camera);
        const pad = 3;
        const state = states.get(p.instanceId)?.state ?? 'todo';
        const done = state !== 'todo';
        return (
          <rect
            key={p.id}
            data-instance={p.instanceId}
            data-state={state}
            x={r.x - pad}
            y={r.y - pad}
            width={Math.max(r.w + 2 * pad, 8)}
            height={Math.max(r.h + 2 * pad, 8)}
            rx={3}
            fill="none"
            stroke={done ? 'var(--color-ok)' : 'var(--color-graphite)'}
            strokeWidth={done ? 2 : 2.5}
            strokeDasharray={done ? undefined : '6 4'}
          />
        );
      })}
    </svg>
  );
}

export function UnitCanvas(props: UnitCanvasProps) {
  const { drawing, layout, view, mode, height } = props;
  const handle = useRef<DrawingCanvasHandle | null>(null);
  const box = useRef<HTMLDivElement>(null);
  const camera = useCamera(handle);
  const [width, setWidth] = useState(0);
  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const m = () => setWidth(el.clientWidth);
    m();
    const ro = typeof ResizeObserver === 'function' ? new ResizeObserver(m) : null;
    ro?.observe(el);
    return () => ro?.disconnect();
  }, []);

  return (
    <div className="space-y-2">
      <div className="flex items-center gap-2 overflow-x-auto pb-1">
        <div role="radiogroup" aria-label="View" className="flex shrink-0 gap-1.5">
          {drawing.views.map((v) => (
            <button
              key={v.key}
              type="button"
              role="radio"
              aria-checked={view === v.key}
              onClick={() => props.onViewChange(v.key)}
              className={`btn shrink-0 px-3 text-base whitespace-nowrap ${view === v.key ? 'bg-graphite text-paper hover:bg-graphite-2' : ''}`}
            >
              {viewLabel(v.key, layout.frontEnd)}
            </button>
          ))}
        </div>
        <button
          type="button"
          className="btn ml-auto shrink-0 px-3 text-base whitespace-nowrap"
          aria-pressed={mode === 'front_first'}
          onClick={() => props.onModeChange(mode === 'front_first' ? 'as_built' : 'front_first')}
          title="Front first draws the front end at the left; as built draws the short hood at the left"
        >
          {mode === 'front_first' ? 'Front first' : 'As built'}
        </button>
      </div>
      <div ref={box} className="relative" style={{ height }}>
        {/* The canvas feature loads Konva on first use and shows its own placeholder meanwhile. */}
        <DrawingCanvas
          ref={handle}
          drawing={drawing}
          layout={layout}
          view={view}
          mode={mode}
          pins={props.pins}
          selectedPartId={props.selectedPartId}
          onSelectPart={props.onSelectPart}
          height={height}
        />
        {camera && width > 0 && (
          <AreaOutlines
            drawing={drawing}
            view={view}
            mode={mode}
            frontEnd={layout.frontEnd}
            camera={camera}
            emphasis={props.emphasis}
            states={props.states}
            selectedPartId={props.selectedPartId}
            width={width}
            height={height}
          />
        )}
      </div>
    </div>
  );
}
