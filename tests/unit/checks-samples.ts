import type { CheckKey } from '../../shared/api/checks';

/** A valid body for each check, used to show that every registry entry runs. */
export const SAMPLE_BODIES: Record<CheckKey, Record<string, unknown>> = {
  pilot_height: { value: 4, unit: 'in' },
  chain_wear: { nominal: 0.5, measured: 0.45, unit: 'in' },
  interval: { interval: 'periodic', lastDone: '2026-01-10', on: '2026-02-01' },
  wheel_flat: { length: 1, unit: 'in' },
  flange_thickness: { value: 1.1, unit: 'in' },
  rim_thickness: { value: 1.5, unit: 'in' },
  tread_hollow: { value: 0.1, unit: 'in' },
  sanders: { discovered: '2026-01-10', on: '2026-01-12' },
};
