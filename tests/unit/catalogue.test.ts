import { describe, expect, it } from 'vitest';
import { PART_KINDS, PART_KIND_KEYS, isPartKind } from '../../shared/domain/parts';

describe('part catalogue', () => {
  it('has snake_case keys and a label for each kind', () => {
    for (const key of PART_KIND_KEYS) {
      expect(key).toMatch(/^[a-z]+(_[a-z]+)*$/);
      expect(PART_KINDS[key].label.length).toBeGreaterThan(0);
    }
  });
  it('rejects unknown kinds, including prototype keys', () => {
    expect(isPartKind('traction_motor')).toBe(true);
    expect(isPartKind('toString')).toBe(false);
    expect(isPartKind('warp_drive')).toBe(false);
  });
});
