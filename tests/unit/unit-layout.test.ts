import { describe, expect, it } from 'vitest';
import { loadDrawingsFromDir } from '../../server/drawings/load';
import { instancesFromFront, unitLayout } from '../../shared/layout/unit-layout';

const drawings = loadDrawingsFromDir();

describe('unit layout', () => {
  for (const d of drawings.values()) {
    it(`${d.key}: one label per physical part whatever the view, and the F always at the front`, () => {
      for (const fe of ['short_hood', 'long_hood'] as const) {
        const parts = unitLayout(d, fe).parts;
        const byInstance = new Map<string, Set<string>>();
        for (const p of parts) byInstance.set(p.instanceId, (byInstance.get(p.instanceId) ?? new Set()).add(p.label));
        for (const labels of byInstance.values()) expect(labels.size).toBe(1);
        // The F marks the front (common practice (no source)): its distance from the front is the same either way round.
        const f = parts.find((p) => p.kind === 'front_marking')!;
        expect(f.along).toBeLessThan(d.lengthIn / 4);
        // Facing the F from the cab, #1 traction motor is the one nearest it (common practice (no source)).
        const tm1 = parts.find((p) => p.kind === 'traction_motor' && p.number === 1)!;
        const nearest = Math.min(...parts.filter((p) => p.kind === 'traction_motor').map((p) => p.along));
        expect(tm1.along).toBe(nearest);
      }
      const a = unitLayout(d, 'short_hood').parts.find((p) => p.kind === 'front_marking')!;
      const b = unitLayout(d, 'long_hood').parts.find((p) => p.kind === 'front_marking')!;
      expect(a.along).toBeCloseTo(b.along, 9);
      expect(a.label).toBe(b.label);
      expect(instancesFromFront(d, 'long_hood')[0].front.along).toBeLessThanOrEqual(instancesFromFront(d, 'long_hood')[1].front.along);
    });
  }
});
