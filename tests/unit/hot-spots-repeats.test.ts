import { describe, expect, it } from 'vitest';
import { findRepeats, repairCounts } from '../../shared/hot-spots/repeats';

// The repeat rule of the hot spots issue: same unit, same physical part, same defect type, a finding
// repaired within the previous 90 days (railroad setting). Days are calendar days in the railroad's
// time zone (product rule: "day counts are calendar days in the railroad's own time zone").
const TZ = 'America/Chicago';
const at = (iso: string) => new Date(iso);

describe('repairCounts: the window edge, in calendar days', () => {
  // Repaired Sunday 1 March 2026, 15:00 Chicago time (CST, UTC−6).
  const repaired = at('2026-03-01T21:00:00Z');
  // New findings at 09:00 Chicago time (CDT, UTC−5, after the 8 March change) N calendar days later.
  const dayLater = (n: number) => new Date(Date.UTC(2026, 2, 1 + n, 14, 0, 0));

  it('89 days: repeat', () => expect(repairCounts(repaired, dayLater(89), 90, TZ)).toBe(true));
  it('90 days: repeat (the window includes its last day)', () => expect(repairCounts(repaired, dayLater(90), 90, TZ)).toBe(true));
  it('91 days: not a repeat', () => expect(repairCounts(repaired, dayLater(91), 90, TZ)).toBe(false));

  it('counts calendar days, not 24-hour periods: 90 days later but 12 hours past 90 × 24 h is still a repeat', () => {
    const morning = at('2026-03-01T14:00:00Z'); // 08:00 CST
    const evening90 = at('2026-05-31T01:00:00Z'); // 20:00 CDT on 30 May, 90 calendar days on
    expect((evening90.getTime() - morning.getTime()) / 86_400_000).toBeGreaterThan(90);
    expect(repairCounts(morning, evening90, 90, TZ)).toBe(true);
  });

  it('uses the railroad day, not UTC: 23:30 local on day 91 is day 91 even though UTC is on day 92', () => {
    const late91 = at('2026-06-01T04:30:00Z'); // 23:30 CDT on 31 May = 91 days after 1 March
    expect(repairCounts(at('2026-03-01T21:00:00Z'), late91, 90, TZ)).toBe(false);
    expect(repairCounts(at('2026-03-01T21:00:00Z'), late91, 91, TZ)).toBe(true);
  });

  it('a repair after the new finding does not count; the same day does', () => {
    expect(repairCounts(at('2026-03-02T12:00:00Z'), at('2026-03-02T11:00:00Z'), 90, TZ)).toBe(false);
    expect(repairCounts(at('2026-03-02T11:00:00Z'), at('2026-03-02T12:00:00Z'), 90, TZ)).toBe(true);
  });
});

describe('findRepeats', () => {
  const base = { unitId: 'u1', instanceId: 'tm_1', defectType: 'traction_motor_flashover' };
  const repaired = { ...base, id: 'old', createdAt: at('2026-02-20T15:00:00Z'), repairedAt: at('2026-03-01T21:00:00Z') };
  const on = (n: number) => new Date(Date.UTC(2026, 2, 1 + n, 14));

  it('marks 89 and 90 days as repeats and 91 as not', () => {
    const r = findRepeats(
      [repaired, { ...base, id: 'd89', createdAt: on(89), repairedAt: null }, { ...base, id: 'd90', createdAt: on(90), repairedAt: null }, { ...base, id: 'd91', createdAt: on(91), repairedAt: null }],
      90,
      TZ,
    );
    expect([...r].sort()).toEqual(['d89', 'd90']);
  });

  it('needs the same unit, the same physical part and the same defect type', () => {
    const r = findRepeats(
      [
        repaired,
        { ...base, id: 'other-unit', unitId: 'u2', createdAt: on(10), repairedAt: null },
        { ...base, id: 'other-part', instanceId: 'tm_6', createdAt: on(10), repairedAt: null },
        { ...base, id: 'other-defect', defectType: 'traction_motor_leak', createdAt: on(10), repairedAt: null },
        { ...base, id: 'same', createdAt: on(10), repairedAt: null },
      ],
      90,
      TZ,
    );
    expect([...r]).toEqual(['same']);
  });

  it('a voided repaired finding is no precedent, and the window follows the setting', () => {
    expect(findRepeats([{ ...repaired, voided: true }, { ...base, id: 'x', createdAt: on(5), repairedAt: null }], 90, TZ).size).toBe(0);
    expect([...findRepeats([repaired, { ...base, id: 'x', createdAt: on(31), repairedAt: null }], 30, TZ)]).toEqual([]);
    expect([...findRepeats([repaired, { ...base, id: 'x', createdAt: on(30), repairedAt: null }], 30, TZ)]).toEqual(['x']);
    expect(() => findRepeats([], 0, TZ)).toThrow(RangeError);
  });
});
