/**
 * Painting on a plain 2-D canvas context: the drawing's linework, the pins, the part numbers.
 * Konva shapes call these from their sceneFunc, with Konva's transform already on the context.
 */
import type { ViewOrientation } from '../../../shared/drawings/screen';
import type { PlacedNumeral } from '../../../shared/drawings/screen-labels';
import type { Box, LineClass, Shape } from '../../../shared/drawings/types';
import { heatFill, withAlpha, type Palette } from './palette';
import type { DrawingHeat, DrawingPin } from './types';

type Ctx = CanvasRenderingContext2D;

export const FONT_STACK = '"Roboto Condensed", "Arial Narrow", system-ui, sans-serif';

/** Line weights in CSS px, whatever the zoom (a technical drawing keeps its pen widths). */
const LINE_PX: Record<LineClass, number> = { heavy: 2, normal: 1.2, hair: 0.6, hidden: 1 };
const HIDDEN_DASH_PX = [6, 4];

/** Adds the shape's outline to the current path, in its own (view) coordinates. */
export function tracePartShape(ctx: Ctx, s: Exclude<Shape, { kind: 'text' }>): void {
  switch (s.kind) {
    case 'rect':
      ctx.rect(s.x, s.y, s.w, s.h);
      return;
    case 'circle':
      ctx.moveTo(s.cx + s.r, s.cy);
      ctx.arc(s.cx, s.cy, s.r, 0, Math.PI * 2);
      return;
    case 'ellipse':
      ctx.moveTo(s.cx + s.ru, s.cy);
      ctx.ellipse(s.cx, s.cy, s.ru, s.rv, 0, 0, Math.PI * 2);
      return;
    case 'line':
      ctx.moveTo(s.x1, s.y1);
      ctx.lineTo(s.x2, s.y2);
      return;
    case 'poly': {
      const p = s.points;
      ctx.moveTo(p[0], p[1]);
      for (let i = 2; i + 1 < p.length; i += 2) ctx.lineTo(p[i], p[i + 1]);
      if (s.closed) ctx.closePath();
    }
  }
}

function fillFor(s: Shape, p: Palette): string | undefined {
  switch (s.style.fill) {
    case 'none':
      return undefined;
    case 'body':
      return withAlpha(p.graphite, 0.05);
    case 'glass':
      return withAlpha(p.graphite, 0.16);
    case 'rubber':
      return withAlpha(p.graphite, 0.5);
    case 'ink':
      return p.graphite;
  }
}

/**
 * The view's linework and labels in view coordinates (the context maps view inches to screen with
 * `scale` px per inch and the orientation signs), then the heat cells tinting the paper under it.
 */
export function paintDrawing(ctx: Ctx, shapes: readonly Shape[], p: Palette, scale: number, o: ViewOrientation, heat?: DrawingHeat): void {
  const px = 1 / scale;
  ctx.lineJoin = 'round';
  ctx.lineCap = 'round';
  for (const s of shapes) {
    if (s.kind === 'text') {
      ctx.save();
      ctx.translate(s.x, s.y);
      // Undo the view's flips so text reads upright whatever way round the view is drawn.
      ctx.scale(o.su, o.sv);
      ctx.fillStyle = p.graphite2;
      ctx.font = `${s.size}px ${FONT_STACK}`;
      ctx.textAlign = s.anchor === 'middle' ? 'center' : s.anchor === 'end' ? 'right' : 'left';
      ctx.textBaseline = 'alphabetic';
      ctx.fillText(s.text, 0, 0);
      ctx.restore();
      continue;
    }
    ctx.beginPath();
    tracePartShape(ctx, s);
    const fill = fillFor(s, p);
    if (fill && s.kind !== 'line' && (s.kind !== 'poly' || s.closed)) {
      ctx.fillStyle = fill;
      ctx.fill();
    }
    if (s.style.fill === 'ink') continue;
    ctx.strokeStyle = s.style.line === 'hair' ? p.graphite2 : p.graphite;
    ctx.lineWidth = LINE_PX[s.style.line] * px;
    ctx.setLineDash(s.style.line === 'hidden' ? HIDDEN_DASH_PX.map((d) => d * px) : []);
    ctx.stroke();
  }
  ctx.setLineDash([]);
  if (heat && heat.cells.length > 0) {
    ctx.save();
    // Multiply (light) / screen (dark) tints the paper and leaves the linework legible on top.
    ctx.globalCompositeOperation = p.dark ? 'screen' : 'multiply';
    for (const c of heat.cells) {
      ctx.fillStyle = heatFill(c.value, heat.max, p);
      ctx.fillRect(c.u, c.v, c.w, c.h);
    }
    ctx.restore();
  }
}

/** Pins pre-sorted into draw batches, positions as flat u, v pairs. */
export interface PinBatches {
  readonly batches: readonly { readonly key: string; readonly weight: DrawingPin['weight']; readonly pending: boolean; readonly alpha: number; readonly uv: Float64Array }[];
  readonly count: number;
  /** Box of all pin positions (view inches), null when there are none. */
  readonly box: Box | null;
}

/** Closed findings are history: drawn fainter; voided ones fainter still. */
const STATE_ALPHA: Record<DrawingPin['state'], number> = { open: 1, in_repair: 1, repaired: 0.45, verified: 0.45, voided: 0.25 };
const WEIGHT_ORDER: Record<DrawingPin['weight'], number> = { note: 0, shop: 1, federal: 2 };

/** Groups pins by how they are drawn. */
export function batchPins(pins: readonly DrawingPin[]): PinBatches {
  const groups = new Map<string, { weight: DrawingPin['weight']; pending: boolean; alpha: number; uv: number[] }>();
  for (const pin of pins) {
    const alpha = STATE_ALPHA[pin.state] ?? 1;
    const pending = pin.pending === true;
    const key = `${pin.weight}|${pending ? 'p' : 's'}|${alpha}`;
    let g = groups.get(key);
    if (!g) groups.set(key, (g = { weight: pin.weight, pending, alpha, uv: [] }));
    g.uv.push(pin.u, pin.v);
  }
  // Faint (closed) findings first so open ones draw over them; within each, federal last, on top.
  const batches = [...groups.entries()]
    .map(([key, g]) => ({ key, weight: g.weight, pending: g.pending, alpha: g.alpha, uv: Float64Array.from(g.uv) }))
    .sort((a, b) => a.alpha - b.alpha || WEIGHT_ORDER[a.weight] - WEIGHT_ORDER[b.weight] || Number(a.pending) - Number(b.pending));
  let umin = Infinity, vmin = Infinity, umax = -Infinity, vmax = -Infinity;
  for (const pin of pins) {
    umin = Math.min(umin, pin.u);
    umax = Math.max(umax, pin.u);
    vmin = Math.min(vmin, pin.v);
    vmax = Math.max(vmax, pin.v);
  }
  return { batches, count: pins.length, box: pins.length ? { umin, vmin, umax, vmax } : null };
}

/** Symbol sizes in CSS px: federal diamond half-diagonal, shop ring radius, note dot radius. */
export const PIN_SIZE = { federal: 8, shop: 6.5, note: 4 } as const;

/**
 * Paints every pin, one path per batch, in screen px relative to the camera origin: a pin at view
 * (u, v) is at (su·scale·u, sv·scale·v). Pins outside `visible` (same relative px) are skipped.
 */
export function paintPins(
  ctx: Ctx,
  pins: PinBatches,
  p: Palette,
  scale: number,
  o: ViewOrientation,
  visible: { x0: number; y0: number; x1: number; y1: number },
): void {
  const ku = o.su * scale, kv = o.sv * scale;
  const m = 12;
  const x0 = visible.x0 - m, x1 = visible.x1 + m, y0 = visible.y0 - m, y1 = visible.y1 + m;
  ctx.lineJoin = 'miter';
  for (const b of pins.batches) {
    const uv = b.uv;
    const colour = b.weight === 'federal' ? p.federal : b.weight === 'shop' ? p.shop : p.note;
    const r = PIN_SIZE[b.weight];
    ctx.beginPath();
    for (let i = 0; i < uv.length; i += 2) {
      const x = ku * uv[i], y = kv * uv[i + 1];
      if (x < x0 || x > x1 || y < y0 || y > y1) continue;
      if (b.weight === 'federal') {
        ctx.moveTo(x, y - r);
        ctx.lineTo(x + r, y);
        ctx.lineTo(x, y + r);
        ctx.lineTo(x - r, y);
        ctx.closePath();
      } else {
        ctx.moveTo(x + r, y);
        ctx.arc(x, y, r, 0, Math.PI * 2);
      }
    }
    ctx.globalAlpha = b.alpha;
    if (b.pending) {
      // Not yet stored: a dashed outline over a paper fill, so it reads as provisional.
      ctx.fillStyle = p.paper;
      ctx.fill();
      ctx.setLineDash([3, 2.5]);
      ctx.strokeStyle = colour;
      ctx.lineWidth = 2;
      ctx.stroke();
      ctx.setLineDash([]);
    } else if (b.weight === 'shop') {
      ctx.strokeStyle = p.paper;
      ctx.lineWidth = 5.5;
      ctx.stroke();
      ctx.strokeStyle = colour;
      ctx.lineWidth = 3;
      ctx.stroke();
    } else {
      ctx.strokeStyle = p.paper;
      ctx.lineWidth = 2;
      ctx.stroke();
      ctx.fillStyle = colour;
      ctx.fill();
    }
  }
  ctx.globalAlpha = 1;
}

/** The small part numbers, centred on their placed spots, with a paper halo so they read over lines. */
export function paintNumerals(ctx: Ctx, numerals: readonly PlacedNumeral[], p: Palette, fontPx: number): void {
  ctx.font = `700 ${fontPx}px ${FONT_STACK}`;
  ctx.textAlign = 'center';
  ctx.textBaseline = 'middle';
  ctx.lineJoin = 'round';
  ctx.lineWidth = 3;
  ctx.strokeStyle = p.paper;
  ctx.fillStyle = p.graphite2;
  for (const n of numerals) {
    ctx.strokeText(n.text, n.x, n.y);
    ctx.fillText(n.text, n.x, n.y);
  }
}
