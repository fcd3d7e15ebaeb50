import { describe, expect, it } from 'vitest';
import { checkPilotHeight, isCheckInputError, type PilotHeightInput } from '../../shared/checks';

type Case = readonly [value: number, unit: 'in' | 'mm', expected: 'pass' | 'fail'];
const run = (input: PilotHeightInput) => checkPilotHeight(input).result;

describe('pilot height above top of rail', () => {
  // 49 CFR 229.123(a): minimum 3 in (76.2 mm).
  it.each<Case>([
    [2.99, 'in', 'fail'],
    [3, 'in', 'pass'],
    [3.01, 'in', 'pass'],
    [76.1, 'mm', 'fail'],
    [76.2, 'mm', 'pass'],
    [76.3, 'mm', 'pass'],
  ])('49 CFR 229.123(a) minimum 3 in: %s %s → %s', (value, unit, expected) => {
    expect(run({ value, unit })).toBe(expected);
  });

  // 49 CFR 229.123(a): maximum 6 in (152.4 mm).
  it.each<Case>([
    [5.99, 'in', 'pass'],
    [6, 'in', 'pass'],
    [6.01, 'in', 'fail'],
    [152.3, 'mm', 'pass'],
    [152.4, 'mm', 'pass'],
    [152.5, 'mm', 'fail'],
  ])('49 CFR 229.123(a) maximum 6 in: %s %s → %s', (value, unit, expected) => {
    expect(run({ value, unit })).toBe(expected);
  });

  // 49 CFR 229.123(b): hump-yard service, stencilled at each end: up to 9 in (228.6 mm).
  it.each<Case>([
    [8.99, 'in', 'pass'],
    [9, 'in', 'pass'],
    [9.01, 'in', 'fail'],
    [228.5, 'mm', 'pass'],
    [228.6, 'mm', 'pass'],
    [228.7, 'mm', 'fail'],
    [2.99, 'in', 'fail'],
    [76.1, 'mm', 'fail'],
  ])('49 CFR 229.123(b) hump yard, stencilled, maximum 9 in: %s %s → %s', (value, unit, expected) => {
    expect(run({ value, unit, service: 'hump_yard', stencilled: true })).toBe(expected);
  });

  it('49 CFR 229.123(b): hump-yard service without the stencil is held to 6 in', () => {
    expect(run({ value: 6, unit: 'in', service: 'hump_yard' })).toBe('pass');
    expect(run({ value: 6.01, unit: 'in', service: 'hump_yard', stencilled: false })).toBe('fail');
    expect(run({ value: 228.6, unit: 'mm', service: 'hump_yard', stencilled: false })).toBe('fail');
    expect(checkPilotHeight({ value: 7, unit: 'in', service: 'hump_yard' }).maxIn).toBe(6);
  });

  it('49 CFR 229.123(b): the stencil alone does not raise the limit in road service', () => {
    expect(run({ value: 6.01, unit: 'in', service: 'road', stencilled: true })).toBe('fail');
    expect(run({ value: 7, unit: 'in', stencilled: true })).toBe('fail');
  });

  it('returns the reading and the limits in inches, the reason and the source (49 CFR 229.123)', () => {
    const low = checkPilotHeight({ value: 50.8, unit: 'mm' });
    expect(low).toMatchObject({ result: 'fail', minIn: 3, maxIn: 6, reason: 'below_min', source: '49 CFR 229.123(a)' });
    expect(low.valueIn).toBeCloseTo(2, 12);
    expect(low.limit).toContain('3 in (76.2 mm)');
    const high = checkPilotHeight({ value: 8, unit: 'in', service: 'hump_yard', stencilled: true });
    expect(high).toMatchObject({ result: 'pass', valueIn: 8, maxIn: 9, reason: null, source: '49 CFR 229.123(b)' });
    expect(checkPilotHeight({ value: 10, unit: 'in', service: 'hump_yard', stencilled: true }).reason).toBe('above_max');
  });

  it('rejects readings that are not a clearance, with a validation error', () => {
    for (const bad of [
      { value: 0, unit: 'in' },
      { value: -3, unit: 'in' },
      { value: Number.NaN, unit: 'in' },
      { value: Number.POSITIVE_INFINITY, unit: 'in' },
      { value: 100, unit: 'in' },
      { value: 2540, unit: 'mm' },
      { value: 3, unit: 'ft' },
    ]) {
      let error: unknown;
      try {
        checkPilotHeight(bad as PilotHeightInput);
      } catch (e) {
        error = e;
      }
      expect(isCheckInputError(error), JSON.stringify(bad)).toBe(true);
    }
    // 2539 mm is just under 100 in: accepted as a reading (and far out of limit).
    expect(run({ value: 2539, unit: 'mm' })).toBe('fail');
  });
});
