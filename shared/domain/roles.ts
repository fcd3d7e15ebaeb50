export const ROLES = ['inspector', 'foreman', 'engineer', 'trainer', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  inspector: 'Inspector',
  foreman: 'Foreman',
  engineer: 'Engineer',
  trainer: 'Trainer',
  admin: 'Admin',
};

/** Who may do what, by capability; routes and screens both read this one table (product.md §2). */
export const CAN = {
  inspect: ['inspector', 'foreman'],
  repair: ['foreman'],
  readRecords: ['inspector', 'foreman', 'engineer', 'admin'],
  readFleet: ['engineer', 'foreman', 'admin'],
  train: ['trainer'],
  takeQuiz: ['inspector', 'foreman', 'engineer', 'trainer', 'admin'],
  administer: ['admin'],
  readOutbox: ['admin'],
} as const satisfies Record<string, readonly Role[]>;
export type Capability = keyof typeof CAN;
export const can = (role: Role, cap: Capability): boolean => (CAN[cap] as readonly Role[]).includes(role);
