/** Hoodline's mark: a hood unit in plan with its F end shown as a bar. */
export function Logo({ size = 44 }: { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 48 48" aria-hidden="true" className="shrink-0">
      <rect x="3" y="14" width="42" height="20" rx="2" fill="none" stroke="currentColor" strokeWidth="3" />
      <rect x="9" y="18" width="10" height="12" fill="currentColor" />
      <path d="M3 14v20" stroke="var(--color-accent)" strokeWidth="6" />
      <circle cx="14" cy="39" r="3" fill="currentColor" />
      <circle cx="34" cy="39" r="3" fill="currentColor" />
    </svg>
  );
}
