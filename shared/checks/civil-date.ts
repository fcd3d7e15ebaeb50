import { z } from 'zod';

/**
 * Civil (calendar) dates as 'YYYY-MM-DD' strings. Day counts are whole
 * calendar days: the arithmetic maps each date to a day number through
 * Date.UTC, which has no daylight-saving shifts, so a 23- or 25-hour local day
 * still counts as one day and a leap day counts as a day.
 */
export type CivilDate = string;

const MS_PER_DAY = 86_400_000;

/** Strict 'YYYY-MM-DD' that is a real calendar date (rejects 2025-02-29, 2024-13-01). */
export const civilDateSchema = z.iso.date('must be a calendar date written YYYY-MM-DD');

export const isCivilDate = (s: unknown): s is CivilDate => civilDateSchema.safeParse(s).success;

const dayNumber = (d: CivilDate): number => {
  if (!isCivilDate(d)) throw new RangeError(`not a calendar date (YYYY-MM-DD): ${String(d)}`);
  const [y, m, day] = d.split('-').map(Number);
  return Date.UTC(y, m - 1, day) / MS_PER_DAY;
};

const fromDayNumber = (n: number): CivilDate => new Date(n * MS_PER_DAY).toISOString().slice(0, 10);

/** The calendar date `days` days after `date` (negative: before). */
export const addDays = (date: CivilDate, days: number): CivilDate => {
  if (!Number.isInteger(days)) throw new RangeError(`days must be a whole number: ${days}`);
  return fromDayNumber(dayNumber(date) + days);
};

/** Whole calendar days from `a` to `b` (positive when b is later). */
export const daysBetween = (a: CivilDate, b: CivilDate): number => dayNumber(b) - dayNumber(a);

const formatters = new Map<string, Intl.DateTimeFormat>();

/**
 * The calendar date an instant falls on in `timeZone` (IANA name, e.g.
 * 'America/Chicago'), so "today" is the railroad's today, not the server's.
 * Throws RangeError for an unknown time zone.
 */
export const civilDateInZone = (instant: Date, timeZone: string): CivilDate => {
  if (Number.isNaN(instant.getTime())) throw new RangeError('invalid instant');
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit', calendar: 'gregory', numberingSystem: 'latn' });
    formatters.set(timeZone, f);
  }
  const parts = f.formatToParts(instant);
  const get = (t: Intl.DateTimeFormatPartTypes) => parts.find((p) => p.type === t)?.value ?? '';
  return `${get('year').padStart(4, '0')}-${get('month')}-${get('day')}`;
};
