import { z } from 'zod';
import { LENGTH_UNITS, toInches } from './units';

/** What every check returns; each check adds its own fields. */
export interface CheckResultBase {
  readonly result: 'pass' | 'fail';
  /** Human text of the limit applied. */
  readonly limit: string;
  /** Where the limit comes from, e.g. '49 CFR 229.123(a)', or 'common practice (no source)'. */
  readonly source: string;
}

export type RuleConfidence = 'seen' | 'memory';

/**
 * Bad input to a check is thrown as a zod validation error, the same error the
 * HTTP schemas produce, so the server maps both to one 400 response.
 */
export const isCheckInputError = (e: unknown): e is z.ZodError => e instanceof z.ZodError;

/** Largest length any check accepts, in inches; anything longer is a typing slip, not a reading. */
export const MAX_LENGTH_IN = 100;

export const lengthUnitSchema = z.enum(LENGTH_UNITS);

/** A measured length: a finite number greater than zero (zod 4 numbers already reject NaN and ±Infinity). */
export const lengthValue = z.number().positive('must be greater than zero');

/**
 * Adds the 100 in cap to the named length fields of an object schema; the cap
 * depends on the unit, so it is checked on the whole object.
 */
export const capLengths = <T extends z.ZodObject<{ unit: typeof lengthUnitSchema }>>(schema: T, keys: readonly string[]) =>
  schema.superRefine((v, ctx) => {
    const rec = v as Record<string, unknown>;
    for (const k of keys) {
      const n = rec[k];
      if (typeof n === 'number' && toInches(n, rec.unit as 'in' | 'mm') >= MAX_LENGTH_IN) {
        ctx.addIssue({ code: 'custom', path: [k], message: `must be less than ${MAX_LENGTH_IN} in (${MAX_LENGTH_IN * 25.4} mm)` });
      }
    }
  });
