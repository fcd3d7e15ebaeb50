import { describe, expect, it } from 'vitest';
import { bodyPoint, frontPoint } from '../../shared/domain/frames';
import type { FrontEnd } from '../../shared/domain/frames';
import type { PartKind } from '../../shared/domain/parts';
import {
  bodyEndOfX,
  bodyEndRole,
  bodyToFront,
  bodyToViewPoint,
  composePartLabel,
  deriveLayout,
  flipFrontEnd,
  frontEndSides,
  frontToBody,
  mirrorNumber,
  pinLabel,
  pinSide,
  sideOfY,
  viewPointToBody,
} from '../../shared/orientation';
import type { DerivedPart, PartInstance } from '../../shared/orientation';

// A hand-built six-axle unit so every expected value is plain arithmetic.
// Sizes are approximate, from memory (product brief §4); they are not check values.
const LENGTH = 850;
const AXLE_X = [155, 236, 317, 533, 614, 695];
const TRUCK_X = [236, 614];
const WHEEL_Y = 28; // half of the track gauge, rounded
const part = (instanceId: string, kind: PartKind, x: number, y: number, z = 0): PartInstance => ({
  instanceId,
  kind,
  centre: bodyPoint(x, y, z),
});
const SIX_AXLE: PartInstance[] = [
  ...AXLE_X.map((x, i) => part(`axle-${i}`, 'axle', x, 0, 20)),
  ...AXLE_X.map((x, i) => part(`tm-${i}`, 'traction_motor', x, 0, 22)),
  ...AXLE_X.map((x, i) => part(`wheel-minus-${i}`, 'wheel', x, -WHEEL_Y, 20)),
  ...AXLE_X.map((x, i) => part(`wheel-plus-${i}`, 'wheel', x, WHEEL_Y, 20)),
  ...TRUCK_X.map((x, i) => part(`truck-${i}`, 'truck', x, 0, 25)),
  part('pilot-sh', 'pilot', 8, 0, 5),
  part('pilot-lh', 'pilot', 842, 0, 5),
  part('lever-sh-minus', 'uncoupling_lever', 4, -40, 30),
  part('lever-sh-plus', 'uncoupling_lever', 4, 40, 30),
  part('lever-lh-minus', 'uncoupling_lever', 846, -40, 30),
  part('ditch-sh-plus', 'ditch_light', 10, 45, 50),
  part('headlight-sh', 'headlight', 6, 0, 140),
  part('sand-minus-0', 'sand_box', 60, -50, 60),
  part('sand-minus-1', 'sand_box', 780, -50, 60),
  part('walkway-minus', 'walkway', 425, -55, 60),
  part('cab', 'cab', 150, 0, 120),
  part('hand-brake', 'hand_brake', 830, 3, 90),
  part('stanchion-centre', 'stanchion', 12, 2, 70),
];
const byId = (layout: DerivedPart[], id: string): DerivedPart => {
  const found = layout.find((d) => d.instanceId === id);
  if (!found) throw new Error(`no part ${id}`);
  return found;
};

describe('front-relative frame', () => {
  it('with the F on the short hood, distance from front is x and left is -y', () => {
    // common practice (no source): facing the F from the cab, left is left; product brief §3 puts +y on the right.
    expect(bodyToFront(bodyPoint(155, -28, 20), 'short_hood', LENGTH)).toEqual(frontPoint(155, 28, 20));
    expect(sideOfY(-28, 'short_hood')).toBe('left');
    expect(sideOfY(28, 'short_hood')).toBe('right');
  });
  it('with the F on the long hood, distance from front is length - x and left is +y', () => {
    // plain geometry: 850 - 155 = 695
    expect(bodyToFront(bodyPoint(155, -28, 20), 'long_hood', LENGTH)).toEqual(frontPoint(695, -28, 20));
    expect(frontToBody(frontPoint(695, -28, 20), 'long_hood', LENGTH)).toEqual(bodyPoint(155, -28, 20));
    expect(sideOfY(-28, 'long_hood')).toBe('right');
    expect(sideOfY(28, 'long_hood')).toBe('left');
  });
  it('treats y within the centre tolerance as center, and just outside it as sided', () => {
    expect(sideOfY(6, 'short_hood')).toBe('center');
    expect(sideOfY(-6, 'long_hood')).toBe('center');
    expect(sideOfY(6.01, 'short_hood')).toBe('right');
    expect(sideOfY(-6.01, 'short_hood')).toBe('left');
  });
  it('names the physical ends by the F', () => {
    expect(frontEndSides('short_hood')).toEqual({ front: 'short_hood', rear: 'long_hood', leftYSign: -1, rightYSign: 1 });
    expect(frontEndSides('long_hood')).toEqual({ front: 'long_hood', rear: 'short_hood', leftYSign: 1, rightYSign: -1 });
    expect(bodyEndRole('short_hood', 'long_hood')).toBe('rear');
    expect(bodyEndRole('long_hood', 'long_hood')).toBe('front');
    expect(flipFrontEnd('short_hood')).toBe('long_hood');
    expect(flipFrontEnd('long_hood')).toBe('short_hood');
    expect(bodyEndOfX(424.9, LENGTH)).toBe('short_hood');
    expect(bodyEndOfX(425, LENGTH)).toBe('long_hood');
  });
});

describe('six-axle unit, F on the short hood', () => {
  const layout = deriveLayout(SIX_AXLE, 'short_hood', LENGTH);
  it('#1 traction motor and #1 truck are the ones nearest the F', () => {
    // common practice (no source): repeated components are numbered from the F end; the truck nearer the front is #1.
    expect(byId(layout, 'tm-0')).toMatchObject({ number: 1, count: 6, label: '#1 traction motor' });
    expect(byId(layout, 'tm-5')).toMatchObject({ number: 6, count: 6, label: '#6 traction motor' });
    expect(byId(layout, 'truck-0')).toMatchObject({ number: 1, count: 2, label: '#1 truck' });
    expect(byId(layout, 'truck-1').label).toBe('#2 truck');
    expect(byId(layout, 'axle-2').label).toBe('#3 axle');
  });
  it('numbers wheels per side, and left is -y', () => {
    // common practice (no source): pairs are numbered per side; with the F on the short hood, -y is left.
    expect(byId(layout, 'wheel-minus-0')).toMatchObject({ side: 'left', number: 1, count: 6, label: 'Left side, #1 wheel' });
    expect(byId(layout, 'wheel-plus-2')).toMatchObject({ side: 'right', number: 3, label: 'Right side, #3 wheel' });
    expect(byId(layout, 'sand-minus-1').label).toBe('Left side, #2 sand box');
    expect(byId(layout, 'walkway-minus').label).toBe('Left side walkway');
  });
  it('names end parts by front/rear', () => {
    expect(byId(layout, 'pilot-sh')).toMatchObject({ end: 'front', label: 'Front pilot' });
    expect(byId(layout, 'pilot-lh').label).toBe('Rear pilot');
    expect(byId(layout, 'lever-sh-minus').label).toBe('Front left uncoupling lever');
    expect(byId(layout, 'lever-lh-minus').label).toBe('Rear left uncoupling lever');
    expect(byId(layout, 'ditch-sh-plus').label).toBe('Front right ditch light');
    expect(byId(layout, 'headlight-sh').label).toBe('Front headlight');
  });
  it('labels plain parts by kind alone and drops the side of a centred sided part', () => {
    expect(byId(layout, 'cab')).toMatchObject({ side: 'center', label: 'Cab' });
    expect(byId(layout, 'cab').end).toBeUndefined();
    expect(byId(layout, 'cab').number).toBeUndefined();
    // the hand brake sits 3 in off the centreline but is not a sided kind
    expect(byId(layout, 'hand-brake')).toMatchObject({ side: 'center', label: 'Hand brake' });
    expect(byId(layout, 'stanchion-centre')).toMatchObject({ side: 'center', number: 1, count: 1, label: '#1 stanchion' });
  });
  it('keeps input order and carries the front-relative centre', () => {
    expect(layout.map((d) => d.instanceId)).toEqual(SIX_AXLE.map((p) => p.instanceId));
    expect(byId(layout, 'tm-3').front).toEqual(frontPoint(533, 0, 22));
  });
});

describe('six-axle unit, F on the long hood', () => {
  const layout = deriveLayout(SIX_AXLE, 'long_hood', LENGTH);
  it('the short-hood pilot is the rear pilot', () => {
    // common practice (no source): the end carrying the F is the front, whichever hood it is.
    expect(byId(layout, 'pilot-sh')).toMatchObject({ end: 'rear', label: 'Rear pilot' });
    expect(byId(layout, 'pilot-lh').label).toBe('Front pilot');
  });
  it('numbers from the long hood end and swaps left and right', () => {
    // common practice (no source): numbering and sides follow the F. Plain arithmetic: 850 - 695 = 155.
    expect(byId(layout, 'tm-5')).toMatchObject({ number: 1, label: '#1 traction motor' });
    expect(byId(layout, 'tm-5').front.along).toBe(155);
    expect(byId(layout, 'tm-0').label).toBe('#6 traction motor');
    expect(byId(layout, 'truck-1').label).toBe('#1 truck');
    expect(byId(layout, 'wheel-minus-0').label).toBe('Right side, #6 wheel');
    expect(byId(layout, 'wheel-plus-5').label).toBe('Left side, #1 wheel');
    expect(byId(layout, 'lever-sh-minus').label).toBe('Rear right uncoupling lever');
    expect(byId(layout, 'lever-lh-minus').label).toBe('Front right uncoupling lever');
    expect(byId(layout, 'sand-minus-1').label).toBe('Right side, #1 sand box');
  });
});

describe('layout input checks', () => {
  it('refuses the same physical part twice (e.g. once per view)', () => {
    expect(() => deriveLayout([SIX_AXLE[0], SIX_AXLE[0]], 'short_hood', LENGTH)).toThrow(/appears twice/);
  });
  it('refuses non-finite centres and non-positive lengths', () => {
    expect(() => deriveLayout([part('a', 'axle', Number.NaN, 0)], 'short_hood', LENGTH)).toThrow(RangeError);
    expect(() => deriveLayout(SIX_AXLE, 'short_hood', 0)).toThrow(RangeError);
  });
  it('breaks exact position ties deterministically, whatever the input order', () => {
    const twins = [part('b', 'axle', 100, 0), part('a', 'axle', 100, 0)];
    const one = deriveLayout(twins, 'short_hood', LENGTH);
    const other = deriveLayout([...twins].reverse(), 'short_hood', LENGTH);
    expect(byId(one, 'a').number).toBe(1);
    expect(byId(other, 'a').number).toBe(1);
    expect(byId(deriveLayout(twins, 'long_hood', LENGTH), 'a').number).toBe(2);
  });
});

describe('mirror numbers', () => {
  it('is count + 1 - n', () => {
    // plain arithmetic: on a six-motor unit #2 from one end is #5 from the other
    expect(mirrorNumber(2, 6)).toBe(5);
    expect(mirrorNumber(1, 1)).toBe(1);
  });
  it('refuses numbers outside 1..count', () => {
    expect(() => mirrorNumber(0, 6)).toThrow(RangeError);
    expect(() => mirrorNumber(7, 6)).toThrow(RangeError);
    expect(() => mirrorNumber(1.5, 6)).toThrow(RangeError);
  });
});

describe('views and pins', () => {
  const centre = bodyPoint(317, 0, 22);
  it('maps each view to its two body axes and takes the missing one from the fallback', () => {
    expect(viewPointToBody('plan', { u: 320, v: -30 }, centre)).toEqual(bodyPoint(320, -30, 22));
    expect(viewPointToBody('side_minus_y', { u: 320, v: 40 }, centre)).toEqual(bodyPoint(320, 0, 40));
    expect(viewPointToBody('end_long_hood', { u: 12, v: 40 }, centre)).toEqual(bodyPoint(317, 12, 40));
    expect(bodyToViewPoint('side_plus_y', bodyPoint(1, 2, 3))).toEqual({ u: 1, v: 3 });
    expect(bodyToViewPoint('end_short_hood', bodyPoint(1, 2, 3))).toEqual({ u: 2, v: 3 });
    expect(bodyToViewPoint('plan', bodyPoint(1, 2, 3))).toEqual({ u: 1, v: 2 });
  });
  it('a side elevation shows one side, which depends on the F', () => {
    // product brief §3: +y is right facing the short hood end; with the F on the long hood, +y is left.
    const cases: [FrontEnd, string, string][] = [
      ['short_hood', 'right', 'left'],
      ['long_hood', 'left', 'right'],
    ];
    for (const [fe, plusY, minusY] of cases) {
      expect(pinSide('side_plus_y', { u: 317, v: 22 }, fe)).toBe(plusY);
      expect(pinSide('side_minus_y', { u: 317, v: 22 }, fe)).toBe(minusY);
    }
    expect(pinSide('plan', { u: 317, v: -30 }, 'short_hood')).toBe('left');
    expect(pinSide('plan', { u: 317, v: 3 }, 'short_hood')).toBe('center');
    expect(pinSide('end_short_hood', { u: -30, v: 40 }, 'long_hood')).toBe('right');
  });
  it('prefixes the pin side only for a centred part pinned off-centre', () => {
    const sh = deriveLayout(SIX_AXLE, 'short_hood', LENGTH);
    const lh = deriveLayout(SIX_AXLE, 'long_hood', LENGTH);
    // common practice (no source): "left side, #2 traction motor" names different motors under the two F positions.
    expect(pinLabel(byId(sh, 'tm-1'), pinSide('side_minus_y', { u: 236, v: 22 }, 'short_hood'))).toBe('Left side, #2 traction motor');
    expect(pinLabel(byId(lh, 'tm-4'), pinSide('side_plus_y', { u: 614, v: 22 }, 'long_hood'))).toBe('Left side, #2 traction motor');
    expect(pinLabel(byId(lh, 'tm-1'), pinSide('side_minus_y', { u: 236, v: 22 }, 'long_hood'))).toBe('Right side, #5 traction motor');
    expect(pinLabel(byId(sh, 'pilot-sh'), 'right')).toBe('Right side, front pilot');
    expect(pinLabel(byId(sh, 'tm-1'), 'center')).toBe('#2 traction motor');
    // a sided part keeps its own label, even when tapped from the other side's view
    expect(pinLabel(byId(sh, 'wheel-minus-0'), 'right')).toBe('Left side, #1 wheel');
  });
  it('keeps the capitals of kind labels inside a phrase', () => {
    expect(composePartLabel({ kind: 'mu_receptacle', side: 'left', end: 'front' })).toBe('Front left MU receptacle');
    const centredMu = byId(deriveLayout([part('mu', 'mu_receptacle', 5, 0)], 'short_hood', LENGTH), 'mu');
    expect(pinLabel(centredMu, 'left')).toBe('Left side, front MU receptacle');
    expect(composePartLabel({ kind: 'front_marking', side: 'center' })).toBe('F marking');
  });
});
