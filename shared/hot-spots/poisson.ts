/**
 * Exact one-sided Poisson test with exposure: is an observed count higher than a
 * baseline rate, scaled by how much was inspected, makes likely by chance?
 * Pure numerics, no dependencies; checked against an independent statistics
 * package in tests/unit/hot-spots-poisson.test.ts.
 */

// Lanczos approximation (g = 7, 9 coefficients): about 15 significant digits for x > 0.
const LANCZOS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
  12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
];

/** ln Γ(x) for x > 0. */
export function lnGamma(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) throw new RangeError(`lnGamma needs a positive finite x, got ${x}`);
  if (x < 0.5) {
    // Reflection keeps the series accurate near zero.
    return Math.log(Math.PI / Math.sin(Math.PI * x)) - lnGamma(1 - x);
  }
  const z = x - 1;
  let a = LANCZOS[0];
  const t = z + 7.5;
  for (let i = 1; i < 9; i++) a += LANCZOS[i] / (z + i);
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(a);
}

/** ln P(X = k) for X ~ Poisson(lambda), k a whole number ≥ 0, lambda > 0. */
export function poissonLogPmf(k: number, lambda: number): number {
  return -lambda + k * Math.log(lambda) - lnGamma(k + 1);
}

/**
 * P(X ≥ k) for X ~ Poisson(lambda): the one-sided (upper) p-value of seeing k or more.
 * Sums the tail directly when k lies above the mean (no 1 − almost-1 cancellation) and
 * the complement otherwise.
 */
export function poissonUpperTail(k: number, lambda: number): number {
  if (!Number.isInteger(k) || k < 0) throw new RangeError(`count must be a whole number ≥ 0, got ${k}`);
  if (!(lambda >= 0) || !Number.isFinite(lambda)) throw new RangeError(`expected count must be finite and ≥ 0, got ${lambda}`);
  if (k === 0) return 1;
  if (lambda === 0) return 0;
  if (k > lambda) {
    let term = Math.exp(poissonLogPmf(k, lambda));
    let sum = 0;
    for (let i = k; term > 0; i++) {
      sum += term;
      if (term < sum * 1e-17) break;
      term *= lambda / (i + 1);
    }
    return Math.min(1, sum);
  }
  // k ≤ lambda: 1 − P(X ≤ k − 1), summing down from k − 1 where the terms are largest.
  let term = Math.exp(poissonLogPmf(k - 1, lambda));
  let lower = 0;
  for (let i = k - 1; i >= 0; i--) {
    lower += term;
    if (term < lower * 1e-17) break;
    term *= i / lambda;
  }
  return Math.max(0, 1 - lower);
}

export interface PoissonTestInput {
  /** Findings counted on the part. */
  readonly observed: number;
  /** Inspections of the part (its exposure). */
  readonly exposure: number;
  /** Baseline findings per inspection of one part of the same kind. */
  readonly baselineRate: number;
  /** Significance level; a part stands out when p < alpha. */
  readonly alpha?: number;
}

export interface PoissonTestResult {
  readonly observed: number;
  readonly exposure: number;
  readonly baselineRate: number;
  /** baselineRate × exposure: what an average part of the kind would have had. */
  readonly expected: number;
  /** P(X ≥ observed) under the baseline. */
  readonly p: number;
  readonly alpha: number;
  /** p < alpha and observed above expected. */
  readonly standsOut: boolean;
}

export const DEFAULT_ALPHA = 0.01;

/** H0: the part fails at the baseline rate; H1: it fails more often (one-sided, exact). */
export function poissonTest({ observed, exposure, baselineRate, alpha = DEFAULT_ALPHA }: PoissonTestInput): PoissonTestResult {
  if (!(exposure >= 0) || !(baselineRate >= 0)) throw new RangeError('exposure and baseline rate must be ≥ 0');
  const expected = baselineRate * exposure;
  const p = poissonUpperTail(observed, expected);
  return { observed, exposure, baselineRate, expected, p, alpha, standsOut: p < alpha && observed > expected };
}
