import type { FindingWeight } from '../../shared/domain/states';

export const WEIGHT_WORD: Record<FindingWeight, string> = { federal: 'Federal', shop: 'Shop', note: 'Note' };

const TEXT_COLOUR: Record<FindingWeight, string> = { federal: 'text-federal', shop: 'text-shop', note: 'text-note' };

/**
 * A finding's weight as a shape, drawn as the canvas pins draw it (same proportions as PIN_SIZE):
 * federal a filled diamond, shop a ring, note a small dot, so it reads in glare and without colour.
 * Decorative on its own: put the word beside it, or use WeightMark.
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

/**
 * A finding's weight by shape, colour and word. `word="hidden"` keeps the word for screen readers only,
 * for tight rows where the shape stands beside other text; the name is never colour or shape alone.
 */
export function WeightMark({ weight, size = 18, word = 'shown' }: { weight: FindingWeight; size?: number; word?: 'shown' | 'hidden' }) {
  return (
    <span className={`inline-flex items-center gap-1.5 font-bold whitespace-nowrap ${TEXT_COLOUR[weight]}`} data-weight={weight}>
      <WeightShape weight={weight} size={size} />
      {word === 'shown' ? WEIGHT_WORD[weight] : <span className="sr-only">{WEIGHT_WORD[weight]}</span>}
    </span>
  );
}
