import type { FindingWeight } from '../../../../shared/domain/states';

/** The product's weight shapes (federal filled diamond, shop ring, note dot), so weights read without colour. */
export function WeightGlyph({ weight, size = 16 }: { weight: FindingWeight; size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 20 20" aria-hidden="true" className="shrink-0">
      {weight === 'federal' && <path d="M10 1 L19 10 L10 19 L1 10 Z" fill="var(--color-federal)" />}
      {weight === 'shop' && <circle cx="10" cy="10" r="6.5" fill="none" stroke="var(--color-shop)" strokeWidth="4" />}
      {weight === 'note' && <circle cx="10" cy="10" r="4" fill="var(--color-note)" />}
    </svg>
  );
}

export const WEIGHT_WORD: Record<FindingWeight, string> = { federal: 'Federal', shop: 'Shop', note: 'Note' };
