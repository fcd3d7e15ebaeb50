/**
 * One view of a unit drawn bare, as the file lays it out, for a quiz question. The shared canvas
 * prints FRONT / REAR / LEFT / RIGHT, part numbers and the selected part's name, which would give
 * the answers away; this sheet shows only the linework and the F where the prompt puts it. Taps are
 * resolved with the shared geometry (lib/resolve-tap.ts).
 */
import { useId, useMemo, useRef, useState, type KeyboardEvent, type PointerEvent } from 'react';
import { VIEW_AXES, type FrontEnd, type ViewKey } from '../../../../shared/domain/frames';
import { PART_KINDS } from '../../../../shared/domain/parts';
import { boxContains, sheetToView, viewToSheet } from '../../../../shared/drawings/geometry';
import { viewExtent } from '../../../../shared/drawings/screen';
import { resolveTap } from '../lib/resolve-tap';
import { placeFrontMarkings, tappableView } from '../../../../shared/drawings/screen-labels';
import type { Drawing, DrawingView, FillClass, LineClass, PartShape, Shape, ViewCoord, ViewPart } from '../../../../shared/drawings/types';

export type MarkTone = 'ask' | 'right' | 'wrong';
export interface SheetMark {
  readonly partIds: readonly string[];
  readonly tone: MarkTone;
}

export interface QuizSheetProps {
  drawing: Drawing;
  view: ViewKey;
  frontEnd: FrontEnd;
  /** Accessible name of the sheet (never says which side it is). */
  title: string;
  marks?: readonly SheetMark[];
  /** Present while the sheet takes an answer. */
  onTap?(part: ViewPart, at: ViewCoord): void;
  /** CSS px; none when undefined (the sheet takes its width and keeps its proportions). */
  maxHeight?: number;
}

const LINE_PX: Record<LineClass, number> = { heavy: 2, normal: 1.2, hair: 0.6, hidden: 1 };
// 'ground' is the paper itself: it hides what lies behind a part.
const FILL: Record<FillClass, { color: string; opacity: number }> = {
  none: { color: 'none', opacity: 0 },
  body: { color: 'var(--color-graphite)', opacity: 0.05 },
  glass: { color: 'var(--color-graphite)', opacity: 0.16 },
  rubber: { color: 'var(--color-graphite)', opacity: 0.5 },
  ink: { color: 'var(--color-graphite)', opacity: 1 },
  ground: { color: 'var(--color-paper)', opacity: 1 },
};
const TONE = {
  ask: { stroke: 'var(--color-accent)', fill: 'var(--color-accent)', fillOpacity: 0.28, dash: undefined, width: 3 },
  right: { stroke: 'var(--color-ok)', fill: 'var(--color-ok)', fillOpacity: 0.35, dash: undefined, width: 3.5 },
  wrong: { stroke: 'var(--color-federal)', fill: 'none', fillOpacity: 0, dash: '5 3', width: 3 },
} as const;

type Pt = { x: number; y: number };

/** Sheet coordinates for the view's own points (absolute SVG user units, inches). */
function sheetOf(view: DrawingView) {
  return (p: ViewCoord): Pt => {
    const s = viewToSheet(view.key, view.sheet, p);
    return { x: s.sx, y: s.sy };
  };
}

/** Whether the sheet's horizontal axis carries the view's u (else the file swapped them). */
const uAlongX = (view: DrawingView) => view.sheet.u.axis === VIEW_AXES[view.key][0];

function shapeElement(s: PartShape, view: DrawingView, key: string, style: React.SVGProps<SVGElement>, extra: Record<string, string> = {}) {
  const at = sheetOf(view);
  switch (s.kind) {
    case 'rect': {
      const a = at({ u: s.x, v: s.y });
      const b = at({ u: s.x + s.w, v: s.y + s.h });
      return <rect key={key} x={Math.min(a.x, b.x)} y={Math.min(a.y, b.y)} width={Math.abs(b.x - a.x)} height={Math.abs(b.y - a.y)} {...(style as object)} {...extra} />;
    }
    case 'circle': {
      const c = at({ u: s.cx, v: s.cy });
      return <circle key={key} cx={c.x} cy={c.y} r={s.r} {...(style as object)} {...extra} />;
    }
    case 'ellipse': {
      const c = at({ u: s.cx, v: s.cy });
      const [rx, ry] = uAlongX(view) ? [s.ru, s.rv] : [s.rv, s.ru];
      return <ellipse key={key} cx={c.x} cy={c.y} rx={rx} ry={ry} {...(style as object)} {...extra} />;
    }
    case 'line': {
      const a = at({ u: s.x1, v: s.y1 });
      const b = at({ u: s.x2, v: s.y2 });
      return <line key={key} x1={a.x} y1={a.y} x2={b.x} y2={b.y} {...(style as object)} {...extra} />;
    }
    case 'poly': {
      const pts: string[] = [];
      for (let i = 0; i + 1 < s.points.length; i += 2) {
        const p = at({ u: s.points[i], v: s.points[i + 1] });
        pts.push(`${p.x},${p.y}`);
      }
      return s.closed ? <polygon key={key} points={pts.join(' ')} {...(style as object)} {...extra} /> : <polyline key={key} points={pts.join(' ')} {...(style as object)} {...extra} />;
    }
  }
}

function baseStyle(s: Shape): React.SVGProps<SVGElement> {
  const filled = s.style.fill !== 'none' && s.kind !== 'line' && !(s.kind === 'poly' && !s.closed);
  return {
    style: {
      stroke: s.style.fill === 'ink' ? 'none' : s.style.line === 'hair' ? 'var(--color-graphite-2)' : 'var(--color-graphite)',
      strokeWidth: LINE_PX[s.style.line],
      strokeDasharray: s.style.line === 'hidden' ? '6 4' : undefined,
      fill: filled ? (FILL[s.style.fill]?.color ?? 'none') : 'none',
      fillOpacity: filled ? (FILL[s.style.fill]?.opacity ?? 0) : 0,
      vectorEffect: 'non-scaling-stroke',
      strokeLinejoin: 'round',
      strokeLinecap: 'round',
    },
  };
}

export function QuizSheet({ drawing, view: viewKey, frontEnd, title, marks = [], onTap, maxHeight }: QuizSheetProps) {
  const view = drawing.views.find((v) => v.key === viewKey);
  if (!view) throw new Error(`drawing ${drawing.key} has no ${viewKey} view`);
  const svgRef = useRef<SVGSVGElement>(null);
  const liveId = useId();
  const at = sheetOf(view);

  const markings = useMemo(() => placeFrontMarkings(drawing, viewKey, frontEnd), [drawing, viewKey, frontEnd]);
  const tappable = useMemo(() => tappableView(view, markings), [view, markings]);
  const fBoxes = useMemo(() => view.parts.filter((p) => p.kind === 'front_marking').map((p) => p.bbox), [view]);
  const shapes = useMemo(() => {
    // The F is drawn where the prompt puts it (below); the file's own F and any "F" text go.
    const decor = view.decor.filter((s) => !(s.kind === 'text' && s.text.trim().toUpperCase() === 'F' && fBoxes.some((b) => boxContains(b, { u: s.x, v: s.y }))));
    const parts = view.parts.filter((p) => p.kind !== 'front_marking');
    return [...decor.map((s) => ({ s, part: undefined as ViewPart | undefined })), ...parts.map((p) => ({ s: p.shape as Shape, part: p as ViewPart | undefined }))].sort(
      (a, b) => a.s.order - b.s.order,
    );
  }, [view, fBoxes]);

  const box = useMemo(() => {
    const e = viewExtent(view, 6);
    const a = at({ u: e.umin, v: e.vmin });
    const b = at({ u: e.umax, v: e.vmax });
    return { x: Math.min(a.x, b.x), y: Math.min(a.y, b.y), w: Math.abs(b.x - a.x), h: Math.abs(b.y - a.y) };
  }, [view]);

  /** The F glyph as the file draws it, moved to where this prompt's F is. */
  const fGlyphs = useMemo(
    () =>
      markings.map((m) => {
        const source = drawing.views.find((v) => v.key === m.sourceView) ?? view;
        const from = sheetOf(source);
        const c0 = from(m.sourceCentre);
        const c1 = at(m.centre);
        const pts: number[] = [];
        const s = m.shape;
        const push = (u: number, v: number) => {
          const p = from({ u, v });
          pts.push(p.x - c0.x + c1.x, p.y - c0.y + c1.y);
        };
        if (s.kind === 'poly') for (let i = 0; i + 1 < s.points.length; i += 2) push(s.points[i], s.points[i + 1]);
        else if (s.kind === 'rect') push(s.x, s.y), push(s.x + s.w, s.y), push(s.x + s.w, s.y + s.h), push(s.x, s.y + s.h);
        const r = Math.max(m.bbox.umax - m.bbox.umin, m.bbox.vmax - m.bbox.vmin) * 0.9 + 3;
        return { key: m.instanceId, points: pts, centre: c1, ring: r };
      }),
    [markings, drawing, view],
  );

  const byId = useMemo(() => new Map(tappable.parts.map((p) => [p.id, p])), [tappable]);
  // Keyboard order: as drawn, left to right then top to bottom (never "from the front": that would hint).
  const order = useMemo(
    () =>
      [...tappable.parts]
        .map((p) => ({ p, c: at(p.centre) }))
        .sort((a, b) => a.c.x - b.c.x || a.c.y - b.c.y)
        .map((x) => x.p),
    [tappable],
  );
  const [focus, setFocus] = useState<number | null>(null);
  const focused = focus === null ? undefined : order[focus];

  const toView = (clientX: number, clientY: number): { at: ViewCoord; pxPerIn: number } | undefined => {
    const svg = svgRef.current;
    const ctm = svg?.getScreenCTM();
    if (!svg || !ctm) return undefined;
    const pt = new DOMPoint(clientX, clientY).matrixTransform(ctm.inverse());
    return { at: sheetToView(view.key, view.sheet, { sx: pt.x, sy: pt.y }), pxPerIn: Math.hypot(ctm.a, ctm.b) };
  };

  const onPointerUp = (e: PointerEvent<SVGSVGElement>) => {
    if (!onTap) return;
    const r = toView(e.clientX, e.clientY);
    if (!r) return;
    const part = resolveTap(tappable, r.at, r.pxPerIn);
    if (part) onTap(part, r.at);
  };

  const onKeyDown = (e: KeyboardEvent<SVGSVGElement>) => {
    if (!onTap || order.length === 0) return;
    const step = (d: number) => {
      e.preventDefault();
      setFocus((f) => (f === null ? (d > 0 ? 0 : order.length - 1) : (f + d + order.length) % order.length));
    };
    if (e.key === 'ArrowRight' || e.key === 'ArrowDown') step(1);
    else if (e.key === 'ArrowLeft' || e.key === 'ArrowUp') step(-1);
    else if ((e.key === 'Enter' || e.key === ' ') && focused) {
      e.preventDefault();
      onTap(focused, focused.centre);
    } else if (e.key === 'Escape') setFocus(null);
  };

  const markShapes = marks.flatMap((m, i) =>
    m.partIds
      .map((id) => byId.get(id))
      .filter((p): p is ViewPart => p !== undefined)
      .map((p) => {
        const t = TONE[m.tone];
        return shapeElement(
          p.shape,
          view,
          `mark-${i}-${p.id}`,
          { style: { stroke: t.stroke, strokeWidth: t.width, strokeDasharray: t.dash, fill: t.fill, fillOpacity: t.fillOpacity, vectorEffect: 'non-scaling-stroke' } },
          { 'data-mark': m.tone, 'data-mark-part': p.id },
        );
      }),
  );

  return (
    <figure className="space-y-1">
      <figcaption className="text-sm font-bold tracking-wider text-graphite-2 uppercase">{title}</figcaption>
      <svg
        ref={svgRef}
        role={onTap ? 'application' : 'img'}
        aria-label={`${drawing.name}: ${title}`}
        aria-describedby={onTap ? liveId : undefined}
        tabIndex={onTap ? 0 : undefined}
        viewBox={`${box.x} ${box.y} ${box.w} ${box.h}`}
        preserveAspectRatio="xMidYMid meet"
        className="block w-full rounded-md border-2 border-rule bg-paper focus-visible:outline-3 focus-visible:outline-offset-2 focus-visible:outline-accent"
        style={{ maxHeight: maxHeight ?? 'none', cursor: onTap ? 'pointer' : 'default', touchAction: 'manipulation' }}
        onPointerUp={onPointerUp}
        onKeyDown={onKeyDown}
        onBlur={() => setFocus(null)}
        data-view={viewKey}
        data-front-end={frontEnd}
      >
        {shapes.map(({ s, part }, i) =>
          s.kind === 'text' ? (
            <text
              key={`t${i}`}
              x={at({ u: s.x, v: s.y }).x}
              y={at({ u: s.x, v: s.y }).y}
              fontSize={s.size}
              textAnchor={s.anchor}
              style={{ fill: 'var(--color-graphite-2)', fontFamily: 'var(--font-sans)' }}
            >
              {s.text}
            </text>
          ) : (
            shapeElement(s, view, part ? part.id : `d${i}`, baseStyle(s), part ? { 'data-part-id': part.id } : {})
          ),
        )}
        {fGlyphs.map((g) => (
          <g key={g.key} data-f-marking="">
            <circle cx={g.centre.x} cy={g.centre.y} r={g.ring} style={{ fill: 'none', stroke: 'var(--color-graphite)', strokeWidth: 1.5, vectorEffect: 'non-scaling-stroke' }} />
            <polygon points={g.points.join(' ')} style={{ fill: 'var(--color-graphite)' }} />
          </g>
        ))}
        {markShapes}
        {focused && (
          <rect
            x={Math.min(at({ u: focused.bbox.umin, v: focused.bbox.vmin }).x, at({ u: focused.bbox.umax, v: focused.bbox.vmax }).x) - 2}
            y={Math.min(at({ u: focused.bbox.umin, v: focused.bbox.vmin }).y, at({ u: focused.bbox.umax, v: focused.bbox.vmax }).y) - 2}
            width={Math.abs(at({ u: focused.bbox.umax, v: focused.bbox.vmax }).x - at({ u: focused.bbox.umin, v: focused.bbox.vmin }).x) + 4}
            height={Math.abs(at({ u: focused.bbox.umax, v: focused.bbox.vmax }).y - at({ u: focused.bbox.umin, v: focused.bbox.vmin }).y) + 4}
            style={{ fill: 'none', stroke: 'var(--color-accent)', strokeWidth: 2, strokeDasharray: '5 3', vectorEffect: 'non-scaling-stroke' }}
          />
        )}
      </svg>
      {onTap && (
        <p id={liveId} className="sr-only" aria-live="polite">
          {focused ? `${PART_KINDS[focused.kind].label}, ${(focus ?? 0) + 1} of ${order.length} from the left of this view. Enter chooses it.` : 'Arrow keys move through the parts of this view; Enter chooses one.'}
        </p>
      )}
    </figure>
  );
}
