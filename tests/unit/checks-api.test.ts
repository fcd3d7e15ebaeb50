import { describe, expect, it } from 'vitest';
import {
  CHECKS,
  CHECK_KEYS,
  chainWearInput,
  intervalInput,
  isCheckKey,
  pilotHeightInput,
  runCheck,
  type CheckKey,
} from '../../shared/api/checks';
import { SAMPLE_BODIES } from './checks-samples';

const fieldsOf = (body: unknown, key: CheckKey) => {
  const r = runCheck(key, body);
  if (r.ok) throw new Error(`expected ${key} to reject ${JSON.stringify(body)}`);
  return r.error.issues.map((i) => i.path.join('.'));
};

describe('check registry for POST /api/checks/:check', () => {
  it('has one entry per check key, each with a schema and a run function', () => {
    expect(Object.keys(CHECKS).sort()).toEqual([...CHECK_KEYS].sort());
    expect(isCheckKey('pilot_height')).toBe(true);
    expect(isCheckKey('toString')).toBe(false);
    for (const key of CHECK_KEYS) {
      const r = runCheck(key, SAMPLE_BODIES[key]);
      expect(r.ok, key).toBe(true);
      if (r.ok) {
        expect(['pass', 'fail']).toContain(r.output.result);
        expect(r.output.limit.length).toBeGreaterThan(0);
        expect(r.output.source.length).toBeGreaterThan(0);
      }
      expect(runCheck(key, null).ok).toBe(false);
      expect(runCheck(key, 'text').ok).toBe(false);
    }
  });

  it('runs the real check: 49 CFR 229.123(a) 152.5 mm pilot fails, 152.4 mm passes', () => {
    const fail = runCheck('pilot_height', { value: 152.5, unit: 'mm' });
    const pass = runCheck('pilot_height', { value: 152.4, unit: 'mm' });
    expect(fail.ok && fail.output.result).toBe('fail');
    expect(pass.ok && pass.output.result).toBe('pass');
  });

  it('pilot_height body: finite, > 0, < 100 in or its mm equivalent, known unit and service', () => {
    expect(pilotHeightInput.safeParse({ value: 99.9, unit: 'in' }).success).toBe(true);
    expect(pilotHeightInput.safeParse({ value: 2539.9, unit: 'mm' }).success).toBe(true);
    expect(fieldsOf({ value: 100, unit: 'in' }, 'pilot_height')).toEqual(['value']);
    expect(fieldsOf({ value: 2540, unit: 'mm' }, 'pilot_height')).toEqual(['value']);
    expect(fieldsOf({ value: 0, unit: 'in' }, 'pilot_height')).toEqual(['value']);
    expect(fieldsOf({ value: '4', unit: 'in' }, 'pilot_height')).toEqual(['value']);
    expect(fieldsOf({ value: 4, unit: 'cm' }, 'pilot_height')).toEqual(['unit']);
    expect(fieldsOf({ value: 4, unit: 'in', service: 'main_line' }, 'pilot_height')).toEqual(['service']);
    expect(fieldsOf({ value: 4, unit: 'in', stencilled: 'yes' }, 'pilot_height')).toEqual(['stencilled']);
    // JSON cannot carry NaN or Infinity, but a direct caller can.
    expect(pilotHeightInput.safeParse({ value: Number.POSITIVE_INFINITY, unit: 'in' }).success).toBe(false);
  });

  it('chain_wear body: positive diameters, measured not above nominal, with a message', () => {
    const r = chainWearInput.safeParse({ nominal: 0.5, measured: 0.6, unit: 'in' });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]).toMatchObject({ path: ['measured'], message: expect.stringMatching(/nominal/) });
    expect(fieldsOf({ nominal: 0.5, measured: -0.1, unit: 'in' }, 'chain_wear')).toContain('measured');
    expect(fieldsOf({ measured: 0.4, unit: 'in' }, 'chain_wear')).toContain('nominal');
    expect(chainWearInput.safeParse({ nominal: 0.5, measured: 0.5, unit: 'in' }).success).toBe(true);
  });

  it('interval body: strict calendar dates, on not before lastDone', () => {
    const ok = (lastDone: string, on: string) => intervalInput.safeParse({ interval: 'annual', lastDone, on }).success;
    expect(ok('2024-02-29', '2024-03-01')).toBe(true);
    expect(ok('2025-02-29', '2025-03-01')).toBe(false);
    expect(ok('2024-13-01', '2025-03-01')).toBe(false);
    expect(ok('2024-00-10', '2025-03-01')).toBe(false);
    expect(ok('24-01-01', '2025-03-01')).toBe(false);
    expect(ok('2025-03-01', '2025-03-01')).toBe(true);
    expect(fieldsOf({ interval: 'annual', lastDone: '2025-03-02', on: '2025-03-01' }, 'interval')).toEqual(['on']);
    expect(fieldsOf({ interval: 'weekly', lastDone: '2025-03-01', on: '2025-03-01' }, 'interval')).toEqual(['interval']);
  });
});
