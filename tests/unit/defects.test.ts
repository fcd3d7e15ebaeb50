import { describe, expect, it } from 'vitest';
import { PART_KIND_KEYS, isPartKind } from '../../shared/domain/parts';
import { CHECKS, CHECK_KEYS, runCheck, type CheckKey } from '../../shared/api/checks';
import { DEFECT_TYPES, DEFECT_WEIGHTS, defectTypeByKey, defectTypesFor, type DefectType } from '../../shared/defects/catalogue';
import { SAMPLE_BODIES } from './checks-samples';

const LENGTH_CHECKS: readonly CheckKey[] = ['pilot_height', 'chain_wear', 'wheel_flat', 'flange_thickness', 'rim_thickness', 'tread_hollow'];
const DATE_CHECKS: readonly CheckKey[] = ['interval', 'sanders'];
const sectionOf = (s: string) => /49 CFR (\d+\.\d+)/.exec(s)?.[1];

describe('defect-type catalogue', () => {
  it('has unique snake_case keys and a label for every type', () => {
    const keys = DEFECT_TYPES.map((d) => d.key);
    expect(new Set(keys).size).toBe(keys.length);
    for (const d of DEFECT_TYPES) {
      expect(d.key).toMatch(/^[a-z0-9]+(_[a-z0-9]+)*$/);
      expect(d.label.trim().length).toBeGreaterThan(0);
    }
  });

  it('gives every type a valid weight and part kind', () => {
    for (const d of DEFECT_TYPES) {
      expect(DEFECT_WEIGHTS, d.key).toContain(d.weight);
      expect(isPartKind(d.partKind), d.key).toBe(true);
    }
  });

  it('has at least one specific type and exactly one generic note-weight `other` for every part kind', () => {
    for (const kind of PART_KIND_KEYS) {
      const types = defectTypesFor(kind);
      expect(types.every((d) => d.partKind === kind)).toBe(true);
      const others = types.filter((d) => d.key === `${kind}_other`);
      expect(others, kind).toHaveLength(1);
      expect(others[0].weight).toBe('note');
      expect(types.length, `${kind} needs at least one specific defect type`).toBeGreaterThan(1);
    }
    expect(DEFECT_TYPES.length).toBe(PART_KIND_KEYS.reduce((n, k) => n + defectTypesFor(k).length, 0));
  });

  it('cites a rule for every federal type, only for federal types, always with its confidence', () => {
    for (const d of DEFECT_TYPES) {
      if (d.weight === 'federal') expect(d.rule, d.key).toBeDefined();
      else expect(d.rule, d.key).toBeUndefined();
      expect(d.rule === undefined, d.key).toBe(d.ruleConfidence === undefined);
      if (d.rule) expect(d.rule, d.key).toMatch(/^49 CFR (Part \d+|\d+\.\d+(\([a-z0-9]+\))*)$/);
      if (d.ruleConfidence) expect(['seen', 'memory']).toContain(d.ruleConfidence);
    }
  });

  it('marks sections that our rules reference only recalls as from memory', () => {
    // rules-reference.md marks these MEMORY: 229.119 (cabs, floors), 229.61 (couplers), 229.85 ("Danger"),
    // 232.105 (locomotive hand brake), 229.75(h) (flange height).
    const memoryOnly = [/^49 CFR 229\.119/, /^49 CFR 229\.61/, /^49 CFR 229\.85/, /^49 CFR 232\.105/, /^49 CFR 229\.75\(h\)/];
    for (const d of DEFECT_TYPES) {
      if (d.rule && memoryOnly.some((re) => re.test(d.rule!))) expect(d.ruleConfidence, d.key).toBe('memory');
    }
    // ...and these SEEN: 229.75(a) flat spot, 229.89 MU cables, 229.43 battery vent, 229.131 sanders.
    for (const key of ['flat_spot', 'mu_insulation_chafed', 'battery_box_vent_blocked', 'sander_inoperative']) {
      expect(defectTypeByKey(key)?.ruleConfidence, key).toBe('seen');
    }
    // No federal rule is known for the F marking: a shop matter.
    expect(defectTypeByKey('front_marking_missing')?.weight).toBe('shop');
    expect(defectTypeByKey('front_marking_missing')?.rule).toBeUndefined();
  });

  it('points every check at a registry key, with a matching measurement and preset', () => {
    for (const d of DEFECT_TYPES) {
      if (d.checkPreset) expect(d.check, d.key).toBeDefined();
      if (!d.check) continue;
      expect(CHECK_KEYS, d.key).toContain(d.check);
      expect(CHECKS[d.check], d.key).toBeDefined();
      if (LENGTH_CHECKS.includes(d.check)) expect(d.measurement, d.key).toEqual({ quantity: 'length', defaultUnit: 'in' });
      if (DATE_CHECKS.includes(d.check)) expect(d.measurement, d.key).toBeUndefined();
      // The preset must be a valid part of the check's input.
      const r = runCheck(d.check, { ...SAMPLE_BODIES[d.check], ...d.checkPreset });
      expect(r.ok, d.key).toBe(true);
      // Where the check cites a CFR section, the defect type cites the same one.
      if (r.ok && sectionOf(r.output.source)) expect(sectionOf(d.rule ?? ''), d.key).toBe(sectionOf(r.output.source));
    }
    expect(defectTypeByKey('hand_brake_date_overdue')?.checkPreset).toEqual({ interval: 'hand_brake' });
  });

  it('has the types inspectors expect on the main parts', () => {
    const expected: Record<string, Partial<DefectType>> = {
      pilot_height_out_of_limit: { partKind: 'pilot', weight: 'federal', check: 'pilot_height' },
      pilot_bent: { partKind: 'pilot', weight: 'shop' },
      chain_worn: { partKind: 'hand_brake_chain', weight: 'federal', check: 'chain_wear' },
      chain_kinked: { partKind: 'hand_brake_chain' },
      hand_brake_inoperative: { partKind: 'hand_brake', weight: 'federal' },
      hand_brake_date_overdue: { partKind: 'hand_brake', weight: 'federal', check: 'interval' },
      flat_spot: { partKind: 'wheel', weight: 'federal', rule: '49 CFR 229.75(a)', check: 'wheel_flat' },
      flange_thin: { partKind: 'wheel', check: 'flange_thickness' },
      rim_thin: { partKind: 'wheel', check: 'rim_thickness' },
      tread_hollow: { partKind: 'wheel', check: 'tread_hollow' },
      chipped_flange: { partKind: 'wheel', weight: 'federal' },
      sander_inoperative: { partKind: 'sand_box', weight: 'federal', check: 'sanders' },
      sand_low: { partKind: 'sand_box', weight: 'shop' },
      mu_cover_missing: { partKind: 'mu_receptacle' },
      mu_insulation_chafed: { partKind: 'mu_receptacle', weight: 'federal', rule: '49 CFR 229.89' },
      reservoir_test_overdue: { partKind: 'air_reservoir', check: 'interval', checkPreset: { interval: 'main_reservoir' } },
    };
    for (const [key, fields] of Object.entries(expected)) expect(defectTypeByKey(key), key).toMatchObject(fields);
    for (const kind of ['step', 'handrail', 'stanchion', 'uncoupling_lever'] as const) {
      for (const what of ['bent', 'loose', 'missing']) {
        expect(defectTypeByKey(`${kind}_${what}`), `${kind}_${what}`).toMatchObject({ partKind: kind, weight: 'federal', rule: '49 CFR Part 231' });
      }
    }
  });

  it('looks types up by key and by part kind', () => {
    expect(defectTypeByKey('no_such_defect')).toBeUndefined();
    expect(defectTypeByKey('toString')).toBeUndefined();
    expect(defectTypesFor('wheel').map((d) => d.key)).toEqual(expect.arrayContaining(['flat_spot', 'shelled_spot', 'wheel_other']));
    expect(defectTypesFor('wheel').at(-1)?.key).toBe('wheel_other');
    for (const d of DEFECT_TYPES) expect(defectTypeByKey(d.key)).toBe(d);
  });
});
