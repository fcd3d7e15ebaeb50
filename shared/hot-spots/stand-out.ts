/**
 * "What stands out": a part whose findings are well above what a part of the same
 * kind shows across the whole fleet, given how often it was inspected.
 *
 * Baseline for a part kind K: every finding on a K anywhere in the fleet (all unit
 * types, same dates and filters) divided by the part-inspections of K, i.e. for each
 * unit type, its inspections times how many K its drawing has. A part of K on a unit
 * type inspected I times is then expected to show rate × I findings; the exact
 * one-sided Poisson test asks how likely that many or more are by chance. The part's
 * own findings are in the baseline, which makes the test a little conservative. A
 * table row that is one side of a centred part (a traction motor pinned from its left
 * side) is held against the whole part's expectation, also conservative.
 */
import { PART_KINDS, isPartKind } from '../domain/parts';
import { DEFAULT_ALPHA, poissonTest, type PoissonTestResult } from './poisson';
import { formatCount, formatProbability, formatRate } from './rates';

export interface FleetKindCount {
  readonly unitTypeKey: string;
  readonly partKind: string;
  readonly findings: number;
}

export interface TypeExposure {
  readonly unitTypeKey: string;
  readonly inspections: number;
}

export interface KindBaseline {
  readonly partKind: string;
  /** Findings on parts of this kind across the fleet. */
  readonly findings: number;
  /** Σ over unit types of inspections × parts of this kind on the type. */
  readonly partInspections: number;
  /** Findings per inspection of one such part; null with no part-inspections. */
  readonly rate: number | null;
}

/**
 * Per-kind fleet baselines. `positions(type, kind)` is how many parts of the kind a unit
 * of the type has (from its drawing); a type without a drawing (undefined) is left out
 * of both the findings and the part-inspections, so it cannot skew the rate.
 */
export function fleetBaselines(
  counts: readonly FleetKindCount[],
  exposure: readonly TypeExposure[],
  positions: (unitTypeKey: string, partKind: string) => number | undefined,
): Map<string, KindBaseline> {
  const inspections = new Map(exposure.map((e) => [e.unitTypeKey, e.inspections]));
  const kinds = new Set(counts.map((c) => c.partKind));
  const out = new Map<string, KindBaseline>();
  for (const kind of kinds) {
    let findings = 0;
    let partInspections = 0;
    for (const c of counts) {
      if (c.partKind !== kind || positions(c.unitTypeKey, kind) === undefined) continue;
      findings += c.findings;
    }
    for (const [type, n] of inspections) {
      const per = positions(type, kind);
      if (per !== undefined) partInspections += n * per;
    }
    out.set(kind, { partKind: kind, findings, partInspections, rate: partInspections > 0 ? findings / partInspections : null });
  }
  return out;
}

export interface StandOut extends PoissonTestResult {
  /** The figures that led to the verdict, in plain words. */
  readonly words: string;
}

const kindNoun = (kind: string) => (isPartKind(kind) ? PART_KINDS[kind].label : kind.replace(/_/g, ' '));
const kindPlural = (kind: string) => (isPartKind(kind) ? PART_KINDS[kind].plural : `${kind.replace(/_/g, ' ')}s`);
const fmtExpected = (e: number) => (e >= 10 ? e.toFixed(0) : e >= 1 ? e.toFixed(1) : Number(e.toPrecision(2)).toString());
const findingsWord = (n: number) => `${formatCount(n)} finding${n === 1 ? '' : 's'}`;

/** The test for one table row, with its explanation; null when the kind has no baseline. */
export function standOut(
  row: { label: string; partKind: string; findings: number },
  inspections: number,
  baseline: KindBaseline | undefined,
  alpha: number = DEFAULT_ALPHA,
): StandOut | null {
  if (!baseline || baseline.rate === null || inspections === 0) return null;
  const t = poissonTest({ observed: row.findings, exposure: inspections, baselineRate: baseline.rate, alpha });
  const noun = kindNoun(row.partKind);
  const words =
    `${row.label}: ${findingsWord(row.findings)} in ${formatCount(inspections)} inspections (${formatRate((row.findings * 100) / inspections)} per 100). ` +
    `Across the fleet a ${noun} shows ${formatRate(baseline.rate * 100)} per 100 inspections ` +
    `(${findingsWord(baseline.findings)} over ${formatCount(baseline.partInspections)} inspections of ${kindPlural(row.partKind)}), ` +
    `so about ${fmtExpected(t.expected)} would be expected here. ` +
    `The chance of ${formatCount(row.findings)} or more when ${fmtExpected(t.expected)} are expected is ${formatProbability(t.p)} ` +
    `(exact one-sided Poisson test): ` +
    (t.standsOut ? `below ${alpha}, so it stands out.` : `not below ${alpha}, so it does not stand out.`);
  return { ...t, words };
}

/** How many rows could stand out by chance alone when `tested` rows are each tested at `alpha`. */
export const chanceFlags = (tested: number, alpha: number = DEFAULT_ALPHA): number => tested * alpha;
