/**
 * HTTP contract for `POST /api/checks/:check`: the input schema of each rule
 * check and the pure function that computes it. The same schemas guard the
 * pure functions, so a client form, the route and a direct call reject the
 * same inputs with the same messages.
 */
import type { z } from 'zod';
import {
  chainWearInput,
  checkChainWear,
  checkFlangeThickness,
  checkInterval,
  checkPilotHeight,
  checkRimThickness,
  checkSanderDays,
  checkTreadHollow,
  checkWheelFlat,
  flangeThicknessInput,
  intervalInput,
  pilotHeightInput,
  rimThicknessInput,
  sanderDaysInput,
  treadHollowInput,
  wheelFlatInput,
  type CheckKey,
  type CheckResultBase,
} from '../checks';

export {
  chainWearInput,
  flangeThicknessInput,
  intervalInput,
  pilotHeightInput,
  rimThicknessInput,
  sanderDaysInput,
  treadHollowInput,
  wheelFlatInput,
};
export { CHECK_KEYS, isCheckKey, type CheckKey } from '../checks';

export interface CheckDefinition<S extends z.ZodType, R extends CheckResultBase> {
  readonly label: string;
  readonly schema: S;
  readonly run: (input: z.input<S>) => R;
}

const def = <S extends z.ZodType, R extends CheckResultBase>(label: string, schema: S, run: (input: z.input<S>) => R) => ({
  label,
  schema,
  run,
});

// `run` is checked with `never` input so each entry keeps its own exact input type.
type AnyCheck = { readonly label: string; readonly schema: z.ZodType; readonly run: (input: never) => CheckResultBase };

export const CHECKS = {
  pilot_height: def('Pilot height above rail', pilotHeightInput, checkPilotHeight),
  chain_wear: def('Hand brake chain wear', chainWearInput, checkChainWear),
  interval: def('Inspection or test interval', intervalInput, checkInterval),
  wheel_flat: def('Wheel flat or shelled spot', wheelFlatInput, checkWheelFlat),
  flange_thickness: def('Wheel flange thickness', flangeThicknessInput, checkFlangeThickness),
  rim_thickness: def('Wheel rim thickness', rimThicknessInput, checkRimThickness),
  tread_hollow: def('Wheel tread worn hollow', treadHollowInput, checkTreadHollow),
  sanders: def('Failed sanders, lead road unit', sanderDaysInput, checkSanderDays),
} as const satisfies { readonly [K in CheckKey]: AnyCheck };

export type CheckInput<K extends CheckKey> = z.input<(typeof CHECKS)[K]['schema']>;
export type CheckOutput<K extends CheckKey> = ReturnType<(typeof CHECKS)[K]['run']>;

export type RunCheckOutcome =
  | { readonly ok: true; readonly check: CheckKey; readonly output: CheckOutput<CheckKey> }
  | { readonly ok: false; readonly check: CheckKey; readonly error: z.ZodError };

/** Validates an untrusted body against the check's schema and runs it; the route only maps the outcome to 200 / 400. */
export const runCheck = (check: CheckKey, body: unknown): RunCheckOutcome => {
  const { schema, run } = CHECKS[check] as unknown as CheckDefinition<z.ZodType, CheckResultBase>;
  const parsed = schema.safeParse(body);
  if (!parsed.success) return { ok: false, check, error: parsed.error };
  return { ok: true, check, output: run(parsed.data) as CheckOutput<CheckKey> };
};
