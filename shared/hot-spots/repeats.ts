/**
 * The repeat rule: a finding is a repeat when the same unit, the same physical part
 * and the same defect type had a finding repaired within the previous N days
 * (railroad_settings.repeat_window_days, 90 by default).
 *
 * "The same part" is the physical part, the drawing's instance id on that unit, not
 * its label: labels follow the F, so if the unit's F marking is moved between two
 * findings the label changes while the part does not. Days are calendar days in the
 * railroad's time zone, like every other day count in Hoodline: repaired on day D,
 * a finding on D + N is a repeat, on D + N + 1 it is not. A repair later than the
 * new finding does not count, nor does a voided finding.
 */
import { civilDateInZone, daysBetween } from '../checks/civil-date';

export interface RepeatCandidate {
  readonly id: string;
  readonly unitId: string;
  readonly instanceId: string;
  readonly defectType: string;
  readonly createdAt: Date;
  readonly repairedAt: Date | null;
  readonly voided?: boolean;
}

/** Key of "same unit, same physical part, same defect type". */
export const repeatKey = (f: Pick<RepeatCandidate, 'unitId' | 'instanceId' | 'defectType'>): string =>
  `${f.unitId}\u0000${f.instanceId}\u0000${f.defectType}`;

/** Whether an earlier repair falls within the window before a finding (calendar days in `timeZone`). */
export function repairCounts(repairedAt: Date, createdAt: Date, windowDays: number, timeZone: string): boolean {
  if (repairedAt.getTime() > createdAt.getTime()) return false;
  return daysBetween(civilDateInZone(repairedAt, timeZone), civilDateInZone(createdAt, timeZone)) <= windowDays;
}

/** Ids of the findings that are repeats, by the rule above. */
export function findRepeats(findings: readonly RepeatCandidate[], windowDays: number, timeZone: string): Set<string> {
  if (!Number.isInteger(windowDays) || windowDays < 1) throw new RangeError(`repeat window must be a whole number of days ≥ 1, got ${windowDays}`);
  const repairsByKey = new Map<string, Date[]>();
  for (const f of findings) {
    if (f.voided || !f.repairedAt) continue;
    const k = repeatKey(f);
    const list = repairsByKey.get(k) ?? [];
    list.push(f.repairedAt);
    repairsByKey.set(k, list);
  }
  const out = new Set<string>();
  for (const f of findings) {
    if (f.voided) continue;
    const repairs = repairsByKey.get(repeatKey(f)) ?? [];
    if (repairs.some((r) => repairCounts(r, f.createdAt, windowDays, timeZone))) out.add(f.id);
  }
  return out;
}
