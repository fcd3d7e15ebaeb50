import { STATUS_WORDS, type ItemStatus } from '../lib/due-words';

const COLOUR: Record<ItemStatus, string> = {
  good: 'text-ok',
  due_soon: 'text-shop',
  overdue: 'text-federal',
  missing: 'text-federal',
  not_in_use: 'text-graphite-2',
};

/** Status by shape and word as well as colour: a tick, a half-filled clock, a struck square, a question, a dash. */
export function StatusShape({ status, size = 18 }: { status: ItemStatus; size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 20 20" aria-hidden="true" className="shrink-0" data-shape={status}>
      {status === 'good' && <path d="M3 10.5 L8 15.5 L17 4.5" fill="none" stroke="currentColor" strokeWidth="3.2" strokeLinecap="round" strokeLinejoin="round" />}
      {status === 'due_soon' && (
        <>
          <circle cx="10" cy="10" r="7.5" fill="none" stroke="currentColor" strokeWidth="2.5" />
          <path d="M10 2.5 A7.5 7.5 0 0 1 10 17.5 Z" fill="currentColor" />
        </>
      )}
      {status === 'overdue' && (
        <>
          <rect x="2" y="2" width="16" height="16" rx="2" fill="currentColor" />
          <path d="M10 5 V11.5 M10 14.2 V14.8" stroke="var(--color-paper)" strokeWidth="3" strokeLinecap="round" />
        </>
      )}
      {status === 'missing' && (
        <>
          <rect x="2.5" y="2.5" width="15" height="15" rx="2" fill="none" stroke="currentColor" strokeWidth="2.5" strokeDasharray="4 2.5" />
          <path d="M7.3 7.6 A2.8 2.8 0 1 1 10 11 V12 M10 14.6 V14.9" fill="none" stroke="currentColor" strokeWidth="2.2" strokeLinecap="round" />
        </>
      )}
      {status === 'not_in_use' && <path d="M4 10 H16" stroke="currentColor" strokeWidth="3" strokeLinecap="round" />}
    </svg>
  );
}

export function StatusMark({ status }: { status: ItemStatus }) {
  return (
    <span className={`inline-flex items-center gap-1.5 font-bold whitespace-nowrap ${COLOUR[status]}`} data-status={status}>
      <StatusShape status={status} />
      {STATUS_WORDS[status]}
    </span>
  );
}
