/** Rates per 100 inspections, exposure counted from the inspections themselves. */

/** Findings per 100 inspections; null when nothing was inspected (no rate, not zero). */
export function ratePer100(findings: number, inspections: number): number | null {
  if (!(findings >= 0) || !(inspections >= 0)) throw new RangeError('counts must be ≥ 0');
  return inspections === 0 ? null : (findings * 100) / inspections;
}

/** A rate as people read it: two significant figures below 10, one decimal place up to 100, whole above. */
export function formatRate(r: number | null): string {
  if (r === null) return '—';
  if (r === 0) return '0';
  if (r < 10) return Number(r.toPrecision(2)).toString();
  if (r < 100) return r.toFixed(1);
  return Math.round(r).toString();
}

/** Whole numbers with thousands separators (en-US, as the rest of the product writes them). */
export const formatCount = (n: number): string => Math.round(n).toLocaleString('en-US');

/** A probability in plain words: "0.003 (about 1 in 330)", "less than 1 in a million". */
export function formatProbability(p: number): string {
  if (!(p >= 0 && p <= 1)) throw new RangeError(`not a probability: ${p}`);
  if (p < 1e-6) return 'less than 1 in a million';
  const oneIn = 1 / p;
  const rounded = oneIn >= 100 ? Number(oneIn.toPrecision(2)) : Math.round(oneIn);
  const fixed = p >= 0.01 ? p.toFixed(2) : Number(p.toPrecision(1)).toString();
  return p >= 0.5 ? fixed : `${fixed} (about 1 in ${formatCount(rounded)})`;
}
