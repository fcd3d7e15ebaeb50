import type { FindingWeight } from '../../../../shared/domain/states';

const WORD: Record<FindingWeight, string> = { federal: 'Federal', shop: 'Shop', note: 'Note' };

/**
 * A finding's weight by shape, colour and word, so it reads in glare and without colour:
 * federal a filled deep-red diamond, shop an amber ring, note a small slate dot.
 */
export function WeightShape({ weight, size = 18 }: { weight: FindingWeight; size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 20 20" aria-hidden="true" className="shrink-0" data-shape={weight}>
      {weight === 'federal' && <path d="M10 1 L19 10 L10 19 L1 10 Z" fill="var(--color-federal)" />}
      {weight === 'shop' && <circle cx="10" cy="10" r="6.5" fill="none" stroke="var(--color-shop)" strokeWidth="4" />}
      {weight === 'note' && <circle cx="10" cy="10" r="4" fill="var(--color-note)" />}
    </svg>
  );
}

export function WeightMark({ weight, size }: { weight: FindingWeight; size?: number }) {
  const colour = weight === 'federal' ? 'text-federal' : weight === 'shop' ? 'text-shop' : 'text-note';
  return (
    <span className={`inline-flex items-center gap-1.5 font-bold ${colour}`} data-weight={weight}>
      <WeightShape weight={weight} size={size} />
      {WORD[weight]}
    </span>
  );
}
