/**
 * A small invented six-axle drawing in our SVG format, for the canvas bench (when diagrams/ has
 * no usable six-axle file) and the canvas component test (which needs fixed, known geometry).
 * Proportions are rough, from memory (product brief §4): 850 in over couplers, 123 in wide,
 * trucks of three axles 81 in apart.
 */
import { parseDrawing } from '../shared/drawings/parse-drawing';
import type { Drawing } from '../shared/drawings/types';

export const SAMPLE_LENGTH = 850;
export const SAMPLE_HALF_WIDTH = 61.5;
/** Axle x positions, from the short hood end. */
export const SAMPLE_AXLES = [74, 155, 236, 614, 695, 776] as const;
/** Which way each traction motor sits from its axle (+1 towards the long hood). */
const MOTOR_DIR = [1, 1, -1, 1, -1, -1] as const;

interface SheetView {
  key: string;
  tx: number;
  ty: number;
  ux: 'x' | 'y';
  su: 1 | -1;
  bounds: [number, number, number, number];
  items: string[];
}

const n = (v: number): string => String(Math.round(v * 100) / 100);
/** Element coordinates inside the view group (the group's translate places them on the sheet). */
const sheet = (v: SheetView, u: number, w: number): [number, number] => [v.su * u + 0, -w + 0];

function rect(v: SheetView, u0: number, u1: number, w0: number, w1: number, attrs: string): string {
  const [ax, ay] = sheet(v, u0, w0), [bx, by] = sheet(v, u1, w1);
  return `<rect ${attrs} x="${n(Math.min(ax, bx))}" y="${n(Math.min(ay, by))}" width="${n(Math.abs(bx - ax))}" height="${n(Math.abs(by - ay))}"/>`;
}
function circle(v: SheetView, u: number, w: number, r: number, attrs: string): string {
  const [x, y] = sheet(v, u, w);
  return `<circle ${attrs} cx="${n(x)}" cy="${n(y)}" r="${n(r)}"/>`;
}
function poly(v: SheetView, pts: number[], closed: boolean, attrs: string): string {
  const out: string[] = [];
  for (let i = 0; i < pts.length; i += 2) out.push(sheet(v, pts[i], pts[i + 1]).map(n).join(','));
  return `<${closed ? 'polygon' : 'polyline'} ${attrs} points="${out.join(' ')}"/>`;
}
function text(v: SheetView, u: number, w: number, s: string, size: number): string {
  const [x, y] = sheet(v, u, w);
  return `<text x="${n(x)}" y="${n(y)}" font-size="${size}" text-anchor="middle">${s}</text>`;
}
/** An upright, readable F stencil filling the sheet rectangle of the view box. */
function glyphF(v: SheetView, u0: number, u1: number, w0: number, w1: number, attrs: string): string {
  const [ax, ay] = sheet(v, u0, w0), [bx, by] = sheet(v, u1, w1);
  const x = Math.min(ax, bx), y = Math.min(ay, by), w = Math.abs(bx - ax), h = Math.abs(by - ay);
  const p = [0, 0, 1, 0, 1, 0.18, 0.28, 0.18, 0.28, 0.42, 0.78, 0.42, 0.78, 0.6, 0.28, 0.6, 0.28, 1, 0, 1];
  const pts: string[] = [];
  for (let i = 0; i < p.length; i += 2) pts.push(`${n(x + p[i] * w)},${n(y + p[i + 1] * h)}`);
  return `<polygon ${attrs} points="${pts.join(' ')}"/>`;
}
const part = (kind: string, id: string, instance: string, cls = ''): string =>
  `id="${id}" data-part="${kind}" data-instance="${instance}"${cls ? ` class="${cls}"` : ''}`;

/** The sample drawing as SVG text. */
export function sampleSixAxleSvg(): string {
  const L = SAMPLE_LENGTH, hw = SAMPLE_HALF_WIDTH;
  const plan: SheetView = { key: 'plan', tx: 100, ty: 100, ux: 'x', su: 1, bounds: [0, -hw, L, hw], items: [] };
  const sidePy: SheetView = { key: 'side_plus_y', tx: 950, ty: 420, ux: 'x', su: -1, bounds: [0, 0, L, 200], items: [] };
  const sideMy: SheetView = { key: 'side_minus_y', tx: 100, ty: 680, ux: 'x', su: 1, bounds: [0, 0, L, 200], items: [] };
  const endSh: SheetView = { key: 'end_short_hood', tx: 1100, ty: 420, ux: 'y', su: -1, bounds: [-hw, 0, hw, 200], items: [] };
  const endLh: SheetView = { key: 'end_long_hood', tx: 1100, ty: 680, ux: 'y', su: 1, bounds: [-hw, 0, hw, 200], items: [] };

  // Plan: carbody, hoods, cab, walkways, then running gear (hidden lines), end gear and the F on top.
  const P = plan.items;
  P.push(rect(plan, 12, L - 12, -hw, hw, 'class="heavy"'));
  P.push(rect(plan, 12, L - 12, 38, hw, part('walkway', 'pl-walkway-py', 'walkway_py')));
  P.push(rect(plan, 12, L - 12, -hw, -38, part('walkway', 'pl-walkway-my', 'walkway_my')));
  P.push(rect(plan, 44, 150, -38, 38, part('short_hood', 'pl-short-hood', 'short_hood', 'body')));
  P.push(rect(plan, 150, 282, -54, 54, part('cab', 'pl-cab', 'cab', 'body heavy')));
  P.push(rect(plan, 282, 820, -38, 38, part('long_hood', 'pl-long-hood', 'long_hood', 'body')));
  for (let i = 0; i < 12; i++) P.push(poly(plan, [300 + i * 42, -30, 300 + i * 42, 30], false, 'class="hair"'));
  const trucks = [
    [SAMPLE_AXLES[0] - 30, SAMPLE_AXLES[2] + 30],
    [SAMPLE_AXLES[3] - 30, SAMPLE_AXLES[5] + 30],
  ];
  trucks.forEach(([t0, t1], i) => P.push(rect(plan, t0, t1, -44, 44, part('truck', `pl-truck-${i + 1}`, `truck_${i + 1}`, 'hidden'))));
  SAMPLE_AXLES.forEach((ax, i) => {
    const [m0, m1] = MOTOR_DIR[i] === 1 ? [ax + 6, ax + 30] : [ax - 30, ax - 6];
    P.push(rect(plan, m0, m1, -24, 24, part('traction_motor', `pl-tm-${i + 1}`, `traction_motor_${i + 1}`, 'hidden')));
    P.push(rect(plan, ax - 3.5, ax + 3.5, -27, 27, part('axle', `pl-axle-${i + 1}`, `axle_${i + 1}`, 'rubber')));
    P.push(rect(plan, ax - 20, ax + 20, 27, 32.5, part('wheel', `pl-wheel-${i + 1}-py`, `wheel_${i + 1}_py`, 'heavy')));
    P.push(rect(plan, ax - 20, ax + 20, -32.5, -27, part('wheel', `pl-wheel-${i + 1}-my`, `wheel_${i + 1}_my`, 'heavy')));
  });
  for (const [tag, mu] of [['sh', (u: number) => u], ['lh', (u: number) => L - u]] as const) {
    P.push(poly(plan, [mu(0), -7, mu(8), -7, mu(8), -3, mu(30), -3, mu(30), 3, mu(8), 3, mu(8), 7, mu(0), 7], true, part('coupler', `pl-coupler-${tag}`, `coupler_${tag}`, 'heavy')));
    P.push(rect(plan, mu(12), mu(24), -56, 56, part('pilot', `pl-pilot-${tag}`, `pilot_${tag}`)));
  }
  P.push(glyphF(plan, 48, 56, 48, 59, part('front_marking', 'pl-f', 'front_marking', 'ink')));
  P.push(text(plan, L / 2, -hw - 16, 'PLAN', 10));

  // Side elevations.
  for (const [v, tag] of [[sidePy, 'py'], [sideMy, 'my']] as const) {
    const S = v.items;
    S.push(rect(v, 12, L - 12, 46, 60, `class="heavy"`));
    S.push(rect(v, 44, 150, 60, 136, part('short_hood', `${tag}-short-hood`, 'short_hood', 'body')));
    S.push(rect(v, 150, 282, 60, 186, part('cab', `${tag}-cab`, 'cab', 'body heavy')));
    S.push(rect(v, 282, 820, 60, 174, part('long_hood', `${tag}-long-hood`, 'long_hood', 'body')));
    S.push(rect(v, 334, 516, 14, 50, part('fuel_tank', `${tag}-fuel-tank`, 'fuel_tank', 'body')));
    trucks.forEach(([t0, t1], i) => S.push(rect(v, t0, t1, 6, 46, part('truck', `${tag}-truck-${i + 1}`, `truck_${i + 1}`, 'hair'))));
    SAMPLE_AXLES.forEach((ax, i) => {
      const [m0, m1] = MOTOR_DIR[i] === 1 ? [ax + 6, ax + 30] : [ax - 30, ax - 6];
      S.push(rect(v, m0, m1, 8, 34, part('traction_motor', `${tag}-tm-${i + 1}`, `traction_motor_${i + 1}`, 'hidden')));
      S.push(circle(v, ax, 20, 20, part('wheel', `${tag}-wheel-${i + 1}`, `wheel_${i + 1}_${tag}`, 'heavy')));
      S.push(circle(v, ax, 20, 3.5, part('axle', `${tag}-axle-${i + 1}`, `axle_${i + 1}`, 'rubber')));
    });
    S.push(glyphF(v, 48, 56, 47, 58, part('front_marking', `${tag}-f`, 'front_marking', 'ink')));
    S.push(text(v, L / 2, -18, tag === 'py' ? 'SIDE, +Y' : 'SIDE, -Y', 10));
  }

  // End elevations.
  for (const [v, tag] of [[endSh, 'sh'], [endLh, 'lh']] as const) {
    const E = v.items;
    E.push(rect(v, -38, 38, 60, tag === 'sh' ? 136 : 174, 'class="heavy"'));
    E.push(rect(v, -7, 7, 29, 40, part('coupler', `${tag}-end-coupler`, `coupler_${tag}`, 'heavy')));
    E.push(poly(v, [-56, 46, 56, 46, 56, 14.5, 46, 4.5, -46, 4.5, -56, 14.5], true, part('pilot', `${tag}-end-pilot`, `pilot_${tag}`)));
    E.push(text(v, 0, -18, tag === 'sh' ? 'SHORT HOOD END' : 'LONG HOOD END', 10));
  }

  const views = [plan, sidePy, sideMy, endSh, endLh];
  const axes = (v: SheetView): string => `${v.su === -1 ? '-' : ''}${v.ux},-z`.replace(',-z', v.key === 'plan' ? ',-y' : ',-z');
  const body = views
    .map((v) => `<g data-view="${v.key}" transform="translate(${v.tx},${v.ty})" data-axes="${axes(v)}" data-bounds="${v.bounds.map(n).join(' ')}">\n  ${v.items.join('\n  ')}\n</g>`)
    .join('\n');
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 1250 720" data-unit-type="sample_six_axle" data-name="Sample six-axle road unit"` +
    ` data-length="${L}" data-width="${2 * hw}" data-axles="6" data-views="plan side_plus_y side_minus_y end_short_hood end_long_hood">\n${body}\n</svg>\n`
  );
}

export function sampleSixAxleDrawing(): Drawing {
  return parseDrawing(sampleSixAxleSvg(), 'sample_six_axle.svg');
}
