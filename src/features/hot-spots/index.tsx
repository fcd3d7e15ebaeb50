import { lazy, Suspense, useEffect, useMemo, useRef, useState, useSyncExternalStore } from 'react';
import { useSearchParams } from 'react-router-dom';
import type { HotSpotsParams } from '../../../shared/api/hot-spots';
import { formatCount, formatRate } from '../../../shared/hot-spots/rates';
import { instanceForRow } from '../../../shared/hot-spots/rows';
import type { LayoutPart } from '../../../shared/layout/unit-layout';
import { useQuery } from '@tanstack/react-query';
import { unitTypeLayoutQuery } from '../drawing/api/get-unit-layout';
import { findingsCsvHref, tableCsvHref, useHotSpots } from './api/hot-spots';
import { useUnitTypes, useYards } from './api/pickers';
import { Filters } from './components/filters';
import { HeatPlan } from './components/heat-plan';
import { HotSpotsTable } from './components/hot-spots-table';
import { RepeatUnits } from './components/repeat-units';
import { RowDetail } from './components/row-detail';
import { StandOuts } from './components/stand-outs';
import { filtersFromSearch, toQueryString } from './lib/params';

// The chart library loads only when the chart is drawn.
const TrendChart = lazy(() => import('./components/trend-chart'));

const wide = () => window.matchMedia('(min-width: 1024px)').matches;
function useWide() {
  return useSyncExternalStore(
    (cb) => {
      const m = window.matchMedia('(min-width: 1024px)');
      m.addEventListener('change', cb);
      return () => m.removeEventListener('change', cb);
    },
    wide,
    () => true,
  );
}

const dateWords = (d: string) => new Intl.DateTimeFormat('en-US', { timeZone: 'UTC', year: 'numeric', month: 'short', day: 'numeric' }).format(new Date(`${d}T00:00:00Z`));

/** Hot spots: where the fleet keeps failing, drawn on the unit front first. Lazy-loaded at /hot-spots/*. */
export default function HotSpotsScreen() {
  const [search, setSearch] = useSearchParams();
  const types = useUnitTypes();
  const yards = useYards();
  const defaultType = types.data?.items[0]?.key ?? '';
  const filters = useMemo(() => filtersFromSearch(search, defaultType), [search, defaultType]);
  const selected = search.get('row');
  const data = useHotSpots(filters, !!filters.unitType);
  const layout = useQuery({ ...unitTypeLayoutQuery(filters.unitType, 'short_hood'), enabled: !!filters.unitType });
  const isWide = useWide();
  const [note, setNote] = useState<string | null>(null);

  // The filters as last asked for, even before the address has re-rendered, so two quick taps both count.
  const latest = useRef({ search: '', filters });
  if (latest.current.search !== search.toString()) latest.current = { search: search.toString(), filters };
  const update = (patch: Partial<HotSpotsParams> | ((f: HotSpotsParams) => Partial<HotSpotsParams>), row: string | null = null) => {
    const merged = { ...latest.current.filters, ...(typeof patch === 'function' ? patch(latest.current.filters) : patch) };
    latest.current = { ...latest.current, filters: merged };
    const next = new URLSearchParams(toQueryString(merged));
    if (row) next.set('row', row);
    setSearch(next, { replace: true });
  };
  const selectRow = (label: string | null) => {
    setNote(null);
    update({}, label);
  };

  const rows = data.data?.rows ?? [];
  const row = rows.find((r) => r.label === selected) ?? null;
  const selectedInstance = row && layout.data ? instanceForRow(row, layout.data.parts) : null;
  useEffect(() => setNote(null), [filters.unitType]);

  const pickPart = (part: LayoutPart) => {
    const match = rows.filter((r) => r.partLabel === part.label && r.partKind === part.kind).sort((a, b) => b.findings - a.findings)[0];
    if (match) selectRow(match.label);
    else setNote(`No findings on ${part.label} in this selection.`);
  };

  if (types.isError) return <p role="alert">The unit types could not be loaded: {types.error.message}</p>;
  if (!types.data) return <p className="text-xl">Loading…</p>;
  const kinds = layout.data ? [...new Set(layout.data.parts.map((p) => p.kind))] : [];
  const d = data.data;

  return (
    <div className="mx-auto max-w-7xl space-y-3">
      <header>
        <h1 className="text-3xl font-bold">Hot spots</h1>
        <p className="text-lg text-graphite-2">
          Every pin on units of one type, placed by distance from the front and side, so units with the F on either end add up on the same spot.
        </p>
      </header>

      <Filters filters={filters} onChange={(p) => update(p)} unitTypes={types.data.items} yards={yards.data?.items ?? []} kinds={kinds} />

      {data.isError && <p role="alert" className="card border-federal p-3">The hot spots could not be loaded: {data.error.message}</p>}
      {!d && data.isPending && <p className="text-xl">Counting the findings…</p>}

      {d && (
        <>
          <div className="flex flex-wrap items-center gap-2" aria-live="polite">
            <p className="mr-auto text-lg" data-testid="hot-spots-summary">
              <strong>{formatCount(d.totals.findings)}</strong> findings on <strong>{formatCount(d.totals.units)}</strong> units in{' '}
              <strong>{formatCount(d.inspections)}</strong> inspections ({formatRate(d.inspections ? (d.totals.findings * 100) / d.inspections : null)} per 100),{' '}
              {dateWords(d.query.from)} to {dateWords(d.query.to)}; <strong>{formatCount(d.totals.repeats)}</strong> repeats.
              {data.isFetching && <span className="ml-2 text-graphite-2">Updating…</span>}
            </p>
            <a className="btn" href={tableCsvHref(filters)} download data-testid="export-table">
              Table (CSV)
            </a>
            <a className="btn" href={findingsCsvHref(filters)} download>
              All findings (CSV)
            </a>
          </div>

          <div className="grid grid-cols-1 items-start gap-3 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
            <section className="card min-w-0 space-y-2 p-2" aria-labelledby="hs-plan-title">
              <h2 id="hs-plan-title" className="px-1 text-xl font-bold">
                {d.unitType.name}, plan, front first
              </h2>
              <HeatPlan data={d} selectedInstance={selectedInstance} onPickPart={pickPart} height={isWide ? 260 : 200} />
              <p className="px-1 text-base text-graphite-2">
                The tint is where pins gather ({d.grid.cellIn}-inch squares, lightly smoothed); the front is at the left. Tap a part to see its row.
              </p>
              {note && <p className="px-1 font-bold" role="status">{note}</p>}
            </section>
            <StandOuts data={d} onSelect={(l) => selectRow(l)} />
          </div>

          <div className="grid grid-cols-1 items-start gap-3 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
            <HotSpotsTable rows={d.rows} selected={row?.label ?? null} onSelect={selectRow} inspections={d.inspections} />
            {row ? (
              <RowDetail row={row} filters={filters} timeZone={d.timeZone} repeatWindowDays={d.repeatWindowDays} onClose={() => selectRow(null)} />
            ) : (
              <p className="card p-3 text-lg">Pick a row, or a part on the drawing, to see its findings.</p>
            )}
          </div>

          <div className="grid grid-cols-1 items-start gap-3 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
            <section className="card space-y-2 p-3" aria-labelledby="hs-trend-title">
              <h2 id="hs-trend-title" className="text-xl font-bold">Findings per month</h2>
              <Suspense fallback={<div style={{ height: 240 }} aria-busy="true" />}>
                <TrendChart trend={d.trend} height={isWide ? 260 : 220} />
              </Suspense>
            </section>
            <RepeatUnits data={d} />
          </div>
        </>
      )}
    </div>
  );
}
