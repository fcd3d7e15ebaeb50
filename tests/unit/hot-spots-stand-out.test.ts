import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { chanceFlags, fleetBaselines, standOut } from '../../shared/hot-spots/stand-out';
import { formatProbability, formatRate, ratePer100 } from '../../shared/hot-spots/rates';
import { monthLabel, monthSeries, monthsBetween } from '../../shared/hot-spots/trend';

// Independent reference for the tail probability: jstat 1.9.6 from npm (regularized lower incomplete gamma).
const { jStat } = createRequire(import.meta.url)('jstat') as { jStat: { lowRegGamma(a: number, x: number): number } };

describe('rate per 100 inspections (exposure from the inspections)', () => {
  it('divides by inspections, not by findings', () => {
    expect(ratePer100(3, 40)).toBe(7.5);
    expect(ratePer100(0, 40)).toBe(0);
    expect(ratePer100(5, 0)).toBeNull();
  });
  it('formats for reading', () => {
    expect(formatRate(7.5)).toBe('7.5');
    expect(formatRate(0.8333)).toBe('0.83');
    expect(formatRate(12.345)).toBe('12.3');
    expect(formatRate(null)).toBe('—');
    expect(formatProbability(0.00049)).toBe('0.0005 (about 1 in 2,000)');
    expect(formatProbability(0.2)).toBe('0.20 (about 1 in 5)');
    expect(formatProbability(1e-9)).toBe('less than 1 in a million');
  });
});

describe('fleet baseline and the stand-out test (hand-computed fixture)', () => {
  // Six-axle type: 6 traction motors, 200 inspections, 30 motor findings. Four-axle type: 4 motors,
  // 100 inspections, 10 motor findings. A third type has no drawing and must not count.
  const positions = (type: string, kind: string) =>
    kind !== 'traction_motor' ? undefined : type === 'six' ? 6 : type === 'four' ? 4 : undefined;
  const counts = [
    { unitTypeKey: 'six', partKind: 'traction_motor', findings: 30 },
    { unitTypeKey: 'four', partKind: 'traction_motor', findings: 10 },
    { unitTypeKey: 'nodrawing', partKind: 'traction_motor', findings: 500 },
  ];
  const exposure = [
    { unitTypeKey: 'six', inspections: 200 },
    { unitTypeKey: 'four', inspections: 100 },
    { unitTypeKey: 'nodrawing', inspections: 50 },
  ];
  const baselines = fleetBaselines(counts, exposure, positions);
  const tm = baselines.get('traction_motor')!;

  it('part-inspections = Σ inspections × motors per unit = 200 × 6 + 100 × 4 = 1,600; rate 40 / 1,600', () => {
    expect(tm.findings).toBe(40);
    expect(tm.partInspections).toBe(1600);
    expect(tm.rate).toBeCloseTo(0.025, 15);
  });

  it('14 findings on one motor where 0.025 × 200 = 5 are expected stands out (p from jstat below 0.01)', () => {
    const s = standOut({ label: '#1 traction motor', partKind: 'traction_motor', findings: 14 }, 200, tm)!;
    expect(s.expected).toBeCloseTo(5, 12);
    expect(s.p).toBeCloseTo(jStat.lowRegGamma(14, 5), 12);
    expect(s.p).toBeLessThan(0.01);
    expect(s.standsOut).toBe(true);
    expect(s.words).toContain('#1 traction motor: 14 findings in 200 inspections (7 per 100)');
    expect(s.words).toContain('Across the fleet a traction motor shows 2.5 per 100 inspections (40 findings over 1,600 inspections of traction motors)');
    expect(s.words).toContain('about 5.0 would be expected here');
    expect(s.words).toContain('exact one-sided Poisson test');
    expect(s.words).toContain('below 0.01, so it stands out.');
  });

  it('9 findings where 5 are expected does not (p ≈ 0.07 by jstat)', () => {
    const s = standOut({ label: '#2 traction motor', partKind: 'traction_motor', findings: 9 }, 200, tm)!;
    expect(s.p).toBeCloseTo(jStat.lowRegGamma(9, 5), 12);
    expect(s.p).toBeGreaterThan(0.05);
    expect(s.standsOut).toBe(false);
    expect(s.words).toContain('not below 0.01, so it does not stand out.');
  });

  it('no baseline or no exposure: no verdict rather than a made-up one', () => {
    expect(standOut({ label: 'x', partKind: 'pilot', findings: 3 }, 200, baselines.get('pilot'))).toBeNull();
    expect(standOut({ label: 'x', partKind: 'traction_motor', findings: 3 }, 0, tm)).toBeNull();
  });

  it('says how many flags chance alone would give', () => {
    expect(chanceFlags(120)).toBeCloseTo(1.2, 12);
  });
});

describe('monthly trend', () => {
  it('lists every month the range touches, across a year end', () => {
    expect(monthsBetween('2025-11-15', '2026-02-03')).toEqual(['2025-11', '2025-12', '2026-01', '2026-02']);
    expect(monthsBetween('2026-03-01', '2026-03-31')).toEqual(['2026-03']);
  });
  it('fills months without findings with zero', () => {
    expect(monthSeries('2025-12-01', '2026-02-28', [{ month: '2026-01', findings: 4, repeats: 1 }])).toEqual([
      { month: '2025-12', findings: 0, repeats: 0 },
      { month: '2026-01', findings: 4, repeats: 1 },
      { month: '2026-02', findings: 0, repeats: 0 },
    ]);
    expect(monthLabel('2026-03')).toBe('Mar 2026');
  });
});
