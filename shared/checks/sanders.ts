import { z } from 'zod';
import { civilDateSchema } from './civil-date';
import { DUE_SOON_DAYS, dueDays, type DueDays } from './interval';
import type { CheckResultBase } from './result';

/** Calendar days a lead road unit may run after its sanders are found failed (49 CFR 229.131(b)). */
export const SANDER_LEAD_MAX_DAYS = 14;

export const sanderDaysInput = z
  .object({
    /** Calendar date the failed sanders were found en route. */
    discovered: civilDateSchema,
    on: civilDateSchema,
    dueSoonDays: z.number().int().min(0).max(14).optional(),
  })
  .refine((v) => v.on >= v.discovered, { path: ['on'], message: 'cannot be before the day the failure was found' });
export type SanderDaysInput = z.input<typeof sanderDaysInput>;

export interface SanderDaysResult extends CheckResultBase, DueDays {}

/**
 * Lead road unit with sanders failed en route: found on day D, it may run
 * through D + 14 and not from D + 15. The rule ends it sooner at the next
 * initial terminal, a place that can deliver sand, or the next periodic
 * inspection; those events are not dates this check can know, so the limit text names them.
 */
export const checkSanderDays = (input: SanderDaysInput): SanderDaysResult => {
  const { discovered, on, dueSoonDays = DUE_SOON_DAYS } = sanderDaysInput.parse(input);
  const due = dueDays(discovered, SANDER_LEAD_MAX_DAYS, on, dueSoonDays);
  return {
    result: due.status === 'overdue' ? 'fail' : 'pass',
    limit:
      `lead road unit: at most ${SANDER_LEAD_MAX_DAYS} calendar days after the failure was found, ` +
      'or sooner at the next initial terminal, a place that can deliver sand, or the next periodic inspection',
    source: '49 CFR 229.131(b)',
    ...due,
  };
};
