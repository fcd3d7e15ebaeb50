/**
 * The canvas view of a unit drawing (Konva). Load it through ./index.ts (lazy) so Konva stays out
 * of screens that do not draw.
 */
import type { Stage as KonvaStage } from 'konva/lib/Stage';
import { useCallback, useId, useImperativeHandle, useMemo, useRef, useState, type KeyboardEvent } from 'react';
import { Stage } from 'react-konva';
import { screenPoint, type ScreenPoint } from '../../../shared/domain/frames';
import type { PartKind } from '../../../shared/domain/parts';
import { boxContains, expandedHitBox, partAtPoint } from '../../../shared/drawings/geometry';
import {
  MIN_TARGET_PX,
  boxToScreen,
  ensureVisible,
  minHitSideIn,
  orientationMarkers,
  panBy,
  pinchCamera,
  screenToView,
  viewExtent,
  viewOrientation,
  viewToScreen,
  zoomAt,
  type Camera,
  type ViewOrientation,
} from '../../../shared/drawings/screen';
import { placeFrontMarkings, placeNumerals, tabOrder, tappableView, type NumeralItem, type PlacedFrontMarking } from '../../../shared/drawings/screen-labels';
import type { DrawingView, PartShape, Shape, ViewCoord, ViewPart } from '../../../shared/drawings/types';
import type { LayoutPart } from '../../../shared/layout/unit-layout';
import { composePartLabel, pinSide } from '../../../shared/orientation';
import {
  LABEL_FONT_PX,
  NUMERAL_FONT_PX,
  OverlayLayer,
  PaperLayer,
  PinsLayer,
  markerBox,
  type FMarkView,
  type SelectionView,
} from './drawing-layers';
import { batchPins } from './paint';
import { paletteFor } from './palette';
import type { DrawingCanvasProps } from './types';
import { useCamera } from './use-camera';
import { useDarkTheme, useElementWidth, usePrefersReducedMotion, useSettled } from './use-environment';
import { usePointerGestures } from './use-pointer-gestures';

const KEY_PAN_PX = 48;
const KEY_ZOOM = 1.25;

/** Which numbers win a crowded spot: running gear first. */
const NUMERAL_PRIORITY: Partial<Record<PartKind, number>> = {
  truck: 0,
  axle: 1,
  traction_motor: 2,
  wheel: 3,
  sand_box: 4,
  air_reservoir: 5,
  battery_box: 6,
  handrail: 7,
  stanchion: 8,
};

const VIEW_NAMES: Record<DrawingView['key'], string> = {
  plan: 'plan',
  side_plus_y: 'side elevation',
  side_minus_y: 'side elevation',
  end_short_hood: 'short hood end elevation',
  end_long_hood: 'long hood end elevation',
};

/** A part's outline as screen offsets about its centre, the way the file draws it (so an F stays readable). */
function glyphOutline(shape: PartShape, centre: ViewCoord, view: DrawingView, scale: number): { outline: number[]; closed: boolean } {
  const ku = view.sheet.u.sign * scale;
  const kv = view.sheet.v.sign * scale;
  const pts: number[] = [];
  const push = (u: number, v: number): void => void pts.push(ku * (u - centre.u), kv * (v - centre.v));
  switch (shape.kind) {
    case 'rect':
      push(shape.x, shape.y), push(shape.x + shape.w, shape.y), push(shape.x + shape.w, shape.y + shape.h), push(shape.x, shape.y + shape.h);
      return { outline: pts, closed: true };
    case 'circle':
    case 'ellipse': {
      const ru = shape.kind === 'circle' ? shape.r : shape.ru, rv = shape.kind === 'circle' ? shape.r : shape.rv;
      for (let i = 0; i < 24; i++) push(shape.cx + ru * Math.cos((i / 24) * Math.PI * 2), shape.cy + rv * Math.sin((i / 24) * Math.PI * 2));
      return { outline: pts, closed: true };
    }
    case 'line':
      push(shape.x1, shape.y1), push(shape.x2, shape.y2);
      return { outline: pts, closed: false };
    case 'poly':
      for (let i = 0; i + 1 < shape.points.length; i += 2) push(shape.points[i], shape.points[i + 1]);
      return { outline: pts, closed: shape.closed };
  }
}

const sameOrient = (a: ViewOrientation, b: ViewOrientation): boolean => a.su === b.su && a.sv === b.sv;

export function DrawingCanvas(props: DrawingCanvasProps) {
  const { drawing, layout, view: viewKey, mode, pins, heat, onSelectPart, onTapEmpty, height = 420, width, ref } = props;
  const outer = useRef<HTMLDivElement>(null);
  const surface = useRef<HTMLDivElement>(null);
  const stageRef = useRef<KonvaStage>(null);
  const helpId = useId();

  const view = drawing.views.find((v) => v.key === viewKey);
  if (!view) throw new Error(`drawing ${drawing.key} has no ${viewKey} view`);
  const frontEnd = layout.frontEnd;

  const measuredWidth = useElementWidth(outer, width);
  const viewport = useMemo(() => ({ width: measuredWidth, height }), [measuredWidth, height]);
  const orientRaw = viewOrientation(view, mode, frontEnd);
  const orientRef = useRef(orientRaw);
  if (!sameOrient(orientRef.current, orientRaw)) orientRef.current = orientRaw;
  const orient = orientRef.current;

  // Fit and clamp to all that is painted (bounds, labels, the file's titles), not just the bounds.
  const extent = useMemo(() => viewExtent(view), [view]);
  const { camera, limits, current, update, fit } = useCamera(viewKey, extent, orient, viewport);
  const lineScale = useSettled(camera.scale, 150);
  const dark = useDarkTheme();
  const palette = paletteFor(dark);
  const reduceMotion = usePrefersReducedMotion();

  // ---- geometry that changes with the data, not with pan / zoom
  const markings = useMemo(() => placeFrontMarkings(drawing, viewKey, frontEnd), [drawing, viewKey, frontEnd]);
  const tappable = useMemo(() => tappableView(view, markings), [view, markings]);
  const paperShapes = useMemo<Shape[]>(() => {
    const fBoxes = view.parts.filter((p) => p.kind === 'front_marking').map((p) => p.bbox);
    // The F is drawn by the overlay, where the unit's front end puts it; a file's own "F" text goes with it.
    const decor = view.decor.filter((s) => !(s.kind === 'text' && s.text.trim().toUpperCase() === 'F' && fBoxes.some((b) => boxContains(b, { u: s.x, v: s.y }))));
    return [...decor, ...view.parts.filter((p) => p.kind !== 'front_marking').map((p) => p.shape)].sort((a, b) => a.order - b.order);
  }, [view]);
  const layoutById = useMemo(() => new Map(layout.parts.map((p) => [p.partId, p])), [layout]);
  const movedF = useMemo(() => new Map(markings.filter((m) => m.moved).map((m) => [m.partId, m])), [markings]);
  const order = useMemo(() => tabOrder(layout.parts, viewKey, drawing.lengthIn, markings), [layout, viewKey, drawing.lengthIn, markings]);
  const pinBatches = useMemo(() => batchPins(pins ?? []), [pins]);

  /** The layout row a tapped part reports; an F shown at the other end is named by where it is shown. */
  const layoutFor = useCallback(
    (part: ViewPart): LayoutPart | undefined => {
      const row = layoutById.get(part.id);
      const moved = movedF.get(part.id);
      if (!row || !moved) return row;
      const side = pinSide(viewKey, moved.centre, frontEnd);
      return { ...row, side, label: composePartLabel({ kind: row.kind, side }) };
    },
    [layoutById, movedF, viewKey, frontEnd],
  );

  // ---- selection and keyboard focus
  const [ownSelection, setOwnSelection] = useState<string | null>(null);
  const selectedId = props.selectedPartId === undefined ? ownSelection : props.selectedPartId;
  const selectedPart = useMemo(() => {
    if (!selectedId) return undefined;
    const direct = tappable.parts.find((p) => p.id === selectedId);
    if (direct) return direct;
    const instanceId = layoutById.get(selectedId)?.instanceId;
    return instanceId ? tappable.parts.find((p) => p.instanceId === instanceId) : undefined;
  }, [selectedId, tappable, layoutById]);
  const selectedRow = selectedPart ? layoutFor(selectedPart) : undefined;
  const [focusId, setFocusId] = useState<string | null>(null);
  const focusPart = focusId ? tappable.parts.find((p) => p.id === focusId) : undefined;
  const [lastEvent, setLastEvent] = useState<'select' | 'focus' | null>(null);

  const select = useCallback(
    (part: ViewPart, at: ViewCoord) => {
      const row = layoutFor(part);
      if (!row) return;
      setOwnSelection(part.id);
      setLastEvent('select');
      onSelectPart(row, at);
    },
    [layoutFor, onSelectPart],
  );

  // ---- overlay geometry, relative to the camera origin (so a pan moves groups, not their contents)
  const { scale } = camera;
  const cam0: Camera = useMemo(() => ({ scale, ox: 0, oy: 0 }), [scale]);
  const markers = useMemo(() => orientationMarkers(view, frontEnd, orient, cam0, 10, extent).map(markerBox), [view, frontEnd, orient, cam0, extent]);
  const numerals = useMemo(() => {
    const items: NumeralItem[] = [];
    for (const part of tappable.parts) {
      const row = layoutById.get(part.id);
      if (row?.number === undefined) continue;
      items.push({ key: part.id, text: String(row.number), box: boxToScreen(part.bbox, orient, cam0), priority: NUMERAL_PRIORITY[part.kind] ?? 9 });
    }
    return placeNumerals(items, NUMERAL_FONT_PX, markers);
  }, [tappable, layoutById, orient, cam0, markers]);
  const fMarks = useMemo<FMarkView[]>(
    () =>
      markings.map((m: PlacedFrontMarking) => {
        const at = viewToScreen(m.centre, orient, cam0);
        const source = drawing.views.find((v) => v.key === m.sourceView) ?? view;
        return { key: m.instanceId, x: at.sx, y: at.sy, ...glyphOutline(m.shape, m.sourceCentre, source, scale) };
      }),
    [markings, orient, cam0, drawing, view, scale],
  );
  const selection = useMemo<SelectionView | undefined>(() => {
    if (!selectedPart || !selectedRow) return undefined;
    const r = boxToScreen(selectedPart.bbox, orient, camera);
    const small = r.w < MIN_TARGET_PX || r.h < MIN_TARGET_PX;
    const text = selectedRow.label;
    const w = Math.ceil(text.length * LABEL_FONT_PX * 0.56 + 20), h = LABEL_FONT_PX + 14;
    let x = r.x + r.w / 2 - w / 2;
    let y = r.y - h - 10;
    if (y < 4) y = r.y + r.h + 10;
    x = Math.min(Math.max(4, x), viewport.width - w - 4);
    y = Math.min(Math.max(4, y), viewport.height - h - 4);
    return {
      shape: selectedPart.shape,
      target: small ? expandedHitBox(selectedPart.bbox, minHitSideIn(camera.scale)) : undefined,
      label: { x: x - camera.ox, y: y - camera.oy, w, h, text },
    };
  }, [selectedPart, selectedRow, orient, camera, viewport]);

  // ---- interaction
  const viewAt = useCallback((p: ScreenPoint): ViewCoord => screenToView(p, orient, current()), [orient, current]);
  const hit = useCallback((p: ScreenPoint) => {
    const at = viewAt(p);
    return { at, part: partAtPoint(tappable, at, minHitSideIn(current().scale)) };
  }, [viewAt, tappable, current]);

  usePointerGestures(surface, {
    onPan: (dx, dy) => update((c) => panBy(c, dx, dy)),
    onPinch: (before, after) => update((c) => pinchCamera(c, before, after, limits)),
    onWheelZoom: (factor, at) => update((c) => zoomAt(c, factor, at, limits)),
    onTap: (p) => {
      surface.current?.focus({ preventScroll: true });
      const { at, part } = hit(p);
      if (part) select(part, at);
      else onTapEmpty?.(at);
    },
    onHover: (p) => {
      if (surface.current) surface.current.style.cursor = hit(p).part ? 'pointer' : 'grab';
    },
  });

  const zoomBy = useCallback(
    (factor: number, at?: ScreenPoint) => update((c) => zoomAt(c, factor, at ?? screenPoint(viewport.width / 2, viewport.height / 2), limits)),
    [update, limits, viewport],
  );

  const moveFocus = (id: string | null): void => {
    setFocusId(id);
    setLastEvent(id ? 'focus' : null);
    const part = id ? tappable.parts.find((p) => p.id === id) : undefined;
    if (part) update((c) => ensureVisible(c, boxToScreen(part.bbox, orient, c), viewport));
  };

  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>): void => {
    if (e.target !== e.currentTarget || e.altKey || e.ctrlKey || e.metaKey) return;
    switch (e.key) {
      case 'Tab': {
        const i = focusId ? order.indexOf(focusId) : -1;
        const next = e.shiftKey ? (i === -1 ? -1 : i - 1) : i + 1;
        if (next < 0 || next >= order.length) {
          // Past either end: let focus leave the canvas as usual.
          moveFocus(null);
          return;
        }
        e.preventDefault();
        moveFocus(order[next]);
        return;
      }
      case 'Enter':
      case ' ':
        if (focusPart) {
          e.preventDefault();
          select(focusPart, focusPart.centre);
        }
        return;
      case 'Escape':
        moveFocus(null);
        return;
      case 'ArrowLeft':
      case 'ArrowRight':
      case 'ArrowUp':
      case 'ArrowDown': {
        e.preventDefault();
        const step = e.shiftKey ? KEY_PAN_PX * 4 : KEY_PAN_PX;
        // The arrow says which way to look, so the drawing moves the other way.
        const dx = e.key === 'ArrowLeft' ? step : e.key === 'ArrowRight' ? -step : 0;
        const dy = e.key === 'ArrowUp' ? step : e.key === 'ArrowDown' ? -step : 0;
        update((c) => panBy(c, dx, dy));
        return;
      }
      case '+':
      case '=':
        e.preventDefault();
        zoomBy(KEY_ZOOM);
        return;
      case '-':
      case '_':
        e.preventDefault();
        zoomBy(1 / KEY_ZOOM);
        return;
      case '0':
        e.preventDefault();
        fit();
        return;
    }
  };

  useImperativeHandle(
    ref,
    () => ({
      panBy: (dx: number, dy: number) => update((c) => panBy(c, dx, dy)),
      zoomBy,
      fit,
      camera: current,
      toScreen: (p: ViewCoord) => viewToScreen(p, orient, current()),
      stage: () => stageRef.current,
    }),
    [update, zoomBy, fit, current, orient],
  );

  const focusRow = focusPart ? layoutFor(focusPart) : undefined;
  const announcement =
    lastEvent === 'focus' && focusRow ? `${focusRow.label}. Enter selects it.` : selectedRow ? `Selected: ${selectedRow.label}` : '';
  const modeName = mode === 'front_first' ? 'front first' : 'as built';

  return (
    <div ref={outer} className="relative w-full select-none" style={{ height }}>
      <div
        ref={surface}
        tabIndex={0}
        role="application"
        aria-roledescription="unit drawing"
        aria-label={`${drawing.name}: ${VIEW_NAMES[viewKey]}, ${modeName}`}
        aria-describedby={helpId}
        data-scale={camera.scale.toFixed(4)}
        onKeyDown={onKeyDown}
        onBlur={() => setFocusId(null)}
        className="h-full w-full overflow-hidden rounded-md focus-visible:outline-3 focus-visible:outline-offset-2 focus-visible:outline-accent"
        style={{ background: palette.paper, touchAction: 'none', cursor: 'grab' }}
      >
        <Stage ref={stageRef} width={viewport.width} height={viewport.height} listening={false}>
          <PaperLayer shapes={paperShapes} extent={extent} palette={palette} orient={orient} camera={camera} lineScale={lineScale} heat={heat} reduceMotion={reduceMotion} />
          <PinsLayer pins={pinBatches} palette={palette} orient={orient} camera={camera} viewport={viewport} lineScale={lineScale} reduceMotion={reduceMotion} />
          <OverlayLayer
            palette={palette}
            orient={orient}
            camera={camera}
            numerals={numerals}
            markers={markers}
            fMarks={fMarks}
            selection={selection}
            focus={focusPart?.bbox}
            flipKey={frontEnd}
            reduceMotion={reduceMotion}
          />
        </Stage>
      </div>
      {/* The frame is drawn over the canvas so the canvas keeps the full width and height. */}
      <div aria-hidden="true" className="pointer-events-none absolute inset-0 rounded-md border-2 border-rule" />
      <div data-canvas-controls className="absolute top-2 right-2 flex gap-2">
        <button type="button" className="btn bg-paper px-3" aria-label="Zoom out" onClick={() => zoomBy(1 / KEY_ZOOM)}>
          −
        </button>
        <button type="button" className="btn bg-paper px-3" aria-label="Zoom in" onClick={() => zoomBy(KEY_ZOOM)}>
          +
        </button>
        <button type="button" className="btn bg-paper" onClick={fit}>
          Fit
        </button>
      </div>
      <p id={helpId} className="sr-only">
        Tap or click a part to select it. Drag to pan, pinch or use the wheel to zoom. From the keyboard: Tab and Shift+Tab move
        through the parts from the front, Enter selects, the arrow keys pan, plus and minus zoom, 0 fits the drawing.
      </p>
      <p role="status" aria-live="polite" className="sr-only">
        {announcement}
      </p>
    </div>
  );
}

export default DrawingCanvas;
