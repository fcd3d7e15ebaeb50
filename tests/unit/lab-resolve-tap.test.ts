import { describe, expect, it } from 'vitest';
import type { DrawingView, ViewPart } from '../../shared/drawings/types';
import { resolveTap } from '../../src/features/orientation-lab/lib/resolve-tap';

// A hood with a small lamp on it and a lone stanchion beside it; sizes in inches, plain geometry.
const rect = (id: string, x: number, y: number, w: number, h: number, order: number): ViewPart => ({
  id,
  kind: 'headlight',
  instanceId: id,
  shape: { kind: 'rect', x, y, w, h, order, style: { fill: 'none', line: 'normal' } },
  bbox: { umin: x, vmin: y, umax: x + w, vmax: y + h },
  centre: { u: x + w / 2, v: y + h / 2 },
});
const view: DrawingView = {
  key: 'plan',
  bounds: { umin: 0, vmin: -60, umax: 800, vmax: 60 },
  parts: [rect('hood', 100, -50, 600, 100, 1), rect('lamp', 400, -2, 4, 4, 2), rect('stanchion', 750, 0, 2, 2, 3)],
  decor: [],
  sheet: { tx: 0, ty: 0, u: { axis: 'x', sign: 1 }, v: { axis: 'y', sign: -1 } },
};

describe('quiz tap resolution', () => {
  // At 1 px per inch a finger target (about 34 px, 9 mm) is 34 in across.
  const px = 1;
  it('takes the small part under the tap', () => {
    expect(resolveTap(view, { u: 402, v: 0 }, px)?.id).toBe('lamp');
  });
  it('gives a near miss over a large part to the small part within a finger of it', () => {
    expect(resolveTap(view, { u: 412, v: 0 }, px)?.id).toBe('lamp');
    expect(resolveTap(view, { u: 745, v: 1 }, px)?.id).toBe('stanchion');
  });
  it('keeps the large part for a tap well away from any small one', () => {
    expect(resolveTap(view, { u: 200, v: 20 }, px)?.id).toBe('hood');
  });
  it('narrows the near-miss reach when zoomed in, and finds nothing on empty paper', () => {
    expect(resolveTap(view, { u: 412, v: 0 }, 10)?.id).toBe('hood');
    expect(resolveTap(view, { u: 50, v: 55 }, 10)).toBeUndefined();
  });
});
