import { addDays, daysBetween, type CivilDate } from '../checks/civil-date';
import { checkInterval, dueDays, DUE_SOON_DAYS, type DueStatus, type IntervalKind } from '../checks/interval';

export interface DueItem {
  key: string;
  label: string;
  source: string | null;
  lastDone: CivilDate | null;
  lastGoodDay: CivilDate | null;
  daysLeft: number | null;
  /** `missing`: no date on record, treated as overdue; `not_in_use`: a stored unit needs no daily. */
  status: DueStatus | 'missing' | 'not_in_use';
}

export interface DueUnitInput {
  serviceState: string;
  conditionMonitoring: boolean;
  lastDailyOn: CivilDate | null;
  lastPeriodicOn: CivilDate | null;
  lastCmCheckOn: CivilDate | null;
  lastAnnualOn: CivilDate | null;
  lastHandBrakeOn: CivilDate | null;
  lastMainReservoirOn: CivilDate | null;
  custom: { id: string; label: string; intervalDays: number; lastDoneOn: CivilDate }[];
}

const item = (key: string, interval: IntervalKind, label: string, lastDone: CivilDate | null, on: CivilDate): DueItem => {
  if (!lastDone) return { key, label, source: null, lastDone: null, lastGoodDay: null, daysLeft: null, status: 'missing' };
  // A date in the future is a data-entry slip; count from it anyway rather than hide the item.
  const base = daysBetween(lastDone, on) < 0 ? on : lastDone;
  const r = checkInterval({ interval, lastDone: base, on });
  // The daily is due again each calendar day: done yesterday means "due today", not yet a missed day.
  const status = interval === 'daily' && r.daysLeft === -1 ? 'due_soon' : r.status;
  return { key, label, source: r.source, lastDone, lastGoodDay: r.lastGoodDay, daysLeft: r.daysLeft, status };
};

/** Every dated item of one unit on a calendar day in the railroad's zone, by the shared interval rule. */
export function dueItems(u: DueUnitInput, on: CivilDate): DueItem[] {
  const items: DueItem[] = [];
  if (u.serviceState === 'in_service') items.push(item('daily', 'daily', 'Daily inspection', u.lastDailyOn, on));
  else items.push({ key: 'daily', label: 'Daily inspection', source: '49 CFR 229.21', lastDone: u.lastDailyOn, lastGoodDay: null, daysLeft: null, status: 'not_in_use' });
  if (u.conditionMonitoring) {
    items.push(item('periodic', 'periodic_cm', 'Periodic inspection (184 days, condition monitoring)', u.lastPeriodicOn, on));
    items.push(item('cm_33_day', 'cm_33_day', '33-day check', u.lastCmCheckOn, on));
  } else items.push(item('periodic', 'periodic', 'Periodic inspection (92 days)', u.lastPeriodicOn, on));
  items.push(item('annual', 'annual', 'Annual tests (368 days)', u.lastAnnualOn, on));
  items.push(item('main_reservoir', 'main_reservoir', 'Main reservoir test (736 days)', u.lastMainReservoirOn, on));
  items.push(item('hand_brake', 'hand_brake', 'Hand brake (368 days)', u.lastHandBrakeOn, on));
  for (const c of u.custom) {
    const d = dueDays(daysBetween(c.lastDoneOn, on) < 0 ? on : c.lastDoneOn, c.intervalDays, on, DUE_SOON_DAYS);
    items.push({ key: `custom:${c.id}`, label: `${c.label} (${c.intervalDays} days)`, source: 'railroad', lastDone: c.lastDoneOn, lastGoodDay: d.lastGoodDay, daysLeft: d.daysLeft, status: d.status });
  }
  return items;
}

export type UnitDueState = 'overdue' | 'due_soon' | 'good';
/** The worst state across a unit's items; a missing date counts as overdue. */
export function unitDueState(items: DueItem[]): UnitDueState {
  if (items.some((i) => i.status === 'overdue' || i.status === 'missing')) return 'overdue';
  if (items.some((i) => i.status === 'due_soon')) return 'due_soon';
  return 'good';
}

/** Items a digest lists: overdue or due within `withinDays` (counting today). */
export const digestItems = (items: DueItem[], withinDays = 7) =>
  items.filter((i) => i.status === 'overdue' || i.status === 'missing' || (i.daysLeft !== null && i.daysLeft >= 0 && i.daysLeft < withinDays && i.key !== 'daily'));

export { addDays };
