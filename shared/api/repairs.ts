import { z } from 'zod';
import { FINDING_STATES, FINDING_WEIGHTS } from '../domain/states';
import { Uuid, Version } from './common';

export const QueueQuery = z.object({
  yard: Uuid.optional(),
  unit: Uuid.optional(),
  state: z.enum(FINDING_STATES).optional(),
  weight: z.enum(FINDING_WEIGHTS).optional(),
  assignee: Uuid.optional(),
  q: z.string().trim().max(60).optional(),
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
