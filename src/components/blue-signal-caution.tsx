/**
 * The caution shown wherever Hoodline sends someone on, under or between equipment (49 CFR Part 218
 * Subpart B). Blue is used for this alone.
 */
export function BlueSignalCaution({ compact = false }: { compact?: boolean }) {
  return (
    <aside role="note" aria-label="Blue-signal caution" className="flex gap-3 rounded-md border-l-8 border-bluesignal bg-paper-2 p-3 text-base">
      <svg width="28" height="28" viewBox="0 0 28 28" aria-hidden="true" className="mt-0.5 shrink-0">
        <rect x="3" y="3" width="22" height="22" rx="3" fill="var(--color-bluesignal)" />
        <rect x="11" y="7" width="6" height="14" rx="1" fill="white" />
      </svg>
      <div>
        <p className="font-bold">Blue-signal protection first.</p>
        {!compact && (
          <p>
            Do not go on, under or between this unit or its consist until blue-signal protection under 49 CFR Part 218
            Subpart B is in place for your craft: blue signal displayed, access switches or derails lined and locked, and
            a blue signal on the controlling locomotive. Follow your railroad’s rules and local codes; Hoodline does not
            replace a qualified person’s judgement.
          </p>
        )}
      </div>
    </aside>
  );
}
