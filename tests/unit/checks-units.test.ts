import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  LENGTH_TOLERANCE_IN,
  MM_PER_IN,
  atLeast,
  atMost,
  formatInches,
  fromInches,
  greaterThan,
  lessThan,
  toInches,
} from '../../shared/checks';

describe('length units', () => {
  // International inch (1959): 1 in = 25.4 mm exactly.
  it('uses 25.4 mm per inch exactly', () => {
    expect(MM_PER_IN).toBe(25.4);
    expect(toInches(25.4, 'mm')).toBe(1);
    expect(toInches(254, 'mm')).toBe(10);
    expect(fromInches(1, 'mm')).toBe(25.4);
    expect(toInches(3, 'in')).toBe(3);
    expect(fromInches(3, 'in')).toBe(3);
  });

  it('converts the limit values to their exact millimetre equivalents', () => {
    // Hand-computed: 3 in = 76.2 mm, 6 in = 152.4 mm, 7/8 in = 22.225 mm, 5/16 in = 7.9375 mm.
    expect(fromInches(3, 'mm')).toBeCloseTo(76.2, 12);
    expect(fromInches(6, 'mm')).toBeCloseTo(152.4, 12);
    expect(fromInches(7 / 8, 'mm')).toBeCloseTo(22.225, 12);
    expect(fromInches(5 / 16, 'mm')).toBeCloseTo(7.9375, 12);
    expect(toInches(76.2, 'mm')).toBeCloseTo(3, 12);
  });

  it('round-trips any length through millimetres within float noise', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-3, max: 100, noNaN: true }), (inches) => {
        expect(Math.abs(toInches(fromInches(inches, 'mm'), 'mm') - inches)).toBeLessThan(LENGTH_TOLERANCE_IN);
      }),
    );
  });

  it('tolerates only float noise, never a real gauge difference', () => {
    // 76.2 mm / 25.4 is 3.0000000000000004 in binary floating point.
    expect(toInches(76.2, 'mm')).not.toBe(3);
    expect(atMost(toInches(76.2, 'mm'), 3)).toBe(true);
    expect(LENGTH_TOLERANCE_IN).toBeLessThan(1e-6);
    // A thousandth of a millimetre is far above the tolerance and still counts.
    expect(atMost(toInches(76.201, 'mm'), 3)).toBe(false);
    expect(atLeast(toInches(76.199, 'mm'), 3)).toBe(false);
    expect(lessThan(toInches(25.399, 'mm'), 1)).toBe(true);
    expect(greaterThan(toInches(25.401, 'mm'), 1)).toBe(true);
    expect(lessThan(toInches(25.4, 'mm'), 1)).toBe(false);
  });

  it('writes limits as trade fractions with the millimetre value', () => {
    expect(formatInches(2.5)).toBe('2 1/2 in (63.5 mm)');
    expect(formatInches(7 / 8)).toBe('7/8 in (22.225 mm)');
    expect(formatInches(5 / 16)).toBe('5/16 in (7.938 mm)');
    expect(formatInches(3)).toBe('3 in (76.2 mm)');
    expect(formatInches(0.3)).toBe('0.3 in (7.62 mm)');
  });
});
