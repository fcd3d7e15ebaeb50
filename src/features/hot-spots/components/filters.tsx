import type { HotSpotsParams } from '../../../../shared/api/hot-spots';
import { DEFECT_TYPES } from '../../../../shared/defects/catalogue';
import { PART_KINDS, isPartKind } from '../../../../shared/domain/parts';
import { FINDING_WEIGHTS, type FindingWeight } from '../../../../shared/domain/states';
import type { UnitTypeItem } from '../api/pickers';
import { WEIGHT_WORD, WeightShape } from '../../../components/weight-mark';

interface Props {
  filters: HotSpotsParams;
  /** A patch, or a function of the latest filters (so two quick taps both count). */
  onChange(patch: Partial<HotSpotsParams> | ((latest: HotSpotsParams) => Partial<HotSpotsParams>)): void;
  unitTypes: UnitTypeItem[];
  yards: { id: string; code: string; name: string }[];
  /** Part kinds drawn on this unit type, to offer only their defect types. */
  kinds: readonly string[];
}

const toggle = <T,>(list: readonly T[], v: T): T[] => (list.includes(v) ? list.filter((x) => x !== v) : [...list, v]);

export function Filters({ filters, onChange, unitTypes, yards, kinds }: Props) {
  const offered = DEFECT_TYPES.filter((d) => kinds.includes(d.partKind));
  const byKind = new Map<string, typeof offered>();
  for (const d of offered) byKind.set(d.partKind, [...(byKind.get(d.partKind) ?? []), d]);
  const kindLabel = (k: string) => (isPartKind(k) ? PART_KINDS[k].label : k);
  return (
    <form className="card grid grid-cols-2 gap-3 p-3 lg:grid-cols-[2fr_1fr_1fr]" aria-label="What to look at" onSubmit={(e) => e.preventDefault()}>
      <div className="col-span-2 lg:col-span-1">
        <label className="label" htmlFor="hs-type">Unit type</label>
        <select id="hs-type" className="field" value={filters.unitType} onChange={(e) => onChange({ unitType: e.target.value, defectTypes: [] })}>
          {unitTypes.map((t) => (
            <option key={t.key} value={t.key}>{t.name}</option>
          ))}
        </select>
      </div>
      <div>
        <label className="label" htmlFor="hs-from">From</label>
        <input id="hs-from" type="date" className="field" value={filters.from} max={filters.to} onChange={(e) => e.target.value && onChange({ from: e.target.value })} />
      </div>
      <div>
        <label className="label" htmlFor="hs-to">To</label>
        <input id="hs-to" type="date" className="field" value={filters.to} min={filters.from} onChange={(e) => e.target.value && onChange({ to: e.target.value })} />
      </div>
      <fieldset className="col-span-2 lg:col-span-1">
        <legend className="label">Weights</legend>
        <div className="flex flex-wrap gap-2">
          {FINDING_WEIGHTS.map((w: FindingWeight) => (
            <label key={w} className={`btn px-3 ${filters.weights.includes(w) ? 'border-accent bg-accent-soft' : ''}`}>
              <input type="checkbox" className="sr-only" checked={filters.weights.includes(w)} onChange={() => onChange((f) => ({ weights: toggle(f.weights, w) }))} />
              <WeightShape weight={w} size={16} />
              {WEIGHT_WORD[w]}
            </label>
          ))}
        </div>
        <p className="mt-1 text-sm text-graphite-2">{filters.weights.length ? 'Only the weights picked.' : 'All weights.'}</p>
      </fieldset>
      <fieldset className="col-span-2">
        <legend className="label">Yards</legend>
        <div className="flex flex-wrap gap-2">
          {yards.map((y) => (
            <label key={y.id} className={`btn px-3 ${filters.yards.includes(y.id) ? 'border-accent bg-accent-soft' : ''}`}>
              <input type="checkbox" className="sr-only" checked={filters.yards.includes(y.id)} onChange={() => onChange((f) => ({ yards: toggle(f.yards, y.id) }))} />
              {y.name}
            </label>
          ))}
        </div>
        <p className="mt-1 text-sm text-graphite-2">{filters.yards.length ? 'Inspections made at the yards picked.' : 'All yards.'}</p>
      </fieldset>
      <details className="col-span-2 lg:col-span-3">
        <summary className="flex min-h-12 cursor-pointer items-center text-lg font-bold">
          Defect types: {filters.defectTypes.length ? `${filters.defectTypes.length} picked` : 'all'}
        </summary>
        <div className="mt-2 flex flex-wrap gap-2">
          {filters.defectTypes.length > 0 && (
            <button type="button" className="btn" onClick={() => onChange({ defectTypes: [] })}>All defect types</button>
          )}
        </div>
        <div className="mt-2 grid max-h-80 gap-3 overflow-y-auto sm:grid-cols-2 lg:grid-cols-3">
          {[...byKind.entries()].map(([kind, types]) => (
            <fieldset key={kind}>
              <legend className="font-bold capitalize">{kindLabel(kind)}</legend>
              {types.map((d) => (
                <label key={d.key} className="flex min-h-12 items-center gap-2 text-base">
                  <input type="checkbox" className="size-5" checked={filters.defectTypes.includes(d.key)} onChange={() => onChange((f) => ({ defectTypes: toggle(f.defectTypes, d.key) }))} />
                  <WeightShape weight={d.weight} size={14} />
                  {d.label}
                </label>
              ))}
            </fieldset>
          ))}
        </div>
      </details>
    </form>
  );
}
