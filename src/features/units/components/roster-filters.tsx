import { useEffect, useId, useRef, useState } from 'react';
import { useSendWhenTypingPauses } from '../../../lib/use-send-when-typing-pauses';
import type { UnitTypeSummary, Yard } from '../api/pickers';
import type { RosterFilterKey, RosterFilters } from '../lib/filters';
import { FRONT_END_WORDS, SERVICE_STATE_WORDS } from '../lib/format';

const SEARCH_DELAY_MS = 250;

export function RosterFilterBar({
  filters,
  onChange,
  onClear,
  yards,
  unitTypes,
}: {
  filters: RosterFilters;
  onChange(key: RosterFilterKey, value: string): void;
  onClear(): void;
  yards: readonly Yard[];
  unitTypes: readonly UnitTypeSummary[];
}) {
  const id = useId();
  // The box answers at once; the URL (and the query) follow when typing pauses.
  const [q, setQ] = useState(filters.q ?? '');
  const sent = useRef(filters.q ?? '');
  useEffect(() => {
    // Only a change from elsewhere (back button, Clear) rewrites the box; our own echo must not eat fresh keystrokes.
    if ((filters.q ?? '') !== sent.current) {
      sent.current = filters.q ?? '';
      setQ(filters.q ?? '');
    }
  }, [filters.q]);
  useSendWhenTypingPauses(
    q.trim(),
    q.trim() !== sent.current,
    (v) => {
      sent.current = v;
      onChange('q', v);
    },
    SEARCH_DELAY_MS,
  );
  const any = Object.values(filters).some(Boolean);

  const select = (key: RosterFilterKey, label: string, options: readonly { value: string; label: string }[], all: string) => (
    <div className="min-w-0">
      <label className="label" htmlFor={`${id}-${key}`}>
        {label}
      </label>
      <select id={`${id}-${key}`} className="field" value={filters[key] ?? ''} onChange={(e) => onChange(key, e.target.value)}>
        <option value="">{all}</option>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </div>
  );

  return (
    <form role="search" aria-label="Find units" className="card grid grid-cols-2 gap-3 p-3 md:grid-cols-3 lg:grid-cols-6" onSubmit={(e) => {
        e.preventDefault();
        sent.current = q.trim();
        onChange('q', q.trim());
      }}>
      <div className="col-span-2 md:col-span-3 lg:col-span-2">
        <label className="label" htmlFor={`${id}-q`}>
          Road number
        </label>
        <input
          id={`${id}-q`}
          className="field"
          type="search"
          inputMode="search"
          autoComplete="off"
          placeholder="e.g. 4101"
          maxLength={40}
          value={q}
          onChange={(e) => setQ(e.target.value)}
        />
      </div>
      {select('yard', 'Yard', yards.map((y) => ({ value: y.id, label: y.name })), 'All yards')}
      {select('type', 'Unit type', unitTypes.map((t) => ({ value: t.key, label: t.name })), 'All types')}
      {select('frontEnd', 'F end', (['short_hood', 'long_hood'] as const).map((f) => ({ value: f, label: FRONT_END_WORDS[f] })), 'Either end')}
      {select(
        'state',
        'State',
        [...(['in_service', 'out_of_service', 'stored'] as const).map((s) => ({ value: s, label: SERVICE_STATE_WORDS[s] })), { value: 'non_complying', label: 'Non-complying' }],
        'Any state',
      )}
      {any && (
        <div className="col-span-2 flex justify-end md:col-span-3 lg:col-span-6">
          <button type="button" className="btn" onClick={onClear}>
            Clear filters
          </button>
        </div>
      )}
    </form>
  );
}
