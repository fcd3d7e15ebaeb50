import { z } from 'zod';
import { FINDING_STATES, FINDING_WEIGHTS } from '../domain/states';
import { Uuid, Version } from './common';

/** The columns the queue sorts by (the table's sortable columns); `age` descending is oldest first. */
export const QUEUE_SORT_COLUMNS = ['unit', 'finding', 'weight', 'state', 'assignee', 'age'] as const;
export type QueueSortColumn = (typeof QUEUE_SORT_COLUMNS)[number];
export const QUEUE_SORTS = QUEUE_SORT_COLUMNS.flatMap((c) => [`${c}.asc`, `${c}.desc`] as const) as unknown as readonly [`${QueueSortColumn}.${'asc' | 'desc'}`, ...`${QueueSortColumn}.${'asc' | 'desc'}`[]];
/** `column.direction`, always under "non-complying units first"; without it the queue reads federal first, then oldest. */
export const QueueSort = z.enum(QUEUE_SORTS, { message: `Sort by one of: ${QUEUE_SORTS.join(', ')}` });
export type QueueSort = z.infer<typeof QueueSort>;
export const QUEUE_PAGE_DEFAULT = 100;
export const QUEUE_PAGE_MAX = 500;

/** The queue's filters and sort: what the screen, the CSV export and the unit page ask for. */
export const QueueFilterQuery = z.object({
  yard: Uuid.optional(),
  unit: Uuid.optional(),
  state: z.enum(FINDING_STATES).optional(),
  weight: z.enum(FINDING_WEIGHTS).optional(),
  assignee: Uuid.optional(),
  q: z.string().trim().max(60).optional(),
  sort: QueueSort.optional(),
});
export type QueueFilterQuery = z.infer<typeof QueueFilterQuery>;

/** One page of the queue: `cursor` is the `nextCursor` of the page before, with the same filters and sort. */
export const QueueQuery = QueueFilterQuery.extend({
  limit: z.coerce.number({ message: 'A number of rows' }).int('A whole number of rows').min(1, 'At least 1 row').max(QUEUE_PAGE_MAX, `At most ${QUEUE_PAGE_MAX} rows a page`).default(QUEUE_PAGE_DEFAULT),
  cursor: z.string().max(2000).optional(),
});
export type QueueQuery = z.infer<typeof QueueQuery>;

export const AssignBody = z.object({ version: Version, assigneeId: Uuid });
export const RepairBody = z.object({
  version: Version,
  whatDone: z.string().trim().min(3, 'Say what was done').max(2000),
  partsUsed: z.string().trim().max(1000).optional(),
  minutes: z.number().int().min(0).max(100000).optional(),
});
export const VerifyBody = z.object({ version: Version });
export const SendBackBody = z.object({ version: Version, reason: z.string().trim().min(3, 'Say why it goes back').max(1000) });
export const VoidBody = z.object({ version: Version, reason: z.string().trim().min(3, 'Say why it was entered in error').max(1000) });

export interface QueueItem {
  id: string;
  unitId: string;
  roadNumber: string;
  yardId: string | null;
  yardName: string | null;
  nonComplying: boolean;
  label: string;
  defectType: string;
  defectLabel: string;
  weight: 'federal' | 'shop' | 'note';
  rule: string | null;
  state: 'open' | 'in_repair' | 'repaired' | 'verified' | 'voided';
  assignedTo: string | null;
  assigneeName: string | null;
  createdAt: string;
  createdByName: string;
  ageDays: number;
  version: number;
}

/** GET /api/repairs: one page, how many match, and what the screen shows whatever the filters. */
export interface QueuePage {
  items: QueueItem[];
  /** Findings matching the filters, on every page. */
  total: number;
  /** Pass as `cursor` for the next page; null on the last one. */
  nextCursor: string | null;
  /** Everyone who holds work in the queue (open, in repair, repaired), whatever the filters; by name. */
  assignees: { id: string; name: string }[];
  /** Repaired findings waiting to be verified, whatever the filters. */
  toVerify: number;
  /** Units still tagged non-complying with no open or in-repair federal finding, whatever the filters. */
  tagsToClear: { unitId: string; roadNumber: string }[];
}
