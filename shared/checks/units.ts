/**
 * Length units. Measurements are entered in inches or millimetres and every
 * limit is stated in inches, so each check converts to inches first.
 */
export const LENGTH_UNITS = ['in', 'mm'] as const;
export type LengthUnit = (typeof LENGTH_UNITS)[number];

/** 1 in = 25.4 mm exactly (international inch, 1959). */
export const MM_PER_IN = 25.4;

/**
 * Slack allowed when a measurement is compared with a limit, in inches.
 * It only absorbs binary floating-point noise from unit conversion
 * (76.2 mm / 25.4 = 3.0000000000000004): 1e-9 in is about 25 picometres,
 * far below the resolution of any gauge, so it never changes a real reading's verdict.
 */
export const LENGTH_TOLERANCE_IN = 1e-9;

/** Converts a length in `unit` to inches. */
export const toInches = (value: number, unit: LengthUnit): number => (unit === 'in' ? value : value / MM_PER_IN);

/** Converts a length in inches to `unit`. */
export const fromInches = (inches: number, unit: LengthUnit): number => (unit === 'in' ? inches : inches * MM_PER_IN);

/** a ≥ b, allowing float noise. */
export const atLeast = (a: number, b: number, tol = LENGTH_TOLERANCE_IN): boolean => a >= b - tol;
/** a ≤ b, allowing float noise. */
export const atMost = (a: number, b: number, tol = LENGTH_TOLERANCE_IN): boolean => a <= b + tol;
/** a < b by more than float noise. */
export const lessThan = (a: number, b: number, tol = LENGTH_TOLERANCE_IN): boolean => a < b - tol;
/** a > b by more than float noise. */
export const greaterThan = (a: number, b: number, tol = LENGTH_TOLERANCE_IN): boolean => a > b + tol;

const FRACTIONS: ReadonlyArray<readonly [number, string]> = [
  [1 / 16, '1/16'], [1 / 8, '1/8'], [3 / 16, '3/16'], [1 / 4, '1/4'], [5 / 16, '5/16'], [3 / 8, '3/8'],
  [7 / 16, '7/16'], [1 / 2, '1/2'], [9 / 16, '9/16'], [5 / 8, '5/8'], [11 / 16, '11/16'], [3 / 4, '3/4'],
  [13 / 16, '13/16'], [7 / 8, '7/8'], [15 / 16, '15/16'],
];

/** Human text for a limit in inches, with the exact millimetre value: "2 1/2 in (63.5 mm)". */
export const formatInches = (inches: number): string => {
  const whole = Math.floor(inches + LENGTH_TOLERANCE_IN);
  const rest = inches - whole;
  const frac = FRACTIONS.find(([v]) => Math.abs(v - rest) < 1e-9)?.[1];
  const inText = Math.abs(rest) < 1e-9 ? `${whole}` : frac ? (whole ? `${whole} ${frac}` : frac) : `${inches}`;
  const mm = Math.round(fromInches(inches, 'mm') * 1000) / 1000;
  return `${inText} in (${mm} mm)`;
};
