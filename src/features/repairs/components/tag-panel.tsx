import { useQuery } from '@tanstack/react-query';
import { OPEN_STATES } from '../../../../shared/repairs/transitions';
import type { FindingState } from '../../../../shared/domain/states';
import { ApiError } from '../../../lib/api-client';
import { unitHistoryQuery, unitTagQuery, useClearTag } from '../api/tag';
import { formatWhen } from '../lib/format';

/**
 * The unit's non-complying tag (49 CFR 229.9) as this finding's page sees it: open with what still
 * needs work, ready for the foreman to clear, or cleared with who and when.
 */
export function TagPanel({ unitId, roadNumber, canClear, timeZone }: { unitId: string; roadNumber: string; canClear: boolean; timeZone?: string }) {
  const tag = useQuery(unitTagQuery(unitId));
  const history = useQuery({ ...unitHistoryQuery(unitId), enabled: tag.data?.open === false });
  const clear = useClearTag();
  if (!tag.data) return null;
  if (!tag.data.open) {
    const last = history.data?.items.find((h) => h.kind === 'tag_cleared' || h.kind === 'tag_opened');
    const cleared = clear.data ? { by: clear.data.clearedBy, at: clear.data.clearedAt } : last?.kind === 'tag_cleared' ? { by: last.actor ?? 'someone', at: last.at } : null;
    if (!cleared) return null;
    return (
      <section aria-label="Non-complying tag" className="card border-ok p-3" role="status">
        <p className="font-bold text-ok">
          {roadNumber} is compliant: tag cleared by {cleared.by} at {formatWhen(cleared.at, timeZone)}.
        </p>
      </section>
    );
  }
  const t = tag.data.tag;
  // The tag lists repaired findings too; only open and in-repair ones keep the tag on (the server's rule for clearing).
  const left = tag.data.defects.filter((d) => OPEN_STATES.includes(d.state as FindingState));
  const waiting = tag.data.defects.filter((d) => d.state === 'repaired');
  return (
    <section aria-label="Non-complying tag" className="card space-y-2 border-federal p-3">
      <p className="font-bold text-federal">
        {roadNumber} is tagged non-complying{t ? ` since ${formatWhen(t.openedAt, timeZone)} (by ${t.openedBy})` : ''}. It moves only as 49 CFR 229.9 allows.
      </p>
      {left.length > 0 ? (
        <p>
          {left.length} federal finding{left.length === 1 ? '' : 's'} still need{left.length === 1 ? 's' : ''} work: {left.map((d) => d.label).join('; ')}.
        </p>
      ) : (
        <>
          <p>No federal finding on this unit needs work any more.</p>
          {waiting.length > 0 && (
            <p className="text-graphite-2">
              Repaired, waiting for an inspector to verify: {waiting.map((d) => d.label).join('; ')}.
            </p>
          )}
          {canClear && (
            <button type="button" className="btn-primary" disabled={clear.isPending} onClick={() => clear.mutate(unitId)}>
              Clear the non-complying tag
            </button>
          )}
        </>
      )}
      {clear.error instanceof ApiError && (
        <p role="alert" className="field-error">
          {clear.error.message}
        </p>
      )}
    </section>
  );
}
