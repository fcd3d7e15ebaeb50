import { readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { VIEW_AXES } from '../../shared/domain/frames';
import type { ViewKey } from '../../shared/domain/frames';
import { PART_KIND_KEYS, isPartKind } from '../../shared/domain/parts';
import type { PartKind } from '../../shared/domain/parts';
import {
  boxInside,
  expandedHitBox,
  hitArea,
  partAtPoint,
  shapeBBox,
  sheetToView,
  viewToSheet,
} from '../../shared/drawings/geometry';
import { parsePathData } from '../../shared/drawings/path-data';
import type { Drawing, DrawingView, ViewPart } from '../../shared/drawings/types';
import { DIAGRAMS_DIR, loadDrawingsFromDir } from '../../server/drawings/load';

// Loaded in beforeAll so a broken file fails each test with its DrawingError message.
let drawings: Map<string, Drawing>;
beforeAll(() => {
  drawings = loadDrawingsFromDir(DIAGRAMS_DIR);
});

/**
 * Plain facts per unit type. Axle count, length and width are the unit types' own figures
 * (product brief §4, approximate, from memory); two wheels per axle and one traction motor per
 * axle on these all-axles-powered units: common practice (no source); two trucks under a hood
 * unit or end-cab switcher: common practice (no source).
 */
const FACTS = {
  six_axle_road: { lengthIn: 850, widthIn: 123, axles: 6, views: 5 },
  four_axle_road: { lengthIn: 710, widthIn: 123, axles: 4, views: 5 },
  four_axle_switcher: { lengthIn: 530, widthIn: 120, axles: 4, views: 5 },
} as const;

const instancesOf = (d: Drawing, kind: PartKind) => d.instances.filter((i) => i.kind === kind);
const view = (d: Drawing, key: ViewKey): DrawingView => {
  const v = d.views.find((x) => x.key === key);
  if (!v) throw new Error(`${d.key} has no ${key}`);
  return v;
};
const partOf = (d: Drawing, key: ViewKey, instanceId: string): ViewPart => {
  const p = view(d, key).parts.find((x) => x.instanceId === instanceId);
  if (!p) throw new Error(`${d.key}: ${instanceId} not in ${key}`);
  return p;
};
const sheetX = (d: Drawing, key: ViewKey, instanceId: string): number => {
  const v = view(d, key);
  return viewToSheet(key, v.sheet, partOf(d, key, instanceId).centre).sx;
};

describe('unit drawings in diagrams/', () => {
  it('loads exactly the three unit types, keyed by file name', () => {
    expect([...drawings.keys()].sort()).toEqual(['four_axle_road', 'four_axle_switcher', 'six_axle_road']);
  });

  for (const [key, facts] of Object.entries(FACTS)) {
    describe(key, () => {
      let d: Drawing;
      beforeAll(() => {
        d = drawings.get(key)!;
      });

      it('declares its length, width, axle count and views', () => {
        expect(d.lengthIn).toBe(facts.lengthIn);
        expect(d.widthIn).toBe(facts.widthIn);
        expect(d.axleCount).toBe(facts.axles);
        expect(d.views.map((v) => v.key)).toContain('plan');
        expect(d.views).toHaveLength(facts.views);
        expect(d.name).not.toMatch(/\d{2,}/); // descriptive names only, no model numbers
      });

      it('stays under 150 KB (tablet download)', () => {
        expect(statSync(join(DIAGRAMS_DIR, `${key}.svg`)).size).toBeLessThan(150 * 1024);
      });

      it('uses only catalogue kinds and draws every kind the catalogue has', () => {
        const kinds = new Set(d.instances.map((i) => i.kind));
        for (const k of kinds) expect(isPartKind(k)).toBe(true);
        // Every part in product brief §6 (and end_handrail) exists on each of these unit types.
        expect([...kinds].sort()).toEqual([...PART_KIND_KEYS].sort());
      });

      it('keeps every part inside its view bounds', () => {
        for (const v of d.views) {
          for (const p of v.parts) {
            expect(boxInside(shapeBBox(p.shape), v.bounds, 0.01), `${p.id} in ${v.key}`).toBe(true);
          }
        }
      });

      it('counts running gear by plain facts', () => {
        expect(instancesOf(d, 'axle')).toHaveLength(facts.axles);
        expect(instancesOf(d, 'wheel')).toHaveLength(2 * facts.axles);
        expect(instancesOf(d, 'traction_motor')).toHaveLength(facts.axles);
        expect(instancesOf(d, 'truck')).toHaveLength(2);
        // Wheels come in pairs, one each side of the centreline (plain geometry).
        expect(instancesOf(d, 'wheel').filter((w) => w.centre.y > 0)).toHaveLength(facts.axles);
        expect(instancesOf(d, 'wheel').filter((w) => w.centre.y < 0)).toHaveLength(facts.axles);
      });

      it('puts each wheel pair on its axle and each axle inside one truck (plain geometry)', () => {
        const trucks = instancesOf(d, 'truck').map((t) => partOf(d, 'plan', t.instanceId).bbox);
        for (const axle of instancesOf(d, 'axle')) {
          const pair = instancesOf(d, 'wheel').filter((w) => Math.abs(w.centre.x - axle.centre.x) < 0.5);
          expect(pair, axle.instanceId).toHaveLength(2);
          expect(pair[0].centre.y).toBeCloseTo(-pair[1].centre.y, 6);
          expect(trucks.filter((t) => axle.centre.x > t.umin && axle.centre.x < t.umax)).toHaveLength(1);
        }
      });

      it('draws 40 in wheels standing on the rail (product brief §4, from memory)', () => {
        for (const side of ['side_plus_y', 'side_minus_y'] as const) {
          for (const p of view(d, side).parts.filter((x) => x.kind === 'wheel')) {
            expect(p.shape.kind).toBe('circle');
            expect(p.bbox.vmax - p.bbox.vmin).toBeCloseTo(40, 6);
            expect(p.bbox.vmin).toBeCloseTo(0, 6);
          }
        }
      });

      it('has a pilot and a coupler at each end, the pilot spanning both rails 3–6 in above them (49 CFR 229.123(a))', () => {
        for (const kind of ['pilot', 'coupler'] as const) {
          const list = instancesOf(d, kind);
          expect(list).toHaveLength(2);
          expect(list.filter((p) => p.centre.x < d.lengthIn / 2)).toHaveLength(1);
        }
        // Rails 56.5 in apart (standard gauge, from memory): the pilot must reach past both.
        for (const pilot of instancesOf(d, 'pilot')) {
          const elev = partOf(d, 'side_minus_y', pilot.instanceId).bbox;
          expect(elev.vmin).toBeGreaterThanOrEqual(3);
          expect(elev.vmin).toBeLessThanOrEqual(6);
          const plan = partOf(d, 'plan', pilot.instanceId).bbox;
          expect(plan.vmin).toBeLessThan(-56.5 / 2);
          expect(plan.vmax).toBeGreaterThan(56.5 / 2);
        }
      });

      it('has coupler centrelines 32.5–34.5 in above the rail (49 CFR 231.31, from memory)', () => {
        for (const c of instancesOf(d, 'coupler')) {
          expect(c.centre.z).toBeGreaterThanOrEqual(32.5);
          expect(c.centre.z).toBeLessThanOrEqual(34.5);
          expect(Math.abs(c.centre.y)).toBeLessThan(1);
        }
      });

      it('has an uncoupling lever on each side at each end (49 CFR 231.29/231.30, from memory)', () => {
        const levers = instancesOf(d, 'uncoupling_lever');
        expect(levers).toHaveLength(4);
        const corners = new Set(levers.map((l) => `${l.centre.x < d.lengthIn / 2}:${Math.sign(l.centre.y)}`));
        expect(corners.size).toBe(4);
      });

      it('has steps at the four corners (49 CFR 231.29 corner stairways, section scope seen)', () => {
        const steps = instancesOf(d, 'step');
        expect(steps).toHaveLength(4);
        const corners = new Set(steps.map((s) => `${s.centre.x < d.lengthIn / 2}:${Math.sign(s.centre.y)}`));
        expect(corners.size).toBe(4);
        for (const s of steps) expect(Math.abs(s.centre.y)).toBeGreaterThan(d.widthIn / 2 - 10);
      });

      it('sets ditch lights at least 36 in above the rail and 60 in apart, below the headlight (49 CFR 229.125(d), from memory)', () => {
        for (const end of ['short', 'long'] as const) {
          const atEnd = (x: number): boolean => (end === 'short' ? x < d.lengthIn / 2 : x >= d.lengthIn / 2);
          const lights = instancesOf(d, 'ditch_light').filter((l) => atEnd(l.centre.x));
          expect(lights).toHaveLength(2);
          const [a, b] = lights;
          expect(Math.abs(a.centre.y - b.centre.y)).toBeGreaterThanOrEqual(60);
          for (const l of lights) expect(l.centre.z).toBeGreaterThanOrEqual(36);
          const head = instancesOf(d, 'headlight').filter((h) => atEnd(h.centre.x));
          expect(head).toHaveLength(1);
          expect(head[0].centre.z).toBeGreaterThan(a.centre.z);
        }
      });

      it('has exactly one F marking, on the short hood half', () => {
        const f = instancesOf(d, 'front_marking');
        expect(f).toHaveLength(1);
        expect(f[0].centre.x).toBeLessThan(d.lengthIn / 2);
        expect(f[0].views).toEqual(['plan', 'side_plus_y', 'side_minus_y']);
      });

      it('has one cab, short hood and long hood with the cab just behind the short hood (product brief §4)', () => {
        for (const kind of ['cab', 'short_hood', 'long_hood'] as const) expect(instancesOf(d, kind)).toHaveLength(1);
        const cab = partOf(d, 'side_minus_y', 'cab').bbox;
        const sh = partOf(d, 'side_minus_y', 'short_hood').bbox;
        const lh = partOf(d, 'side_minus_y', 'long_hood').bbox;
        expect(sh.umax).toBeCloseTo(cab.umin, 6);
        expect(cab.umax).toBeCloseTo(lh.umin, 6);
        expect(lh.umax - lh.umin).toBeGreaterThan(sh.umax - sh.umin);
      });

      it('draws a physical part at the same x in plan and side elevation, and the same y in plan and end elevation (plain geometry)', () => {
        let compared = 0;
        const plan = view(d, 'plan');
        for (const p of plan.parts) {
          for (const key of ['side_plus_y', 'side_minus_y', 'end_short_hood', 'end_long_hood'] as const) {
            const other = view(d, key).parts.find((q) => q.instanceId === p.instanceId);
            if (!other) continue;
            compared++;
            // Sides show x as u; ends show y as u (VIEW_AXES).
            const planValue = VIEW_AXES[key][0] === 'x' ? p.centre.u : p.centre.v;
            expect(other.centre.u, `${p.instanceId} plan vs ${key}`).toBeCloseTo(planValue, 1);
            expect(other.kind).toBe(p.kind);
          }
        }
        expect(compared).toBeGreaterThan(50);
      });

      it('gives every plan part a height from an elevation, so no z is defaulted', () => {
        for (const i of d.instances.filter((x) => x.views.includes('plan'))) {
          expect(i.views.length, i.instanceId).toBeGreaterThan(1);
        }
      });

      it('shows only its own side in each side elevation (a +y elevation cannot see −y parts)', () => {
        for (const [key, sign] of [['side_plus_y', 1], ['side_minus_y', -1]] as const) {
          // The F is stencilled on both sides but recorded as one instance at its plan position.
          for (const p of view(d, key).parts.filter((x) => x.kind !== 'front_marking')) {
            const inst = d.instances.find((i) => i.instanceId === p.instanceId)!;
            expect(sign * inst.centre.y, `${p.id}`).toBeGreaterThanOrEqual(0);
          }
        }
      });

      it('lays the views out the way they are seen (right-handed body frame, product brief §3)', () => {
        // From the +y side you see the short hood end on your right; from the −y side on your left.
        expect(sheetX(d, 'side_plus_y', 'coupler_sh')).toBeGreaterThan(sheetX(d, 'side_plus_y', 'coupler_lh'));
        expect(sheetX(d, 'side_minus_y', 'coupler_sh')).toBeLessThan(sheetX(d, 'side_minus_y', 'coupler_lh'));
        // Facing the short hood end from outside, its +y corner is on your left; at the long hood end, on your right.
        expect(sheetX(d, 'end_short_hood', 'step_sh_py')).toBeLessThan(sheetX(d, 'end_short_hood', 'step_sh_my'));
        expect(sheetX(d, 'end_long_hood', 'step_lh_py')).toBeGreaterThan(sheetX(d, 'end_long_hood', 'step_lh_my'));
        // From above with the short hood at the left, the right-hand side (+y, facing the short hood) is at the top.
        const plan = view(d, 'plan');
        const sy = (id: string): number => viewToSheet('plan', plan.sheet, partOf(d, 'plan', id).centre).sy;
        expect(sheetX(d, 'plan', 'coupler_sh')).toBeLessThan(sheetX(d, 'plan', 'coupler_lh'));
        expect(sy('step_sh_py')).toBeLessThan(sy('step_sh_my'));
      });

      it('places each part on the sheet where the file writes it (translate plus the raw attributes)', () => {
        const text = readFileSync(join(DIAGRAMS_DIR, `${key}.svg`), 'utf8');
        for (const key2 of ['plan', 'side_plus_y', 'end_short_hood'] as const) {
          const v = view(d, key2);
          const part = v.parts.find((p) => p.shape.kind === 'rect')!;
          const m = new RegExp(`id="${part.id}"[^>]* x="([-\\d.]+)" y="([-\\d.]+)" width="([-\\d.]+)" height="([-\\d.]+)"`).exec(text)!;
          const [x, y, w, h] = m.slice(1).map(Number);
          const corners = [
            viewToSheet(key2, v.sheet, { u: part.bbox.umin, v: part.bbox.vmin }),
            viewToSheet(key2, v.sheet, { u: part.bbox.umax, v: part.bbox.vmax }),
          ];
          expect(Math.min(corners[0].sx, corners[1].sx)).toBeCloseTo(v.sheet.tx + x, 6);
          expect(Math.min(corners[0].sy, corners[1].sy)).toBeCloseTo(v.sheet.ty + y, 6);
          expect(Math.abs(corners[1].sx - corners[0].sx)).toBeCloseTo(w, 6);
          expect(Math.abs(corners[1].sy - corners[0].sy)).toBeCloseTo(h, 6);
        }
      });
    });
  }
});

describe('drawing geometry helpers', () => {
  let d: Drawing;
  let plan: DrawingView;
  beforeAll(() => {
    d = drawings.get('six_axle_road')!;
    plan = view(d, 'plan');
  });

  it('grows small boxes to the minimum side about their centre and leaves large sides alone', () => {
    const b = expandedHitBox({ umin: 10, vmin: 20, umax: 12, vmax: 60 }, 8);
    expect(b).toEqual({ umin: 7, vmin: 20, umax: 15, vmax: 60 });
    const stanchion = partOf(d, 'plan', 'stanchion_1_py');
    const hit = hitArea(stanchion, 9);
    expect(hit.umax - hit.umin).toBeCloseTo(9, 9);
    expect(hit.vmax - hit.vmin).toBeCloseTo(9, 9);
    expect((hit.umin + hit.umax) / 2).toBeCloseTo(stanchion.centre.u, 9);
  });

  it('picks the topmost part under a tap, and a small part from a near miss', () => {
    const wheel = partOf(d, 'plan', 'wheel_1_py');
    // The wheel lies over its truck and the walkway/hood; the topmost (the wheel) wins.
    expect(partAtPoint(plan, wheel.centre, 4)?.instanceId).toBe('wheel_1_py');
    const stanchion = partOf(d, 'plan', 'stanchion_5_py');
    // 3 in inboard of the stanchion: on the walkway, 3 in from the handrail line.
    const nearMiss = { u: stanchion.centre.u, v: stanchion.centre.v - 3 };
    expect(partAtPoint(plan, nearMiss, 9)?.instanceId).toBe('stanchion_5_py');
    expect(partAtPoint(plan, nearMiss, 1)?.instanceId).toBe('walkway_py');
    expect(partAtPoint(plan, { u: -40, v: 0 }, 9)).toBeUndefined();
  });

  it('maps view points to the sheet and back', () => {
    for (const v of d.views) {
      const p = { u: 123.25, v: 45.5 };
      const back = sheetToView(v.key, v.sheet, viewToSheet(v.key, v.sheet, p));
      expect(back.u).toBeCloseTo(p.u, 9);
      expect(back.v).toBeCloseTo(p.v, 9);
    }
  });
});

describe('path data subset', () => {
  it('reads absolute M, L, H, V, Z with implicit line-tos', () => {
    expect(parsePathData('M0 0 10 0 V5 H0 Z M1,1 L2,2')).toEqual([
      { points: [0, 0, 10, 0, 10, 5, 0, 5], closed: true },
      { points: [1, 1, 2, 2], closed: false },
    ]);
  });
  it('rejects relative commands, curves and a missing start', () => {
    expect(() => parsePathData('m0 0 l10 0')).toThrow(/"m" is not allowed/);
    expect(() => parsePathData('M0 0 C1 1 2 2 3 3')).toThrow(/"C" is not allowed/);
    expect(() => parsePathData('L0 0 10 10')).toThrow(/must start with M/);
    expect(() => parsePathData('M0 0 L5')).toThrow(/missing a number/);
  });
});
