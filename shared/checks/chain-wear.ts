import { z } from 'zod';
import { capLengths, lengthUnitSchema, lengthValue, type CheckResultBase } from './result';
import { toInches } from './units';

/** Largest share of a link's cross-section that may be worn away (common practice, no source). */
export const CHAIN_MAX_AREA_LOSS = 0.3;
/** Slack on the loss fraction for float noise only (e.g. measured = nominal·√0.7 gives 0.30000000000000004). */
const LOSS_TOLERANCE = 1e-9;

export const chainWearInput = capLengths(
  z.object({
    /** Diameter of the link stock when new. */
    nominal: lengthValue,
    /** Smallest diameter measured at the worn spot. */
    measured: lengthValue,
    unit: lengthUnitSchema,
  }),
  ['nominal', 'measured'],
).refine((v) => v.measured <= v.nominal, {
  path: ['measured'],
  message: 'measured diameter cannot be larger than the nominal diameter',
});
export type ChainWearInput = z.input<typeof chainWearInput>;

export interface ChainWearResult extends CheckResultBase {
  readonly nominalIn: number;
  readonly measuredIn: number;
  /** Area lost, 0..1, unrounded (the verdict uses this). */
  readonly lossFraction: number;
  /** Area lost in percent, rounded to 0.1 for display. */
  readonly percentLost: number;
  readonly maxPercentLost: number;
}

/**
 * Hand brake chain link wear. A link's section is circular, so its area
 * scales with the diameter squared: loss = 1 − (measured ÷ nominal)².
 * Fails when more than 30 % of the area is gone.
 */
export const checkChainWear = (input: ChainWearInput): ChainWearResult => {
  const { nominal, measured, unit } = chainWearInput.parse(input);
  const lossFraction = 1 - (measured / nominal) ** 2;
  return {
    result: lossFraction > CHAIN_MAX_AREA_LOSS + LOSS_TOLERANCE ? 'fail' : 'pass',
    limit: `no more than ${CHAIN_MAX_AREA_LOSS * 100} % of the link's cross-sectional area worn away`,
    source: 'common practice (no source); area formula: plain geometry',
    nominalIn: toInches(nominal, unit),
    measuredIn: toInches(measured, unit),
    lossFraction,
    percentLost: Math.round(lossFraction * 1000) / 10,
    maxPercentLost: CHAIN_MAX_AREA_LOSS * 100,
  };
};
