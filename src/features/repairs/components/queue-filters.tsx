import { useEffect, useId, useState } from 'react';
import { FINDING_STATES, FINDING_WEIGHTS } from '../../../../shared/domain/states';
import type { QueueFilterKey, QueueFilters } from '../api/queue';
import type { Yard } from '../api/pickers';
import { STATE_WORDS } from '../lib/format';
import { WEIGHT_WORD } from '../../../components/weight-mark';
import { useSendWhenTypingPauses } from '../../../lib/use-send-when-typing-pauses';

interface Props {
  filters: QueueFilters;
  onChange: (key: QueueFilterKey, value: string) => void;
  onClear: () => void;
  yards: Yard[];
  units: { id: string; roadNumber: string }[];
  people: { id: string; name: string }[];
}

/** Filters live in the address, so a filtered queue can be shared, reloaded and exported as it is. */
export function QueueFilterBar({ filters, onChange, onClear, yards, units, people }: Props) {
  const id = useId();
  const [text, setText] = useState(filters.q ?? '');
  useEffect(() => setText(filters.q ?? ''), [filters.q]);
  useSendWhenTypingPauses(text, text !== (filters.q ?? ''), (v) => onChange('q', v), 300);
  const any = Object.values(filters).some(Boolean);
  const [shown, setShown] = useState(false);
  const select = (key: QueueFilterKey, label: string, options: { value: string; label: string }[], all: string) => (
    <div>
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
  const set = Object.values(filters).filter(Boolean).length;
  return (
    <>
    {/* On a phone the filters fold away so the queue starts on the first screen. */}
    <button type="button" className="btn w-full md:hidden" aria-expanded={shown} aria-controls={`${id}-form`} onClick={() => setShown((s) => !s)}>
      {shown ? 'Hide filters' : `Filters${set ? ` (${set} set)` : ''}`}
    </button>
    <form id={`${id}-form`} role="search" aria-label="Filter the repair queue" className={`${shown ? 'grid' : 'hidden'} grid-cols-2 gap-3 md:grid md:grid-cols-4 lg:grid-cols-7`} onSubmit={(e) => e.preventDefault()}>
      <div className="col-span-2 md:col-span-4 lg:col-span-2">
        <label className="label" htmlFor={`${id}-q`}>
          Search unit or part
        </label>
        <input id={`${id}-q`} type="search" className="field" value={text} placeholder="e.g. 4104 or pilot" onChange={(e) => setText(e.target.value)} />
      </div>
      {select('yard', 'Yard', yards.map((y) => ({ value: y.id, label: y.name })), 'All yards')}
      {select('unit', 'Unit', units.map((u) => ({ value: u.id, label: u.roadNumber })), 'All units')}
      {select('state', 'State', FINDING_STATES.map((s) => ({ value: s, label: STATE_WORDS[s] })), 'In the queue')}
      {select('weight', 'Weight', FINDING_WEIGHTS.map((w) => ({ value: w, label: WEIGHT_WORD[w] })), 'All weights')}
      {select('assignee', 'Assigned to', people.map((p) => ({ value: p.id, label: p.name })), 'Anyone')}
      {any && (
        <div className="col-span-2 flex items-end md:col-span-4 lg:col-span-7">
          <button type="button" className="btn" onClick={onClear}>
            Clear filters
          </button>
        </div>
      )}
    </form>
    </>
  );
}
