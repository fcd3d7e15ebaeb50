import type { FindingState } from '../../../../shared/domain/states';
import type { FindingEvent } from '../api/finding';

export const STATE_WORDS: Record<FindingState, string> = {
  open: 'Open',
  in_repair: 'In repair',
  repaired: 'Repaired',
  verified: 'Verified',
  voided: 'Voided',
};

/** A moment in the railroad's own zone (records are read in the yard's time, not the device's). */
export function formatWhen(iso: string, timeZone?: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return new Intl.DateTimeFormat('en-GB', { timeZone: timeZone || undefined, day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).format(d);
}

export const ageWords = (days: number) => (days <= 0 ? 'today' : days === 1 ? '1 day' : `${days} days`);

const str = (v: unknown) => (typeof v === 'string' && v.trim() ? v.trim() : null);

/** What an event did, in words, with what was recorded on it. */
export function eventWords(e: Pick<FindingEvent, 'kind' | 'details'>, nameOf: (id: string) => string | undefined = () => undefined): { what: string; more: string[] } {
  const d = e.details ?? {};
  switch (e.kind) {
    case 'created':
      return { what: 'Pinned the finding', more: [] };
    case 'assigned':
      return { what: `Assigned it to ${str(d.assigneeName) ?? (typeof d.assigneeId === 'string' ? nameOf(d.assigneeId) : undefined) ?? 'someone'}`, more: [] };
    case 'repaired': {
      const more = [str(d.whatDone) && `Done: ${str(d.whatDone)}`, str(d.partsUsed) && `Parts: ${str(d.partsUsed)}`, typeof d.minutes === 'number' && `Time: ${d.minutes} min`].filter(
        (x): x is string => !!x,
      );
      return { what: 'Recorded the repair', more };
    }
    case 'verified':
      return { what: 'Verified the repair', more: [] };
    case 'sent_back':
      return { what: 'Sent it back', more: str(d.reason) ? [`Reason: ${str(d.reason)}`] : [] };
    case 'voided':
      return { what: 'Voided it (entered in error)', more: str(d.reason) ? [`Reason: ${str(d.reason)}`] : [] };
    default:
      return { what: e.kind.replace(/_/g, ' '), more: [] };
  }
}
