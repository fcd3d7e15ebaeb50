/**
 * What a drawing view shows besides its lines: where the F is displayed for the unit's front end,
 * the keyboard order of parts (from the front), and where the small part numbers go without
 * overlapping. Pure functions; the canvas only draws what they return.
 */
import type { FrontEnd, ViewKey } from '../domain/frames';
import type { PartKind } from '../domain/parts';
import { bodyEndOfX } from '../orientation/front-frame';
import type { Box, Drawing, DrawingView, PartShape, ViewCoord, ViewPart } from './types';
import { boxCentre } from './geometry';
import type { ScreenRect } from './screen';

/** The view that shows the other end / other side of the carbody after a half turn (x → L − x, y → −y). */
const PARTNER: Record<ViewKey, ViewKey> = {
  plan: 'plan',
  side_plus_y: 'side_minus_y',
  side_minus_y: 'side_plus_y',
  end_short_hood: 'end_long_hood',
  end_long_hood: 'end_short_hood',
};

/**
 * A view point moved by the half turn about the carbody's vertical centre line, x → L − x,
 * y → −y, z kept, written in the partner view's coordinates. It takes a point to the place that has
 * the same distance from the front and the same offset to the left once the front is the other end.
 */
export function halfTurnViewPoint(from: ViewKey, p: ViewCoord, lengthIn: number): ViewCoord {
  switch (from) {
    case 'plan':
      return { u: lengthIn - p.u, v: -p.v + 0 };
    case 'side_plus_y':
    case 'side_minus_y':
      return { u: lengthIn - p.u, v: p.v };
    case 'end_short_hood':
    case 'end_long_hood':
      return { u: -p.u + 0, v: p.v };
  }
}

/** One F shown in a view. */
export interface PlacedFrontMarking {
  readonly instanceId: string;
  /** The element a tap on this F reports: this view's own drawing of the instance, else the one it was moved from. */
  readonly partId: string;
  /** The F as the file draws it, in the coordinates of `sourceView`. */
  readonly shape: PartShape;
  readonly sourceView: ViewKey;
  readonly sourceCentre: ViewCoord;
  /** Where the F is shown in this view, and its box there (same size as drawn). */
  readonly centre: ViewCoord;
  readonly bbox: Box;
  /** True when the unit's F is on the other end from where the file draws it. */
  readonly moved: boolean;
}

/**
 * The F markings to show in a view for the unit's front end. The file draws the F where it is on
 * the usual unit (the short hood end); when the unit carries it on the other end, the F is shown at
 * the half-turned place, taken from the partner view, so it keeps the same place relative to the front.
 */
export function placeFrontMarkings(drawing: Drawing, viewKey: ViewKey, frontEnd: FrontEnd): PlacedFrontMarking[] {
  const view = drawing.views.find((v) => v.key === viewKey);
  if (!view) return [];
  const out: PlacedFrontMarking[] = [];
  for (const inst of drawing.instances) {
    if (inst.kind !== 'front_marking') continue;
    const drawnEnd = bodyEndOfX(inst.centre.x, drawing.lengthIn);
    const own = view.parts.find((p) => p.instanceId === inst.instanceId);
    if (drawnEnd === frontEnd) {
      if (own) out.push({ instanceId: inst.instanceId, partId: own.id, shape: own.shape, sourceView: viewKey, sourceCentre: own.centre, centre: own.centre, bbox: own.bbox, moved: false });
      continue;
    }
    const sourceKey = PARTNER[viewKey];
    const source = drawing.views.find((v) => v.key === sourceKey)?.parts.find((p) => p.instanceId === inst.instanceId);
    if (!source) continue;
    const centre = halfTurnViewPoint(sourceKey, source.centre, drawing.lengthIn);
    const hu = (source.bbox.umax - source.bbox.umin) / 2, hv = (source.bbox.vmax - source.bbox.vmin) / 2;
    out.push({
      instanceId: inst.instanceId,
      partId: own?.id ?? source.id,
      shape: source.shape,
      sourceView: sourceKey,
      sourceCentre: source.centre,
      centre,
      bbox: { umin: centre.u - hu, vmin: centre.v - hv, umax: centre.u + hu, vmax: centre.v + hv },
      moved: true,
    });
  }
  return out;
}

/**
 * The view's parts as a tap sees them: the F markings are replaced by their displayed boxes (on
 * top, as they are small and drawn last), so a tap on the F lands on it at either end.
 */
export function tappableView(view: DrawingView, markings: readonly PlacedFrontMarking[]): DrawingView {
  const parts: ViewPart[] = view.parts.filter((p) => p.kind !== 'front_marking');
  for (const m of markings) {
    const { umin, vmin, umax, vmax } = m.bbox;
    parts.push({
      id: m.partId,
      kind: 'front_marking',
      instanceId: m.instanceId,
      shape: { kind: 'rect', x: umin, y: vmin, w: umax - umin, h: vmax - vmin, style: { fill: 'ink', line: 'normal' }, order: Number.MAX_SAFE_INTEGER },
      bbox: m.bbox,
      centre: boxCentre(m.bbox),
    });
  }
  return { ...view, parts };
}

/** The bits of a derived layout row the keyboard order needs (shared/layout's LayoutPart has them). */
export interface OrderedPart {
  readonly partId: string;
  readonly kind: PartKind;
  readonly instanceId: string;
  readonly view: ViewKey;
  readonly along: number;
  readonly left: number;
}

/**
 * Element ids of a view's parts in order from the front: nearer the front first, then further left,
 * then by instance id — the order instancesFromFront gives. A moved F counts where it is shown.
 */
export function tabOrder(parts: readonly OrderedPart[], viewKey: ViewKey, lengthIn: number, markings: readonly PlacedFrontMarking[] = []): string[] {
  // The layout already places the F where the unit carries it (markingCentre), so its along/left are
  // where it is shown; an F is in the order only in the view that shows it (see placeFrontMarkings).
  void lengthIn;
  const shown = new Map(markings.map((m) => [m.instanceId, m.partId]));
  const rows = parts.filter((p) => p.view === viewKey && (p.kind === 'front_marking' ? shown.get(p.instanceId) === p.partId : true));
  // A moved F drawn only in the partner view has no row in this view: add it from its source row.
  for (const m of markings) {
    if (rows.some((r) => r.instanceId === m.instanceId)) continue;
    const src = parts.find((p) => p.partId === m.partId);
    if (src) rows.push(src);
  }
  rows.sort((a, b) => a.along - b.along || b.left - a.left || a.instanceId.localeCompare(b.instanceId));
  return rows.map((r) => r.partId);
}

/** A number to place beside a part's screen box; lower priority is placed first and wins a contested spot. */
export interface NumeralItem {
  readonly key: string;
  readonly text: string;
  readonly box: ScreenRect;
  readonly priority: number;
}

/** A placed number: centre (x, y) and size of its label, CSS px. */
export interface PlacedNumeral {
  readonly key: string;
  readonly text: string;
  readonly x: number;
  readonly y: number;
  readonly w: number;
  readonly h: number;
}

const overlaps = (a: ScreenRect, b: ScreenRect): boolean => a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h;

/**
 * Places each number just outside its part (above, below, right or left, first free spot), never
 * over another number; a number that finds no free spot is left out (it appears when zoomed in).
 * `avoid` holds screen areas numbers must not cover (e.g. the orientation words).
 */
export function placeNumerals(items: readonly NumeralItem[], fontPx: number, avoid: readonly ScreenRect[] = [], gap = 2): PlacedNumeral[] {
  const ordered = [...items].sort((a, b) => a.priority - b.priority || a.box.x - b.box.x || a.box.y - b.box.y || a.key.localeCompare(b.key));
  const taken: ScreenRect[] = [...avoid];
  const out: PlacedNumeral[] = [];
  for (const it of ordered) {
    const w = fontPx * 0.62 * it.text.length + 4;
    const h = fontPx + 2;
    const { x, y, w: bw, h: bh } = it.box;
    const candidates: [number, number][] = [
      [x + bw / 2, y - gap - h / 2],
      [x + bw / 2, y + bh + gap + h / 2],
      [x + bw + gap + w / 2, y + bh / 2],
      [x - gap - w / 2, y + bh / 2],
    ];
    for (const [cx, cy] of candidates) {
      const r = { x: cx - w / 2, y: cy - h / 2, w, h };
      if (taken.some((t) => overlaps(t, r))) continue;
      taken.push(r);
      out.push({ key: it.key, text: it.text, x: cx, y: cy, w, h });
      break;
    }
  }
  return out;
}
