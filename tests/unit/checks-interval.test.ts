import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { addDays as fnsAddDays, differenceInCalendarDays, format } from 'date-fns';
import {
  INTERVALS,
  addDays,
  checkInterval,
  checkSanderDays,
  civilDateInZone,
  daysBetween,
  isCheckInputError,
  isCivilDate,
  type IntervalKind,
} from '../../shared/checks';

const expectInvalid = (fn: () => unknown) => {
  let error: unknown;
  try {
    fn();
  } catch (e) {
    error = e;
  }
  expect(isCheckInputError(error)).toBe(true);
};

describe('civil dates', () => {
  it('accepts only real calendar dates written YYYY-MM-DD', () => {
    expect(isCivilDate('2024-02-29')).toBe(true); // 2024 is a leap year
    expect(isCivilDate('2000-02-29')).toBe(true); // divisible by 400
    expect(isCivilDate('2025-02-29')).toBe(false);
    expect(isCivilDate('2100-02-29')).toBe(false); // divisible by 100, not 400
    expect(isCivilDate('2024-13-01')).toBe(false);
    expect(isCivilDate('2024-04-31')).toBe(false);
    expect(isCivilDate('2024-1-01')).toBe(false);
    expect(isCivilDate('2024-01-01T00:00')).toBe(false);
    expect(() => addDays('2025-02-29', 1)).toThrow(RangeError);
  });

  it('counts a leap day as a day and crosses year ends', () => {
    expect(addDays('2028-02-28', 1)).toBe('2028-02-29');
    expect(addDays('2028-02-28', 2)).toBe('2028-03-01');
    expect(addDays('2027-02-28', 1)).toBe('2027-03-01');
    expect(daysBetween('2028-02-01', '2028-03-01')).toBe(29);
    expect(daysBetween('2027-02-01', '2027-03-01')).toBe(28);
    expect(addDays('2026-12-31', 1)).toBe('2027-01-01');
    expect(daysBetween('2026-12-31', '2026-01-01')).toBe(-364);
    expect(daysBetween('2028-01-01', '2029-01-01')).toBe(366);
  });

  it('agrees with date-fns calendar-day arithmetic (independent oracle)', () => {
    const civil = fc
      .date({ min: new Date(1901, 0, 1), max: new Date(2199, 11, 31), noInvalidDate: true })
      .map((d) => format(d, 'yyyy-MM-dd'));
    fc.assert(
      fc.property(civil, fc.integer({ min: -4000, max: 4000 }), (d, n) => {
        const [y, m, day] = d.split('-').map(Number);
        const local = new Date(y, m - 1, day, 12);
        expect(addDays(d, n)).toBe(format(fnsAddDays(local, n), 'yyyy-MM-dd'));
        expect(daysBetween(d, addDays(d, n))).toBe(n);
        expect(daysBetween(d, format(fnsAddDays(local, n), 'yyyy-MM-dd'))).toBe(
          differenceInCalendarDays(fnsAddDays(local, n), local),
        );
      }),
      { numRuns: 500 },
    );
  });

  it('civilDateInZone: one instant, different calendar days in America/Chicago and UTC', () => {
    // 2026-01-15 03:00 UTC is 2026-01-14 21:00 CST (UTC−6).
    const instant = new Date('2026-01-15T03:00:00Z');
    expect(civilDateInZone(instant, 'UTC')).toBe('2026-01-15');
    expect(civilDateInZone(instant, 'America/Chicago')).toBe('2026-01-14');
    // Summer: CDT is UTC−5, so the day turns at 05:00 UTC.
    expect(civilDateInZone(new Date('2026-07-01T04:59:59Z'), 'America/Chicago')).toBe('2026-06-30');
    expect(civilDateInZone(new Date('2026-07-01T05:00:00Z'), 'America/Chicago')).toBe('2026-07-01');
    expect(() => civilDateInZone(instant, 'Not/AZone')).toThrow(RangeError);
  });

  it('civilDateInZone: 2026-03-08 in America/New_York (spring forward) is a 23-hour day but one calendar day', () => {
    const zone = 'America/New_York';
    const start = new Date('2026-03-08T05:00:00Z'); // 00:00 EST
    const end = new Date('2026-03-09T03:59:59Z'); // 23:59:59 EDT, 22 h 59 m 59 s later
    expect(civilDateInZone(new Date('2026-03-08T04:59:59Z'), zone)).toBe('2026-03-07');
    expect(civilDateInZone(start, zone)).toBe('2026-03-08');
    expect(civilDateInZone(end, zone)).toBe('2026-03-08');
    const next = new Date('2026-03-09T04:00:00Z'); // 00:00 EDT, only 23 h after the day began
    expect(civilDateInZone(next, zone)).toBe('2026-03-09');
    expect(daysBetween(civilDateInZone(start, zone), civilDateInZone(next, zone))).toBe(1);
    // 49 CFR 229.21: a daily inspection at 00:00 on 03-08 is overdue at 00:00 on 03-09, 23 hours later.
    const lastDone = civilDateInZone(start, zone);
    expect(checkInterval({ interval: 'daily', lastDone, on: civilDateInZone(end, zone) }).status).toBe('good');
    expect(checkInterval({ interval: 'daily', lastDone, on: civilDateInZone(next, zone) }).status).toBe('overdue');
  });

  it('civilDateInZone: 2026-11-01 in America/New_York (fall back) is a 25-hour day but one calendar day', () => {
    const zone = 'America/New_York';
    const start = new Date('2026-11-01T04:00:00Z'); // 00:00 EDT
    const late = new Date('2026-11-02T04:30:00Z'); // 23:30 EST, 24 h 30 m later, still 11-01
    const next = new Date('2026-11-02T05:00:00Z'); // 00:00 EST 11-02
    expect(civilDateInZone(start, zone)).toBe('2026-11-01');
    expect(civilDateInZone(late, zone)).toBe('2026-11-01');
    expect(civilDateInZone(next, zone)).toBe('2026-11-02');
    expect(late.getTime() - start.getTime()).toBeGreaterThan(24 * 3600 * 1000);
    // 49 CFR 229.21: still good more than 24 hours later, because it is the same calendar day.
    expect(checkInterval({ interval: 'daily', lastDone: '2026-11-01', on: civilDateInZone(late, zone) }).status).toBe('good');
    expect(checkInterval({ interval: 'daily', lastDone: '2026-11-01', on: civilDateInZone(next, zone) }).status).toBe('overdue');
    // 49 CFR 229.23(a): a 92-day count across both changes is still calendar days.
    expect(daysBetween('2026-02-01', '2026-12-01')).toBe(303);
  });
});

describe('inspection and test intervals', () => {
  // Done 2026-01-10; last good days worked by hand on a calendar.
  const cases: ReadonlyArray<readonly [IntervalKind, number, string, string, string]> = [
    ['daily', 0, '2026-01-10', '2026-01-11', '49 CFR 229.21'],
    ['periodic', 92, '2026-04-12', '2026-04-13', '49 CFR 229.23(a)'],
    ['periodic_cm', 184, '2026-07-13', '2026-07-14', '49 CFR 229.23(b)'],
    ['cm_33_day', 33, '2026-02-12', '2026-02-13', '49 CFR 229.23(b)'],
    ['annual', 368, '2027-01-13', '2027-01-14', '49 CFR 229.27'],
    ['main_reservoir', 736, '2028-01-16', '2028-01-17', '49 CFR 229.31'],
    ['hand_brake', 368, '2027-01-13', '2027-01-14', '49 CFR 232.105(c) (from memory)'],
  ];

  it.each(cases)('%s (N = %i): good through D + N, overdue from D + N + 1 — %s', (interval, days, good, overdue, source) => {
    expect(INTERVALS[interval].days).toBe(days);
    const onEdge = checkInterval({ interval, lastDone: '2026-01-10', on: good });
    expect(onEdge).toMatchObject({ result: 'pass', lastGoodDay: good, overdueFrom: overdue, daysLeft: 0, days, source });
    expect(onEdge.status).not.toBe('overdue');
    const late = checkInterval({ interval, lastDone: '2026-01-10', on: overdue });
    expect(late).toMatchObject({ result: 'fail', status: 'overdue', daysLeft: -1 });
    if (days > 0) {
      expect(checkInterval({ interval, lastDone: '2026-01-10', on: addDays(good, -1) })).toMatchObject({ result: 'pass', daysLeft: 1 });
    }
  });

  it('hand brake interval is marked from memory (49 CFR 232.105(c), from memory)', () => {
    expect(checkInterval({ interval: 'hand_brake', lastDone: '2026-01-10', on: '2026-01-10' }).ruleConfidence).toBe('memory');
    expect(checkInterval({ interval: 'annual', lastDone: '2026-01-10', on: '2026-01-10' }).ruleConfidence).toBe('seen');
  });

  it('counts the leap day 2028-02-29', () => {
    // 49 CFR 229.27: 2027-03-01 + 368 spans 2028-02-29 → 2028-03-03 (not 03-04 as in a common year).
    expect(checkInterval({ interval: 'annual', lastDone: '2027-03-01', on: '2028-03-03' })).toMatchObject({ result: 'pass', daysLeft: 0 });
    expect(checkInterval({ interval: 'annual', lastDone: '2027-03-01', on: '2028-03-04' }).result).toBe('fail');
    // 49 CFR 229.23(a): 2027-12-15 + 92 → 2028-03-16; the same start a year earlier → 2027-03-17.
    expect(checkInterval({ interval: 'periodic', lastDone: '2027-12-15', on: '2028-03-16' }).lastGoodDay).toBe('2028-03-16');
    expect(checkInterval({ interval: 'periodic', lastDone: '2026-12-15', on: '2027-03-17' }).lastGoodDay).toBe('2027-03-17');
    // 49 CFR 229.27: done on the leap day itself → 2029-03-03.
    expect(checkInterval({ interval: 'annual', lastDone: '2028-02-29', on: '2029-03-01' }).lastGoodDay).toBe('2029-03-03');
    // 49 CFR 229.21: a daily inspection on 2028-02-28 is overdue on the leap day.
    expect(checkInterval({ interval: 'daily', lastDone: '2028-02-28', on: '2028-02-29' }).status).toBe('overdue');
    expect(checkInterval({ interval: 'daily', lastDone: '2028-02-29', on: '2028-02-29' }).status).toBe('good');
    expect(checkInterval({ interval: 'daily', lastDone: '2028-02-29', on: '2028-03-01' }).status).toBe('overdue');
  });

  it('crosses the year end', () => {
    // 49 CFR 229.21
    expect(checkInterval({ interval: 'daily', lastDone: '2026-12-31', on: '2026-12-31' }).result).toBe('pass');
    expect(checkInterval({ interval: 'daily', lastDone: '2026-12-31', on: '2027-01-01' }).result).toBe('fail');
    // 49 CFR 229.23(a): 2026-10-01 + 92 = 2027-01-01.
    expect(checkInterval({ interval: 'periodic', lastDone: '2026-10-01', on: '2027-01-01' })).toMatchObject({ result: 'pass', daysLeft: 0 });
    expect(checkInterval({ interval: 'periodic', lastDone: '2026-10-01', on: '2027-01-02' })).toMatchObject({ result: 'fail', daysLeft: -1 });
    // 49 CFR 229.27: 2025-12-30 + 368 = 2027-01-02.
    expect(checkInterval({ interval: 'annual', lastDone: '2025-12-30', on: '2026-06-30' }).lastGoodDay).toBe('2027-01-02');
  });

  it('reports due soon within the warning window (49 CFR 229.23(a), 92 days)', () => {
    const on = (d: string, dueSoonDays?: number) =>
      checkInterval({ interval: 'periodic', lastDone: '2026-01-10', on: d, dueSoonDays });
    // Last good day 2026-04-12. Default window 7 days counting today: 0..6 days left.
    expect(on('2026-04-05')).toMatchObject({ daysLeft: 7, status: 'good' });
    expect(on('2026-04-06')).toMatchObject({ daysLeft: 6, status: 'due_soon', result: 'pass' });
    expect(on('2026-04-12')).toMatchObject({ daysLeft: 0, status: 'due_soon', result: 'pass' });
    expect(on('2026-04-13')).toMatchObject({ daysLeft: -1, status: 'overdue', result: 'fail' });
    expect(on('2026-05-13')).toMatchObject({ daysLeft: -31, status: 'overdue' });
    expect(on('2026-03-20', 30)).toMatchObject({ daysLeft: 23, status: 'due_soon' });
    expect(on('2026-04-12', 0)).toMatchObject({ daysLeft: 0, status: 'good' });
    // 49 CFR 229.21: the daily inspection has no warning window by default.
    expect(checkInterval({ interval: 'daily', lastDone: '2026-01-10', on: '2026-01-10' }).status).toBe('good');
  });

  it('rejects dates that are not calendar dates, and a judging day before the work', () => {
    expectInvalid(() => checkInterval({ interval: 'annual', lastDone: '2025-02-29', on: '2025-03-01' }));
    expectInvalid(() => checkInterval({ interval: 'annual', lastDone: '2024-13-01', on: '2025-03-01' }));
    expectInvalid(() => checkInterval({ interval: 'annual', lastDone: '2025-03-02', on: '2025-03-01' }));
    expectInvalid(() => checkInterval({ interval: 'monthly' as IntervalKind, lastDone: '2025-03-01', on: '2025-03-01' }));
    expectInvalid(() => checkInterval({ interval: 'daily', lastDone: '2025-03-01', on: '2025-03-01', dueSoonDays: -1 }));
    expect(checkInterval({ interval: 'annual', lastDone: '2024-02-29', on: '2024-02-29' }).result).toBe('pass');
  });
});

describe('failed sanders on a lead road unit (49 CFR 229.131(b))', () => {
  it('49 CFR 229.131(b): found on D, may run through D + 14, not from D + 15', () => {
    // Found 2026-02-20 → last day 2026-03-06 (February 2026 has 28 days).
    expect(checkSanderDays({ discovered: '2026-02-20', on: '2026-03-05' })).toMatchObject({ result: 'pass', daysLeft: 1 });
    expect(checkSanderDays({ discovered: '2026-02-20', on: '2026-03-06' })).toMatchObject({
      result: 'pass',
      daysLeft: 0,
      lastGoodDay: '2026-03-06',
      overdueFrom: '2026-03-07',
      source: '49 CFR 229.131(b)',
    });
    expect(checkSanderDays({ discovered: '2026-02-20', on: '2026-03-07' })).toMatchObject({ result: 'fail', status: 'overdue' });
    expect(checkSanderDays({ discovered: '2026-02-20', on: '2026-02-20' })).toMatchObject({ daysLeft: 14, status: 'good' });
  });

  it('49 CFR 229.131(b): counts the leap day (found 2028-02-20 → last day 2028-03-05)', () => {
    expect(checkSanderDays({ discovered: '2028-02-20', on: '2028-03-05' }).result).toBe('pass');
    expect(checkSanderDays({ discovered: '2028-02-20', on: '2028-03-06' }).result).toBe('fail');
  });

  it('names the earlier limits the rule sets, and rejects bad dates', () => {
    expect(checkSanderDays({ discovered: '2026-02-20', on: '2026-02-21' }).limit).toMatch(/initial terminal/);
    expectInvalid(() => checkSanderDays({ discovered: '2026-02-30', on: '2026-03-01' }));
    expectInvalid(() => checkSanderDays({ discovered: '2026-03-02', on: '2026-03-01' }));
  });
});
