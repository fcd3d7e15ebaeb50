/** Rule checks: pure functions from a measurement or dates to pass/fail with the limit and its source. */
export * from './units';
export * from './result';
export * from './civil-date';
export * from './pilot-height';
export * from './chain-wear';
export * from './interval';
export * from './wheel';
export * from './sanders';

/** Every check the registry (shared/api/checks.ts) serves; defect types refer to these. */
export const CHECK_KEYS = [
  'pilot_height',
  'chain_wear',
  'interval',
  'wheel_flat',
  'flange_thickness',
  'rim_thickness',
  'tread_hollow',
  'sanders',
] as const;
export type CheckKey = (typeof CHECK_KEYS)[number];
export const isCheckKey = (v: string): v is CheckKey => (CHECK_KEYS as readonly string[]).includes(v);
