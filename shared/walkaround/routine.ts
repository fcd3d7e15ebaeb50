import type { FrontEnd } from '../domain/frames';
import { CENTRE_TOLERANCE_IN, PART_KINDS, type PartKind } from '../domain/parts';
import type { Drawing } from '../drawings/types';
import type { CoverageState } from '../domain/states';

/** Physical areas of a unit, named in the carbody frame so a routine means the same whichever end has the F. */
export const AREA_KEYS = ['end_short_hood', 'side_minus_y', 'cab', 'running_gear', 'end_long_hood', 'side_plus_y'] as const;
export type AreaKey = (typeof AREA_KEYS)[number];

export interface Area {
  key: string;
  label: string;
  hazard: boolean;
  instanceIds: string[];
}

const END_KINDS = new Set<PartKind>(['pilot', 'coupler', 'uncoupling_lever', 'mu_receptacle', 'air_hose', 'headlight', 'ditch_light', 'number_board', 'end_handrail', 'nose_compartment', 'step']);
const UNDER_KINDS = new Set<PartKind>(['truck', 'axle', 'traction_motor', 'fuel_tank', 'air_reservoir']);
const CAB_KINDS = new Set<PartKind>(['cab', 'horn', 'hand_brake', 'hand_brake_chain', 'cab_window', 'cab_door']);

/** Which physical area a part belongs to in the default routine. */
export function areaOf(kind: PartKind, x: number, y: number, lengthIn: number): AreaKey {
  const nearShort = x < lengthIn / 2;
  if (kind === 'short_hood') return 'end_short_hood';
  if (kind === 'long_hood') return 'end_long_hood';
  if (END_KINDS.has(kind)) return nearShort ? 'end_short_hood' : 'end_long_hood';
  if (UNDER_KINDS.has(kind)) return 'running_gear';
  if (CAB_KINDS.has(kind) && Math.abs(y) <= CENTRE_TOLERANCE_IN) return 'cab';
  if (kind === 'cab' || kind === 'horn' || kind === 'hand_brake' || kind === 'hand_brake_chain') return 'cab';
  if (y < -CENTRE_TOLERANCE_IN) return 'side_minus_y';
  if (y > CENTRE_TOLERANCE_IN) return 'side_plus_y';
  return 'cab';
}

/** A person-facing name for a physical area under the F end in use. */
export function areaLabel(key: string, frontEnd: FrontEnd, fallback: string): string {
  const fOnShort = frontEnd === 'short_hood';
  switch (key) {
    case 'end_short_hood':
      return fOnShort ? 'Front end (short hood)' : 'Rear end (short hood)';
    case 'end_long_hood':
      return fOnShort ? 'Rear end (long hood)' : 'Front end (long hood)';
    case 'side_minus_y':
      return fOnShort ? 'Left side' : 'Right side';
    case 'side_plus_y':
      return fOnShort ? 'Right side' : 'Left side';
    case 'cab':
      return 'Cab';
    case 'running_gear':
      return 'Running gear, trucks and under the unit';
    default:
      return fallback;
  }
}

const DEFAULT_LABELS: Record<AreaKey, string> = {
  end_short_hood: 'Short hood end',
  side_minus_y: 'Side −y',
  cab: 'Cab',
  running_gear: 'Running gear, trucks and under the unit',
  end_long_hood: 'Long hood end',
  side_plus_y: 'Side +y',
};

/**
 * The default routine of a unit type: start at the short hood end and walk round, cab and running
 * gear in between. Parts inside an area are ordered along the unit from the short hood.
 */
export function defaultRoutine(drawing: Drawing, direction: 'clockwise' | 'counterclockwise' = 'clockwise') {
  const buckets = new Map<AreaKey, { id: string; x: number }[]>(AREA_KEYS.map((k) => [k, []]));
  for (const i of drawing.instances) buckets.get(areaOf(i.kind, i.centre.x, i.centre.y, drawing.lengthIn))!.push({ id: i.instanceId, x: i.centre.x });
  const order: AreaKey[] =
    direction === 'clockwise'
      ? ['end_short_hood', 'side_minus_y', 'cab', 'running_gear', 'end_long_hood', 'side_plus_y']
      : ['end_short_hood', 'side_plus_y', 'cab', 'running_gear', 'end_long_hood', 'side_minus_y'];
  const areas: Area[] = order
    .map((key) => {
      const parts = buckets.get(key)!.sort((a, b) => a.x - b.x || a.id.localeCompare(b.id));
      const hazard = key !== 'cab' || parts.some((p) => PART_KINDS[drawing.instances.find((i) => i.instanceId === p.id)!.kind].hazard);
      return { key, label: DEFAULT_LABELS[key], hazard: key === 'cab' ? false : hazard, instanceIds: parts.map((p) => p.id) };
    })
    .filter((a) => a.instanceIds.length > 0);
  return { name: 'Standard walk', startPoint: 'Short hood end', direction, areas };
}

export interface CoverageItem {
  instanceId: string;
  state: CoverageState;
  reason: string | null;
}

/** Coverage of a routine: every part passed, with a finding, or not applicable; gaps listed with their reasons. */
export function coverageOf(areas: readonly Pick<Area, 'instanceIds'>[], items: readonly CoverageItem[]) {
  const byId = new Map(items.map((i) => [i.instanceId, i]));
  const all = [...new Set(areas.flatMap((a) => a.instanceIds))];
  let passed = 0;
  let findings = 0;
  let notApplicable = 0;
  const gaps: { instanceId: string; reason: string | null }[] = [];
  for (const id of all) {
    const it = byId.get(id);
    if (it?.state === 'passed') passed++;
    else if (it?.state === 'finding') findings++;
    else if (it?.state === 'not_applicable') notApplicable++;
    else gaps.push({ instanceId: id, reason: it?.reason ?? null });
  }
  const done = passed + findings + notApplicable;
  return { total: all.length, done, passed, findings, notApplicable, gaps, complete: gaps.length === 0 };
}

/** A record can be signed when coverage is complete or every gap says why it was left. */
export const canSign = (c: ReturnType<typeof coverageOf>) => c.gaps.every((g) => !!g.reason && g.reason.trim().length > 0);
