import { beforeEach, describe, expect, it, vi } from 'vitest';
import { loadDrawingsFromDir } from '../../server/drawings/load';
import type { FrontEnd } from '../../shared/domain/frames';

// Grading must go through the project's orientation engine, never a copy of its rules. Swap the
// engine's layout for one that answers with the other F position: if grading kept a rule of its
// own, its verdicts would not follow.
const swap = { on: false };
const calls = { n: 0 };
vi.mock('../../shared/layout/unit-layout', async (importOriginal) => {
  const real = await importOriginal<typeof import('../../shared/layout/unit-layout')>();
  return {
    ...real,
    unitLayout: (d: Parameters<typeof real.unitLayout>[0], fe: FrontEnd) => {
      calls.n += 1;
      const other: FrontEnd = fe === 'short_hood' ? 'long_hood' : 'short_hood';
      return { ...real.unitLayout(d, swap.on ? other : fe), frontEnd: fe };
    },
  };
});

const { gradeAnswer, generatePrompts, expectedFor } = await import('../../shared/lab');
const d = loadDrawingsFromDir('diagrams').get('four_axle_road')!;

describe('grading follows the shared engine', () => {
  beforeEach(() => {
    swap.on = false;
  });

  it('calls the engine for the labels it grades against', () => {
    const before = calls.n;
    const [p] = generatePrompts([{ template: 'tap_part', count: 1, kinds: ['traction_motor'] }], [d], d.key, 11);
    gradeAnswer(p, { template: 'tap_part', partId: expectedFor(p, d).partIds[0] }, d);
    expect(calls.n).toBeGreaterThan(before);
  });

  it('changes its verdict when the engine changes its answer', () => {
    // A fresh drawing object, so no derivation from another test is reused.
    const fresh = loadDrawingsFromDir('diagrams').get('four_axle_road')!;
    const prompt = { index: 0, template: 'tap_part' as const, unitTypeKey: fresh.key, frontEnd: 'short_hood' as const, kind: 'traction_motor' as const, targetLabel: '#1 traction motor', views: ['plan' as const], text: 'Tap the #1 traction motor.' };
    const motor1 = fresh.views.find((v) => v.key === 'plan')!.parts.find((p) => p.instanceId === 'traction_motor_1')!;
    expect(gradeAnswer(prompt, { template: 'tap_part', partId: motor1.id }, fresh).correct).toBe(true);
    swap.on = true;
    const swapped = loadDrawingsFromDir('diagrams').get('four_axle_road')!;
    const motor1b = swapped.views.find((v) => v.key === 'plan')!.parts.find((p) => p.instanceId === 'traction_motor_1')!;
    expect(gradeAnswer(prompt, { template: 'tap_part', partId: motor1b.id }, swapped).correct).toBe(false);
  });
});
