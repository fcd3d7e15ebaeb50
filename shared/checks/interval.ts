import { z } from 'zod';
import { addDays, civilDateSchema, daysBetween, type CivilDate } from './civil-date';
import type { CheckResultBase, RuleConfidence } from './result';

export const INTERVAL_KINDS = ['daily', 'periodic', 'annual', 'hand_brake', 'main_reservoir', 'periodic_cm', 'cm_33_day'] as const;
export type IntervalKind = (typeof INTERVAL_KINDS)[number];

export interface IntervalSpec {
  readonly label: string;
  /** N: work done on day D is good through day D + N (daily: N = 0, good through D only). */
  readonly days: number;
  readonly source: string;
  readonly ruleConfidence: RuleConfidence;
}

export const INTERVALS: Readonly<Record<IntervalKind, IntervalSpec>> = {
  daily: { label: 'daily inspection', days: 0, source: '49 CFR 229.21', ruleConfidence: 'seen' },
  periodic: { label: 'periodic inspection', days: 92, source: '49 CFR 229.23(a)', ruleConfidence: 'seen' },
  periodic_cm: {
    label: 'periodic inspection (on-board condition monitoring)',
    days: 184,
    source: '49 CFR 229.23(b)',
    ruleConfidence: 'seen',
  },
  cm_33_day: {
    label: 'daily inspection by a qualified mechanical inspector (condition-monitored unit)',
    days: 33,
    source: '49 CFR 229.23(b)',
    ruleConfidence: 'seen',
  },
  annual: { label: 'annual tests', days: 368, source: '49 CFR 229.27', ruleConfidence: 'seen' },
  main_reservoir: {
    label: 'main reservoir hydrostatic / hammer test',
    days: 736,
    source: '49 CFR 229.31',
    ruleConfidence: 'seen',
  },
  hand_brake: {
    label: 'hand brake inspection',
    days: 368,
    source: '49 CFR 232.105(c) (from memory)',
    ruleConfidence: 'memory',
  },
};

/** Default warning window, in calendar days, before an interval runs out. */
export const DUE_SOON_DAYS = 7;

export const intervalInput = z
  .object({
    interval: z.enum(INTERVAL_KINDS),
    /** Calendar date (railroad's time zone) the inspection or test was done. */
    lastDone: civilDateSchema,
    /** Calendar date to judge on, usually today in the railroad's time zone. */
    on: civilDateSchema,
    /** Warning window in days; 0 turns it off. Default 7 (0 for daily). */
    dueSoonDays: z.number().int().min(0).max(365).optional(),
  })
  .refine((v) => v.on >= v.lastDone, { path: ['on'], message: 'cannot be before the date it was last done' });
export type IntervalInput = z.input<typeof intervalInput>;

export type DueStatus = 'good' | 'due_soon' | 'overdue';

export interface DueDays {
  /** Last calendar day the work is still good. */
  readonly lastGoodDay: CivilDate;
  /** First calendar day it is overdue. */
  readonly overdueFrom: CivilDate;
  /** Days from `on` to lastGoodDay: 0 on the last good day, negative when overdue. */
  readonly daysLeft: number;
  readonly status: DueStatus;
}

/**
 * Due arithmetic shared by the interval and sander checks. `due_soon` means
 * the last good day falls within the next `dueSoonDays` calendar days
 * counting `on` itself (0 ≤ daysLeft < dueSoonDays).
 */
export const dueDays = (start: CivilDate, days: number, on: CivilDate, dueSoonDays: number): DueDays => {
  const lastGoodDay = addDays(start, days);
  const daysLeft = daysBetween(on, lastGoodDay);
  const status: DueStatus = daysLeft < 0 ? 'overdue' : daysLeft < dueSoonDays ? 'due_soon' : 'good';
  return { lastGoodDay, overdueFrom: addDays(lastGoodDay, 1), daysLeft, status };
};

export interface IntervalResult extends CheckResultBase, DueDays {
  readonly interval: IntervalKind;
  readonly days: number;
  readonly ruleConfidence: RuleConfidence;
}

/**
 * Whether an inspection or test done on `lastDone` is still good on `on`.
 * Done on day D with interval N: good through D + N, overdue from D + N + 1.
 * The daily inspection is good through the same calendar day only.
 */
export const checkInterval = (input: IntervalInput): IntervalResult => {
  const { interval, lastDone, on, dueSoonDays } = intervalInput.parse(input);
  const spec = INTERVALS[interval];
  const due = dueDays(lastDone, spec.days, on, dueSoonDays ?? (interval === 'daily' ? 0 : DUE_SOON_DAYS));
  return {
    result: due.status === 'overdue' ? 'fail' : 'pass',
    limit:
      spec.days === 0
        ? `${spec.label} once each calendar day`
        : `${spec.label} at most ${spec.days} calendar days apart`,
    source: spec.source,
    interval,
    days: spec.days,
    ruleConfidence: spec.ruleConfidence,
    ...due,
  };
};
