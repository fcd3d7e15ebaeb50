// Screen placement of drawing views: plain geometry (affine maps, boxes) and the orientation rules of
// product brief §3 (front = the F end; left when facing the front from the cab; count from the front).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { sampleSixAxleDrawing, SAMPLE_LENGTH } from '../../bench/canvas-sample-drawing';
import { bodyPoint, screenPoint } from '../../shared/domain/frames';
import type { FrontEnd } from '../../shared/domain/frames';
import {
  CSS_PX_PER_INCH,
  MIN_TARGET_PX,
  boxToScreen,
  clampCamera,
  defaultFitPadding,
  ensureVisible,
  fitCamera,
  minHitSideIn,
  orientationMarkers,
  pinchCamera,
  reorientCamera,
  screenToView,
  viewExtent,
  viewOrientation,
  viewToScreen,
  wheelZoomFactor,
  zoomAt,
  zoomLimits,
  type Camera,
  type ViewOrientation,
} from '../../shared/drawings/screen';
import { halfTurnViewPoint, placeFrontMarkings, placeNumerals, tabOrder, tappableView } from '../../shared/drawings/screen-labels';
import { partAtPoint } from '../../shared/drawings/geometry';
import type { Box, DrawingView } from '../../shared/drawings/types';
import { instancesFromFront, unitLayout } from '../../shared/layout/unit-layout';
import { bodyToFront } from '../../shared/orientation';

const drawing = sampleSixAxleDrawing();
const viewOf = (key: DrawingView['key']): DrawingView => drawing.views.find((v) => v.key === key)!;
const plan = viewOf('plan');
const vp = { width: 800, height: 400 };
const close = (a: number, b: number, eps = 1e-9): boolean => Math.abs(a - b) <= eps * Math.max(1, Math.abs(a), Math.abs(b));

describe('minimum finger target', () => {
  it('is 9 mm at 96 CSS px per inch, about 34 px (9 / 25.4 × 96; CSS reference pixel)', () => {
    expect(CSS_PX_PER_INCH).toBe(96);
    expect(MIN_TARGET_PX).toBeCloseTo(34.0157, 3);
  });
  it('converts to drawing inches by the current scale, so the target is always 34 px on screen', () => {
    expect(minHitSideIn(1)).toBeCloseTo(34.0157, 3);
    expect(minHitSideIn(2)).toBeCloseTo(17.0079, 3);
    expect(minHitSideIn(0.5)).toBeCloseTo(68.0315, 3);
    fc.assert(fc.property(fc.double({ min: 0.01, max: 500, noNaN: true }), (s) => close(minHitSideIn(s) * s, MIN_TARGET_PX)));
    expect(() => minHitSideIn(0)).toThrow(RangeError);
  });
  it('lets a tap 15 px beside an axle (7 in wide, ~6 px on screen) still find it', () => {
    const o = viewOrientation(plan, 'as_built', 'short_hood');
    const cam = fitCamera(plan.bounds, o, vp);
    // Axle 1 is centred at x = 74 in; 15 px towards the short hood lands on the truck frame, not the axle.
    const c = viewToScreen({ u: 74, v: 0 }, o, cam);
    const at = screenToView(screenPoint(c.sx - 15, c.sy), o, cam);
    expect(Math.abs(at.u - 74)).toBeGreaterThan(3.5);
    expect(partAtPoint(plan, at, minHitSideIn(cam.scale))?.instanceId).toBe('axle_1');
    expect(partAtPoint(plan, at, 0.1)?.instanceId).toBe('truck_1');
  });
  it('gives a tap squarely on a traction motor to the motor, though the axle beside it reaches over with its enlarged target', () => {
    // Plain geometry of the sample plan: axle 1 is 7 in wide at x = 74 in; at whole-unit zoom its 34 px
    // target spans more than ±14 in, over traction motor 1 (x 80–104 in), which lies beside it, not under it.
    const o = viewOrientation(plan, 'as_built', 'short_hood');
    const cam = fitCamera(plan.bounds, o, vp);
    const side = minHitSideIn(cam.scale);
    const axle = plan.parts.find((p) => p.instanceId === 'axle_1')!;
    const motor = plan.parts.find((p) => p.instanceId === 'traction_motor_1')!;
    const onMotor = { u: motor.bbox.umin + 2, v: 0 };
    expect(Math.abs(onMotor.u - (axle.bbox.umin + axle.bbox.umax) / 2)).toBeLessThan(side / 2);
    expect(partAtPoint(plan, onMotor, side)?.instanceId).toBe('traction_motor_1');
    // Between the axle and the motor, on the truck frame the axle sits on, the axle's target still wins.
    const between = { u: axle.bbox.umax + 1, v: 0 };
    expect(partAtPoint(plan, between, side)?.instanceId).toBe('axle_1');
  });
});

describe('fit to screen', () => {
  it('shows the whole view, as large as the padded viewport allows, centred', () => {
    const o = viewOrientation(plan, 'as_built', 'short_hood');
    const cam = fitCamera(plan.bounds, o, vp, { x: 64, y: 40 });
    // 850 in into 672 px, 123 in into 320 px: the length limits.
    expect(cam.scale).toBeCloseTo(672 / 850, 12);
    const r = boxToScreen(plan.bounds, o, cam);
    expect(r.x).toBeCloseTo(64, 9);
    expect(r.x + r.w).toBeCloseTo(736, 9);
    expect(r.y + r.h / 2).toBeCloseTo(200, 9);
  });
  it('leaves room for the orientation words by default, and still room for a FRONT tag on a phone', () => {
    expect(defaultFitPadding({ width: 800, height: 400 })).toEqual({ x: 88, y: 40 });
    const phone = defaultFitPadding({ width: 360, height: 640 });
    expect(phone.x).toBe(66); // a FRONT tag is about 60 px wide: 12 % of 360 px (43 px) clipped it
    expect(phone.y).toBe(44);
    const o = viewOrientation(plan, 'as_built', 'short_hood');
    expect(fitCamera(plan.bounds, o, vp).scale).toBeCloseTo((800 - 176) / 850, 12);
  });
  it('fits the tall end elevation by its height', () => {
    const end = viewOf('end_short_hood');
    const o = viewOrientation(end, 'as_built', 'short_hood');
    const cam = fitCamera(end.bounds, o, vp, { x: 64, y: 40 });
    expect(cam.scale).toBeCloseTo(320 / 200, 12);
  });
});

describe('which way round a view is drawn', () => {
  it('as built: short hood end at the left and +y / z up, whatever end has the F', () => {
    for (const fe of ['short_hood', 'long_hood'] as FrontEnd[]) {
      expect(viewOrientation(plan, 'as_built', fe)).toEqual({ su: 1, sv: -1 });
      expect(viewOrientation(viewOf('side_plus_y'), 'as_built', fe)).toEqual({ su: 1, sv: -1 });
      expect(viewOrientation(viewOf('side_minus_y'), 'as_built', fe)).toEqual({ su: 1, sv: -1 });
    }
  });
  it('front first with the F on the long hood: the plan turns end for end, an elevation mirrors', () => {
    expect(viewOrientation(plan, 'front_first', 'short_hood')).toEqual({ su: 1, sv: -1 });
    expect(viewOrientation(plan, 'front_first', 'long_hood')).toEqual({ su: -1, sv: 1 });
    expect(viewOrientation(viewOf('side_plus_y'), 'front_first', 'long_hood')).toEqual({ su: -1, sv: -1 });
  });
  it('end elevations keep the sheet’s layout (seen from outside that end)', () => {
    // The sample files them as "-y,-z" (short hood end) and "y,-z" (long hood end).
    expect(viewOrientation(viewOf('end_short_hood'), 'front_first', 'long_hood')).toEqual({ su: -1, sv: -1 });
    expect(viewOrientation(viewOf('end_long_hood'), 'as_built', 'short_hood')).toEqual({ su: 1, sv: -1 });
  });
  it('front first puts a part at the same screen spot on both kinds of unit when its place from the front is the same', () => {
    const oShort = viewOrientation(plan, 'front_first', 'short_hood');
    const oLong = viewOrientation(plan, 'front_first', 'long_hood');
    const cShort = fitCamera(plan.bounds, oShort, vp);
    const cLong = fitCamera(plan.bounds, oLong, vp);
    fc.assert(
      fc.property(fc.double({ min: 0, max: SAMPLE_LENGTH, noNaN: true }), fc.double({ min: -61.5, max: 61.5, noNaN: true }), (x, y) => {
        const onShort = bodyPoint(x, y);
        // The physical point on a long-hood-front unit with the same distance from the front and offset to the left.
        const f = bodyToFront(onShort, 'short_hood', SAMPLE_LENGTH);
        const onLong = bodyPoint(SAMPLE_LENGTH - f.along, f.left);
        expect(bodyToFront(onLong, 'long_hood', SAMPLE_LENGTH).along).toBeCloseTo(f.along, 9);
        const a = viewToScreen({ u: onShort.x, v: onShort.y }, oShort, cShort);
        const b = viewToScreen({ u: onLong.x, v: onLong.y }, oLong, cLong);
        return close(a.sx, b.sx, 1e-9) && close(a.sy, b.sy, 1e-9);
      }),
    );
  });
  it('front first keeps the front at the left of the screen', () => {
    for (const fe of ['short_hood', 'long_hood'] as FrontEnd[]) {
      const o = viewOrientation(plan, 'front_first', fe);
      const cam = fitCamera(plan.bounds, o, vp);
      const frontX = fe === 'short_hood' ? 0 : SAMPLE_LENGTH;
      const rearX = SAMPLE_LENGTH - frontX;
      expect(viewToScreen({ u: frontX, v: 0 }, o, cam).sx).toBeLessThan(viewToScreen({ u: rearX, v: 0 }, o, cam).sx);
    }
  });
});

describe('screen ↔ view', () => {
  const orients: ViewOrientation[] = [
    { su: 1, sv: -1 },
    { su: -1, sv: 1 },
    { su: -1, sv: -1 },
    { su: 1, sv: 1 },
  ];
  const camArb = fc.record({ scale: fc.double({ min: 0.05, max: 80, noNaN: true }), ox: fc.double({ min: -5000, max: 5000, noNaN: true }), oy: fc.double({ min: -5000, max: 5000, noNaN: true }) });
  it('round-trips view → screen → view', () => {
    fc.assert(
      fc.property(camArb, fc.constantFrom(...orients), fc.double({ min: -1000, max: 1000, noNaN: true }), fc.double({ min: -1000, max: 1000, noNaN: true }), (cam, o, u, v) => {
        const back = screenToView(viewToScreen({ u, v }, o, cam), o, cam);
        return Math.abs(back.u - u) < 1e-6 && Math.abs(back.v - v) < 1e-6;
      }),
    );
  });
  it('round-trips screen → view → screen', () => {
    fc.assert(
      fc.property(camArb, fc.constantFrom(...orients), fc.double({ min: 0, max: 2000, noNaN: true }), fc.double({ min: 0, max: 2000, noNaN: true }), (cam, o, sx, sy) => {
        const back = viewToScreen(screenToView(screenPoint(sx, sy), o, cam), o, cam);
        return Math.abs(back.sx - sx) < 1e-6 && Math.abs(back.sy - sy) < 1e-6;
      }),
    );
  });
  it('scales distances by the scale', () => {
    const cam: Camera = { scale: 2.5, ox: 10, oy: 20 };
    const a = viewToScreen({ u: 0, v: 0 }, { su: 1, sv: -1 }, cam);
    const b = viewToScreen({ u: 3, v: 4 }, { su: 1, sv: -1 }, cam);
    expect(Math.hypot(b.sx - a.sx, b.sy - a.sy)).toBeCloseTo(12.5, 12);
    expect(b.sy).toBeLessThan(a.sy); // +v is drawn up
  });
});

describe('pan and zoom commands', () => {
  const o: ViewOrientation = { su: 1, sv: -1 };
  const cam: Camera = { scale: 1, ox: 100, oy: 200 };
  const limits = { min: 0.5, max: 30 };
  it('zooms about the pointer: the view point under it stays put', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.6, max: 1.6, noNaN: true }), fc.double({ min: 0, max: 800, noNaN: true }), fc.double({ min: 0, max: 400, noNaN: true }), (f, sx, sy) => {
        const at = screenPoint(sx, sy);
        const before = screenToView(at, o, cam);
        const after = screenToView(at, o, zoomAt(cam, f, at, limits));
        return Math.abs(before.u - after.u) < 1e-6 && Math.abs(before.v - after.v) < 1e-6;
      }),
    );
  });
  it('stops at the zoom limits', () => {
    expect(zoomAt(cam, 1000, screenPoint(0, 0), limits).scale).toBe(30);
    expect(zoomAt(cam, 0.001, screenPoint(0, 0), limits).scale).toBe(0.5);
    expect(zoomLimits(0.8)).toEqual({ min: 0.4, max: 48 });
    expect(zoomLimits(2).max).toBeCloseTo(60, 12);
  });
  it('wheel steps are symmetric: one notch in and one out return to the same scale', () => {
    expect(wheelZoomFactor(100) * wheelZoomFactor(-100)).toBeCloseTo(1, 12);
    expect(wheelZoomFactor(-100)).toBeGreaterThan(1);
    expect(wheelZoomFactor(3, 1)).toBeCloseTo(wheelZoomFactor(48, 0), 12);
  });
  it('pinch: fingers spread to twice their distance double the scale about their midpoint', () => {
    const before = [screenPoint(300, 200), screenPoint(500, 200)] as const;
    const after = [screenPoint(200, 200), screenPoint(600, 200)] as const;
    const mid = screenToView(screenPoint(400, 200), o, cam);
    const next = pinchCamera(cam, before, after, limits);
    expect(next.scale).toBeCloseTo(2, 12);
    const midAfter = screenToView(screenPoint(400, 200), o, next);
    expect(midAfter.u).toBeCloseTo(mid.u, 9);
    // Both fingers moved right by 50 px: the drawing follows.
    const moved = pinchCamera(cam, before, [screenPoint(350, 200), screenPoint(550, 200)], limits);
    expect(moved).toEqual({ scale: 1, ox: 150, oy: 200 });
  });
  it('a flung drawing is brought back so part of it stays on screen', () => {
    const oPlan = viewOrientation(plan, 'as_built', 'short_hood');
    const fit = fitCamera(plan.bounds, oPlan, vp);
    const lost = { ...fit, ox: fit.ox - 5000 };
    const r = boxToScreen(plan.bounds, oPlan, clampCamera(lost, plan.bounds, oPlan, vp, 48));
    expect(r.x + r.w).toBeCloseTo(48, 9);
    expect(clampCamera(fit, plan.bounds, oPlan, vp)).toBe(fit);
  });
  it('turning the view round keeps the drawing’s box where it was on screen', () => {
    const from = viewOrientation(plan, 'front_first', 'short_hood');
    const to = viewOrientation(plan, 'front_first', 'long_hood');
    const c = { scale: 3, ox: -400, oy: 150 };
    const r0 = boxToScreen(plan.bounds, from, c);
    const r1 = boxToScreen(plan.bounds, to, reorientCamera(c, from, to, plan.bounds));
    for (const k of ['x', 'y', 'w', 'h'] as const) expect(r1[k]).toBeCloseTo(r0[k], 9);
  });
  it('brings a focused part into view with the smallest pan', () => {
    const c: Camera = { scale: 1, ox: 0, oy: 0 };
    expect(ensureVisible(c, { x: 100, y: 100, w: 20, h: 20 }, vp)).toBe(c);
    expect(ensureVisible(c, { x: 900, y: 100, w: 20, h: 20 }, vp, 24)).toEqual({ scale: 1, ox: 800 - 24 - 920, oy: 0 });
  });
});

describe('orientation words', () => {
  const markersFor = (fe: FrontEnd, key: DrawingView['key'] = 'plan', mode: 'as_built' | 'front_first' = 'as_built') => {
    const v = viewOf(key);
    const o = viewOrientation(v, mode, fe);
    const cam = fitCamera(v.bounds, o, vp);
    const r = boxToScreen(v.bounds, o, cam);
    return { r, m: Object.fromEntries(orientationMarkers(v, fe, o, cam).map((x) => [x.role, x])) };
  };
  it('F on the short hood, as built: FRONT at the left; facing the front from the cab, left is −y, drawn at the bottom', () => {
    const { r, m } = markersFor('short_hood');
    expect(m.front.text).toBe('FRONT');
    expect(m.front.at.sx).toBeLessThan(r.x);
    expect(m.rear.at.sx).toBeGreaterThan(r.x + r.w);
    expect(m.left.at.sy).toBeGreaterThan(r.y + r.h);
    expect(m.right.at.sy).toBeLessThan(r.y);
  });
  it('F on the long hood, as built: FRONT and REAR, LEFT and RIGHT change places', () => {
    const { r, m } = markersFor('long_hood');
    expect(m.front.at.sx).toBeGreaterThan(r.x + r.w);
    expect(m.rear.at.sx).toBeLessThan(r.x);
    expect(m.left.at.sy).toBeLessThan(r.y);
    expect(m.right.at.sy).toBeGreaterThan(r.y + r.h);
  });
  it('front first: FRONT at the left and LEFT at the bottom for both kinds of unit', () => {
    for (const fe of ['short_hood', 'long_hood'] as FrontEnd[]) {
      const { r, m } = markersFor(fe, 'plan', 'front_first');
      expect(m.front.at.sx).toBeLessThan(r.x);
      expect(m.left.at.sy).toBeGreaterThan(r.y + r.h);
    }
  });
  it('names the side an elevation shows and the end an end elevation shows', () => {
    // +y is the right side when facing the short hood from the cab (brief §3).
    expect(markersFor('short_hood', 'side_plus_y').m.caption.text).toBe('RIGHT SIDE');
    expect(markersFor('long_hood', 'side_plus_y').m.caption.text).toBe('LEFT SIDE');
    expect(markersFor('short_hood', 'side_minus_y').m.caption.text).toBe('LEFT SIDE');
    expect(markersFor('short_hood', 'end_short_hood').m.caption.text).toBe('FRONT END');
    expect(markersFor('long_hood', 'end_short_hood').m.caption.text).toBe('REAR END');
  });
  it('in the short hood end view (seen from outside, -y to the right), LEFT is at the right with the F on the short hood', () => {
    // Facing the short hood from the cab, left is −y; a person outside that end looking at it sees −y on their right.
    const { r, m } = markersFor('short_hood', 'end_short_hood');
    expect(m.left.at.sx).toBeGreaterThan(r.x + r.w);
    expect(m.right.at.sx).toBeLessThan(r.x);
  });
});

describe('the F for each front end', () => {
  it('is shown where the file draws it when the unit’s F is on the short hood', () => {
    const [f] = placeFrontMarkings(drawing, 'plan', 'short_hood');
    expect(f.moved).toBe(false);
    expect(f.centre).toEqual(plan.parts.find((p) => p.kind === 'front_marking')!.centre);
  });
  it('moves by the half turn when the F is on the long hood: same distance from the front, same side', () => {
    const own = plan.parts.find((p) => p.kind === 'front_marking')!;
    const [f] = placeFrontMarkings(drawing, 'plan', 'long_hood');
    expect(f.moved).toBe(true);
    expect(f.centre.u).toBeCloseTo(SAMPLE_LENGTH - own.centre.u, 9);
    expect(f.centre.v).toBeCloseTo(-own.centre.v, 9);
    const before = bodyToFront(bodyPoint(own.centre.u, own.centre.v), 'short_hood', SAMPLE_LENGTH);
    const after = bodyToFront(bodyPoint(f.centre.u, f.centre.v), 'long_hood', SAMPLE_LENGTH);
    expect(after.along).toBeCloseTo(before.along, 9);
    expect(after.left).toBeCloseTo(before.left, 9);
  });
  it('the half turn keeps the place relative to the front for any point (brief §3 frames)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: SAMPLE_LENGTH, noNaN: true }), fc.double({ min: -61.5, max: 61.5, noNaN: true }), (x, y) => {
        const t = halfTurnViewPoint('plan', { u: x, v: y }, SAMPLE_LENGTH);
        const a = bodyToFront(bodyPoint(x, y), 'short_hood', SAMPLE_LENGTH);
        const b = bodyToFront(bodyPoint(t.u, t.v), 'long_hood', SAMPLE_LENGTH);
        return close(a.along, b.along, 1e-9) && close(a.left, b.left, 1e-9);
      }),
    );
  });
  it('in an elevation the moved F comes from the other side’s elevation', () => {
    const [f] = placeFrontMarkings(drawing, 'side_plus_y', 'long_hood');
    expect(f.sourceView).toBe('side_minus_y');
    expect(f.centre.u).toBeCloseTo(SAMPLE_LENGTH - 52, 9);
  });
  it('a tap on the moved F finds it; a tap where the file drew it does not', () => {
    const markings = placeFrontMarkings(drawing, 'plan', 'long_hood');
    const view = tappableView(plan, markings);
    expect(partAtPoint(view, markings[0].centre, 1)?.kind).toBe('front_marking');
    expect(partAtPoint(view, { u: 52, v: 53.5 }, 1)?.kind).not.toBe('front_marking');
  });
});

describe('keyboard order', () => {
  for (const fe of ['short_hood', 'long_hood'] as FrontEnd[]) {
    it(`follows instancesFromFront in the plan (F on the ${fe === 'short_hood' ? 'short' : 'long'} hood)`, () => {
      const layout = unitLayout(drawing, fe);
      const markings = placeFrontMarkings(drawing, 'plan', fe);
      const ids = tabOrder(layout.parts, 'plan', drawing.lengthIn, markings);
      const instanceOf = new Map(plan.parts.map((p) => [p.id, p.instanceId]));
      const inPlan = new Set(plan.parts.map((p) => p.instanceId));
      const expected = instancesFromFront(drawing, fe)
        .filter((d) => inPlan.has(d.instanceId) && d.kind !== 'front_marking')
        .map((d) => d.instanceId);
      expect(ids.map((id) => instanceOf.get(id)).filter((i) => i !== 'front_marking')).toEqual(expected);
      expect(ids).toHaveLength(plan.parts.length);
      // The F is at the front on either kind of unit, so it comes early.
      expect(ids.map((id) => instanceOf.get(id)).indexOf('front_marking')).toBeLessThan(5);
    });
  }
});

describe('part numbers', () => {
  it('never overlap one another and sit outside their part', () => {
    const items = Array.from({ length: 40 }, (_, i) => ({ key: `p${i}`, text: String(i + 1), box: { x: (i % 10) * 30, y: Math.floor(i / 10) * 30, w: 20, h: 20 }, priority: i % 3 }));
    const placed = placeNumerals(items, 11);
    expect(placed.length).toBeGreaterThan(0);
    for (let i = 0; i < placed.length; i++) {
      for (let j = i + 1; j < placed.length; j++) {
        const a = placed[i], b = placed[j];
        const apart = Math.abs(a.x - b.x) * 2 >= a.w + b.w || Math.abs(a.y - b.y) * 2 >= a.h + b.h;
        expect(apart).toBe(true);
      }
      const own = items.find((it) => it.key === placed[i].key)!.box;
      const inside = placed[i].x > own.x && placed[i].x < own.x + own.w && placed[i].y > own.y && placed[i].y < own.y + own.h;
      expect(inside).toBe(false);
    }
  });
  it('give a contested spot to the lower priority and keep out of areas to avoid', () => {
    const box = { x: 100, y: 100, w: 10, h: 10 };
    const placed = placeNumerals(
      [
        { key: 'b', text: '2', box, priority: 5 },
        { key: 'a', text: '1', box, priority: 0 },
      ],
      11,
    );
    expect(placed[0].key).toBe('a');
    expect(placed[0].y).toBeLessThan(100); // above, the first choice
    const avoided = placeNumerals([{ key: 'a', text: '1', box, priority: 0 }], 11, [{ x: 0, y: 0, w: 400, h: 99 }]);
    expect(avoided[0].y).toBeGreaterThan(110); // pushed below
  });
});

describe('view extent', () => {
  it('holds the bounds, every part and the labels', () => {
    const e: Box = viewExtent(plan, 0);
    expect(e.umin).toBeLessThanOrEqual(plan.bounds.umin);
    expect(e.umax).toBeGreaterThanOrEqual(plan.bounds.umax);
    const title = plan.decor.find((s) => s.kind === 'text')!;
    expect(title.kind === 'text' && e.vmin <= title.y - title.size).toBe(true);
  });
});
