import type { CoverageSummary } from '../../../../shared/api/walkaround';

/**
 * How much of the routine is done: passed, with a finding, not applicable, and what is left.
 * `waiting` parts are counted as the server will count them once the changes kept on this device arrive.
 */
export function CoverageBar({ coverage, waiting = 0 }: { coverage: CoverageSummary; waiting?: number }) {
  const { total, passed, findings, notApplicable } = coverage;
  const left = total - passed - findings - notApplicable;
  const pct = (n: number) => (total ? (n / total) * 100 : 0);
  return (
    <div className="space-y-1" data-testid="coverage">
      <div
        className="flex h-5 w-full overflow-hidden rounded border-2 border-graphite bg-paper"
        role="progressbar"
        aria-label="Coverage of the routine"
        aria-valuemin={0}
        aria-valuemax={total}
        aria-valuenow={total - left}
        aria-valuetext={`${total - left} of ${total} parts done`}
      >
        <div className="h-full bg-ok" style={{ width: `${pct(passed)}%` }} />
        <div className="h-full bg-graphite" style={{ width: `${pct(findings)}%` }} />
        <div className="h-full bg-[repeating-linear-gradient(45deg,var(--color-graphite-2)_0_3px,transparent_3px_7px)]" style={{ width: `${pct(notApplicable)}%` }} />
      </div>
      <p className="flex flex-wrap gap-x-4 gap-y-0 text-base font-bold">
        <span>
          <span className="mr-1 inline-block h-3 w-3 rounded-sm bg-ok align-middle" aria-hidden="true" />
          {passed} passed
        </span>
        <span>
          <span className="mr-1 inline-block h-3 w-3 rounded-sm bg-graphite align-middle" aria-hidden="true" />
          {findings} with a finding
        </span>
        <span>
          <span className="mr-1 inline-block h-3 w-3 rounded-sm border border-graphite-2 align-middle" aria-hidden="true" />
          {notApplicable} n.a.
        </span>
        <span data-testid="coverage-left">{left} left</span>
        {waiting > 0 && (
          <span data-testid="coverage-waiting" className="rounded border-2 border-dashed border-shop px-1.5 leading-snug">
            {waiting} {waiting === 1 ? 'part' : 'parts'} waiting to send
          </span>
        )}
      </p>
    </div>
  );
}
