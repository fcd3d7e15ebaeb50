import type { FindingState } from '../../../../shared/domain/states';
import { STATE_WORDS } from '../lib/format';

/** The unit may move only as 49 CFR 229.9 allows: said in words, in a box that reads in glare. */
export function NonComplyingBadge() {
  return (
    <span className="inline-flex items-center gap-1 rounded border-2 border-federal bg-federal px-1.5 py-0.5 text-sm leading-none font-bold tracking-wider text-paper">
      <svg width="12" height="12" viewBox="0 0 20 20" aria-hidden="true">
        <path d="M10 1 L19 10 L10 19 L1 10 Z" fill="currentColor" />
      </svg>
      NON-COMPLYING
    </span>
  );
}

const STATE_STYLE: Record<FindingState, string> = {
  open: 'border-graphite text-graphite',
  in_repair: 'border-graphite bg-paper-2 text-graphite',
  repaired: 'border-ok text-ok',
  verified: 'border-ok bg-ok text-paper',
  voided: 'border-rule text-graphite-2 line-through',
};

export function StateBadge({ state }: { state: FindingState }) {
  return <span className={`inline-block rounded border-2 px-1.5 py-0.5 text-sm leading-none font-bold whitespace-nowrap uppercase ${STATE_STYLE[state]}`}>{STATE_WORDS[state]}</span>;
}

/** The unit is overdue on an inspection or test interval (the due board says which). */
export function OverdueBadge() {
  return (
    <span className="inline-block rounded border-2 border-federal px-1.5 py-0.5 text-sm leading-none font-bold whitespace-nowrap text-federal" title="Overdue on an inspection or test: see the due board">
      Intervals overdue
    </span>
  );
}
