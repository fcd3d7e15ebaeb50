import { useQuery } from '@tanstack/react-query';
import { OPEN_STATES } from '../../../../shared/repairs/transitions';
import { ApiError } from '../../../lib/api-client';
import { unitsQuery } from '../api/pickers';
import { queueQuery } from '../api/queue';
import { useClearTag } from '../api/tag';
import { formatWhen } from '../lib/format';

/**
 * Units still tagged non-complying although no federal finding on them needs work any more:
 * the foreman clears each tag here (who and when are recorded by the server).
 */
export function TagsToClear({ timeZone }: { timeZone?: string }) {
  const units = useQuery(unitsQuery());
  const federal = useQuery(queueQuery({ weight: 'federal' }));
  const clear = useClearTag();
  if (!units.data || !federal.data) return null;
  const busy = new Set(federal.data.items.filter((f) => OPEN_STATES.includes(f.state)).map((f) => f.unitId));
  const ready = units.data.items.filter((u) => u.nonComplying && !busy.has(u.id));
  const done = clear.data;
  if (!ready.length && !done) return null;
  return (
    <section aria-labelledby="tags-to-clear" className="card space-y-2 border-ok p-3">
      <h2 id="tags-to-clear" className="text-xl font-bold">
        Non-complying tags ready to clear
      </h2>
      {ready.length > 0 && <p>No federal finding on these units needs work any more. Clear the tag once you have checked the unit.</p>}
      <ul className="flex flex-wrap gap-2">
        {ready.map((u) => (
          <li key={u.id}>
            <button className="btn" disabled={clear.isPending} onClick={() => clear.mutate(u.id)}>
              Clear the non-complying tag of {u.roadNumber}
            </button>
          </li>
        ))}
      </ul>
      {done && (
        <p role="status" className="font-bold text-ok">
          Tag of {units.data.items.find((u) => u.id === done.unitId)?.roadNumber ?? 'the unit'} cleared by {done.clearedBy} at {formatWhen(done.clearedAt, timeZone)}.
        </p>
      )}
      {clear.error instanceof ApiError && (
        <p role="alert" className="field-error">
          {clear.error.message}
        </p>
      )}
    </section>
  );
}
