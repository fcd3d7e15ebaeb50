import { z } from 'zod';
import { FINDING_STATES, FINDING_WEIGHTS } from '../domain/states';
import type { FrontEnd } from '../domain/frames';
import type { CellCount } from '../hot-spots/grid';
import type { HeatCell } from '../hot-spots/density';
import type { MonthCount } from '../hot-spots/trend';
import { Uuid } from './common';

const civil = z.iso.date('Use YYYY-MM-DD');
/** Comma-separated list in a query string ("federal,shop"); empty means no filter. */
const list = <T extends z.ZodType>(item: T, max: number) =>
  z.preprocess(
    (v) => (typeof v === 'string' ? v.split(',').map((x) => x.trim()).filter(Boolean) : (v ?? [])),
    z.array(item).max(max, `At most ${max} values`),
  );

const DefectTypeKey = z.string().regex(/^[a-z0-9_]{1,80}$/, 'Not a defect type key');

const FilterShape = z.object({
  unitType: z.string().regex(/^[a-z0-9_]{1,60}$/, 'Not a unit type key'),
  from: civil,
  to: civil,
  defectTypes: list(DefectTypeKey, 200),
  weights: list(z.enum(FINDING_WEIGHTS), 3),
  yards: list(Uuid, 50),
});
const rangeChecks = <T extends z.ZodType<{ from: string; to: string }>>(schema: T) =>
  schema
    .refine((q) => q.from <= q.to, { message: 'The range must not end before it starts', path: ['to'] })
    .refine((q) => Date.parse(q.to) - Date.parse(q.from) <= 1100 * 86_400_000, { message: 'At most three years at a time', path: ['from'] });

/** GET /api/hot-spots and GET /api/hot-spots/table.csv: one unit type over a civil date range, in the railroad's time zone. */
export const HotSpotsQuery = rangeChecks(FilterShape);
export type HotSpotsQuery = z.infer<typeof HotSpotsQuery>;
/** What the client sends: lists as arrays, joined with commas in the query string. */
export type HotSpotsParams = z.infer<typeof FilterShape>;

/** GET /api/hot-spots/findings and /findings.csv: the findings behind one row (by its label), or the whole selection. */
export const HotSpotFindingsQuery = rangeChecks(
  FilterShape.extend({
    label: z.string().trim().min(1).max(200).optional(),
    limit: z.coerce.number().int().min(1).max(500).default(200),
  }),
);
export type HotSpotFindingsQuery = z.infer<typeof HotSpotFindingsQuery>;

export interface StandOutVerdict {
  standsOut: boolean;
  /** P(X ≥ observed) under the fleet rate of the part kind. */
  p: number;
  expected: number;
  /** Fleet findings per 100 inspections of one part of the kind. */
  fleetRatePer100: number;
  words: string;
}

/** One table row: a part as a person names it under each unit's own F. */
export interface HotSpotRow {
  label: string;
  partLabel: string;
  partKind: string;
  findings: number;
  /** Per 100 inspections of the unit type in the range (null with no inspections). */
  ratePer100: number | null;
  units: number;
  repeats: number;
  /** Mean pin position, front-relative inches. */
  along: number;
  left: number;
  standOut: StandOutVerdict | null;
}

export interface RepeatUnit {
  unitId: string;
  roadNumber: string;
  frontEnd: FrontEnd;
  repeats: number;
  findings: number;
}

export interface FleetKindRow {
  partKind: string;
  findings: number;
  partInspections: number;
  ratePer100: number | null;
}

export interface HotSpotsResponse {
  query: HotSpotsQuery;
  unitType: { key: string; name: string; lengthIn: number; widthIn: number };
  timeZone: string;
  repeatWindowDays: number;
  /** Inspections of the unit type in the range: the exposure. */
  inspections: number;
  totals: { findings: number; units: number; repeats: number };
  grid: { cellIn: number; cols: number; rows: number; lengthIn: number; widthIn: number; cells: CellCount[]; heat: HeatCell[] };
  rows: HotSpotRow[];
  trend: MonthCount[];
  repeatUnits: RepeatUnit[];
  fleet: FleetKindRow[];
  test: { name: string; alpha: number; tested: number; chanceFlags: number; description: string };
}

export interface HotSpotFinding {
  id: string;
  unitId: string;
  roadNumber: string;
  frontEnd: FrontEnd;
  label: string;
  partLabel: string;
  defectType: string;
  defectLabel: string;
  weight: (typeof FINDING_WEIGHTS)[number];
  state: (typeof FINDING_STATES)[number];
  createdAt: string;
  repairedAt: string | null;
  repeat: boolean;
  along: number;
  left: number;
}

export interface HotSpotFindingsResponse {
  items: HotSpotFinding[];
  total: number;
}
