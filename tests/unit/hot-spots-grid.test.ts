import { describe, expect, it } from 'vitest';
import { bodyPoint } from '../../shared/domain/frames';
import { binPins, cellBounds, cellOf, gridFor, heatCells, instanceForRow, smoothCounts } from '../../shared/hot-spots';
import { bodyToFront, deriveLayout, pinLabel, pinSide, type PartInstance } from '../../shared/orientation';

// A hand-made six-axle carbody (plain geometry, inches): 850 in long, 123 in wide, six traction motors
// on the centreline, three per truck, and a sand box on each side at each end.
const LENGTH = 850;
const WIDTH = 123;
const PARTS: PartInstance[] = [
  ...[100, 180, 260, 590, 670, 750].map((x, i) => ({ instanceId: `tm_${i + 1}`, kind: 'traction_motor' as const, centre: bodyPoint(x, 0, 20) })),
  { instanceId: 'sb_sh_py', kind: 'sand_box', centre: bodyPoint(60, 50, 50) },
  { instanceId: 'sb_sh_my', kind: 'sand_box', centre: bodyPoint(60, -50, 50) },
  { instanceId: 'sb_lh_py', kind: 'sand_box', centre: bodyPoint(790, 50, 50) },
  { instanceId: 'sb_lh_my', kind: 'sand_box', centre: bodyPoint(790, -50, 50) },
];

describe('front-relative binning: units with the F on either end add up', () => {
  const shortF = deriveLayout(PARTS, 'short_hood', LENGTH);
  const longF = deriveLayout(PARTS, 'long_hood', LENGTH);
  const motor1 = (layout: typeof shortF) => layout.find((p) => p.kind === 'traction_motor' && p.number === 1)!;

  it('"#1 traction motor" is a different physical motor on the two units', () => {
    expect(motor1(shortF).instanceId).toBe('tm_1'); // x = 100, nearest the short hood
    expect(motor1(longF).instanceId).toBe('tm_6'); // x = 750, nearest the long hood
  });

  it('a left-side pin on each lands in the same cell and reads "Left side, #1 traction motor"', () => {
    const grid = gridFor(LENGTH, WIDTH, 12);
    // Unit A, F on the short hood: left is −y, so the left elevation is side_minus_y; tap 5 in behind the motor centre.
    const a = { body: bodyPoint(105, 0, 22), side: pinSide('side_minus_y', { u: 105, v: 22 }, 'short_hood') };
    // Unit B, F on the long hood: left is +y (side_plus_y); 5 in behind its #1 motor is x = 750 − 5.
    const b = { body: bodyPoint(745, 0, 22), side: pinSide('side_plus_y', { u: 745, v: 22 }, 'long_hood') };
    const fa = bodyToFront(a.body, 'short_hood', LENGTH);
    const fb = bodyToFront(b.body, 'long_hood', LENGTH);
    expect(fa.along).toBe(105);
    expect(fb.along).toBe(105);
    expect(cellOf(grid, fa.along, fa.left)).toEqual(cellOf(grid, fb.along, fb.left));
    expect(cellOf(grid, fa.along, fa.left)).toEqual({ col: 8, row: 5 }); // floor(105/12) = 8, floor((0 + 61.5)/12) = 5
    expect(pinLabel(motor1(shortF), a.side)).toBe('Left side, #1 traction motor');
    expect(pinLabel(motor1(longF), b.side)).toBe('Left side, #1 traction motor');
  });

  it('plan taps on the left of each unit bin together although their body y has opposite signs', () => {
    const grid = gridFor(LENGTH, WIDTH, 12);
    const fa = bodyToFront(bodyPoint(62, -48, 50), 'short_hood', LENGTH); // left sand box of A
    const fb = bodyToFront(bodyPoint(788, 48, 50), 'long_hood', LENGTH); // left sand box of B
    expect(fa.left).toBe(48);
    expect(fb.left).toBe(48);
    expect(cellOf(grid, fa.along, fa.left)).toEqual(cellOf(grid, fb.along, fb.left));
    const sbA = shortF.find((p) => p.instanceId === 'sb_sh_my')!;
    const sbB = longF.find((p) => p.instanceId === 'sb_lh_py')!;
    expect(sbA.label).toBe('Left side, #1 sand box');
    expect(sbB.label).toBe('Left side, #1 sand box');
  });

  it('binPins counts both pins in one cell', () => {
    const grid = gridFor(LENGTH, WIDTH, 12);
    expect(binPins(grid, [{ along: 105, left: 0 }, { along: 105, left: 0 }, { along: 300, left: -40 }])).toEqual([
      { col: 8, row: 5, count: 2 },
      { col: 25, row: 1, count: 1 }, // floor(300/12) = 25, floor((−40 + 61.5)/12) = 1
    ]);
  });

  it('instanceForRow finds the part a row names on the front-first layout', () => {
    const parts = shortF.map((d) => ({ instanceId: d.instanceId, kind: d.kind, label: d.label }));
    expect(instanceForRow({ partKind: 'traction_motor', partLabel: '#1 traction motor' }, parts)).toBe('tm_1');
    expect(instanceForRow({ partKind: 'sand_box', partLabel: 'Left side, #2 sand box' }, parts)).toBe('sb_lh_my');
    expect(instanceForRow({ partKind: 'traction_motor', partLabel: '#9 traction motor' }, parts)).toBeNull();
  });
});

describe('grid', () => {
  it('covers the plan with whole cells and clamps pins just outside it to the edge', () => {
    const g = gridFor(850, 123, 12);
    expect(g.cols).toBe(71); // ceil(850/12)
    expect(g.rows).toBe(11); // ceil(123/12)
    expect(cellOf(g, -3, 0)).toEqual({ col: 0, row: 5 });
    expect(cellOf(g, 851, 70)).toEqual({ col: 70, row: 10 });
    expect(cellOf(g, 850, -61.5)).toEqual({ col: 70, row: 0 });
    expect(cellBounds(g, { col: 8, row: 5 })).toEqual({ along: 96, left: -1.5, w: 12, h: 12 });
  });
  it('refuses non-positive sizes and non-finite points', () => {
    expect(() => gridFor(0, 10)).toThrow(RangeError);
    expect(() => cellOf(gridFor(10, 10), Number.NaN, 0)).toThrow(RangeError);
  });
});

describe('density', () => {
  const g = gridFor(120, 60, 12); // 10 × 5 cells

  it('the blur keeps the total count, also at the edges', () => {
    const cells = [{ col: 0, row: 0, count: 7 }, { col: 4, row: 2, count: 16 }, { col: 9, row: 4, count: 3 }];
    const s = smoothCounts(g, cells);
    expect([...s].reduce((a, b) => a + b, 0)).toBeCloseTo(26, 10);
  });

  it('an interior cell keeps 4/16 of its count and gives 2/16 to each edge neighbour, 1/16 to each corner', () => {
    const s = smoothCounts(g, [{ col: 4, row: 2, count: 16 }]);
    expect(s[4 * 5 + 2]).toBeCloseTo(4, 12);
    expect(s[3 * 5 + 2]).toBeCloseTo(2, 12);
    expect(s[4 * 5 + 3]).toBeCloseTo(2, 12);
    expect(s[3 * 5 + 1]).toBeCloseTo(1, 12);
  });

  it('heat values run 0..1 with the hottest cell at 1, and raw counts ride along', () => {
    const h = heatCells(g, [{ col: 4, row: 2, count: 16 }, { col: 8, row: 2, count: 4 }]);
    const max = Math.max(...h.map((c) => c.value));
    expect(max).toBe(1);
    const hot = h.find((c) => c.value === 1)!;
    expect(hot.count).toBe(16);
    expect(hot.along).toBe(48);
    expect(h.every((c) => c.value >= 0 && c.value <= 1)).toBe(true);
    expect(heatCells(g, [])).toEqual([]);
  });

  it('without the blur the heat is the raw count scaled', () => {
    const h = heatCells(g, [{ col: 1, row: 1, count: 10 }, { col: 2, row: 1, count: 5 }], { blur: false });
    expect(h.map((c) => [c.count, c.value])).toEqual([[10, 1], [5, 0.5]]);
  });
});
