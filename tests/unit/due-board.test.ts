import { describe, expect, it } from 'vitest';
import { civilDateInZone } from '../../shared/checks/civil-date';
import { digestItems, dueItems, unitDueState, type DueUnitInput } from '../../shared/due/board';

const unit = (over: Partial<DueUnitInput> = {}): DueUnitInput => ({
  serviceState: 'in_service',
  conditionMonitoring: false,
  lastDailyOn: null,
  lastPeriodicOn: null,
  lastCmCheckOn: null,
  lastAnnualOn: null,
  lastHandBrakeOn: null,
  lastMainReservoirOn: null,
  custom: [],
  ...over,
});
const get = (u: DueUnitInput, on: string, key: string) => dueItems(u, on).find((i) => i.key === key)!;

describe('due board intervals (calendar days: done on D with interval N is good through D + N)', () => {
  it('periodic, 49 CFR 229.23: 92 days across the 2028 leap day', () => {
    // 2027-12-15 + 92 days = 2028-03-16 (Dec 16 days + Jan 31 + Feb 29 + Mar 16 = 92).
    const u = unit({ lastPeriodicOn: '2027-12-15' });
    expect(get(u, '2028-03-16', 'periodic')).toMatchObject({ status: 'due_soon', daysLeft: 0, lastGoodDay: '2028-03-16' });
    expect(get(u, '2028-03-17', 'periodic')).toMatchObject({ status: 'overdue', daysLeft: -1 });
    expect(get(u, '2028-03-09', 'periodic').status).toBe('good');
    expect(get(u, '2028-03-10', 'periodic').status).toBe('due_soon');
  });

  it('annual tests, 49 CFR 229.27: 368 days across year end', () => {
    const u = unit({ lastAnnualOn: '2025-12-31' });
    expect(get(u, '2027-01-03', 'annual')).toMatchObject({ lastGoodDay: '2027-01-03', daysLeft: 0 });
    expect(get(u, '2027-01-04', 'annual').status).toBe('overdue');
  });

  it('main reservoir, 49 CFR 229.31: 736 days', () => {
    const u = unit({ lastMainReservoirOn: '2024-02-29' });
    expect(get(u, '2026-03-05', 'main_reservoir')).toMatchObject({ lastGoodDay: '2026-03-06', daysLeft: 1 });
    expect(get(u, '2026-03-07', 'main_reservoir').status).toBe('overdue');
  });

  it('hand brake, 49 CFR 232.105(c) (from memory): 368 days', () => {
    const u = unit({ lastHandBrakeOn: '2026-01-01' });
    expect(get(u, '2027-01-04', 'hand_brake').status).toBe('due_soon');
    expect(get(u, '2027-01-05', 'hand_brake').status).toBe('overdue');
  });

  it('condition-monitored units, 49 CFR 229.23(b): 184-day periodic and the 33-day check', () => {
    const u = unit({ conditionMonitoring: true, lastPeriodicOn: '2026-01-01', lastCmCheckOn: '2026-01-01' });
    expect(get(u, '2026-07-04', 'periodic').status).not.toBe('overdue'); // 2026-01-01 + 184 = 2026-07-04
    expect(get(u, '2026-07-05', 'periodic').status).toBe('overdue');
    expect(get(u, '2026-02-03', 'cm_33_day').daysLeft).toBe(0); // 2026-01-01 + 33 = 2026-02-03
    expect(get(u, '2026-02-04', 'cm_33_day').status).toBe('overdue');
  });

  it('daily, 49 CFR 229.21: done today is good, done yesterday is due today, older is overdue; a stored unit needs none', () => {
    expect(get(unit({ lastDailyOn: '2026-11-30' }), '2026-11-30', 'daily').status).toBe('good');
    expect(get(unit({ lastDailyOn: '2026-11-29' }), '2026-11-30', 'daily').status).toBe('due_soon');
    expect(get(unit({ lastDailyOn: '2026-11-27' }), '2026-11-30', 'daily').status).toBe('overdue');
    expect(get(unit({ serviceState: 'stored' }), '2026-11-30', 'daily').status).toBe('not_in_use');
  });

  it('counts calendar days, not hours, across both daylight-saving changes (plain calendar arithmetic)', () => {
    // 2026-03-08 (spring forward) and 2026-11-01 (fall back) in the US: still one day each.
    const spring = unit({ lastPeriodicOn: '2026-03-07' });
    expect(get(spring, '2026-06-07', 'periodic').daysLeft).toBe(0); // 2026-03-07 + 92
    const fall = unit({ lastPeriodicOn: '2026-10-31' });
    expect(get(fall, '2027-01-31', 'periodic').daysLeft).toBe(0); // 2026-10-31 + 92
    // The same instant is a different calendar day in the railroad's zone than in UTC.
    const instant = new Date('2026-11-01T05:30:00Z'); // 00:30 CDT (UTC−5) on the day the clocks go back
    expect(civilDateInZone(instant, 'America/Chicago')).toBe('2026-11-01');
    expect(civilDateInZone(new Date('2026-11-01T04:30:00Z'), 'America/Chicago')).toBe('2026-10-31');
    expect(civilDateInZone(new Date('2026-03-01T11:30:00Z'), 'Pacific/Auckland')).toBe('2026-03-02');
  });

  it('a missing date makes the unit overdue; the digest lists overdue and due-soon items but not a daily due today', () => {
    const u = unit({ lastDailyOn: '2026-11-29', lastPeriodicOn: '2026-09-01', lastAnnualOn: '2026-01-01', lastHandBrakeOn: '2026-11-01', lastMainReservoirOn: '2026-01-01' });
    const items = dueItems(u, '2026-11-30');
    expect(unitDueState(items)).toBe('due_soon');
    expect(digestItems(items).map((i) => i.key)).toEqual(['periodic']); // 2026-09-01 + 92 = 2026-12-02
    expect(unitDueState(dueItems(unit(), '2026-11-30'))).toBe('overdue');
  });
});
