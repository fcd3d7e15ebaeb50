import { z } from 'zod';
import { capLengths, lengthUnitSchema, lengthValue, type CheckResultBase } from './result';
import { atLeast, atMost, formatInches, lessThan, toInches } from './units';

/**
 * Wheel condemning limits, 49 CFR 229.75. Each check takes one gauged length
 * and says whether the wheel must be condemned.
 */

/** Service the unit is in. 'yard' covers yard and switching service. */
export const wheelServiceSchema = z.enum(['road', 'yard']);
export type WheelService = z.infer<typeof wheelServiceSchema>;

export interface WheelResult extends CheckResultBase {
  readonly valueIn: number;
  /** The edge of the limit, in inches. */
  readonly limitIn: number;
}

// --- flat or shelled spot: 229.75(a), (d) ---
export const SPOT_SINGLE_MAX_IN = 2.5;
export const SPOT_ADJOINING_MAX_IN = 2;

export const wheelFlatInput = capLengths(
  z.object({
    /** Length of the spot along the tread. */
    length: lengthValue,
    /** Length of a second spot adjoining the first, if there is one. */
    adjoiningLength: lengthValue.optional(),
    unit: lengthUnitSchema,
    spot: z.enum(['flat', 'shelled']).optional(),
  }),
  ['length', 'adjoiningLength'],
);
export type WheelFlatInput = z.input<typeof wheelFlatInput>;

export interface WheelFlatResult extends WheelResult {
  readonly adjoiningIn: number | null;
}

/** Condemned: one spot 2½ in or longer, or two adjoining spots each 2 in or longer. */
export const checkWheelFlat = (input: WheelFlatInput): WheelFlatResult => {
  const { length, adjoiningLength, unit, spot = 'flat' } = wheelFlatInput.parse(input);
  const valueIn = toInches(length, unit);
  const adjoiningIn = adjoiningLength === undefined ? null : toInches(adjoiningLength, unit);
  const single = atLeast(Math.max(valueIn, adjoiningIn ?? 0), SPOT_SINGLE_MAX_IN);
  const pair = adjoiningIn !== null && atLeast(valueIn, SPOT_ADJOINING_MAX_IN) && atLeast(adjoiningIn, SPOT_ADJOINING_MAX_IN);
  return {
    result: single || pair ? 'fail' : 'pass',
    limit:
      `${spot} spot shorter than ${formatInches(SPOT_SINGLE_MAX_IN)}, ` +
      `and not two adjoining spots each ${formatInches(SPOT_ADJOINING_MAX_IN)} or longer`,
    source: spot === 'flat' ? '49 CFR 229.75(a)' : '49 CFR 229.75(d)',
    valueIn,
    adjoiningIn,
    limitIn: adjoiningIn === null ? SPOT_SINGLE_MAX_IN : SPOT_ADJOINING_MAX_IN,
  };
};

// --- flange thickness: 229.75(f) ---
export const FLANGE_MIN_IN = 7 / 8;

export const flangeThicknessInput = capLengths(z.object({ value: lengthValue, unit: lengthUnitSchema }), ['value']);
export type FlangeThicknessInput = z.input<typeof flangeThicknessInput>;

/** Condemned: flange worn to 7/8 in thick or less, gauged 3/8 in above the tread. */
export const checkFlangeThickness = (input: FlangeThicknessInput): WheelResult => {
  const { value, unit } = flangeThicknessInput.parse(input);
  const valueIn = toInches(value, unit);
  return {
    result: atMost(valueIn, FLANGE_MIN_IN) ? 'fail' : 'pass',
    limit: `flange thicker than ${formatInches(FLANGE_MIN_IN)}, gauged ${formatInches(3 / 8)} above the tread`,
    source: '49 CFR 229.75(f)',
    valueIn,
    limitIn: FLANGE_MIN_IN,
  };
};

// --- rim thickness: 229.75(j) ---
export const RIM_MIN_IN: Readonly<Record<WheelService, number>> = { road: 1, yard: 3 / 4 };

export const rimThicknessInput = capLengths(
  z.object({ value: lengthValue, unit: lengthUnitSchema, service: wheelServiceSchema.optional() }),
  ['value'],
);
export type RimThicknessInput = z.input<typeof rimThicknessInput>;

/** Condemned: rim thinner than 1 in (road service) or ¾ in (yard service). */
export const checkRimThickness = (input: RimThicknessInput): WheelResult => {
  const { value, unit, service = 'road' } = rimThicknessInput.parse(input);
  const valueIn = toInches(value, unit);
  const limitIn = RIM_MIN_IN[service];
  return {
    result: lessThan(valueIn, limitIn) ? 'fail' : 'pass',
    limit: `rim at least ${formatInches(limitIn)} thick (${service} service)`,
    source: '49 CFR 229.75(j)',
    valueIn,
    limitIn,
  };
};

// --- tread worn hollow: 229.75(g) ---
export const TREAD_HOLLOW_MAX_IN: Readonly<Record<WheelService, number>> = { road: 5 / 16, yard: 3 / 8 };

export const treadHollowInput = capLengths(
  z.object({ value: lengthValue, unit: lengthUnitSchema, service: wheelServiceSchema.optional() }),
  ['value'],
);
export type TreadHollowInput = z.input<typeof treadHollowInput>;

/** Condemned: tread worn hollow 5/16 in or more (road service) or 3/8 in or more (switching service). */
export const checkTreadHollow = (input: TreadHollowInput): WheelResult => {
  const { value, unit, service = 'road' } = treadHollowInput.parse(input);
  const valueIn = toInches(value, unit);
  const limitIn = TREAD_HOLLOW_MAX_IN[service];
  return {
    result: atLeast(valueIn, limitIn) ? 'fail' : 'pass',
    limit: `tread hollow less than ${formatInches(limitIn)} (${service === 'road' ? 'road' : 'switching'} service)`,
    source: '49 CFR 229.75(g)',
    valueIn,
    limitIn,
  };
};
