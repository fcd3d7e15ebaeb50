import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { lnGamma, poissonTest, poissonUpperTail } from '../../shared/hot-spots/poisson';

// Independent reference: jstat 1.9.6, a general-purpose statistics package from npm (dev dependency).
// jStat.poisson.cdf(k, λ) sums the probability mass; jStat.lowRegGamma(a, x) is the regularized lower
// incomplete gamma P(a, x), and P(X ≥ k) = P(k, λ) for X ~ Poisson(λ) (a standard identity).
interface JStat {
  poisson: { cdf(k: number, lambda: number): number; pdf(k: number, lambda: number): number };
  lowRegGamma(a: number, x: number): number;
  gammaln(x: number): number;
}
const { jStat } = createRequire(import.meta.url)('jstat') as { jStat: JStat };

const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(Math.abs(b), 1e-300);

describe('lnGamma', () => {
  it('gives ln(n!) at whole numbers and ln √π at ½ (plain arithmetic)', () => {
    expect(lnGamma(1)).toBeCloseTo(0, 12);
    expect(lnGamma(6)).toBeCloseTo(Math.log(120), 12);
    expect(lnGamma(11)).toBeCloseTo(Math.log(3628800), 11);
    expect(lnGamma(0.5)).toBeCloseTo(Math.log(Math.sqrt(Math.PI)), 12);
  });
  it('agrees with jStat.gammaln over a wide range', () => {
    for (const x of [0.1, 0.7, 1.5, 3.25, 10, 57.5, 171, 1000, 12345.6]) {
      expect(rel(lnGamma(x), jStat.gammaln(x))).toBeLessThan(1e-10);
    }
  });
  it('refuses x ≤ 0', () => {
    expect(() => lnGamma(0)).toThrow(RangeError);
    expect(() => lnGamma(-2)).toThrow(RangeError);
  });
});

describe('poissonUpperTail P(X ≥ k)', () => {
  it('matches closed forms: P(X ≥ 1) = 1 − e^−λ, P(X ≥ 2 | λ = 1) = 1 − 2/e, P(X ≥ 0) = 1', () => {
    for (const l of [0.01, 0.5, 2, 7]) expect(poissonUpperTail(1, l)).toBeCloseTo(1 - Math.exp(-l), 13);
    expect(poissonUpperTail(2, 1)).toBeCloseTo(1 - 2 / Math.E, 13);
    expect(poissonUpperTail(0, 3)).toBe(1);
    expect(poissonUpperTail(3, 0)).toBe(0);
  });

  it('agrees with jstat (1 − poisson.cdf and lowRegGamma) on both sides of the mean', () => {
    const cases: [number, number][] = [
      [1, 0.3], [3, 2.5], [4, 2.5], [5, 1.2], [10, 3.5], [12, 2.8], [20, 20], [25, 18.3], [40, 55.2], [8, 0.9], [60, 30], [150, 120],
    ];
    for (const [k, l] of cases) {
      const ours = poissonUpperTail(k, l);
      const viaCdf = 1 - jStat.poisson.cdf(k - 1, l);
      const viaGamma = jStat.lowRegGamma(k, l);
      expect(rel(ours, viaGamma), `k=${k} λ=${l}`).toBeLessThan(1e-8);
      // 1 − cdf loses digits to cancellation when the tail is small; compare only where it is not.
      if (viaCdf > 1e-6) expect(rel(ours, viaCdf), `k=${k} λ=${l}`).toBeLessThan(1e-8);
    }
  });

  it('stays accurate far into the tail, where 1 − cdf would round to 0', () => {
    const ours = poissonUpperTail(30, 4);
    expect(ours).toBeGreaterThan(0);
    expect(rel(ours, jStat.lowRegGamma(30, 4))).toBeLessThan(1e-8);
  });

  it('refuses counts that are not whole numbers and negative expectations', () => {
    expect(() => poissonUpperTail(2.5, 1)).toThrow(RangeError);
    expect(() => poissonUpperTail(-1, 1)).toThrow(RangeError);
    expect(() => poissonUpperTail(1, -1)).toThrow(RangeError);
  });
});

describe('poissonTest with exposure', () => {
  it('scales the baseline by exposure and flags only below alpha, checked against jstat', () => {
    // Baseline 0.8 findings per 100 inspections of one such part; 340 inspections → 2.72 expected.
    const flagged = poissonTest({ observed: 9, exposure: 340, baselineRate: 0.008 });
    expect(flagged.expected).toBeCloseTo(2.72, 12);
    expect(flagged.p).toBeCloseTo(jStat.lowRegGamma(9, 2.72), 12);
    expect(flagged.p).toBeLessThan(0.01);
    expect(flagged.standsOut).toBe(true);

    // 7 or more when 2.72 are expected is about 0.02 by jstat: not below 0.01.
    const notFlagged = poissonTest({ observed: 7, exposure: 340, baselineRate: 0.008 });
    expect(notFlagged.p).toBeCloseTo(jStat.lowRegGamma(7, 2.72), 12);
    expect(notFlagged.p).toBeGreaterThan(0.01);
    expect(notFlagged.standsOut).toBe(false);

    // The same 9 findings over twice the inspections are ordinary: exposure matters.
    const moreExposure = poissonTest({ observed: 9, exposure: 680, baselineRate: 0.008 });
    expect(moreExposure.p).toBeGreaterThan(0.01);
    expect(moreExposure.standsOut).toBe(false);
  });

  it('never flags a count at or below what was expected', () => {
    const t = poissonTest({ observed: 0, exposure: 100, baselineRate: 0.5 });
    expect(t.p).toBe(1);
    expect(t.standsOut).toBe(false);
  });
});
