import { z } from 'zod';
import { capLengths, lengthUnitSchema, lengthValue, type CheckResultBase } from './result';
import { atLeast, atMost, formatInches, toInches } from './units';

export const PILOT_HEIGHT_MIN_IN = 3; // 49 CFR 229.123(a)
export const PILOT_HEIGHT_MAX_IN = 6; // 49 CFR 229.123(a)
export const PILOT_HEIGHT_HUMP_MAX_IN = 9; // 49 CFR 229.123(b), only when stencilled at each end

export const pilotHeightInput = capLengths(
  z.object({
    /** Clearance of the pilot, end plate or plow above the top of rail. */
    value: lengthValue,
    unit: lengthUnitSchema,
    service: z.enum(['road', 'hump_yard']).optional(),
    /** The unit carries the 9-inch maximum end plate height stencil at each end. */
    stencilled: z.boolean().optional(),
  }),
  ['value'],
);
export type PilotHeightInput = z.input<typeof pilotHeightInput>;

export interface PilotHeightResult extends CheckResultBase {
  readonly valueIn: number;
  readonly minIn: number;
  readonly maxIn: number;
  /** Why it failed: below the minimum or above the maximum; null on a pass. */
  readonly reason: 'below_min' | 'above_max' | null;
}

/**
 * Pilot / end plate / plow clearance above top of rail: 3 to 6 in; up to 9 in
 * only for hump-yard service with the stencil at each end. Hump-yard service
 * without the stencil is held to 6 in.
 */
export const checkPilotHeight = (input: PilotHeightInput): PilotHeightResult => {
  const { value, unit, service = 'road', stencilled = false } = pilotHeightInput.parse(input);
  const valueIn = toInches(value, unit);
  const hump = service === 'hump_yard' && stencilled;
  const minIn = PILOT_HEIGHT_MIN_IN;
  const maxIn = hump ? PILOT_HEIGHT_HUMP_MAX_IN : PILOT_HEIGHT_MAX_IN;
  const reason = !atLeast(valueIn, minIn) ? 'below_min' : !atMost(valueIn, maxIn) ? 'above_max' : null;
  const limit = hump
    ? `${formatInches(minIn)} to ${formatInches(maxIn)} above top of rail (hump-yard service, stencilled at each end; 10 mph over grade crossings when leading in switching service)`
    : `${formatInches(minIn)} to ${formatInches(maxIn)} above top of rail` +
      (service === 'hump_yard' ? ' (hump-yard service without the 9-inch stencil at each end is held to 6 in)' : '');
  return {
    result: reason ? 'fail' : 'pass',
    limit,
    source: hump ? '49 CFR 229.123(b)' : '49 CFR 229.123(a)',
    valueIn,
    minIn,
    maxIn,
    reason,
  };
};
