/** Monthly trend: every calendar month of the range, months without findings as zero. */

export interface MonthCount {
  /** 'YYYY-MM' in the railroad's time zone. */
  readonly month: string;
  readonly findings: number;
  readonly repeats: number;
}

/** 'YYYY-MM' of every month touched by the civil date range [from, to]. */
export function monthsBetween(from: string, to: string): string[] {
  const [fy, fm] = from.split('-').map(Number);
  const [ty, tm] = to.split('-').map(Number);
  if (![fy, fm, ty, tm].every(Number.isInteger)) throw new RangeError(`not a date range: ${from}..${to}`);
  const out: string[] = [];
  for (let y = fy, m = fm; y < ty || (y === ty && m <= tm); m === 12 ? ((m = 1), y++) : m++) {
    out.push(`${String(y).padStart(4, '0')}-${String(m).padStart(2, '0')}`);
    if (out.length > 1200) throw new RangeError('range too long for a monthly trend');
  }
  return out;
}

/** The full series for the range, filling the gaps with zeros; counts outside the range are dropped. */
export function monthSeries(from: string, to: string, counts: readonly MonthCount[]): MonthCount[] {
  const byMonth = new Map(counts.map((c) => [c.month, c]));
  return monthsBetween(from, to).map((month) => byMonth.get(month) ?? { month, findings: 0, repeats: 0 });
}

/** 'Mar 2026' for axis labels. */
export function monthLabel(month: string): string {
  const [y, m] = month.split('-').map(Number);
  return `${['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'][m - 1]} ${y}`;
}
