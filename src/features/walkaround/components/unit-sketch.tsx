import type { FrontEnd } from '../../../../shared/domain/frames';

/**
 * A small side sketch of a hood unit, short hood at the left, with the F painted on the end that
 * carries it. Drawn the same way round in both choices so only the F moves.
 */
export function UnitSketch({ frontEnd, width = 220 }: { frontEnd: FrontEnd; width?: number }) {
  const fx = frontEnd === 'short_hood' ? 22 : 198;
  return (
    <svg width={width} height={width * 0.42} viewBox="0 0 220 92" aria-hidden="true" className="max-w-full">
      <g fill="var(--color-paper-2)" stroke="var(--color-graphite)" strokeWidth="2.5" strokeLinejoin="round">
        {/* short hood, cab, long hood */}
        <rect x="10" y="30" width="34" height="26" />
        <rect x="44" y="12" width="36" height="44" />
        <rect x="50" y="18" width="11" height="12" fill="var(--color-paper)" />
        <rect x="66" y="18" width="10" height="12" fill="var(--color-paper)" />
        <rect x="80" y="26" width="130" height="30" />
        <line x1="6" y1="56" x2="214" y2="56" />
        {/* trucks */}
        <rect x="26" y="58" width="56" height="8" />
        <rect x="140" y="58" width="56" height="8" />
      </g>
      <g fill="var(--color-graphite)">
        {[34, 54, 74, 150, 170, 190].map((x) => (
          <circle key={x} cx={x} cy="70" r="7" />
        ))}
      </g>
      <line x1="2" y1="78" x2="218" y2="78" stroke="var(--color-graphite-2)" strokeWidth="2" />
      <g>
        <rect x={fx - 13} y="29" width="26" height="26" rx="3" fill="var(--color-graphite)" />
        <text x={fx} y="49" textAnchor="middle" fontSize="22" fontWeight="700" fill="var(--color-paper)" fontFamily="inherit">
          F
        </text>
      </g>
      <text x="27" y="91" textAnchor="middle" fontSize="12" fill="var(--color-graphite-2)" fontFamily="inherit">
        short hood
      </text>
      <text x="145" y="91" textAnchor="middle" fontSize="12" fill="var(--color-graphite-2)" fontFamily="inherit">
        long hood
      </text>
    </svg>
  );
}
