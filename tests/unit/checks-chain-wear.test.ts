import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { checkChainWear } from '../../shared/checks';

// 30 % limit: common practice (no source). Area of a circular section ∝ d²: plain geometry.
describe('hand brake chain wear (common practice (no source); area formula: plain geometry)', () => {
  // measured = nominal × √(1 − loss) gives exactly that loss of area.
  const at = (nominal: number, loss: number) => nominal * Math.sqrt(1 - loss);

  it.each([
    ['in', 0.5],
    ['mm', 12.7],
  ] as const)('at, just inside and just outside 30 %% in %s', (unit, nominal) => {
    const edge = checkChainWear({ nominal, measured: at(nominal, 0.3), unit });
    expect(edge.result).toBe('pass');
    expect(edge.percentLost).toBe(30);
    const inside = checkChainWear({ nominal, measured: at(nominal, 0.299), unit });
    expect(inside.result).toBe('pass');
    expect(inside.percentLost).toBe(29.9);
    const outside = checkChainWear({ nominal, measured: at(nominal, 0.301), unit });
    expect(outside.result).toBe('fail');
    expect(outside.percentLost).toBe(30.1);
  });

  it('matches hand-worked geometry', () => {
    // 1 in stock worn to 0.8 in: (0.8)² = 0.64 of the area left → 36 % lost.
    expect(checkChainWear({ nominal: 1, measured: 0.8, unit: 'in' })).toMatchObject({ result: 'fail', percentLost: 36 });
    // 10 mm worn to 8.4 mm: 0.7056 left → 29.44 % lost, shown 29.4.
    const a = checkChainWear({ nominal: 10, measured: 8.4, unit: 'mm' });
    expect(a).toMatchObject({ result: 'pass', percentLost: 29.4 });
    expect(a.lossFraction).toBeCloseTo(0.2944, 12);
    // 10 mm worn to 8.3 mm: 0.6889 left → 31.11 % lost.
    expect(checkChainWear({ nominal: 10, measured: 8.3, unit: 'mm' })).toMatchObject({ result: 'fail', percentLost: 31.1 });
    // Unworn.
    expect(checkChainWear({ nominal: 0.5, measured: 0.5, unit: 'in' })).toMatchObject({ result: 'pass', percentLost: 0 });
  });

  it('gives the same verdict for the same chain in inches and millimetres', () => {
    const inch = checkChainWear({ nominal: 0.5, measured: 0.41, unit: 'in' });
    const mm = checkChainWear({ nominal: 12.7, measured: 10.414, unit: 'mm' });
    expect(mm.result).toBe(inch.result);
    expect(mm.lossFraction).toBeCloseTo(inch.lossFraction, 12);
    expect(mm.nominalIn).toBeCloseTo(0.5, 12);
    expect(mm.measuredIn).toBeCloseTo(0.41, 12);
  });

  it('compares the unrounded loss, not the displayed one', () => {
    // 30.04 % lost displays as 30 but is over the limit; 29.96 % displays as 30 and is within it.
    const over = checkChainWear({ nominal: 1, measured: at(1, 0.3004), unit: 'in' });
    expect(over.percentLost).toBe(30);
    expect(over.result).toBe('fail');
    const under = checkChainWear({ nominal: 1, measured: at(1, 0.2996), unit: 'in' });
    expect(under.percentLost).toBe(30);
    expect(under.result).toBe('pass');
  });

  it('names the limit and its source honestly', () => {
    const r = checkChainWear({ nominal: 0.5, measured: 0.45, unit: 'in' });
    expect(r.source).toContain('common practice (no source)');
    expect(r.source).toContain('plain geometry');
    expect(r.maxPercentLost).toBe(30);
    expect(r.limit).toContain('30 %');
  });

  it('rejects a reading larger than nominal, or not positive, with a validation error (never a silent pass)', () => {
    const issuesFor = (input: Parameters<typeof checkChainWear>[0]) => {
      try {
        checkChainWear(input);
      } catch (e) {
        expect(e).toBeInstanceOf(z.ZodError);
        return (e as z.ZodError).issues;
      }
      throw new Error('expected a validation error');
    };
    const larger = issuesFor({ nominal: 0.5, measured: 0.51, unit: 'in' });
    expect(larger[0].path).toEqual(['measured']);
    expect(larger[0].message).toMatch(/larger than the nominal/);
    expect(issuesFor({ nominal: 12.7, measured: 12.8, unit: 'mm' })[0].path).toEqual(['measured']);
    expect(issuesFor({ nominal: 0.5, measured: 0, unit: 'in' })[0].path).toEqual(['measured']);
    expect(issuesFor({ nominal: -1, measured: -2, unit: 'in' }).map((i) => i.path[0])).toContain('nominal');
    expect(issuesFor({ nominal: 0, measured: 0, unit: 'mm' }).length).toBeGreaterThan(0);
  });
});
