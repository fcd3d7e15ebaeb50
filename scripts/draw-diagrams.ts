/**
 * Draws the unit diagrams in diagrams/*.svg (run: npx tsx scripts/draw-diagrams.ts).
 *
 * Every part is defined once as a box in the carbody frame (inches) and projected into
 * each view that shows it, so the same physical part lands at the same x, y, z in every
 * view by construction. The SVGs are committed; rerun this after changing it.
 * Proportions are approximate, from memory (product brief §4), not check values.
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { VIEW_AXES } from '../shared/domain/frames';
import type { ViewKey } from '../shared/domain/frames';
import type { PartKind } from '../shared/domain/parts';

type Axis = 'x' | 'y' | 'z';
interface SheetAxis {
  axis: Axis;
  sign: 1 | -1;
}
interface Box3 {
  x0: number;
  x1: number;
  y0: number;
  y1: number;
  z0: number;
  z1: number;
}
/** A box projected into a view: u0..u1, v0..v1 in view coordinates. */
interface Box2 {
  u0: number;
  u1: number;
  v0: number;
  v1: number;
}

interface ViewDef {
  key: ViewKey;
  prefix: string;
  title: string;
  u: SheetAxis;
  v: SheetAxis;
  tx: number;
  ty: number;
  bounds: [number, number, number, number];
  items: string[];
}

interface Hood {
  x0: number;
  x1: number;
  hw: number;
  top: number;
}
interface Unit {
  key: string;
  name: string;
  file: string;
  L: number;
  W: number;
  trucks: { axles: number[]; motorDir: (1 | -1)[] }[];
  shortHood: Hood;
  cab: { x0: number; x1: number; hw: number; roof: number };
  longHood: Hood;
  fuel: { x0: number; x1: number };
  reservoirs: { x0: number; x1: number; transverse: boolean }[];
  /** Handrail segments along each side, [x0, x1], from the short hood end. */
  handrails: [number, number][];
}

const INK = '#2b2b2b';
/** Only for viewing the file on its own; the app fills `ground` shapes with its own ground colour. */
const GROUND = '#faf7f0';
const DECK_Z = 60;
const SILL_Z = 46;
const WHEEL_R = 20;
/** Wheel tread centres about half the 56.5 in standard gauge plus half a tread out (from memory). */
const WHEEL_Y0 = 27;
const WHEEL_Y1 = 32.5;
const PILOT_FACE = 12;
const PILOT_BACK = 24;
/** Coupler centreline 34.5 in above the rail (common practice, from memory). */
const COUPLER_Z0 = 29;
const COUPLER_Z1 = 40;

const f = (n: number): string => {
  const r = Math.round(n * 100) / 100;
  return String(r === 0 ? 0 : r);
};

// ---------------------------------------------------------------- sheet mapping

function bodyOf(view: ViewDef, u: number, v: number): Record<Axis, number> {
  const [ua, va] = VIEW_AXES[view.key];
  const b: Record<Axis, number> = { x: 0, y: 0, z: 0 };
  b[ua] = u;
  b[va] = v;
  return b;
}
/** Coordinates inside the view group (the group's translate places them on the sheet). */
function toSheet(view: ViewDef, u: number, v: number): [number, number] {
  const b = bodyOf(view, u, v);
  return [view.u.sign * b[view.u.axis] + 0, view.v.sign * b[view.v.axis] + 0];
}
function project(view: ViewDef, b: Box3): Box2 {
  const [ua, va] = VIEW_AXES[view.key];
  const r = (a: Axis): [number, number] => (a === 'x' ? [b.x0, b.x1] : a === 'y' ? [b.y0, b.y1] : [b.z0, b.z1]);
  const [u0, u1] = r(ua);
  const [v0, v1] = r(va);
  return { u0, u1, v0, v1 };
}
/** The sheet rectangle covering a view box. */
function sheetRect(view: ViewDef, p: Box2): { x: number; y: number; w: number; h: number } {
  const [ax, ay] = toSheet(view, p.u0, p.v0);
  const [bx, by] = toSheet(view, p.u1, p.v1);
  return { x: Math.min(ax, bx), y: Math.min(ay, by), w: Math.abs(bx - ax), h: Math.abs(by - ay) };
}

// ---------------------------------------------------------------- element writers (view coordinates in, sheet markup out)

const attr = (a: string): string => (a ? ` ${a}` : '');
const cls = (c?: string): string => (c ? `class="${c}"` : '');

function rectEl(view: ViewDef, p: Box2, a: string): string {
  const r = sheetRect(view, p);
  return `<rect${attr(a)} x="${f(r.x)}" y="${f(r.y)}" width="${f(r.w)}" height="${f(r.h)}"/>`;
}
function circleEl(view: ViewDef, cu: number, cv: number, r: number, a: string): string {
  const [cx, cy] = toSheet(view, cu, cv);
  return `<circle${attr(a)} cx="${f(cx)}" cy="${f(cy)}" r="${f(r)}"/>`;
}
function lineEl(view: ViewDef, u1: number, v1: number, u2: number, v2: number, a: string): string {
  const [x1, y1] = toSheet(view, u1, v1);
  const [x2, y2] = toSheet(view, u2, v2);
  return `<line${attr(a)} x1="${f(x1)}" y1="${f(y1)}" x2="${f(x2)}" y2="${f(y2)}"/>`;
}
function polyEl(view: ViewDef, pts: number[], closed: boolean, a: string): string {
  const out: string[] = [];
  for (let i = 0; i < pts.length; i += 2) {
    const [x, y] = toSheet(view, pts[i], pts[i + 1]);
    out.push(`${f(x)},${f(y)}`);
  }
  return `<${closed ? 'polygon' : 'polyline'}${attr(a)} points="${out.join(' ')}"/>`;
}
/** Many straight runs as one decorative path (hatching, seams). */
function pathEl(view: ViewDef, runs: number[][], a: string): string {
  const d = runs
    .map((pts) => {
      const parts: string[] = [];
      for (let i = 0; i < pts.length; i += 2) {
        const [x, y] = toSheet(view, pts[i], pts[i + 1]);
        parts.push(`${i === 0 ? 'M' : 'L'}${f(x)} ${f(y)}`);
      }
      return parts.join(' ');
    })
    .join(' ');
  return d ? `<path${attr(a)} d="${d}"/>` : '';
}
function textEl(view: ViewDef, u: number, v: number, text: string, size: number, anchor: 'start' | 'middle' | 'end', a = ''): string {
  const [x, y] = toSheet(view, u, v);
  return `<text${attr(a)} x="${f(x)}" y="${f(y)}" font-size="${f(size)}" text-anchor="${anchor}">${text}</text>`;
}
/** Diagonal hatch lines (u − v = c) clipped to a view box. */
function hatch(p: Box2, step: number): number[][] {
  const runs: number[][] = [];
  for (let c = p.u0 - p.v1 + step / 2; c < p.u1 - p.v0; c += step) {
    const va = Math.max(p.v0, p.u0 - c);
    const vb = Math.min(p.v1, p.u1 - c);
    if (vb - va > 0.5) runs.push([va + c, va, vb + c, vb]);
  }
  return runs;
}

/** An upright stencil F filling a sheet rectangle, whichever way the view runs. */
function glyphF(view: ViewDef, p: Box2, a: string): string {
  const r = sheetRect(view, p);
  const g = [0, 0, 1, 0, 1, 0.2, 0.34, 0.2, 0.34, 0.42, 0.82, 0.42, 0.82, 0.6, 0.34, 0.6, 0.34, 1, 0, 1];
  const out: string[] = [];
  for (let i = 0; i < g.length; i += 2) out.push(`${f(r.x + g[i] * r.w)},${f(r.y + g[i + 1] * r.h)}`);
  return `<polygon${attr(a)} points="${out.join(' ')}"/>`;
}

// ---------------------------------------------------------------- parts

type Draw = 'auto' | ((view: ViewDef, p: Box2, a: string) => string);

/** Default drawing of a box: a rect, a line if it is flat one way, a small circle if it is a point. */
function autoDraw(view: ViewDef, p: Box2, a: string): string {
  const du = p.u1 - p.u0, dv = p.v1 - p.v0;
  if (du === 0 && dv === 0) return circleEl(view, p.u0, p.v0, 1.25, a);
  if (du === 0 || dv === 0) return lineEl(view, p.u0, p.v0, p.u1, p.v1, a);
  return rectEl(view, p, a);
}

class Sheet {
  readonly views = new Map<ViewKey, ViewDef>();
  constructor(readonly unit: Unit) {}

  add(key: ViewKey, markup: string): void {
    if (markup) this.views.get(key)!.items.push(markup);
  }

  part(kind: PartKind, instance: string, box: Box3, views: Partial<Record<ViewKey, Draw>>, className?: string): void {
    for (const [key, draw] of Object.entries(views) as [ViewKey, Draw][]) {
      const view = this.views.get(key)!;
      const a = `id="${view.prefix}-${instance}" data-part="${kind}" data-instance="${instance}"${className ? ` class="${className}"` : ''}`;
      const p = project(view, box);
      view.items.push(draw === 'auto' ? autoDraw(view, p, a) : draw(view, p, a));
    }
  }
}

const mirrorBox = (b: Box3, L: number): Box3 => ({ ...b, x0: L - b.x1, x1: L - b.x0 });
const sideBox = (b: Box3, s: 1 | -1): Box3 => (s === 1 ? b : { ...b, y0: -b.y1, y1: -b.y0 });
const SIDES = [
  { s: 1 as const, tag: 'py', view: 'side_plus_y' as ViewKey },
  { s: -1 as const, tag: 'my', view: 'side_minus_y' as ViewKey },
];
const ENDS = [
  { tag: 'sh', view: 'end_short_hood' as ViewKey },
  { tag: 'lh', view: 'end_long_hood' as ViewKey },
];
const BOTH_SIDES: ViewKey[] = ['side_plus_y', 'side_minus_y'];

// ---------------------------------------------------------------- one unit

function drawUnit(unit: Unit): string {
  const { L, W } = unit;
  const hw = W / 2;
  const sh = unit.shortHood, cab = unit.cab, lh = unit.longHood;
  const H = Math.ceil(cab.roof + 14);
  const M = 30, G = 44;
  const planX = M + W + G;
  const row1Rail = M + H;
  const row2Top = row1Rail + G;
  const endRail = row2Top + H;
  const planY = row2Top + H / 2;
  const row3Rail = endRail + G + H;
  const sheetW = planX + L + G + W + M;
  const sheetH = row3Rail + 30;

  const sheet = new Sheet(unit);
  const views: ViewDef[] = [
    { key: 'plan', prefix: 'pl', title: 'PLAN, FROM ABOVE', u: { axis: 'x', sign: 1 }, v: { axis: 'y', sign: -1 }, tx: planX, ty: planY, bounds: [0, -hw, L, hw], items: [] },
    { key: 'side_plus_y', prefix: 'sp', title: 'SIDE ELEVATION, +Y SIDE', u: { axis: 'x', sign: -1 }, v: { axis: 'z', sign: -1 }, tx: planX + L, ty: row1Rail, bounds: [0, 0, L, H], items: [] },
    { key: 'side_minus_y', prefix: 'sm', title: 'SIDE ELEVATION, \u2212Y SIDE', u: { axis: 'x', sign: 1 }, v: { axis: 'z', sign: -1 }, tx: planX, ty: row3Rail, bounds: [0, 0, L, H], items: [] },
    { key: 'end_short_hood', prefix: 'es', title: 'SHORT HOOD END', u: { axis: 'y', sign: -1 }, v: { axis: 'z', sign: -1 }, tx: M + hw, ty: endRail, bounds: [-hw, 0, hw, H], items: [] },
    { key: 'end_long_hood', prefix: 'el', title: 'LONG HOOD END', u: { axis: 'y', sign: 1 }, v: { axis: 'z', sign: -1 }, tx: planX + L + G + hw, ty: endRail, bounds: [-hw, 0, hw, H], items: [] },
  ];
  for (const v of views) sheet.views.set(v.key, v);
  const V = (k: ViewKey): ViewDef => sheet.views.get(k)!;
  const plan = V('plan');

  // Rails, frame and deck: the ground everything else sits on.
  for (const k of BOTH_SIDES) {
    const v = V(k);
    sheet.add(k, lineEl(v, -24, 0, L + 24, 0, cls('heavy')));
    sheet.add(k, rectEl(v, { u0: PILOT_FACE, u1: L - PILOT_FACE, v0: SILL_Z, v1: DECK_Z }, cls('heavy body')));
  }
  for (const e of ENDS) {
    const v = V(e.view);
    sheet.add(e.view, lineEl(v, -hw - 10, 0, hw + 10, 0, cls('heavy')));
    for (const s of [1, -1]) sheet.add(e.view, rectEl(v, { u0: s * 26.75 - 1.5, u1: s * 26.75 + 1.5, v0: -5, v1: 0 }, cls('rubber')));
    sheet.add(e.view, rectEl(v, { u0: -hw, u1: hw, v0: SILL_Z, v1: DECK_Z }, cls('heavy body')));
    // The nearest truck behind the pilot: wheels and side frames, hatched.
    for (const s of [1, -1]) {
      sheet.add(e.view, rectEl(v, { u0: s === 1 ? WHEEL_Y0 : -WHEEL_Y1, u1: s === 1 ? WHEEL_Y1 : -WHEEL_Y0, v0: 0, v1: 2 * WHEEL_R }, cls('hair')));
      const frame = { u0: s === 1 ? 34 : -44, u1: s === 1 ? 44 : -34, v0: 8, v1: 40 };
      sheet.add(e.view, rectEl(v, frame, cls('hair')));
      sheet.add(e.view, pathEl(v, hatch(frame, 4), cls('hair')));
    }
  }
  sheet.add('plan', rectEl(plan, { u0: PILOT_FACE, u1: L - PILOT_FACE, v0: -hw, v1: hw }, cls('heavy')));
  sheet.add('plan', pathEl(plan, [[-16, 0, L + 16, 0]], cls('hair hidden')));

  // Walkways along both sides at deck level.
  for (const side of SIDES) {
    const box = sideBox({ x0: PILOT_FACE, x1: L - PILOT_FACE, y0: lh.hw, y1: hw, z0: DECK_Z - 3, z1: DECK_Z }, side.s);
    sheet.part('walkway', `walkway_${side.tag}`, box, { plan: 'auto', [side.view]: 'auto' }, 'hair');
  }

  // Carbody: long hood, cab, short hood.
  const lhBox: Box3 = { x0: lh.x0, x1: lh.x1, y0: -lh.hw, y1: lh.hw, z0: DECK_Z, z1: lh.top };
  const cabBox: Box3 = { x0: cab.x0, x1: cab.x1, y0: -cab.hw, y1: cab.hw, z0: DECK_Z, z1: cab.roof };
  const shBox: Box3 = { x0: sh.x0, x1: sh.x1, y0: -sh.hw, y1: sh.hw, z0: DECK_Z, z1: sh.top };
  const chamfered = (c: number) => (view: ViewDef, p: Box2, a: string): string =>
    polyEl(view, [p.u0, p.v0, p.u1, p.v0, p.u1, p.v1 - c, p.u1 - c, p.v1, p.u0 + c, p.v1, p.u0, p.v1 - c], true, a);
  const cabSide = (view: ViewDef, p: Box2, a: string): string =>
    polyEl(view, [cab.x0, p.v0, cab.x1, p.v0, cab.x1, p.v1 - 4, cab.x1 - 6, p.v1, cab.x0 + 10, p.v1, cab.x0, p.v1 - 10], true, a);
  const noseSide = (view: ViewDef, p: Box2, a: string): string =>
    polyEl(view, [sh.x0, p.v0, sh.x1, p.v0, sh.x1, p.v1, sh.x0 + 14, p.v1, sh.x0, p.v1 - 10], true, a);
  sheet.part('cab', 'cab', cabBox, { plan: 'auto', side_plus_y: cabSide, side_minus_y: cabSide, end_short_hood: chamfered(8), end_long_hood: chamfered(8) }, 'heavy body');
  sheet.part('long_hood', 'long_hood', lhBox, { plan: 'auto', side_plus_y: chamfered(4), side_minus_y: chamfered(4), end_long_hood: chamfered(6) }, 'heavy body');
  sheet.part('short_hood', 'short_hood', shBox, { plan: 'auto', side_plus_y: noseSide, side_minus_y: noseSide, end_short_hood: chamfered(8) }, 'heavy body');

  // Hood detail: door seams, radiator grille, fans, exhaust stack (decoration only).
  for (const k of BOTH_SIDES) {
    const v = V(k);
    const seams: number[][] = [];
    for (let x = lh.x0 + 48; x < lh.x1 - 120; x += 40) seams.push([x, DECK_Z + 4, x, lh.top - 8]);
    sheet.add(k, pathEl(v, seams, cls('hair')));
    const grille = { u0: lh.x1 - 112, u1: lh.x1 - 12, v0: lh.top - 44, v1: lh.top - 8 };
    sheet.add(k, rectEl(v, grille, cls('hair')));
    sheet.add(k, pathEl(v, hatch(grille, 3), cls('hair')));
    sheet.add(k, rectEl(v, { u0: lh.x0 + 150, u1: lh.x0 + 166, v0: lh.top, v1: lh.top + 6 }, ''));
    if (sh.x1 - sh.x0 >= 60) sheet.add(k, textEl(v, (sh.x0 + sh.x1) / 2, DECK_Z + 8, 'short hood', 7, 'middle'));
    sheet.add(k, textEl(v, (lh.x0 + lh.x1) / 2, DECK_Z + 8, 'long hood', 7, 'middle'));
  }
  for (let i = 0; i < 3; i++) {
    const cx = lh.x1 - 34 - i * 40;
    sheet.add('plan', circleEl(plan, cx, 0, 16, cls('hair')));
    sheet.add('plan', circleEl(plan, cx, 0, 3, cls('hair')));
  }
  sheet.add('plan', rectEl(plan, { u0: lh.x0 + 150, u1: lh.x0 + 166, v0: -8, v1: 8 }, ''));
  if (sh.x1 - sh.x0 >= 60) sheet.add('plan', textEl(plan, (sh.x0 + sh.x1) / 2, -2, 'short hood', 7, 'middle'));
  sheet.add('plan', textEl(plan, (cab.x0 + cab.x1) / 2, -2, 'cab', 7, 'middle'));
  sheet.add('plan', textEl(plan, lh.x0 + 0.3 * (lh.x1 - lh.x0), -2, 'long hood', 7, 'middle'));

  // Battery boxes: compartments in the long hood sides just behind the cab.
  for (const side of SIDES) {
    const box = sideBox({ x0: lh.x0 + 6, x1: lh.x0 + 46, y0: lh.hw - 10, y1: lh.hw, z0: DECK_Z + 4, z1: DECK_Z + 40 }, side.s);
    sheet.part('battery_box', `battery_box_${side.tag}`, box, { plan: 'auto', [side.view]: 'auto' });
  }
  // Nose compartment: the door in the short hood nose.
  const hl0 = sh.top - 22;
  const noseBox: Box3 = { x0: sh.x0, x1: sh.x0 + Math.min(24, sh.x1 - sh.x0 - 4), y0: -14, y1: 14, z0: DECK_Z + 4, z1: hl0 - 4 };
  sheet.part('nose_compartment', 'nose_compartment', noseBox, { plan: 'auto', side_plus_y: 'auto', side_minus_y: 'auto', end_short_hood: 'auto' });

  // Cab doors and windows.
  const win0 = sh.top + 8, win1 = cab.roof - 14;
  for (const side of SIDES) {
    const doorBox = sideBox({ x0: cab.x1 - 30, x1: cab.x1 - 4, y0: cab.hw - 1, y1: cab.hw, z0: DECK_Z + 4, z1: cab.roof - 26 }, side.s);
    sheet.part('cab_door', `cab_door_${side.tag}`, doorBox, { [side.view]: 'auto' });
    const sideWin = sideBox({ x0: cab.x0 + 10, x1: cab.x0 + 50, y0: cab.hw - 1, y1: cab.hw, z0: win0, z1: win1 }, side.s);
    sheet.part('cab_window', `cab_window_side_${side.tag}`, sideWin, { [side.view]: 'auto' }, 'glass');
    const frontWin = sideBox({ x0: cab.x0, x1: cab.x0 + 2, y0: 8, y1: 40, z0: win0, z1: win1 }, side.s);
    sheet.part('cab_window', `cab_window_front_${side.tag}`, frontWin, { plan: 'auto', end_short_hood: 'auto' }, 'glass');
    if (lh.top + 16 < cab.roof - 6) {
      const rearWin = sideBox({ x0: cab.x1 - 2, x1: cab.x1, y0: 8, y1: 40, z0: lh.top + 4, z1: cab.roof - 6 }, side.s);
      sheet.part('cab_window', `cab_window_rear_${side.tag}`, rearWin, { plan: 'auto', end_long_hood: 'auto' }, 'glass');
    }
  }
  // Horn on the cab roof.
  const hornBox: Box3 = { x0: cab.x0 + 20, x1: cab.x0 + 44, y0: -6, y1: 6, z0: cab.roof, z1: cab.roof + 10 };
  const hornSide = (view: ViewDef, p: Box2, a: string): string =>
    polyEl(view, [p.u0, p.v0 + 3, p.u0 + 10, p.v0 + 3, p.u0 + 10, p.v0, p.u0 + 14, p.v0, p.u0 + 14, p.v0 + 3, p.u1, p.v0 + 3, p.u1, p.v1, p.u0, p.v1], true, a);
  sheet.part('horn', 'horn', hornBox, { plan: 'auto', side_plus_y: hornSide, side_minus_y: hornSide, end_short_hood: 'auto', end_long_hood: 'auto' });

  // Headlights and number boards, one set per end.
  const endParts = [
    { e: ENDS[0], faceX: sh.x0, top: sh.top, hoodHw: sh.hw, mirror: (b: Box3) => b },
    { e: ENDS[1], faceX: L - lh.x1, top: lh.top, hoodHw: lh.hw, mirror: (b: Box3) => mirrorBox(b, L) },
  ];
  for (const { e, faceX, top, hoodHw, mirror } of endParts) {
    const hl = mirror({ x0: faceX - 2, x1: faceX + 2, y0: -7, y1: 7, z0: top - 22, z1: top - 8 });
    sheet.part('headlight', `headlight_${e.tag}`, hl, { plan: 'auto', side_plus_y: 'auto', side_minus_y: 'auto', [e.view]: 'auto' }, 'glass');
    for (const side of SIDES) {
      const nb = mirror(sideBox({ x0: faceX - 1, x1: faceX + 2, y0: 12, y1: Math.min(30, hoodHw - 6), z0: top - 20, z1: top - 10 }, side.s));
      sheet.part('number_board', `number_board_${e.tag}_${side.tag}`, nb, { plan: 'auto', [e.view]: 'auto' }, 'glass');
    }
    const hv = V(e.view);
    const c = project(hv, hl);
    sheet.add(e.view, circleEl(hv, (c.u0 + c.u1) / 2 - 3.2, (c.v0 + c.v1) / 2, 2.6, cls('hair')));
    sheet.add(e.view, circleEl(hv, (c.u0 + c.u1) / 2 + 3.2, (c.v0 + c.v1) / 2, 2.6, cls('hair')));
  }

  // Hand brake on the long hood end face, its chain down into the frame.
  const hbY0 = lh.hw - 16, hbY1 = lh.hw - 2;
  const hbBox: Box3 = { x0: lh.x1, x1: lh.x1 + 4, y0: hbY0, y1: hbY1, z0: 84, z1: 84 + (hbY1 - hbY0) };
  const wheelFace = (view: ViewDef, p: Box2, a: string): string => circleEl(view, (p.u0 + p.u1) / 2, (p.v0 + p.v1) / 2, (p.u1 - p.u0) / 2, a);
  sheet.part('hand_brake', 'hand_brake', hbBox, { plan: 'auto', side_plus_y: 'auto', end_long_hood: wheelFace });
  const chainY = (hbY0 + hbY1) / 2;
  const chainBox: Box3 = { x0: lh.x1 + 2, x1: lh.x1 + 2, y0: chainY, y1: chainY, z0: SILL_Z + 1, z1: 84 };
  sheet.part('hand_brake_chain', 'hand_brake_chain', chainBox, { side_plus_y: 'auto', end_long_hood: 'auto' }, 'heavy');

  // Handrails and stanchions along both sides.
  const railY = hw - 2;
  const stanchionXs = new Set<number>();
  for (const [a, b] of unit.handrails) {
    stanchionXs.add(a);
    stanchionXs.add(b);
    if (b - a > 100) stanchionXs.add(Math.round((a + b) / 2));
  }
  const sortedStanchions = [...stanchionXs].sort((p, q) => p - q);
  for (const side of SIDES) {
    unit.handrails.forEach(([a, b], i) => {
      const box = sideBox({ x0: a, x1: b, y0: railY, y1: railY, z0: 100, z1: 100 }, side.s);
      sheet.part('handrail', `handrail_${i + 1}_${side.tag}`, box, { plan: 'auto', [side.view]: 'auto' }, 'heavy');
    });
    sortedStanchions.forEach((x, i) => {
      const box = sideBox({ x0: x, x1: x, y0: railY, y1: railY, z0: DECK_Z, z1: 100 }, side.s);
      sheet.part('stanchion', `stanchion_${i + 1}_${side.tag}`, box, { plan: 'auto', [side.view]: 'auto' }, 'heavy');
    });
  }

  // Running gear: trucks, traction motors, wheels, axles, sand boxes.
  let axleNo = 0;
  let sandNo = 0;
  unit.trucks.forEach((truck, ti) => {
    const tx0 = truck.axles[0] - 30, tx1 = truck.axles[truck.axles.length - 1] + 30;
    const truckBox: Box3 = { x0: tx0, x1: tx1, y0: -44, y1: 44, z0: 6, z1: SILL_Z };
    sheet.part('truck', `truck_${ti + 1}`, truckBox, { plan: 'auto', side_plus_y: 'auto', side_minus_y: 'auto' }, 'hair');
    sheet.add('plan', pathEl(plan, hatch({ u0: tx0, u1: tx1, v0: 34, v1: 44 }, 5), cls('hair')));
    sheet.add('plan', pathEl(plan, hatch({ u0: tx0, u1: tx1, v0: -44, v1: -34 }, 5), cls('hair')));
    for (const k of BOTH_SIDES) {
      const v = V(k);
      const frame = { u0: tx0 + 6, u1: tx1 - 6, v0: 14, v1: 38 };
      sheet.add(k, rectEl(v, frame, cls('hair')));
      sheet.add(k, pathEl(v, hatch(frame, 4), cls('hair')));
      const mid = (tx0 + tx1) / 2;
      sheet.add(k, pathEl(v, [[mid - 10, 16, mid - 6, 20, mid - 10, 24, mid - 6, 28, mid - 10, 32], [mid + 6, 16, mid + 10, 20, mid + 6, 24, mid + 10, 28, mid + 6, 32]], ''));
    }
    truck.axles.forEach((ax, ai) => {
      axleNo++;
      const dir = truck.motorDir[ai];
      const mx0 = dir === 1 ? ax + 6 : ax - 30, mx1 = dir === 1 ? ax + 30 : ax - 6;
      const motorBox: Box3 = { x0: mx0, x1: mx1, y0: -24, y1: 24, z0: 8, z1: 34 };
      sheet.part('traction_motor', `traction_motor_${axleNo}`, motorBox, { plan: 'auto', side_plus_y: 'auto', side_minus_y: 'auto' }, 'hidden');
      for (const side of SIDES) {
        const wb = sideBox({ x0: ax - WHEEL_R, x1: ax + WHEEL_R, y0: WHEEL_Y0, y1: WHEEL_Y1, z0: 0, z1: 2 * WHEEL_R }, side.s);
        const wheelSide = (view: ViewDef, _p: Box2, a: string): string => circleEl(view, ax, WHEEL_R, WHEEL_R, a);
        sheet.part('wheel', `wheel_${axleNo}_${side.tag}`, wb, { plan: 'auto', [side.view]: wheelSide }, 'heavy ground');
        sheet.add(side.view, circleEl(V(side.view), ax, WHEEL_R, WHEEL_R - 3, cls('hair')));
        sheet.add(side.view, circleEl(V(side.view), ax, WHEEL_R, 9, cls('hair')));
      }
      const axleBox: Box3 = { x0: ax - 3.5, x1: ax + 3.5, y0: -WHEEL_Y0, y1: WHEEL_Y0, z0: WHEEL_R - 3.5, z1: WHEEL_R + 3.5 };
      const hub = (view: ViewDef, _p: Box2, a: string): string => circleEl(view, ax, WHEEL_R, 3.5, a);
      sheet.part('axle', `axle_${axleNo}`, axleBox, { plan: 'auto', side_plus_y: hub, side_minus_y: hub }, 'rubber');
    });
    for (const [x0, x1] of [[tx0, tx0 + 12], [tx1 - 12, tx1]]) {
      sandNo++;
      for (const side of SIDES) {
        const sb = sideBox({ x0, x1, y0: 36, y1: 48, z0: 30, z1: SILL_Z }, side.s);
        sheet.part('sand_box', `sand_box_${sandNo}_${side.tag}`, sb, { plan: 'auto', [side.view]: 'auto' });
      }
    }
  });

  // Fuel tank and main reservoirs under the frame between the trucks.
  const fuelBox: Box3 = { x0: unit.fuel.x0, x1: unit.fuel.x1, y0: -50, y1: 50, z0: 14, z1: SILL_Z + 4 };
  sheet.part('fuel_tank', 'fuel_tank', fuelBox, { side_plus_y: 'auto', side_minus_y: 'auto' }, 'body');
  for (const k of BOTH_SIDES) {
    const v = V(k);
    const fx = (unit.fuel.x0 + unit.fuel.x1) / 2;
    sheet.add(k, pathEl(v, [[unit.fuel.x0 + 6, 20, unit.fuel.x1 - 6, 20], [fx - 8, 30, fx + 8, 30, fx + 8, 40, fx - 8, 40, fx - 8, 30]], cls('hair')));
  }
  unit.reservoirs.forEach((r, i) => {
    const box: Box3 = r.transverse
      ? { x0: r.x0, x1: r.x1, y0: -40, y1: 40, z0: 28, z1: 28 + (r.x1 - r.x0) }
      : { x0: r.x0, x1: r.x1, y0: -11, y1: 11, z0: 28, z1: 50 };
    const draw: Draw = r.transverse ? (view, p, a) => circleEl(view, (p.u0 + p.u1) / 2, (p.v0 + p.v1) / 2, (p.u1 - p.u0) / 2, a) : 'auto';
    sheet.part('air_reservoir', `air_reservoir_${i + 1}`, box, { side_plus_y: draw, side_minus_y: draw });
  });

  // End equipment, drawn for the short hood end and mirrored to the long hood end.
  for (const [ei, e] of ENDS.entries()) {
    const m = (b: Box3): Box3 => (ei === 0 ? b : mirrorBox(b, L));
    const mu = (u: number): number => (ei === 0 ? u : L - u);
    const pilotBox = m({ x0: PILOT_FACE, x1: PILOT_BACK, y0: -(hw - 5.5), y1: hw - 5.5, z0: 4.5, z1: SILL_Z });
    const pilotSide = (view: ViewDef, _p: Box2, a: string): string =>
      polyEl(view, [mu(PILOT_FACE), SILL_Z, mu(PILOT_BACK), SILL_Z, mu(PILOT_BACK), 4.5, mu(PILOT_FACE + 6), 4.5, mu(PILOT_FACE), 18], true, a);
    const pilotEnd = (view: ViewDef, p: Box2, a: string): string =>
      polyEl(view, [p.u0, p.v1, p.u1, p.v1, p.u1, p.v0 + 10, p.u1 - 10, p.v0, p.u0 + 10, p.v0, p.u0, p.v0 + 10], true, a);
    sheet.part('pilot', `pilot_${e.tag}`, pilotBox, { plan: 'auto', side_plus_y: pilotSide, side_minus_y: pilotSide, [e.view]: pilotEnd }, 'body');
    const ev = V(e.view);
    sheet.add(e.view, pathEl(ev, [[-(hw - 5.5) + 12, 12, hw - 5.5 - 12, 12], [-(hw - 5.5) + 6, 24, hw - 5.5 - 6, 24]], cls('hair')));

    const couplerBox = m({ x0: 0, x1: 30, y0: -7, y1: 7, z0: COUPLER_Z0, z1: COUPLER_Z1 });
    const couplerSide = (view: ViewDef, _p: Box2, a: string): string =>
      polyEl(view, [mu(0), COUPLER_Z0, mu(8), COUPLER_Z0, mu(8), 32, mu(30), 32, mu(30), 37, mu(8), 37, mu(8), COUPLER_Z1, mu(0), COUPLER_Z1], true, a);
    const couplerPlan = (view: ViewDef, _p: Box2, a: string): string =>
      polyEl(view, [mu(0), -7, mu(8), -7, mu(8), -3, mu(30), -3, mu(30), 3, mu(8), 3, mu(8), 7, mu(0), 7], true, a);
    sheet.part('coupler', `coupler_${e.tag}`, couplerBox, { plan: couplerPlan, side_plus_y: couplerSide, side_minus_y: couplerSide, [e.view]: 'auto' }, 'heavy');

    const endRail = m({ x0: 22, x1: 22, y0: -(hw - 9.5), y1: hw - 9.5, z0: DECK_Z, z1: 100 });
    const endRailEnd = (view: ViewDef, p: Box2, a: string): string => polyEl(view, [p.u0, p.v0, p.u0, p.v1, p.u1, p.v1, p.u1, p.v0], false, a);
    sheet.part('end_handrail', `end_handrail_${e.tag}`, endRail, { plan: 'auto', side_plus_y: 'auto', side_minus_y: 'auto', [e.view]: endRailEnd }, 'heavy');

    for (const side of SIDES) {
      const s = side.s;
      const lever = m(sideBox({ x0: 7, x1: 11, y0: 9, y1: hw - 9.5, z0: 40, z1: 46 }, s));
      const leverEnd = (view: ViewDef, p: Box2, a: string): string => {
        const [inner, outer] = s === 1 ? [p.u0, p.u1] : [p.u1, p.u0];
        const t = (d: number): number => outer - s * d;
        return polyEl(view, [inner, 44, t(6), 44, t(2), 46, outer, 40], false, a);
      };
      sheet.part('uncoupling_lever', `uncoupling_lever_${e.tag}_${side.tag}`, lever, { plan: 'auto', [side.view]: 'auto', [e.view]: leverEnd }, 'heavy');

      const mu0 = hw - 21.5, mu1 = hw - 13.5;
      const muBox = m(sideBox({ x0: 2, x1: 7, y0: mu0, y1: mu1, z0: 50, z1: 58 }, s));
      sheet.part('mu_receptacle', `mu_receptacle_${e.tag}_${side.tag}`, muBox, { plan: 'auto', [e.view]: 'auto' });
      const mc = project(ev, muBox);
      sheet.add(e.view, circleEl(ev, (mc.u0 + mc.u1) / 2, (mc.v0 + mc.v1) / 2, 2.5, cls('hair')));

      const hose = m(sideBox({ x0: 1, x1: 7, y0: 13, y1: 19, z0: 16, z1: 38 }, s));
      const hoseEnd = (view: ViewDef, p: Box2, a: string): string =>
        polyEl(view, [p.u0 + 3, p.v1, p.u0, p.v1 - 8, p.u1, p.v0 + 8, p.u0 + 3, p.v0], false, a);
      sheet.part('air_hose', `air_hose_${e.tag}_${side.tag}`, hose, { plan: 'auto', [e.view]: hoseEnd }, 'rubber');

      const ditch = m(sideBox({ x0: 13, x1: 19, y0: mu0, y1: mu1, z0: 63, z1: 71 }, s));
      const lamp = (view: ViewDef, p: Box2, a: string): string => circleEl(view, (p.u0 + p.u1) / 2, (p.v0 + p.v1) / 2, 4, a);
      sheet.part('ditch_light', `ditch_light_${e.tag}_${side.tag}`, ditch, { plan: 'auto', [side.view]: 'auto', [e.view]: lamp }, 'glass');

      const step = m(sideBox({ x0: 25, x1: 41, y0: hw - 8.5, y1: hw, z0: 12, z1: DECK_Z }, s));
      sheet.part('step', `step_${e.tag}_${side.tag}`, step, { plan: 'auto', [side.view]: 'auto', [e.view]: 'auto' });
      const sv = V(side.view);
      sheet.add(side.view, pathEl(sv, [24, 36, 48].map((z) => [mu(26), z, mu(40), z]), cls('hair')));
    }
  }

  // The F, stencilled near the short hood corner; the app moves its display with the unit's front.
  const fBox: Box3 = { x0: 48, x1: 56, y0: hw - 13.5, y1: hw - 2.5, z0: SILL_Z + 1, z1: SILL_Z + 12 };
  sheet.part('front_marking', 'front_marking', fBox, { plan: glyphF, side_plus_y: glyphF, side_minus_y: glyphF }, 'ink');

  // View titles.
  for (const v of views) {
    const [u, vv] =
      v.key === 'plan' ? [L / 2, -hw - 16] : v.key.startsWith('side') ? [L / 2, -18] : [0, -18];
    sheet.add(v.key, textEl(v, u, vv, v.title, 10, 'middle'));
  }

  const style =
    `svg{fill:none;stroke:${INK};stroke-width:.7;stroke-linejoin:round;stroke-linecap:round}` +
    `.heavy{stroke-width:1.2}.hair{stroke-width:.3}.hidden{stroke-dasharray:3 2}` +
    `.body{fill:${INK};fill-opacity:.04}.glass{fill:${INK};fill-opacity:.16}.rubber{fill:${INK};fill-opacity:.5}` +
    `.ink{fill:${INK};stroke:none}.ground{fill:${GROUND}}text{fill:${INK};stroke:none;font-family:'Roboto Condensed',sans-serif}`;
  const viewsMarkup = views
    .map((v) => {
      const axes = `${v.u.sign === -1 ? '-' : ''}${v.u.axis},${v.v.sign === -1 ? '-' : ''}${v.v.axis}`;
      return (
        `<g data-view="${v.key}" transform="translate(${f(v.tx)},${f(v.ty)})" data-axes="${axes}" data-bounds="${v.bounds.map(f).join(' ')}">\n` +
        v.items.map((i) => `  ${i}\n`).join('') +
        '</g>\n'
      );
    })
    .join('');
  return (
    `<?xml version="1.0" encoding="UTF-8"?>\n` +
    `<!-- Generated by scripts/draw-diagrams.ts: carbody inches, format in diagrams/README.md. Edit the script, then rerun it. -->\n` +
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${f(sheetW)} ${f(sheetH)}" width="${f(sheetW)}" height="${f(sheetH)}"` +
    ` data-unit-type="${unit.key}" data-name="${unit.name}" data-length="${f(L)}" data-width="${f(W)}" data-axles="${axleNo}"` +
    ` data-views="${views.map((v) => v.key).join(' ')}">\n` +
    `<title>${unit.name}</title>\n<style>${style}</style>\n` +
    viewsMarkup +
    '</svg>\n'
  );
}

// ---------------------------------------------------------------- the three unit types (approximate, from memory)

const UNITS: Unit[] = [
  {
    key: 'six_axle_road',
    name: 'Six-axle road unit, cab on short hood',
    file: 'six_axle_road.svg',
    L: 850,
    W: 123,
    // Truck centres 155 and 695 in: 45 ft apart; axles 81 in apart in each truck.
    trucks: [
      { axles: [74, 155, 236], motorDir: [1, 1, -1] },
      { axles: [614, 695, 776], motorDir: [1, -1, -1] },
    ],
    shortHood: { x0: 44, x1: 150, hw: 38, top: 136 },
    cab: { x0: 150, x1: 282, hw: 54, roof: 186 },
    longHood: { x0: 282, x1: 820, hw: 38, top: 174 },
    fuel: { x0: 334, x1: 516 },
    reservoirs: [
      { x0: 272, x1: 326, transverse: false },
      { x0: 524, x1: 578, transverse: false },
    ],
    handrails: [
      [34, 144],
      [284, 460],
      [460, 640],
      [640, 816],
    ],
  },
  {
    key: 'four_axle_road',
    name: 'Four-axle road unit, cab on short hood',
    file: 'four_axle_road.svg',
    L: 710,
    W: 123,
    // Truck centres 151 and 559 in: 34 ft apart; axles 108 in apart in each truck.
    trucks: [
      { axles: [97, 205], motorDir: [1, -1] },
      { axles: [505, 613], motorDir: [1, -1] },
    ],
    shortHood: { x0: 40, x1: 126, hw: 38, top: 132 },
    cab: { x0: 126, x1: 250, hw: 54, roof: 182 },
    longHood: { x0: 250, x1: 680, hw: 38, top: 170 },
    fuel: { x0: 290, x1: 420 },
    reservoirs: [
      { x0: 240, x1: 284, transverse: false },
      { x0: 426, x1: 470, transverse: false },
    ],
    handrails: [
      [34, 120],
      [252, 400],
      [400, 540],
      [540, 676],
    ],
  },
  {
    key: 'four_axle_switcher',
    name: 'Four-axle end-cab yard switcher',
    file: 'four_axle_switcher.svg',
    L: 530,
    W: 120,
    // Truck centres 133 and 397 in: 22 ft apart; axles 96 in apart in each truck.
    trucks: [
      { axles: [85, 181], motorDir: [1, -1] },
      { axles: [349, 445], motorDir: [1, -1] },
    ],
    // The short hood is only the low nose ahead of the cab.
    shortHood: { x0: 30, x1: 50, hw: 30, top: 110 },
    cab: { x0: 50, x1: 160, hw: 52, roof: 170 },
    longHood: { x0: 160, x1: 500, hw: 34, top: 146 },
    fuel: { x0: 240, x1: 290 },
    reservoirs: [
      { x0: 216, x1: 236, transverse: true },
      { x0: 294, x1: 314, transverse: true },
    ],
    handrails: [
      [162, 330],
      [330, 496],
    ],
  },
];

const outDir = fileURLToPath(new URL('../diagrams/', import.meta.url));
for (const unit of UNITS) {
  const svg = drawUnit(unit);
  writeFileSync(outDir + unit.file, svg);
  console.log(`${unit.file}: ${(svg.length / 1024).toFixed(1)} KB`);
}
