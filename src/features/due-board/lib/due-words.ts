import type { DueItem } from '../../../../shared/due/board';

export type ItemStatus = DueItem['status'];

export const STATUS_WORDS: Record<ItemStatus, string> = {
  good: 'Good',
  due_soon: 'Due soon',
  overdue: 'Overdue',
  missing: 'No date',
  not_in_use: 'Not in use',
};

const days = (n: number) => `${n} day${n === 1 ? '' : 's'}`;

/**
 * The days line under an item's status. Intervals run in calendar days: done on D with N days,
 * good through D + N, so daysLeft 0 is the last good day (product brief §5).
 * The daily is good through the day it was done only (49 CFR 229.21).
 */
export function daysWords(i: Pick<DueItem, 'key' | 'status' | 'daysLeft' | 'lastDone'>): string {
  if (i.status === 'missing') return 'no date on record';
  if (i.status === 'not_in_use') return i.lastDone ? `last ${i.lastDone}` : 'unit not in use';
  const n = i.daysLeft;
  if (n == null) return '';
  if (i.key === 'daily') {
    if (n >= 0) return 'done today';
    if (n === -1) return 'due today';
    return `last done ${days(-n)} ago`;
  }
  if (n > 0) return `${days(n)} left`;
  if (n === 0) return 'last good day today';
  return `overdue by ${days(-n)}`;
}

/** "Thursday 15 May 2025" for a civil date, read as a calendar day (no zone shift). */
export function civilDateWords(on: string): string {
  const [y, m, d] = on.split('-').map(Number);
  if (!y || !m || !d) return on;
  return new Intl.DateTimeFormat('en-GB', { timeZone: 'UTC', weekday: 'long', day: 'numeric', month: 'long', year: 'numeric' }).format(new Date(Date.UTC(y, m - 1, d)));
}
