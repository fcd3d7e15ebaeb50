import { useState } from 'react';
import type { QueuePage } from '../../../../shared/api/repairs';
import { ApiError } from '../../../lib/api-client';
import { useClearTag } from '../api/tag';
import { formatWhen } from '../lib/format';

/**
 * Units still tagged non-complying although no federal finding on them needs work any more (the
 * server lists them with the queue, whatever its filters): the foreman clears each tag here (who and
 * when are recorded by the server).
 */
export function TagsToClear({ units, timeZone }: { units: QueuePage['tagsToClear']; timeZone?: string }) {
  const clear = useClearTag();
  // The unit leaves the list once its tag is cleared; keep its number for the confirmation.
  const [cleared, setCleared] = useState<string | null>(null);
  const done = clear.data;
  if (!units.length && !done) return null;
  return (
    <section aria-labelledby="tags-to-clear" className="card space-y-2 border-ok p-3">
      <h2 id="tags-to-clear" className="text-xl font-bold">
        Non-complying tags ready to clear
      </h2>
      {units.length > 0 && <p>No federal finding on these units needs work any more. Clear the tag once you have checked the unit.</p>}
      <ul className="flex flex-wrap gap-2">
        {units.map((u) => (
          <li key={u.unitId}>
            <button
              className="btn"
              disabled={clear.isPending}
              onClick={() => {
                setCleared(u.roadNumber);
                clear.mutate(u.unitId);
              }}
            >
              Clear the non-complying tag of {u.roadNumber}
            </button>
          </li>
        ))}
      </ul>
      {done && (
        <p role="status" className="font-bold text-ok">
          Tag of {cleared ?? 'the unit'} cleared by {done.clearedBy} at {formatWhen(done.clearedAt, timeZone)}.
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
