import { TZDate } from '@date-fns/tz';
import { format } from 'date-fns';
import type { FrontEnd } from '../../../../shared/domain/frames';

/** A moment in the railroad's own time zone, with the zone's name so a printed record is unambiguous. */
export function formatInZone(iso: string, timeZone: string, pattern = 'EEE d MMM yyyy, HH:mm zzz', withZone = true): string {
  const text = format(new TZDate(iso, timeZone), pattern);
  return withZone ? `${text} (${timeZone})` : text;
}

export const endName = (e: FrontEnd) => (e === 'short_hood' ? 'short hood' : 'long hood');

export const kindName = (k: 'daily' | 'periodic') => (k === 'daily' ? 'Daily inspection' : 'Periodic inspection');

export function measurementText(m: { value: number; unit: string; inches?: number } | null | undefined): string {
  if (!m) return '';
  const inches = m.unit === 'mm' && Number.isFinite(m.inches) ? ` (${Math.round((m.inches ?? 0) * 1000) / 1000} in)` : '';
  return `${m.value} ${m.unit}${inches}`;
}
