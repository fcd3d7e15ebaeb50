import type { Role } from '../domain/roles';
import type { FindingState } from '../domain/states';

/** What can happen to a finding after it is pinned (product.md §6). Verified and voided are final. */
export const FINDING_ACTIONS = ['assign', 'repair', 'verify', 'send_back', 'void'] as const;
export type FindingAction = (typeof FINDING_ACTIONS)[number];

interface Rule {
  from: readonly FindingState[];
  to: FindingState | 'same';
  roles: readonly Role[];
  /** The event kind recorded for the change. */
  event: 'assigned' | 'repaired' | 'verified' | 'sent_back' | 'voided';
}

export const TRANSITIONS: Record<FindingAction, Rule> = {
  // Assigning starts the repair; re-assigning an in-repair finding keeps its state.
  assign: { from: ['open', 'in_repair'], to: 'in_repair', roles: ['foreman'], event: 'assigned' },
  repair: { from: ['open', 'in_repair'], to: 'repaired', roles: ['foreman'], event: 'repaired' },
  verify: { from: ['repaired'], to: 'verified', roles: ['inspector', 'foreman'], event: 'verified' },
  send_back: { from: ['repaired'], to: 'in_repair', roles: ['inspector', 'foreman'], event: 'sent_back' },
  void: { from: ['open', 'in_repair', 'repaired'], to: 'voided', roles: ['inspector', 'foreman'], event: 'voided' },
};

export type TransitionVerdict = { ok: true; to: FindingState } | { ok: false; reason: 'role' | 'state' };

/** Pure check of one transition; the server adds who-may-verify-whom on top. */
export function transition(action: FindingAction, from: FindingState, role: Role): TransitionVerdict {
  const rule = TRANSITIONS[action];
  if (!rule.roles.includes(role)) return { ok: false, reason: 'role' };
  if (!rule.from.includes(from)) return { ok: false, reason: 'state' };
  return { ok: true, to: rule.to === 'same' ? from : rule.to };
}

/** States in which a finding still needs work; a federal one in these keeps the unit non-complying. */
export const OPEN_STATES: readonly FindingState[] = ['open', 'in_repair'];
/** States shown in the repair queue. */
export const QUEUE_STATES: readonly FindingState[] = ['open', 'in_repair', 'repaired'];
