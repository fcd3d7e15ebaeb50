import { describe, expect, it } from 'vitest';
import { loadDrawingsFromDir } from '../../server/drawings/load';
import {
  MAX_PROMPTS,
  ORIENTATION_KINDS,
  PromptError,
  expectedFor,
  generatePrompts,
  gradeAnswer,
  reasonFor,
  seededRng,
  type Answer,
  type Prompt,
  type TemplateSpec,
} from '../../shared/lab';
import { unitLayout } from '../../shared/layout/unit-layout';

const drawingMap = loadDrawingsFromDir('diagrams');
const drawings = [...drawingMap.values()];
const ALL: TemplateSpec[] = [
  { template: 'tap_part', count: 10 },
  { template: 'name_part', count: 10 },
  { template: 'which_end', count: 5 },
  { template: 'which_side', count: 5 },
];

/** The answer the engine says is right, in the form a learner sends it. */
function rightAnswer(p: Prompt): Answer {
  const e = expectedFor(p, drawingMap.get(p.unitTypeKey)!);
  switch (p.template) {
    case 'tap_part':
      return { template: 'tap_part', partId: e.partIds[0] };
    case 'name_part':
      return { template: 'name_part', label: e.label };
    case 'which_end':
      return { template: 'which_end', end: e.end! };
    case 'which_side':
      return { template: 'which_side', ySign: e.ySign! };
  }
}

describe('seeded random source', () => {
  it('repeats for a seed, stays in range and refuses a bad seed', () => {
    const a = seededRng(7);
    const b = seededRng(7);
    const xs = Array.from({ length: 1000 }, () => a.next());
    expect(Array.from({ length: 1000 }, () => b.next())).toEqual(xs);
    expect(xs.every((x) => x >= 0 && x < 1)).toBe(true);
    // Roughly uniform: each tenth gets 100 ± 40 of 1000 draws.
    const bins = Array(10).fill(0);
    for (const x of xs) bins[Math.floor(x * 10)] += 1;
    for (const n of bins) expect(Math.abs(n - 100)).toBeLessThan(40);
    expect(seededRng(8).next()).not.toBe(seededRng(7).next());
    expect(() => seededRng(-1)).toThrow(RangeError);
    expect(() => seededRng(1.5)).toThrow(RangeError);
    expect(seededRng(3).shuffle([1, 2, 3, 4, 5]).sort()).toEqual([1, 2, 3, 4, 5]);
  });
});

describe('prompt generation', () => {
  it('gives the same prompts for the same seed and different ones for another', () => {
    const a = generatePrompts(ALL, drawings, null, 1234);
    expect(generatePrompts(ALL, drawings, null, 1234)).toEqual(a);
    expect(generatePrompts(ALL, drawings, null, 1235)).not.toEqual(a);
  });

  it('follows the templates in order and their counts, and indexes prompts 0..n-1', () => {
    const ps = generatePrompts(ALL, drawings, null, 5);
    expect(ps.map((p) => p.template)).toEqual(ALL.flatMap((t) => Array(t.count).fill(t.template)));
    expect(ps.map((p) => p.index)).toEqual(ps.map((_, i) => i));
  });

  it('places the F at random: about half the prompts over many seeds have it on the long hood', () => {
    let long = 0;
    let total = 0;
    for (let seed = 1; seed <= 40; seed++) {
      for (const p of generatePrompts(ALL, drawings, null, seed)) {
        total += 1;
        if (p.frontEnd === 'long_hood') long += 1;
      }
    }
    expect(long / total).toBeGreaterThan(0.4);
    expect(long / total).toBeLessThan(0.6);
  });

  it('keeps to the quiz unit type when it has one, and mixes types when it has none', () => {
    expect(new Set(generatePrompts(ALL, drawings, 'four_axle_switcher', 9).map((p) => p.unitTypeKey))).toEqual(new Set(['four_axle_switcher']));
    expect(new Set(generatePrompts(ALL, drawings, null, 9).map((p) => p.unitTypeKey)).size).toBe(3);
  });

  it('asks only about the part kinds the trainer chose', () => {
    const ps = generatePrompts([{ template: 'tap_part', count: 8, kinds: ['traction_motor', 'axle'] }, { template: 'name_part', count: 8, kinds: ['sand_box'] }], drawings, null, 21);
    for (const p of ps) {
      if (p.template === 'tap_part') expect(['traction_motor', 'axle']).toContain(p.kind);
      if (p.template === 'name_part') expect(p.kind).toBe('sand_box');
    }
    expect(ORIENTATION_KINDS).not.toContain('front_marking');
    expect(ORIENTATION_KINDS).not.toContain('cab');
  });

  it('words every prompt so that the engine-derived answer grades right, and no prompt gives its answer away', () => {
    for (let seed = 100; seed < 130; seed++) {
      for (const p of generatePrompts(ALL, drawings, null, seed)) {
        const d = drawingMap.get(p.unitTypeKey)!;
        const g = gradeAnswer(p, rightAnswer(p), d);
        expect(g.correct, `${seed}: ${p.text}`).toBe(true);
        expect(g.reason).toMatch(/The F is on the (short|long) hood end/);
        if (p.template === 'tap_part') {
          // The words of the prompt are the engine's label (side, end, number) under this F.
          const label = unitLayout(d, p.frontEnd).parts.find((x) => x.partId === g.expected.partIds[0])!.label;
          expect(label).toBe(p.targetLabel);
          expect(p.text.toLowerCase()).toContain(label.toLowerCase().replace(/^(left|right) side, /, '$1 side, '));
        }
        if (p.template === 'name_part') {
          expect(p.text).toBe('Name this part.');
          expect(new Set(p.choices).size).toBe(p.choices.length);
          expect(p.choices.length).toBeGreaterThanOrEqual(2);
          expect(p.choices.length).toBeLessThanOrEqual(4);
          expect(p.choices).toContain(g.expected.label);
        }
        if (p.template === 'which_end') expect(p.text).toBe(`Which end is the ${p.ask}?`);
      }
    }
  });

  it('offers the name the same part has with the F on the other end as a wrong choice', () => {
    let seen = 0;
    for (let seed = 1; seed < 30; seed++) {
      for (const p of generatePrompts([{ template: 'name_part', count: 5, kinds: ['traction_motor', 'sand_box', 'uncoupling_lever'] }], drawings, null, seed)) {
        if (p.template !== 'name_part') continue;
        const d = drawingMap.get(p.unitTypeKey)!;
        const other = unitLayout(d, p.frontEnd === 'short_hood' ? 'long_hood' : 'short_hood').parts.find((x) => x.partId === p.partId)!.label;
        const mine = unitLayout(d, p.frontEnd).parts.find((x) => x.partId === p.partId)!.label;
        if (other !== mine) {
          expect(p.choices).toContain(other);
          expect(gradeAnswer(p, { template: 'name_part', label: other }, d).correct).toBe(false);
          seen += 1;
        }
      }
    }
    expect(seen).toBeGreaterThan(50);
  });

  it('asks "on the right side" of centred parts and the reason says how to find that side', () => {
    const ps = generatePrompts([{ template: 'tap_part', count: 20, kinds: ['traction_motor'] }], drawings, 'six_axle_road', 3);
    const sided = ps.filter((p) => p.template === 'tap_part' && p.side);
    expect(sided.length).toBeGreaterThan(0);
    for (const p of sided) {
      expect(p.text).toMatch(/^Tap the #\d traction motor on the (left|right) side\.$/);
      expect(reasonFor(p, drawingMap.get(p.unitTypeKey)!)).toMatch(/seen from outside/);
    }
  });

  it('refuses quizzes it cannot build', () => {
    expect(() => generatePrompts([{ template: 'which_end', count: MAX_PROMPTS + 1 }], drawings, null, 1)).toThrow(PromptError);
    expect(() => generatePrompts([{ template: 'which_end', count: 0 }], drawings, null, 1)).toThrow(PromptError);
    expect(() => generatePrompts([{ template: 'which_end', count: 1 }], drawings, 'no_such_type', 1)).toThrow(PromptError);
    expect(() => generatePrompts([{ template: 'tap_part', count: 1, kinds: ['front_marking'] }], drawings, null, 1)).not.toThrow();
    expect(() => generatePrompts([{ template: 'tap_part', count: 1, kinds: ['cab'] }], [], null, 1)).toThrow(PromptError);
  });
});
