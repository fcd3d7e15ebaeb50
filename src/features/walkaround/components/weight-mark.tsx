/** A finding's weight by shape and colour, as the pins draw it, and always with the word (glare, colour-blindness). */
export type Weight = 'federal' | 'shop' | 'note';

const WORD: Record<Weight, string> = { federal: 'Federal', shop: 'Shop', note: 'Note' };

export function WeightShape({ weight, size = 18 }: { weight: Weight; size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 20 20" aria-hidden="true" className="shrink-0">
      {weight === 'federal' && <path d="M10 1 L19 10 L10 19 L1 10 Z" fill="var(--color-federal)" stroke="var(--color-federal)" strokeWidth="1" />}
      {weight === 'shop' && <circle cx="10" cy="10" r="6.5" fill="none" stroke="var(--color-shop)" strokeWidth="4" />}
      {weight === 'note' && <circle cx="10" cy="10" r="4.5" fill="var(--color-note)" />}
    </svg>
  );
}

export function WeightMark({ weight, size }: { weight: Weight; size?: number }) {
  const colour = weight === 'federal' ? 'text-federal' : weight === 'shop' ? 'text-shop' : 'text-note';
  return (
    <span className={`inline-flex items-center gap-1.5 font-bold ${colour}`} data-weight={weight}>
      <WeightShape weight={weight} size={size} />
      {WORD[weight]}
    </span>
  );
}
