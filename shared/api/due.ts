import { z } from 'zod';
import { CivilDate, Uuid } from './common';

export const DueQuery = z.object({
  yard: Uuid.optional(),
  state: z.enum(['overdue', 'due_soon', 'good']).optional(),
  /** A day other than today, for planning (YYYY-MM-DD in the railroad's zone). */
  on: CivilDate.optional(),
});

export const UnitDateBody = z.object({
  label: z.string().trim().min(2).max(80),
  intervalDays: z.number().int().min(1).max(3660),
  lastDoneOn: CivilDate,
});
