/**
 * Putting a drawing view on a screen: which way round each view is drawn, pan and zoom as pure
 * camera commands, view ↔ screen conversion, the minimum finger target, and where the
 * orientation markers (FRONT / REAR / LEFT / RIGHT) go. No DOM, no canvas: a canvas component
 * feeds these numbers to its drawing library.
 *
 * Screen coordinates are CSS pixels, x to the right and y down, origin at the canvas's top left.
 */
import { screenPoint } from '../domain/frames';
import type { FrontEnd, ScreenPoint, ViewKey } from '../domain/frames';
import { frontEndSides } from '../orientation/front-frame';
import { shapeBBox } from './geometry';
import type { Box, DrawingView, ViewCoord } from './types';

/**
 * `as_built`: the carbody frame, short hood end at the left of the screen in the plan and side
 * elevations, whatever end carries the F. `front_first`: the front leads, so the front end is at the
 * left; with the F on the long hood the drawing turns end for end (see viewOrientation).
 */
export const DRAWING_MODES = ['as_built', 'front_first'] as const;
export type DrawingMode = (typeof DRAWING_MODES)[number];

/** Screen x grows with su·u and screen y with sv·v (so sv = −1 draws +v upwards). */
export interface ViewOrientation {
  readonly su: 1 | -1;
  readonly sv: 1 | -1;
}

/** Pan and zoom: screen = (ox, oy) + (su·scale·u, sv·scale·v); scale in CSS px per drawing inch. */
export interface Camera {
  readonly scale: number;
  readonly ox: number;
  readonly oy: number;
}

export interface Viewport {
  readonly width: number;
  readonly height: number;
}

/** An axis-aligned screen rectangle, CSS px. */
export interface ScreenRect {
  readonly x: number;
  readonly y: number;
  readonly w: number;
  readonly h: number;
}

export interface ZoomLimits {
  readonly min: number;
  readonly max: number;
}

/** CSS px per inch of screen (the CSS reference pixel). */
export const CSS_PX_PER_INCH = 96;
/** Smallest finger target, 9 mm on screen (common practice for touch targets, no source). */
export const MIN_TARGET_MM = 9;
/** The same in CSS px: 9 / 25.4 × 96 ≈ 34 px. */
export const MIN_TARGET_PX = (MIN_TARGET_MM / 25.4) * CSS_PX_PER_INCH;

/**
 * The minimum side, in drawing inches, a part's hit area must have at this zoom so that it is at
 * least MIN_TARGET_PX on screen (feed it to geometry's expandedHitBox / partAtPoint).
 */
export function minHitSideIn(scale: number, minTargetPx: number = MIN_TARGET_PX): number {
  if (!(scale > 0)) throw new RangeError(`scale ${scale} must be positive`);
  return minTargetPx / scale;
}

const isElevation = (key: ViewKey): boolean => key === 'side_plus_y' || key === 'side_minus_y';
const isEnd = (key: ViewKey): boolean => key === 'end_short_hood' || key === 'end_long_hood';

/**
 * Which way round a view is drawn.
 * - Plan, as built: body x to the right (short hood at the left), +y up: a true view from above.
 * - Side elevations, as built: x to the right, z up (short hood at the left on both sides, so the
 *   two elevations line up under the plan).
 * - Front first with the F on the short hood: the same. With the F on the long hood the x axis is
 *   reversed so the front is at the left; the plan also reverses y, which turns it end for end
 *   (a rotation, still a view from above) and keeps the left side at the bottom, so the same screen
 *   spot means the same front-relative place on every unit (what fleet overlays rely on). An
 *   elevation cannot turn over (z stays up), so it is mirrored.
 * - End elevations: drawn as the file lays them out (seen from outside that end), in both modes.
 */
export function viewOrientation(view: Pick<DrawingView, 'key' | 'sheet'>, mode: DrawingMode, frontEnd: FrontEnd): ViewOrientation {
  if (isEnd(view.key)) {
    const { u, v } = view.sheet;
    const su = u.axis === 'y' ? u.sign : 1;
    const sv = v.axis === 'z' ? v.sign : -1;
    return { su, sv };
  }
  const reversed = mode === 'front_first' && frontEnd === 'long_hood';
  if (!reversed) return { su: 1, sv: -1 };
  return isElevation(view.key) ? { su: -1, sv: -1 } : { su: -1, sv: 1 };
}

/** A view point on screen. */
export function viewToScreen(p: ViewCoord, o: ViewOrientation, cam: Camera): ScreenPoint {
  return screenPoint(cam.ox + o.su * cam.scale * p.u, cam.oy + o.sv * cam.scale * p.v);
}

/** The view point under a screen point; inverse of viewToScreen. */
export function screenToView(s: ScreenPoint, o: ViewOrientation, cam: Camera): ViewCoord {
  return { u: (s.sx - cam.ox) / (o.su * cam.scale) + 0, v: (s.sy - cam.oy) / (o.sv * cam.scale) + 0 };
}

/** Screen rectangle covering a view box. */
export function boxToScreen(b: Box, o: ViewOrientation, cam: Camera): ScreenRect {
  const a = viewToScreen({ u: b.umin, v: b.vmin }, o, cam);
  const c = viewToScreen({ u: b.umax, v: b.vmax }, o, cam);
  return { x: Math.min(a.sx, c.sx), y: Math.min(a.sy, c.sy), w: Math.abs(c.sx - a.sx), h: Math.abs(c.sy - a.sy) };
}

/** Padding kept free round a fitted drawing, CSS px (room for the FRONT / REAR and side markers). */
export interface FitPadding {
  readonly x: number;
  readonly y: number;
}
/** Room for a FRONT / REAR word beside each end and a LEFT / RIGHT word above and below; less on a small screen. */
export function defaultFitPadding(vp: Viewport): FitPadding {
  // At least room for the FRONT / REAR tags beside the drawing, even on a phone.
  return { x: Math.min(88, Math.max(66, vp.width * 0.12)), y: Math.min(44, vp.height * 0.1) };
}

/** The camera that shows the whole box, centred, as large as the viewport allows less the padding. */
export function fitCamera(b: Box, o: ViewOrientation, vp: Viewport, pad: FitPadding = defaultFitPadding(vp)): Camera {
  const bw = Math.max(b.umax - b.umin, 1e-6);
  const bh = Math.max(b.vmax - b.vmin, 1e-6);
  const aw = Math.max(vp.width - 2 * pad.x, vp.width * 0.25, 1);
  const ah = Math.max(vp.height - 2 * pad.y, vp.height * 0.25, 1);
  const scale = Math.min(aw / bw, ah / bh);
  const cu = (b.umin + b.umax) / 2;
  const cv = (b.vmin + b.vmax) / 2;
  return { scale, ox: vp.width / 2 - o.su * scale * cu, oy: vp.height / 2 - o.sv * scale * cv };
}

/** How far one may zoom: out to half the fitted size, in to 30× it (at least 48 px per inch). */
export function zoomLimits(fitScale: number): ZoomLimits {
  return { min: fitScale / 2, max: Math.max(fitScale * 30, 48) };
}

export function panBy(cam: Camera, dx: number, dy: number): Camera {
  return { scale: cam.scale, ox: cam.ox + dx, oy: cam.oy + dy };
}

/** Zoom by `factor` keeping the view point under `at` where it is (wheel, pinch, + / −). */
export function zoomAt(cam: Camera, factor: number, at: ScreenPoint, limits: ZoomLimits): Camera {
  const scale = Math.min(limits.max, Math.max(limits.min, cam.scale * factor));
  const k = scale / cam.scale;
  return { scale, ox: at.sx - (at.sx - cam.ox) * k, oy: at.sy - (at.sy - cam.oy) * k };
}

/** Two fingers moved from `before` to `after`: zoom by the change in their spread about the old midpoint, then follow the midpoint. */
export function pinchCamera(
  cam: Camera,
  before: readonly [ScreenPoint, ScreenPoint],
  after: readonly [ScreenPoint, ScreenPoint],
  limits: ZoomLimits,
): Camera {
  const d0 = Math.hypot(before[1].sx - before[0].sx, before[1].sy - before[0].sy);
  const d1 = Math.hypot(after[1].sx - after[0].sx, after[1].sy - after[0].sy);
  const m0 = screenPoint((before[0].sx + before[1].sx) / 2, (before[0].sy + before[1].sy) / 2);
  const m1 = screenPoint((after[0].sx + after[1].sx) / 2, (after[0].sy + after[1].sy) / 2);
  const zoomed = d0 > 0 && d1 > 0 ? zoomAt(cam, d1 / d0, m0, limits) : cam;
  return panBy(zoomed, m1.sx - m0.sx, m1.sy - m0.sy);
}

/** Zoom factor for one wheel event; line and page deltas are converted to pixels first. */
export function wheelZoomFactor(deltaY: number, deltaMode: 0 | 1 | 2 = 0, pageHeight = 800): number {
  const px = deltaMode === 1 ? deltaY * 16 : deltaMode === 2 ? deltaY * pageHeight : deltaY;
  // exp keeps zoom-in and zoom-out symmetric: +d then −d returns to the same scale.
  return Math.exp(-Math.max(-400, Math.min(400, px)) * 0.0015);
}

/**
 * Keeps at least `margin` px of the drawing's box on screen each way, so a fling cannot lose it.
 */
export function clampCamera(cam: Camera, b: Box, o: ViewOrientation, vp: Viewport, margin = 48): Camera {
  const r = boxToScreen(b, o, cam);
  const mx = Math.min(margin, r.w), my = Math.min(margin, r.h);
  let dx = 0, dy = 0;
  if (r.x + r.w < mx) dx = mx - (r.x + r.w);
  else if (r.x > vp.width - mx) dx = vp.width - mx - r.x;
  if (r.y + r.h < my) dy = my - (r.y + r.h);
  else if (r.y > vp.height - my) dy = vp.height - my - r.y;
  return dx === 0 && dy === 0 ? cam : panBy(cam, dx, dy);
}

/**
 * The camera after the view turns round (the F moved in front-first mode, or the mode changed):
 * the drawing's box keeps its place on screen, so what was at a screen spot is now its mirror —
 * the same place relative to the front when the front moved.
 */
export function reorientCamera(cam: Camera, from: ViewOrientation, to: ViewOrientation, b: Box): Camera {
  const cu = (b.umin + b.umax) / 2, cv = (b.vmin + b.vmax) / 2;
  return {
    scale: cam.scale,
    ox: cam.ox + (from.su - to.su) * cam.scale * cu,
    oy: cam.oy + (from.sv - to.sv) * cam.scale * cv,
  };
}

/** The smallest pan that brings a screen rectangle fully inside the viewport (less margin); unchanged when it is already in. */
export function ensureVisible(cam: Camera, r: ScreenRect, vp: Viewport, margin = 24): Camera {
  const shift = (lo: number, size: number, extent: number): number => {
    if (size + 2 * margin > extent) return extent / 2 - (lo + size / 2);
    if (lo < margin) return margin - lo;
    if (lo + size > extent - margin) return extent - margin - (lo + size);
    return 0;
  };
  const dx = shift(r.x, r.w, vp.width);
  const dy = shift(r.y, r.h, vp.height);
  return dx === 0 && dy === 0 ? cam : panBy(cam, dx, dy);
}

export type MarkerRole = 'front' | 'rear' | 'left' | 'right' | 'caption';

/** A word placed outside the drawing: `at` is the anchor; the text hangs from it by align / valign. */
export interface OrientationMarker {
  /** Stable across a flip for front/rear/left/right, so a canvas can animate each word to its new place. */
  readonly role: MarkerRole;
  readonly text: string;
  readonly at: ScreenPoint;
  readonly align: 'left' | 'center' | 'right';
  readonly valign: 'top' | 'middle' | 'bottom';
}

/**
 * The orientation words for a view: FRONT and REAR beyond the ends (plan and side elevations);
 * LEFT and RIGHT beyond the sides (plan: above / below; end elevations: beside); for elevations a
 * caption naming the side or end shown ("RIGHT SIDE", "FRONT END"). The words keep `gap` CSS px
 * clear of `around`: the view's bounds, or its whole painted extent so they miss the file's titles.
 */
export function orientationMarkers(
  view: Pick<DrawingView, 'key' | 'bounds'>,
  frontEnd: FrontEnd,
  o: ViewOrientation,
  cam: Camera,
  gap = 10,
  around: Box = view.bounds,
): OrientationMarker[] {
  const b = around;
  const r = boxToScreen(b, o, cam);
  const cx = r.x + r.w / 2, cy = r.y + r.h / 2;
  const sides = frontEndSides(frontEnd);
  const out: OrientationMarker[] = [];

  // Screen x of a u edge, and whether it lies on the screen's left.
  const uEdge = (u: number): { x: number; left: boolean } => {
    const x = cam.ox + o.su * cam.scale * u;
    return { x, left: x < cx };
  };
  const vEdge = (v: number): { y: number; top: boolean } => {
    const y = cam.oy + o.sv * cam.scale * v;
    return { y, top: y < cy };
  };
  const horizontal = (role: MarkerRole, text: string, u: number): void => {
    const e = uEdge(u);
    out.push({ role, text, at: screenPoint(e.x + (e.left ? -gap : gap), cy), align: e.left ? 'right' : 'left', valign: 'middle' });
  };
  const vertical = (role: MarkerRole, text: string, v: number): void => {
    const e = vEdge(v);
    out.push({ role, text, at: screenPoint(cx, e.y + (e.top ? -gap : gap)), align: 'center', valign: e.top ? 'bottom' : 'top' });
  };
  const caption = (text: string): void => {
    out.push({ role: 'caption', text, at: screenPoint(cx, r.y - gap), align: 'center', valign: 'bottom' });
  };

  if (view.key === 'plan' || isElevation(view.key)) {
    // u is body x: the short hood end is at u = umin (x = 0 side).
    horizontal('front', 'FRONT', sides.front === 'short_hood' ? b.umin : b.umax);
    horizontal('rear', 'REAR', sides.rear === 'short_hood' ? b.umin : b.umax);
  }
  if (view.key === 'plan') {
    vertical('left', 'LEFT', sides.leftYSign < 0 ? b.vmin : b.vmax);
    vertical('right', 'RIGHT', sides.rightYSign < 0 ? b.vmin : b.vmax);
  } else if (isElevation(view.key)) {
    const ySign = view.key === 'side_plus_y' ? 1 : -1;
    caption(ySign === sides.leftYSign ? 'LEFT SIDE' : 'RIGHT SIDE');
  } else {
    // End elevations: u is body y.
    horizontal('left', 'LEFT', sides.leftYSign < 0 ? b.umin : b.umax);
    horizontal('right', 'RIGHT', sides.rightYSign < 0 ? b.umin : b.umax);
    const bodyEnd = view.key === 'end_short_hood' ? 'short_hood' : 'long_hood';
    caption(bodyEnd === sides.front ? 'FRONT END' : 'REAR END');
  }
  return out;
}

/**
 * Everything a view paints, in view inches: its bounds, every shape, and its labels (a text's
 * box is guessed from its size and length, wide enough for condensed type).
 */
export function viewExtent(view: Pick<DrawingView, 'bounds' | 'parts' | 'decor'>, margin = 4): Box {
  let { umin, vmin, umax, vmax } = view.bounds;
  const grow = (b: Box): void => {
    umin = Math.min(umin, b.umin);
    vmin = Math.min(vmin, b.vmin);
    umax = Math.max(umax, b.umax);
    vmax = Math.max(vmax, b.vmax);
  };
  for (const p of view.parts) grow(p.bbox);
  for (const s of view.decor) {
    if (s.kind !== 'text') {
      grow(shapeBBox(s));
      continue;
    }
    const w = s.size * 0.6 * s.text.length;
    const u0 = s.anchor === 'start' ? s.x : s.anchor === 'middle' ? s.x - w / 2 : s.x - w;
    // The baseline is at y; the glyphs reach about one size above and a third below it, on either side of v.
    grow({ umin: u0, umax: u0 + w, vmin: s.y - s.size, vmax: s.y + s.size });
  }
  return { umin: umin - margin, vmin: vmin - margin, umax: umax + margin, vmax: vmax + margin };
}
