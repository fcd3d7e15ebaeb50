import { describe, expect, it } from 'vitest';
import { loadDrawingsFromDir } from '../../server/drawings/load';
import { bothNames, flipSteps, labelChanges } from '../../shared/lab';

// Instance ids in the drawings count from the short hood end in body terms (diagrams/README.md), so
// traction_motor_1 is the motor nearest x = 0 whatever the F says.
const drawings = loadDrawingsFromDir('diagrams');
const six = drawings.get('six_axle_road')!;

describe('flip demonstration', () => {
  it('names the same motor #1 with the F on the short hood and #6 with it on the long hood (six axles: 1 + 6 = n + 1)', () => {
    expect(bothNames(six, 'traction_motor_1')).toMatchObject({ shortHood: '#1 traction motor', longHood: '#6 traction motor', changes: true });
    expect(bothNames(six, 'traction_motor_3')).toMatchObject({ shortHood: '#3 traction motor', longHood: '#4 traction motor' });
    expect(bothNames(six, 'no_such_part')).toBeUndefined();
  });

  it('keeps the cab and hoods as they are, and changes every sided, ended or numbered part', () => {
    for (const d of drawings.values()) {
      const ch = labelChanges(d);
      for (const id of ['cab', 'long_hood', 'short_hood']) {
        const inst = d.instances.find((i) => i.kind === id)!;
        expect(ch.get(inst.instanceId)!.changes, `${d.key} ${id}`).toBe(false);
      }
      for (const inst of d.instances.filter((i) => ['traction_motor', 'sand_box', 'uncoupling_lever', 'wheel', 'walkway', 'coupler'].includes(i.kind))) {
        expect(ch.get(inst.instanceId)!.changes, `${d.key} ${inst.instanceId}`).toBe(true);
      }
    }
  });

  it('explains the rule step by step with this drawing’s own numbers, and the pinned part under both F positions', () => {
    const steps = flipSteps(six, 'long_hood', 'traction_motor_1');
    expect(steps.map((s) => s.key)).toEqual(['find-f', 'face-f', 'count', 'trucks', 'move-f', 'stays', 'pinned']);
    expect(steps[0].body).toMatch(/F is stencilled on the long hood end/);
    // Plan drawn with +y up (data-axes x,-y): with the F on the long hood, left is +y, the upper edge.
    expect(steps[1].body).toMatch(/left side is the upper edge/);
    expect(flipSteps(six, 'short_hood')[1].body).toMatch(/left side is the lower edge/);
    expect(steps[2].body).toMatch(/numbered 1 to 6 starting at the front: #1 is the one nearest the long hood end/);
    expect(steps[4].body).toMatch(/#1 becomes #6, #2 becomes #5/);
    expect(steps[6].body).toBe(
      'The pinned part is the #1 traction motor with the F on the short hood, and the #6 traction motor with the F on the long hood. Write it down wrong and the repair goes to another part.',
    );
    for (const s of steps) for (const id of s.partIds) expect(six.views.some((v) => v.parts.some((p) => p.id === id))).toBe(true);
    expect(flipSteps(six, 'short_hood').map((s) => s.key)).not.toContain('pinned');
  });
});
