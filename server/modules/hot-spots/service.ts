import { TZDate } from '@date-fns/tz';
import { stringify } from 'csv-stringify/sync';
import type pg from 'pg';
import type { HotSpotFinding, HotSpotFindingsQuery, HotSpotRow, HotSpotsQuery, HotSpotsResponse } from '../../../shared/api/hot-spots';
import { defectTypeByKey } from '../../../shared/defects/catalogue';
import type { Drawing } from '../../../shared/drawings/types';
import { heatCells } from '../../../shared/hot-spots/density';
import { DEFAULT_CELL_IN, gridFor } from '../../../shared/hot-spots/grid';
import { DEFAULT_ALPHA } from '../../../shared/hot-spots/poisson';
import { ratePer100 } from '../../../shared/hot-spots/rates';
import { chanceFlags, fleetBaselines, standOut } from '../../../shared/hot-spots/stand-out';
import { monthSeries } from '../../../shared/hot-spots/trend';
import { AppError, notFound } from '../../http/errors';
import { hotSpotsRepository, type FindingRow, type HotSpotFilter, type Settings } from './repository';

const TEST_DESCRIPTION =
  'Each part is compared with the same part kind across the fleet: all findings on that kind, on every unit type, in the same ' +
  'dates and filters, divided by its part-inspections (each unit type’s inspections × how many of the kind its drawing has). ' +
  'That rate × this unit type’s inspections is what an average part of the kind would have had. A part stands out when the ' +
  'chance of its count or more, under that expectation, is below 0.01 (exact one-sided Poisson test).';

/** Midnight starting a civil date in a zone, as an instant. */
const midnight = (date: string, timeZone: string): Date => {
  const [y, m, d] = date.split('-').map(Number);
  return new Date(new TZDate(y, m - 1, d, timeZone).getTime());
};
const dayAfter = (date: string) => new Date(Date.parse(`${date}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10);

/** The civil range [from, to] as instants: from's midnight up to (not including) the midnight after `to`. */
const toFilter = (q: HotSpotsQuery, timeZone: string): HotSpotFilter => ({
  unitType: q.unitType,
  start: midnight(q.from, timeZone),
  end: midnight(dayAfter(q.to), timeZone),
  defectTypes: q.defectTypes,
  weights: q.weights,
  yards: q.yards,
});

/** Settings are read once and then checked by every statement; a change is picked up by the next request. */
const SETTINGS_TTL_MS = 60_000;
const sameSettings = (a: Settings | null, b: Settings) => !!a && a.timeZone === b.timeZone && a.repeatWindowDays === b.repeatWindowDays;

/** 'YYYY-MM-DD HH:mm' in the railroad's zone, for exports people read. */
function localTime(d: Date | null, timeZone: string): string {
  if (!d) return '';
  const parts = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).formatToParts(d);
  const g = (t: string) => parts.find((p) => p.type === t)?.value ?? '';
  return `${g('year')}-${g('month')}-${g('day')} ${g('hour')}:${g('minute')}`;
}

/** `opts.summary = false` computes every screen from findings alone (tests and the bench compare the two). */
export function hotSpotsService(pool: pg.Pool, drawings: ReadonlyMap<string, Drawing>, opts: { summary?: boolean } = {}) {
  const repo = hotSpotsRepository(pool, opts);
  // How many parts of each kind a unit of each type has, from its drawing (the exposure per inspection).
  const positionsByType = new Map<string, Map<string, number>>();
  for (const d of drawings.values()) {
    const m = new Map<string, number>();
    for (const i of d.instances) m.set(i.kind, (m.get(i.kind) ?? 0) + 1);
    positionsByType.set(d.key, m);
  }
  const positions = (type: string, kind: string) => positionsByType.get(type)?.get(kind) ?? (positionsByType.has(type) ? 0 : undefined);

  let cached: { s: Settings; at: number } | null = null;
  const settings = async (fresh = false): Promise<Settings> => {
    if (!fresh && cached && Date.now() - cached.at < SETTINGS_TTL_MS) return cached.s;
    const s = await repo.settings();
    if (!s) throw new AppError('not_found', 'The railroad is not set up yet');
    cached = { s, at: Date.now() };
    return s;
  };
  /** Runs a statement with the cached settings; if the statement saw other settings, runs it once more with those. */
  const withSettings = async <T extends { settings: Settings | null }>(run: (s: Settings) => Promise<T>): Promise<T & { used: Settings }> => {
    const s = await settings();
    const r = await run(s);
    if (sameSettings(r.settings, s)) return { ...r, used: s };
    const again = await settings(true);
    return { ...(await run(again)), used: again };
  };
  const otherTypes = (type: string) => [...drawings.keys()].filter((k) => k !== type);

  const toFinding = (f: FindingRow): HotSpotFinding => ({
    id: f.id,
    unitId: f.unitId,
    roadNumber: f.roadNumber,
    frontEnd: f.frontEnd,
    label: f.label,
    partLabel: f.partLabel,
    defectType: f.defectType,
    defectLabel: defectTypeByKey(f.defectType)?.label ?? f.defectType,
    weight: f.weight,
    state: f.state,
    createdAt: f.createdAt.toISOString(),
    repairedAt: f.repairedAt?.toISOString() ?? null,
    repeat: f.repeat,
    along: f.along,
    left: f.left,
  });

  return {
    /** The screen: grid, table with rates and the stand-out test, trend, repeat units, all from one query. */
    async screen(q: HotSpotsQuery): Promise<HotSpotsResponse> {
      const a = await withSettings((s) => repo.aggregate(toFilter(q, s.timeZone), DEFAULT_CELL_IN, s, otherTypes(q.unitType)));
      if (!a.unitType) throw notFound('Unit type');
      const grid = gridFor(a.unitType.lengthIn, a.unitType.widthIn, DEFAULT_CELL_IN);
      const inspections = a.exposure.find((e) => e.unitTypeKey === q.unitType)?.inspections ?? 0;
      const baselines = fleetBaselines(a.fleet, a.exposure, positions);
      const rows: HotSpotRow[] = a.rows.map((r) => {
        const s = standOut(r, inspections, baselines.get(r.partKind), DEFAULT_ALPHA);
        const baseline = baselines.get(r.partKind);
        return {
          ...r,
          ratePer100: ratePer100(r.findings, inspections),
          standOut: s && baseline?.rate != null ? { standsOut: s.standsOut, p: s.p, expected: s.expected, fleetRatePer100: baseline.rate * 100, words: s.words } : null,
        };
      });
      const tested = rows.filter((r) => r.standOut).length;
      return {
        query: q,
        unitType: a.unitType,
        timeZone: a.used.timeZone,
        repeatWindowDays: a.used.repeatWindowDays,
        inspections,
        totals: a.totals,
        grid: { cellIn: grid.cellIn, cols: grid.cols, rows: grid.rows, lengthIn: grid.lengthIn, widthIn: grid.widthIn, cells: a.cells, heat: heatCells(grid, a.cells) },
        rows,
        trend: monthSeries(q.from, q.to, a.months),
        repeatUnits: a.repeatUnits,
        fleet: [...baselines.values()]
          .map((b) => ({ partKind: b.partKind, findings: b.findings, partInspections: b.partInspections, ratePer100: b.rate === null ? null : b.rate * 100 }))
          .sort((x, y) => x.partKind.localeCompare(y.partKind)),
        test: { name: 'Exact one-sided Poisson test with exposure', alpha: DEFAULT_ALPHA, tested, chanceFlags: chanceFlags(tested), description: TEST_DESCRIPTION },
      };
    },

    /** The findings behind one row (or the whole selection), newest first. */
    async findings(q: HotSpotFindingsQuery) {
      const r = await withSettings((s) => repo.findings(toFilter(q, s.timeZone), s, q.label ?? null, q.limit));
      return { total: r.total, items: r.items.map(toFinding) };
    },

    /** The table as CSV, the same figures the screen shows. */
    async tableCsv(q: HotSpotsQuery): Promise<string> {
      const s = await this.screen(q);
      return stringify(
        s.rows.map((r) => ({
          ...r,
          ratePer100: r.ratePer100 === null ? '' : r.ratePer100.toFixed(2),
          standsOut: r.standOut ? (r.standOut.standsOut ? 'yes' : 'no') : '',
          p: r.standOut ? r.standOut.p.toPrecision(3) : '',
          expected: r.standOut ? r.standOut.expected.toFixed(2) : '',
          why: r.standOut?.words ?? '',
        })),
        {
          header: true,
          columns: [
            { key: 'label', header: 'Part' },
            { key: 'partKind', header: 'Part kind' },
            { key: 'findings', header: 'Findings' },
            { key: 'ratePer100', header: `Per 100 inspections (${s.inspections} inspections)` },
            { key: 'units', header: 'Units' },
            { key: 'repeats', header: 'Repeats' },
            { key: 'standsOut', header: 'Stands out (p < 0.01)' },
            { key: 'p', header: 'p (exact one-sided Poisson)' },
            { key: 'expected', header: 'Expected at fleet rate' },
            { key: 'why', header: 'Why' },
          ],
        },
      );
    },

    /** The underlying findings as CSV, times in the railroad's zone. */
    async findingsCsv(q: HotSpotFindingsQuery): Promise<{ csv: string; total: number; truncated: boolean }> {
      const r = await withSettings((s) => repo.findings(toFilter(q, s.timeZone), s, q.label ?? null, EXPORT_LIMIT));
      const zone = r.used.timeZone;
      const csv = stringify(
        r.items.map((f) => ({
          ...f,
          createdAt: localTime(f.createdAt, zone),
          repairedAt: localTime(f.repairedAt, zone),
          defectLabel: defectTypeByKey(f.defectType)?.label ?? f.defectType,
          repeat: f.repeat ? 'yes' : 'no',
          along: f.along.toFixed(1),
          left: f.left.toFixed(1),
        })),
        {
          header: true,
          columns: [
            { key: 'id', header: 'Finding' },
            { key: 'createdAt', header: `Found (${zone})` },
            { key: 'roadNumber', header: 'Unit' },
            { key: 'unitTypeKey', header: 'Unit type' },
            { key: 'frontEnd', header: 'F end at the time' },
            { key: 'label', header: 'Part' },
            { key: 'partKind', header: 'Part kind' },
            { key: 'instanceId', header: 'Physical part' },
            { key: 'defectType', header: 'Defect type' },
            { key: 'defectLabel', header: 'Defect' },
            { key: 'weight', header: 'Weight' },
            { key: 'state', header: 'State' },
            { key: 'repairedAt', header: `Repaired (${zone})` },
            { key: 'repeat', header: 'Repeat' },
            { key: 'along', header: 'From the front (in)' },
            { key: 'left', header: 'Left of centre (in)' },
          ],
        },
      );
      return { csv, total: r.total, truncated: r.total > r.items.length };
    },
  };
}

/** Most findings one CSV export carries; the response says so (X-Hoodline-Truncated) when it is cut. */
export const EXPORT_LIMIT = 100_000;
export type HotSpotsService = ReturnType<typeof hotSpotsService>;
