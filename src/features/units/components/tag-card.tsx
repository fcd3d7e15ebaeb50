import { Link } from 'react-router-dom';
import type { UnitTag } from '../api/tag';
import { formatWhen } from '../lib/format';

/** The open non-complying tag (49 CFR 229.9), with a link to the tag page for those who print it. */
export function TagCard({ tag, canOpenTagPage, timeZone }: { tag: UnitTag; canOpenTagPage: boolean; timeZone?: string }) {
  if (!tag.open || !tag.tag) return null;
  return (
    <section aria-labelledby="tag-title" className="card space-y-2 border-federal p-3">
      <h2 id="tag-title" className="flex items-center gap-2 text-xl font-bold text-federal">
        <svg width="16" height="16" viewBox="0 0 20 20" aria-hidden="true">
          <path d="M10 1 L19 10 L10 19 L1 10 Z" fill="currentColor" />
        </svg>
        Non-complying tag open
      </h2>
      <p>
        Opened {formatWhen(tag.tag.openedAt, timeZone)} by {tag.tag.openedBy}
        {tag.tag.place && ` at ${tag.tag.place}`}. It moves only as 49 CFR 229.9 allows.
      </p>
      {tag.tag.destination && <p>Destination: {tag.tag.destination}</p>}
      {tag.tag.restrictions && <p>Restrictions: {tag.tag.restrictions}</p>}
      {tag.defects.length > 0 && (
        <ul className="list-disc pl-5">
          {tag.defects.map((d) => (
            <li key={d.id}>
              {d.label}: {d.defect}
              {d.rule && <span className="text-graphite-2"> ({d.rule})</span>}
            </li>
          ))}
        </ul>
      )}
      {canOpenTagPage && (
        <Link to={`/walkaround/units/${tag.unit.id}/tag`} className="btn">
          Open the tag
        </Link>
      )}
    </section>
  );
}
