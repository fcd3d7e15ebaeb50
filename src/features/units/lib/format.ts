import type { FrontEnd } from '../../../../shared/domain/frames';
import type { FindingState, UnitServiceState } from '../../../../shared/domain/states';

export const FRONT_END_WORDS: Record<FrontEnd, string> = {
  short_hood: 'F on short hood',
  long_hood: 'F on long hood',
};

export const HOOD_WORDS: Record<FrontEnd, string> = { short_hood: 'short hood', long_hood: 'long hood' };

export const SERVICE_STATE_WORDS: Record<UnitServiceState, string> = {
  in_service: 'In service',
  out_of_service: 'Out of service',
  stored: 'Stored',
};

export const FINDING_STATE_WORDS: Record<FindingState, string> = {
  open: 'Open',
  in_repair: 'In repair',
  repaired: 'Repaired, to verify',
  verified: 'Verified',
  voided: 'Voided',
};

/** A moment in the railroad's own zone (records are read in the yard's time, not the device's). */
export function formatWhen(iso: string, timeZone?: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return new Intl.DateTimeFormat('en-GB', {
    timeZone: timeZone || undefined,
    day: 'numeric',
    month: 'short',
    year: 'numeric',
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
  }).format(d);
}

/** A calendar day (YYYY-MM-DD) as "3 Dec 2026"; the day is already the railroad's, so no zone shift. */
export function formatDay(day: string | null): string {
  if (!day) return '—';
  const d = new Date(`${day}T12:00:00Z`);
  if (Number.isNaN(d.getTime())) return day;
  return new Intl.DateTimeFormat('en-GB', { timeZone: 'UTC', day: 'numeric', month: 'short', year: 'numeric' }).format(d);
}

/** Inches as feet and inches, for distances along the unit ("12 ft 4 in"). */
export function feetInches(inches: number): string {
  const total = Math.round(Math.abs(inches));
  const ft = Math.floor(total / 12);
  const inch = total % 12;
  return ft === 0 ? `${inch} in` : inch === 0 ? `${ft} ft` : `${ft} ft ${inch} in`;
}

export const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** Only the time of day, in the railroad's zone ("07:21"). */
export function formatTime(iso: string, timeZone?: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return new Intl.DateTimeFormat('en-GB', { timeZone: timeZone || undefined, hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).format(d);
}

/** A span of time: "30 Nov 2026, 06:41–07:21", or both dates in full when it crosses midnight. */
export function formatSpan(startIso: string, endIso: string, timeZone?: string): string {
  const day = (iso: string) => new Intl.DateTimeFormat('en-GB', { timeZone: timeZone || undefined, day: 'numeric', month: 'short', year: 'numeric' }).format(new Date(iso));
  if (Number.isNaN(new Date(startIso).getTime()) || Number.isNaN(new Date(endIso).getTime())) return formatWhen(endIso, timeZone);
  return day(startIso) === day(endIso) ? `${formatWhen(startIso, timeZone)}–${formatTime(endIso, timeZone)}` : `${formatWhen(startIso, timeZone)} – ${formatWhen(endIso, timeZone)}`;
}
