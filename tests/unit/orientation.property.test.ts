import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { FRONT_ENDS, VIEW_KEYS, bodyPoint, frontPoint } from '../../shared/domain/frames';
import type { BodyPoint, End, FrontPoint, Side } from '../../shared/domain/frames';
import { CENTRE_TOLERANCE_IN, PART_KINDS, PART_KIND_KEYS } from '../../shared/domain/parts';
import {
  bodyToFront,
  bodyToViewPoint,
  deriveLayout,
  flipFrontEnd,
  frontToBody,
  mirrorNumber,
  pinLabel,
  pinSide,
  sideOfY,
  viewPointToBody,
} from '../../shared/orientation';
import type { DerivedPart, PartInstance } from '../../shared/orientation';

// Invariants of product brief §3, checked as plain geometry over generated units.

const close = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b));
const expectBodyClose = (a: BodyPoint, b: BodyPoint) => expect(close(a.x, b.x) && close(a.y, b.y) && close(a.z, b.z)).toBe(true);
const expectFrontClose = (a: FrontPoint, b: FrontPoint) =>
  expect(close(a.along, b.along) && close(a.left, b.left) && close(a.z, b.z)).toBe(true);

const SWAP_SIDE: Record<Side, Side> = { left: 'right', right: 'left', center: 'center' };
const SWAP_END: Record<End, End> = { front: 'rear', rear: 'front' };

const frontEndArb = fc.constantFrom(...FRONT_ENDS);
const viewArb = fc.constantFrom(...VIEW_KEYS);
const lengthArb = fc.integer({ min: 300, max: 1200 });
const coord = (min: number, max: number) => fc.double({ min, max, noNaN: true });
const NUMBERED_KINDS = PART_KIND_KEYS.filter((k) => PART_KINDS[k].numbered);

/** A coordinate that is often one of a few shared values, so exact ties between parts occur. */
const gridded = (free: fc.Arbitrary<number>, ...shared: number[]) =>
  fc.oneof({ arbitrary: free, weight: 1 }, { arbitrary: fc.constantFrom(...shared), weight: 2 });

/** A unit: parts biased toward numbered kinds and shared positions, so groups and exact ties occur. */
const unitArb = lengthArb.chain((lengthIn) => {
  const spec = fc.record({
    kind: fc.oneof(fc.constantFrom(...PART_KIND_KEYS), fc.constantFrom(...NUMBERED_KINDS)),
    x: gridded(coord(0, lengthIn), 0, 100, lengthIn / 2, lengthIn - 100, lengthIn),
    y: gridded(coord(-70, 70), -28, -CENTRE_TOLERANCE_IN, 0, CENTRE_TOLERANCE_IN, 28),
    z: gridded(coord(0, 200), 20),
  });
  // Some parts get an exact twin (same kind and centre) so tie-breaking is always exercised.
  const specsArb = fc
    .array(spec, { maxLength: 40, size: 'medium' })
    .chain((specs) => fc.subarray(specs).map((twins) => [...specs, ...twins]));
  return specsArb.chain((specs) =>
    fc
      .uniqueArray(fc.string({ minLength: 1, maxLength: 6 }), { minLength: specs.length, maxLength: specs.length })
      .map((ids) => ({
        lengthIn,
        parts: specs.map((s, i): PartInstance => ({ instanceId: ids[i], kind: s.kind, centre: bodyPoint(s.x, s.y, s.z) })),
      })),
  );
});

describe('orientation invariants (product brief §3)', () => {
  it('flipping the front twice is the identity', () => {
    fc.assert(
      fc.property(unitArb, frontEndArb, ({ parts, lengthIn }, fe) => {
        expect(flipFrontEnd(flipFrontEnd(fe))).toBe(fe);
        expect(flipFrontEnd(fe)).not.toBe(fe);
        expect(deriveLayout(parts, flipFrontEnd(flipFrontEnd(fe)), lengthIn)).toEqual(deriveLayout(parts, fe, lengthIn));
      }),
    );
  });

  it('flipping the front swaps left/right and front/rear, and a number plus its mirror is n + 1', () => {
    fc.assert(
      fc.property(unitArb, frontEndArb, ({ parts, lengthIn }, fe) => {
        const a = deriveLayout(parts, fe, lengthIn);
        const b = deriveLayout(parts, flipFrontEnd(fe), lengthIn);
        a.forEach((pa, i) => {
          const pb = b[i];
          expect(pb.instanceId).toBe(pa.instanceId);
          expect(pb.side).toBe(SWAP_SIDE[pa.side]);
          expect(pb.end).toBe(pa.end === undefined ? undefined : SWAP_END[pa.end]);
          expect(pb.count).toBe(pa.count);
          if (pa.number !== undefined && pa.count !== undefined) {
            expect(pa.number + (pb.number ?? Number.NaN)).toBe(pa.count + 1);
            expect(pb.number).toBe(mirrorNumber(pa.number, pa.count));
          }
          if (pa.side !== 'center' || pa.end !== undefined) expect(pb.label).not.toBe(pa.label);
          // plain geometry: distance from the front end is measured from the other coupler face
          expectFrontClose(pb.front, frontPoint(lengthIn - pa.front.along, -pa.front.left, pa.front.z));
        });
      }),
    );
  });

  it('numbers each group 1..n by increasing distance from the front, per side for sided kinds', () => {
    fc.assert(
      fc.property(unitArb, frontEndArb, ({ parts, lengthIn }, fe) => {
        const layout = deriveLayout(parts, fe, lengthIn);
        const groups = new Map<string, DerivedPart[]>();
        for (const d of layout) {
          const spec = PART_KINDS[d.kind];
          expect(d.number !== undefined).toBe(spec.numbered);
          expect(d.end !== undefined).toBe(spec.ended);
          if (!spec.sided) expect(d.side).toBe('center');
          if (!spec.numbered) continue;
          const key = `${d.kind}|${d.side}`;
          groups.set(key, [...(groups.get(key) ?? []), d]);
        }
        for (const group of groups.values()) {
          const sorted = [...group].sort((p, q) => (p.number ?? 0) - (q.number ?? 0));
          sorted.forEach((d, i) => {
            expect(d.number).toBe(i + 1);
            expect(d.count).toBe(group.length);
            expect(d.label).toContain(`#${i + 1} `);
            if (i > 0) expect(d.front.along).toBeGreaterThanOrEqual(sorted[i - 1].front.along);
          });
        }
      }),
    );
  });

  it('carbody and front-relative frames round trip', () => {
    const pointArb = fc.tuple(coord(-2000, 2000), coord(-100, 100), coord(0, 300));
    fc.assert(
      fc.property(pointArb, frontEndArb, lengthArb, ([x, y, z], fe, lengthIn) => {
        const p = bodyPoint(x, y, z);
        expectBodyClose(frontToBody(bodyToFront(p, fe, lengthIn), fe, lengthIn), p);
        const f = frontPoint(x, y, z);
        expectFrontClose(bodyToFront(frontToBody(f, fe, lengthIn), fe, lengthIn), f);
        // plain geometry: the distances from the two ends add up to the length
        const sum = bodyToFront(p, 'short_hood', lengthIn).along + bodyToFront(p, 'long_hood', lengthIn).along;
        expect(close(sum, lengthIn)).toBe(true);
      }),
    );
  });

  it('left and right swap when the front end flips, away from the centreline', () => {
    fc.assert(
      fc.property(coord(-100, 100), frontEndArb, (y, fe) => {
        const here = sideOfY(y, fe);
        expect(sideOfY(y, flipFrontEnd(fe))).toBe(SWAP_SIDE[here]);
        expect(here === 'center').toBe(Math.abs(y) <= CENTRE_TOLERANCE_IN);
      }),
    );
  });

  it('the label of a physical part does not depend on the view it is looked up from', () => {
    // A drawing shows one physical part in one or more views; every view element points at the same instance.
    const drawingArb = unitArb.chain(({ parts, lengthIn }) =>
      fc.record({
        lengthIn: fc.constant(lengthIn),
        parts: fc.constant(parts),
        reordered: fc.shuffledSubarray(parts, { minLength: parts.length, maxLength: parts.length }),
        elements: fc
          .tuple(
            ...parts.map((p) =>
              fc.uniqueArray(viewArb, { minLength: 1, maxLength: VIEW_KEYS.length }).map((views) =>
                views.map((view) => ({ view, elementId: `${view}:${p.instanceId}`, instanceId: p.instanceId })),
              ),
            ),
          )
          .map((lists) => lists.flat()),
        taps: fc.array(fc.tuple(coord(-100, 1300), coord(-100, 300)), { minLength: 1, maxLength: 5 }),
        fe: frontEndArb,
      }),
    );
    fc.assert(
      fc.property(drawingArb, ({ lengthIn, parts, reordered, elements, taps, fe }) => {
        const layout = deriveLayout(parts, fe, lengthIn);
        const other = new Map(deriveLayout(reordered, fe, lengthIn).map((d) => [d.instanceId, d]));
        const labelsSeen = new Map<string, Set<string>>();
        for (const el of elements) {
          const viaView = other.get(el.instanceId);
          const own = layout.find((d) => d.instanceId === el.instanceId);
          expect(viaView).toBeDefined();
          expect(viaView).toEqual(own);
          if (!viaView) continue;
          labelsSeen.set(el.instanceId, (labelsSeen.get(el.instanceId) ?? new Set()).add(viaView.label));
          // a sided part's pin keeps the part's own label wherever it is tapped in any view
          if (viaView.side !== 'center') {
            for (const [u, v] of taps) expect(pinLabel(viaView, pinSide(el.view, { u, v }, fe))).toBe(viaView.label);
          }
        }
        for (const labels of labelsSeen.values()) expect(labels.size).toBe(1);
      }),
    );
  });

  it('a plan tap at a part centre lies on the part side, and view points round trip through the body frame', () => {
    fc.assert(
      fc.property(unitArb, frontEndArb, viewArb, ({ parts, lengthIn }, fe, view) => {
        const layout = deriveLayout(parts, fe, lengthIn);
        parts.forEach((p, i) => {
          if (PART_KINDS[p.kind].sided) expect(pinSide('plan', bodyToViewPoint('plan', p.centre), fe)).toBe(layout[i].side);
          const shown = bodyToViewPoint(view, p.centre);
          expect(viewPointToBody(view, shown, p.centre)).toEqual(p.centre);
          // the axes a view shows come from the tap; the hidden one from the fallback
          const fallback = bodyPoint(-1, -2, -3);
          const back = viewPointToBody(view, shown, fallback);
          expect(bodyToViewPoint(view, back)).toEqual(shown);
          const hidden = (['x', 'y', 'z'] as const).filter((a) => !shownAxes(view).includes(a));
          for (const a of hidden) expect(back[a]).toBe(fallback[a]);
        });
      }),
    );
  });
});

function shownAxes(view: (typeof VIEW_KEYS)[number]): readonly string[] {
  // independent of VIEW_AXES: product brief §3 lists plan (x, y), side elevations (x, z), end elevations (y, z)
  if (view === 'plan') return ['x', 'y'];
  if (view === 'side_plus_y' || view === 'side_minus_y') return ['x', 'z'];
  return ['y', 'z'];
}
