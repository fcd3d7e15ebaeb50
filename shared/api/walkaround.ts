import { z } from 'zod';
import { FRONT_ENDS, VIEW_KEYS } from '../domain/frames';
import { LENGTH_UNITS } from '../checks/units';
import { CivilDate, Uuid, Version } from './common';

export const IdempotencyKey = z.string().min(8).max(100).regex(/^[A-Za-z0-9_-]+$/, 'Letters, digits, - and _ only');

export const RoutineArea = z.object({
  key: z.string().min(1).max(60).regex(/^[a-z0-9_-]+$/),
  label: z.string().trim().min(1).max(80),
  /** The area puts the inspector on, under or between equipment (blue-signal caution first). */
  hazard: z.boolean(),
  instanceIds: z.array(z.string().min(1).max(80)).min(1).max(400),
});
export type RoutineArea = z.infer<typeof RoutineArea>;

export const RoutineBody = z.object({
  name: z.string().trim().min(1).max(80),
  startPoint: z.string().trim().min(1).max(80),
  direction: z.enum(['clockwise', 'counterclockwise']),
  areas: z.array(RoutineArea).min(1).max(40),
  version: Version.optional(),
});
export type RoutineBody = z.infer<typeof RoutineBody>;

export interface Routine extends RoutineBody {
  id: string | null;
  unitTypeKey: string;
  personal: boolean;
  version: number;
}

export const StartInspectionBody = z.object({
  unitId: Uuid,
  kind: z.enum(['daily', 'periodic']),
  /** The end the inspector sees the F on; defaults to the record. */
  frontEndSeen: z.enum(FRONT_ENDS).optional(),
  idempotencyKey: IdempotencyKey.optional(),
});
export type StartInspectionBody = z.infer<typeof StartInspectionBody>;

export const CoverageBody = z.object({
  instanceIds: z.array(z.string().min(1).max(80)).min(1).max(500),
  state: z.enum(['passed', 'not_applicable', 'gap']),
  /** Required for not_applicable and for a gap left at signing. */
  reason: z.string().trim().max(300).optional(),
});

export const Measurement = z
  .object({
    value: z.number().finite().positive().max(10000),
    unit: z.enum(LENGTH_UNITS),
    /** Chain wear: the nominal diameter the value is compared with. */
    nominal: z.number().finite().positive().max(10000).optional(),
    /** Wheel spots: the adjoining spot's length. */
    adjoining: z.number().finite().positive().max(10000).optional(),
  })
  .strict();

export const FindingBody = z
  .object({
    partId: z.string().min(1).max(80),
    view: z.enum(VIEW_KEYS),
    /** The two body-frame coordinates the view shows (plan: x,y; side: x,z; end: y,z), inches. */
    x: z.number().finite(),
    y: z.number().finite(),
    defectType: z.string().min(1).max(80),
    measurement: Measurement.optional(),
    /** Dated defects (cab card, sanders): the date on the card or of discovery. */
    lastDone: CivilDate.optional(),
    note: z.string().trim().max(2000).optional(),
    /** The check passed and the inspector chose to keep the finding as a note. */
    keepAsNote: z.boolean().optional(),
    idempotencyKey: IdempotencyKey.optional(),
  })
  .strict();
export type FindingBody = z.infer<typeof FindingBody>;

export const SignBody = z.object({
  password: z.string().min(1, 'Enter your password to sign').max(200),
});

export const CorrectionBody = z.object({
  note: z.string().trim().min(3, 'Say what is corrected').max(2000),
  password: z.string().min(1).max(200),
});

export const TagBody = z.object({
  destination: z.string().trim().max(200).optional(),
  restrictions: z.string().trim().max(500).optional(),
});

export interface FindingView {
  id: string;
  inspectionId: string;
  unitId: string;
  partId: string;
  instanceId: string;
  partKind: string;
  view: string;
  body: { x: number; y: number; z: number };
  front: { along: number; left: number };
  frontEnd: 'short_hood' | 'long_hood';
  label: string;
  partLabel: string;
  side: string;
  endRole: string | null;
  number: number | null;
  defectType: string;
  defectLabel: string;
  weight: 'federal' | 'shop' | 'note';
  rule: string | null;
  measurement: { value: number; unit: string; inches: number } | null;
  checkResult: Record<string, unknown> | null;
  note: string | null;
  state: 'open' | 'in_repair' | 'repaired' | 'verified' | 'voided';
  assignedTo: string | null;
  createdBy: string;
  createdAt: string;
  version: number;
  photos: { id: string; thumb: string; full: string }[];
}

export interface CoverageSummary {
  total: number;
  done: number;
  passed: number;
  findings: number;
  notApplicable: number;
  gaps: { instanceId: string; reason: string | null }[];
  complete: boolean;
}

export interface InspectionView {
  id: string;
  unit: { id: string; roadNumber: string; unitTypeKey: string; frontEnd: 'short_hood' | 'long_hood'; yardName: string | null };
  inspector: { id: string; name: string };
  kind: 'daily' | 'periodic';
  status: 'in_progress' | 'signed';
  frontEndSeen: 'short_hood' | 'long_hood';
  frontEndRecorded: 'short_hood' | 'long_hood';
  startedAt: string;
  signedAt: string | null;
  place: string | null;
  routine: Routine;
  items: { instanceId: string; state: string; reason: string | null }[];
  coverage: CoverageSummary;
  findings: FindingView[];
  corrections: { id: string; note: string; signedAt: string; by: string }[];
  correctsId: string | null;
  railroad: { name: string; reportingMark: string; timeZone: string };
  version: number;
}
