import { describe, expect, it } from 'vitest';
import {
  checkFlangeThickness,
  checkRimThickness,
  checkTreadHollow,
  checkWheelFlat,
  isCheckInputError,
} from '../../shared/checks';

type Unit = 'in' | 'mm';
type Verdict = 'pass' | 'fail';

describe('wheel flat and shelled spots', () => {
  // 49 CFR 229.75(a): a single flat spot 2 1/2 in (63.5 mm) or longer condemns the wheel.
  it.each<readonly [number, Unit, Verdict]>([
    [2.49, 'in', 'pass'],
    [2.5, 'in', 'fail'],
    [2.51, 'in', 'fail'],
    [63.4, 'mm', 'pass'],
    [63.5, 'mm', 'fail'],
    [63.6, 'mm', 'fail'],
  ])('49 CFR 229.75(a) single flat spot: %s %s → %s', (length, unit, expected) => {
    expect(checkWheelFlat({ length, unit }).result).toBe(expected);
  });

  // 49 CFR 229.75(a): two adjoining flat spots each 2 in (50.8 mm) or longer condemn the wheel.
  it.each<readonly [number, number, Unit, Verdict]>([
    [1.99, 2, 'in', 'pass'],
    [2, 1.99, 'in', 'pass'],
    [2, 2, 'in', 'fail'],
    [2.01, 2.01, 'in', 'fail'],
    [50.7, 50.8, 'mm', 'pass'],
    [50.8, 50.8, 'mm', 'fail'],
    [50.9, 50.9, 'mm', 'fail'],
  ])('49 CFR 229.75(a) two adjoining flat spots: %s and %s %s → %s', (length, adjoiningLength, unit, expected) => {
    expect(checkWheelFlat({ length, adjoiningLength, unit }).result).toBe(expected);
  });

  it('49 CFR 229.75(a): one of a pair at 2 1/2 in condemns on its own', () => {
    expect(checkWheelFlat({ length: 1, adjoiningLength: 2.5, unit: 'in' }).result).toBe('fail');
    expect(checkWheelFlat({ length: 1, adjoiningLength: 2.4, unit: 'in' }).result).toBe('pass');
  });

  // 49 CFR 229.75(d): shelled spots use the same lengths.
  it.each<readonly [number, Unit, Verdict]>([
    [2.49, 'in', 'pass'],
    [2.5, 'in', 'fail'],
    [63.4, 'mm', 'pass'],
    [63.5, 'mm', 'fail'],
  ])('49 CFR 229.75(d) shelled spot: %s %s → %s', (length, unit, expected) => {
    const r = checkWheelFlat({ length, unit, spot: 'shelled' });
    expect(r.result).toBe(expected);
    expect(r.source).toBe('49 CFR 229.75(d)');
  });
});

describe('wheel flange thickness', () => {
  // 49 CFR 229.75(f): flange worn to 7/8 in (22.225 mm) or less condemns the wheel.
  it.each<readonly [number, Unit, Verdict]>([
    [0.874, 'in', 'fail'],
    [0.875, 'in', 'fail'],
    [0.876, 'in', 'pass'],
    [22.2, 'mm', 'fail'],
    [22.225, 'mm', 'fail'],
    [22.25, 'mm', 'pass'],
  ])('49 CFR 229.75(f) flange 7/8 in or less: %s %s → %s', (value, unit, expected) => {
    const r = checkFlangeThickness({ value, unit });
    expect(r.result).toBe(expected);
    expect(r.source).toBe('49 CFR 229.75(f)');
    expect(r.limitIn).toBe(0.875);
  });
});

describe('wheel rim thickness', () => {
  // 49 CFR 229.75(j): rim under 1 in (25.4 mm) in road service condemns.
  it.each<readonly [number, Unit, Verdict]>([
    [0.99, 'in', 'fail'],
    [1, 'in', 'pass'],
    [1.01, 'in', 'pass'],
    [25.3, 'mm', 'fail'],
    [25.4, 'mm', 'pass'],
    [25.5, 'mm', 'pass'],
  ])('49 CFR 229.75(j) road rim under 1 in: %s %s → %s', (value, unit, expected) => {
    expect(checkRimThickness({ value, unit }).result).toBe(expected);
    expect(checkRimThickness({ value, unit, service: 'road' }).result).toBe(expected);
  });

  // 49 CFR 229.75(j): rim under 3/4 in (19.05 mm) in yard service condemns.
  it.each<readonly [number, Unit, Verdict]>([
    [0.74, 'in', 'fail'],
    [0.75, 'in', 'pass'],
    [0.76, 'in', 'pass'],
    [19.0, 'mm', 'fail'],
    [19.05, 'mm', 'pass'],
    [19.1, 'mm', 'pass'],
  ])('49 CFR 229.75(j) yard rim under 3/4 in: %s %s → %s', (value, unit, expected) => {
    const r = checkRimThickness({ value, unit, service: 'yard' });
    expect(r.result).toBe(expected);
    expect(r.limitIn).toBe(0.75);
  });

  it('49 CFR 229.75(j): a rim between 3/4 in and 1 in is good in yard service only', () => {
    expect(checkRimThickness({ value: 0.9, unit: 'in', service: 'yard' }).result).toBe('pass');
    expect(checkRimThickness({ value: 0.9, unit: 'in', service: 'road' }).result).toBe('fail');
  });
});

describe('wheel tread worn hollow', () => {
  // 49 CFR 229.75(g): hollow 5/16 in (7.9375 mm) or more in road service condemns.
  it.each<readonly [number, Unit, Verdict]>([
    [0.31, 'in', 'pass'],
    [0.3125, 'in', 'fail'],
    [0.32, 'in', 'fail'],
    [7.9, 'mm', 'pass'],
    [7.9375, 'mm', 'fail'],
    [8.0, 'mm', 'fail'],
  ])('49 CFR 229.75(g) road tread hollow 5/16 in or more: %s %s → %s', (value, unit, expected) => {
    expect(checkTreadHollow({ value, unit }).result).toBe(expected);
  });

  // 49 CFR 229.75(g): hollow 3/8 in (9.525 mm) or more in switching service condemns.
  it.each<readonly [number, Unit, Verdict]>([
    [0.37, 'in', 'pass'],
    [0.375, 'in', 'fail'],
    [0.38, 'in', 'fail'],
    [9.5, 'mm', 'pass'],
    [9.525, 'mm', 'fail'],
    [9.55, 'mm', 'fail'],
  ])('49 CFR 229.75(g) switching tread hollow 3/8 in or more: %s %s → %s', (value, unit, expected) => {
    const r = checkTreadHollow({ value, unit, service: 'yard' });
    expect(r.result).toBe(expected);
    expect(r.source).toBe('49 CFR 229.75(g)');
    expect(r.limit).toContain('switching');
  });
});

describe('wheel checks reject non-readings (49 CFR 229.75 inputs)', () => {
  it.each([
    () => checkWheelFlat({ length: 0, unit: 'in' }),
    () => checkWheelFlat({ length: 1, adjoiningLength: -1, unit: 'in' }),
    () => checkFlangeThickness({ value: Number.NaN, unit: 'mm' }),
    () => checkRimThickness({ value: 2540, unit: 'mm' }),
    () => checkTreadHollow({ value: 0.3, unit: 'in', service: 'hump' as 'yard' }),
  ])('throws a validation error %#', (fn) => {
    let error: unknown;
    try {
      fn();
    } catch (e) {
      error = e;
    }
    expect(isCheckInputError(error)).toBe(true);
  });
});
