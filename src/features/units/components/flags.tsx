import type { FrontEnd } from '../../../../shared/domain/frames';
import type { UnitDueState } from '../../../../shared/due/board';
import { FRONT_END_WORDS } from '../lib/format';

/**
 * A small side view of a hood unit, short hood at the left, the hood that carries the F filled
 * with the F cut out of it, so the end reads without the words too.
 */
export function FrontEndGlyph({ frontEnd, size = 22 }: { frontEnd: FrontEnd; size?: number }) {
  const short = frontEnd === 'short_hood';
  const ink = 'var(--color-graphite)';
  const paper = 'var(--color-paper)';
  return (
    <svg width={(size * 46) / 18} height={size} viewBox="0 0 46 18" aria-hidden="true" className="shrink-0" data-front-end={frontEnd}>
      {/* short hood, cab, long hood, frame */}
      <rect x="2" y="6" width="9" height="8" fill={short ? ink : 'none'} stroke={ink} strokeWidth="1.4" />
      <rect x="11" y="1.5" width="8" height="12.5" fill="none" stroke={ink} strokeWidth="1.4" />
      <rect x="19" y="6" width="25" height="8" fill={short ? 'none' : ink} stroke={ink} strokeWidth="1.4" />
      <line x1="1" y1="15.5" x2="45" y2="15.5" stroke={ink} strokeWidth="1.6" />
      <text x={short ? 6.5 : 31.5} y="13" textAnchor="middle" fontSize="8.5" fontWeight="700" fontFamily="inherit" fill={paper}>
        F
      </text>
    </svg>
  );
}

export function FrontEndWords({ frontEnd }: { frontEnd: FrontEnd }) {
  return (
    <span className="inline-flex items-center gap-1.5 whitespace-nowrap">
      <FrontEndGlyph frontEnd={frontEnd} />
      {FRONT_END_WORDS[frontEnd]}
    </span>
  );
}

/** The unit may move only as 49 CFR 229.9 allows: a filled deep-red diamond and the word, never colour alone. */
export function NonComplyingFlag({ large = false }: { large?: boolean }) {
  return (
    <span
      data-flag="non-complying"
      className={`inline-flex items-center gap-1.5 rounded border-2 border-federal bg-federal font-bold leading-none tracking-wider whitespace-nowrap text-paper ${large ? 'px-2.5 py-1.5 text-lg' : 'px-1.5 py-1 text-sm'}`}
    >
      <svg width={large ? 16 : 12} height={large ? 16 : 12} viewBox="0 0 20 20" aria-hidden="true">
        <path d="M10 1 L19 10 L10 19 L1 10 Z" fill="currentColor" />
      </svg>
      NON-COMPLYING
    </span>
  );
}

/** Overdue on the due board: an hourglass and the word, graphite on paper (blue and red mean other things). */
export function DueFlag({ state, large = false }: { state: UnitDueState; large?: boolean }) {
  if (state === 'good') return null;
  const overdue = state === 'overdue';
  return (
    <span
      data-flag={overdue ? 'overdue' : 'due-soon'}
      className={`inline-flex items-center gap-1.5 rounded border-2 border-graphite font-bold leading-none tracking-wider whitespace-nowrap ${overdue ? 'bg-graphite text-paper' : 'border-dashed text-graphite'} ${large ? 'px-2.5 py-1.5 text-lg' : 'px-1.5 py-1 text-sm'}`}
    >
      <svg width={large ? 14 : 11} height={large ? 16 : 13} viewBox="0 0 14 16" aria-hidden="true">
        <path d="M2 1 H12 M2 15 H12 M3 1 C3 6 11 10 11 15 M11 1 C11 6 3 10 3 15" fill="none" stroke="currentColor" strokeWidth="1.8" />
      </svg>
      {overdue ? 'OVERDUE' : 'DUE SOON'}
    </span>
  );
}
