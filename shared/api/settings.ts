import { z } from 'zod';

const isTimeZone = (tz: string) => {
  try {
    new Intl.DateTimeFormat('en-US', { timeZone: tz });
    return true;
  } catch {
    return false;
  }
};

export const SettingsBody = z
  .object({
    name: z.string().trim().min(1).max(120).optional(),
    reportingMark: z.string().trim().toUpperCase().regex(/^[A-Z]{2,4}$/, 'Two to four letters').optional(),
    timeZone: z.string().refine(isTimeZone, 'Not a known IANA time zone (for example America/Chicago)').optional(),
    digestHour: z.number().int().min(0).max(23).optional(),
    repeatWindowDays: z.number().int().min(1).max(365).optional(),
  })
  .strict();

export interface Settings {
  name: string;
  reportingMark: string;
  timeZone: string;
  digestHour: number;
  repeatWindowDays: number;
}
