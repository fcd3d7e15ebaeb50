import { sql, type SQL } from 'drizzle-orm';
import type pg from 'pg';
import type { DbOrTx } from '../../db/client';
import type { CellCount } from '../../../shared/hot-spots/grid';
import type { MonthCount } from '../../../shared/hot-spots/trend';
import type { FrontEnd } from '../../../shared/domain/frames';

/** Validated filters, already in the shape the SQL takes. */
export interface HotSpotFilter {
  unitType: string;
  /** First instant of the range and the instant just after it (midnights in the railroad's zone). */
  start: Date;
  end: Date;
  defectTypes: string[];
  weights: string[];
  yards: string[];
}

export interface AggregateRow {
  label: string;
  partLabel: string;
  partKind: string;
  findings: number;
  units: number;
  repeats: number;
  along: number;
  left: number;
}

export interface Settings {
  timeZone: string;
  repeatWindowDays: number;
}

export interface Aggregate {
  /** The settings as stored now; differ from the ones passed in only when they changed meanwhile. */
  settings: Settings | null;
  unitType: { key: string; name: string; lengthIn: number; widthIn: number } | null;
  exposure: { unitTypeKey: string; inspections: number }[];
  /** Findings by (unit type, part kind) across the fleet. */
  fleet: { unitTypeKey: string; partKind: string; findings: number }[];
  rows: AggregateRow[];
  cells: CellCount[];
  months: MonthCount[];
  repeatUnits: { unitId: string; roadNumber: string; frontEnd: FrontEnd; repeats: number; findings: number }[];
  totals: { findings: number; units: number; repeats: number };
}

export interface FindingRow {
  id: string;
  unitId: string;
  roadNumber: string;
  unitTypeKey: string;
  frontEnd: FrontEnd;
  label: string;
  partLabel: string;
  partKind: string;
  instanceId: string;
  defectType: string;
  weight: 'federal' | 'shop' | 'note';
  state: 'open' | 'in_repair' | 'repaired' | 'verified' | 'voided';
  createdAt: Date;
  repairedAt: Date | null;
  repeat: boolean;
  along: number;
  left: number;
}

/*
 * Parameters shared by every statement below, in this order:
 *   $1 unit type, $2 start (timestamptz), $3 end (timestamptz, exclusive), $4 defect types[] or null,
 *   $5 weights[] or null, $6 yards[] or null, $7 time zone, $8 repeat window (days); then each statement's own.
 * The range arrives as instants (midnights in the railroad's zone, computed by the service) so the
 * planner knows how many rows it will read. Each statement also returns the settings it finds, so
 * the service can tell when its cached zone or window went stale and run again.
 */
const T0 = `$2::timestamptz`;
const T1 = `$3::timestamptz`;
const WIN = `$8::int`;
const CURRENT = `(select json_build_object('timeZone', time_zone, 'repeatWindowDays', repeat_window_days) from railroad_settings where id = 1) as settings`;

/** Filters on a findings row `f` (voided findings are entered in error and never count). */
const FINDING_FILTERS = `
      f.created_at >= ${T0} and f.created_at < ${T1}
  and f.state <> 'voided'
  and ($4::text[] is null or f.defect_type = any($4::text[]))
  and ($5::text[] is null or f.weight = any($5::text[]))
  and ($6::uuid[] is null or f.inspection_id in (select id from yard_inspections))`;
/**
 * The inspections made in the chosen yards (the inspection's yard, else the unit's), gathered once
 * for FINDING_FILTERS to probe; every statement using the filters starts its WITH list with it.
 */
const YARD_INSPECTIONS = `
  yard_inspections as materialized (
    select yi.id from inspections yi join units yu on yu.id = yi.unit_id where coalesce(yi.yard_id, yu.yard_id) = any($6::uuid[])
  )`;

/**
 * Selected rows and whether each is a repeat; used by the row list and the export.
 * The repeat rule (same unit, same physical part, same defect type, a repair of a non-voided finding
 * no later than this one and at most WIN calendar days before it, railroad zone) is one comparison:
 * the day count is kept on each finding at write time (see `priorRepairs` below); the window is
 * read here, so a change of the setting takes effect at once.
 */
const selected = (extra = '') => `${YARD_INSPECTIONS},
  sel as materialized (
    select f.id, f.unit_id, f.label, f.part_label, f.part_kind, f.created_at,
           f.front_along, f.front_left, (f.created_at at time zone $7::text)::date as day,
           coalesce(f.prior_repair_days <= ${WIN}, false) as rep
      from findings f
     where f.unit_type_key = $1 and ${FINDING_FILTERS} ${extra}
  )`;

const params = (f: HotSpotFilter, s: Settings) => [
  f.unitType,
  f.start,
  f.end,
  f.defectTypes.length ? f.defectTypes : null,
  f.weights.length ? f.weights : null,
  f.yards.length ? f.yards : null,
  s.timeZone,
  s.repeatWindowDays,
];

async function inTx<T>(pool: pg.Pool, run: (c: pg.PoolClient) => Promise<T>): Promise<T> {
  const c = await pool.connect();
  try {
    // These statements read many rows and finish in well under a second: compiling them to
    // machine code (JIT) costs more than it saves, and the per-key hashes want more than 4 MB.
    await c.query(`begin read only; set local jit = off; set local work_mem = '32MB'`);
    const out = await run(c);
    await c.query('commit');
    return out;
  } catch (e) {
    await c.query('rollback').catch(() => {});
    throw e;
  } finally {
    c.release();
  }
}

/**
 * The screen's closing SELECT, the same for both statements below. Each defines, as CTEs:
 *   out_rows(label, part_kind, part_label, n, units, r, sa, sl), out_cells(col, row, n),
 *   out_months(month date, n, r), out_units(unit_id, n, r), out_fleet(type, kind, n).
 * Counts agree exactly. Mean positions agree to float precision, not to the last bit: the raw statement
 * adds float8 in its own order, the summary keeps exact numeric sums (no drift under adds and removals).
 */
const screenSelect = (p: { type: string; t0: string; t1: string; yards: string | null }) => `
      select
        (select json_build_object('key', t.key, 'name', t.name, 'lengthIn', t.length_in, 'widthIn', t.width_in)
           from unit_types t where t.key = ${p.type}) as "unitType",
        ${CURRENT},
        (select coalesce(json_agg(json_build_object('unitTypeKey', e.type, 'inspections', e.n)), '[]')
           from (select u.unit_type_key as type, count(*)::int as n
                   from inspections i join units u on u.id = i.unit_id
                  where i.started_at >= ${p.t0} and i.started_at < ${p.t1}
                    ${p.yards ? `and (${p.yards} is null or coalesce(i.yard_id, u.yard_id) = any(${p.yards}))` : ''}
                  group by 1) e) as exposure,
        (select coalesce(json_agg(json_build_object('unitTypeKey', k.type, 'partKind', k.kind, 'findings', k.n)), '[]') from out_fleet k) as fleet,
        (select coalesce(json_agg(json_build_object('label', x.label, 'partLabel', x.part_label, 'partKind', x.part_kind,
                  'findings', x.n, 'units', x.units, 'repeats', x.r, 'along', (x.sa / x.n)::float8, 'left', (x.sl / x.n)::float8)
                  order by x.n desc, x.label), '[]')
           from out_rows x) as rows,
        (select coalesce(json_agg(json_build_object('col', c.col, 'row', c.row, 'count', c.n) order by c.col, c.row), '[]') from out_cells c) as cells,
        (select coalesce(json_agg(json_build_object('month', to_char(m.month, 'YYYY-MM'), 'findings', m.n, 'repeats', m.r) order by m.month), '[]')
           from out_months m) as months,
        (select coalesce(json_agg(json_build_object('unitId', w.unit_id, 'roadNumber', un.road_number, 'frontEnd', un.front_end,
                  'repeats', w.r, 'findings', w.n) order by w.r desc, un.road_number), '[]')
           from (select unit_id, r, n from out_units where r > 0 order by r desc, unit_id limit 10) w join units un on un.id = w.unit_id) as "repeatUnits",
        (select json_build_object('findings', coalesce(sum(n), 0)::int, 'units', count(*)::int, 'repeats', coalesce(sum(r), 0)::int)
           from out_units) as totals`;

/** Cell size of the summary's grid (hot_spots_by_cell): the screen's default cell. */
export const SUMMARY_CELL_IN = 12;

/** Can the summary answer this selection? It has no yard, defect type or weight in its keys. */
export const summaryAnswers = (f: HotSpotFilter, cellIn: number) =>
  cellIn === SUMMARY_CELL_IN && !f.defectTypes.length && !f.weights.length && !f.yards.length;

/**
 * The screen from the summary tables (drizzle/0005): whole civil months of the range from the
 * summary, the partial months at either end from findings (the same index-only range the raw
 * statement reads). Parameters: $1 unit type, $2 start, $3 end (exclusive), $4 time zone,
 * $5 repeat window, $6 cell size (SUMMARY_CELL_IN), $7 the other unit types.
 */
const SUMMARY_SCREEN = `
      with
      -- Whole months: from the first month starting at or after the start to the last ending at or before the end
      -- (railroad zone, month starts as PostgreSQL places them, as the summary's months are). With none,
      -- the raw part is the whole range.
      w as materialized (
        select m0, m1,
               case when m0 < m1 then m0::timestamp at time zone $4::text else $3::timestamptz end as t0,
               case when m0 < m1 then m1::timestamp at time zone $4::text else $3::timestamptz end as t1,
               array(select generate_series(m0::timestamp, (m1 - 1)::timestamp, interval '1 month')::date) as whole
          from (select (case when (a at time zone $4::text) >= $2::timestamptz then a else a + interval '1 month' end)::date as m0,
                       (case when (b at time zone $4::text) <= $3::timestamptz then b else b - interval '1 month' end)::date as m1
                  from (select date_trunc('month', $2::timestamptz at time zone $4::text) as a,
                               date_trunc('month', $3::timestamptz at time zone $4::text) as b) x) y
      ),
      d as (select ceil(length_in / $6::float8) as cols, ceil(width_in / $6::float8) as rows, width_in / 2 as half from unit_types where key = $1),
      -- The findings of the partial months (voided findings never count).
      e as materialized (
        select f.label, f.unit_id, f.part_kind, f.part_label, f.front_along, f.front_left, f.created_at,
               coalesce(f.prior_repair_days <= $5::int, false) as rep
          from findings f
         where f.unit_type_key = $1 and f.created_at >= $2::timestamptz and f.created_at < (select t0 from w) and f.state <> 'voided'
        union all
        select f.label, f.unit_id, f.part_kind, f.part_label, f.front_along, f.front_left, f.created_at,
               coalesce(f.prior_repair_days <= $5::int, false)
          from findings f
         where f.unit_type_key = $1 and f.created_at >= (select t1 from w) and f.created_at < $3::timestamptz and f.state <> 'voided'
      ),
      parts as materialized (
        select label, part_kind, part_label, sum(n)::int as n, sum(r)::int as r, sum(sa) as sa, sum(sl) as sl
          from (select s.label, s.part_kind, s.part_label, s.findings as n, s.repeats as r, s.sum_along as sa, s.sum_left as sl
                  from hot_spots_by_label s, w where s.unit_type_key = $1 and s.month >= w.m0 and s.month < w.m1
                union all
                select label, part_kind, part_label, count(*), count(*) filter (where rep), sum(front_along)::numeric, sum(front_left)::numeric
                  from e group by 1, 2, 3) x
         group by 1, 2, 3 having sum(n) > 0
      ),
      lab as (
        select label, min(part_kind) as part_kind, min(part_label) as part_label, sum(n)::int as n, sum(r)::int as r, sum(sa) as sa, sum(sl) as sl
          from parts group by label
      ),
      -- Units affected are distinct: the (part, unit) pairs with findings in a whole month, and those of the partial months not among them.
      pairs as (
        select s.label, s.unit_id from hot_spots_label_units s, w where s.unit_type_key = $1 and s.months && w.whole
      ),
      out_rows as (
        select x.label, x.part_kind, x.part_label, x.n, x.r, x.sa, x.sl, p.units
          from lab x
          join (select label, count(*)::int as units
                  from (select label, unit_id from pairs
                        union all
                        select label, unit_id from (select distinct label, unit_id from e) q
                         where not exists (select 1 from pairs p where p.label = q.label and p.unit_id = q.unit_id)) z
                 group by label) p using (label)
      ),
      out_units as (
        select unit_id, sum(n)::int as n, sum(r)::int as r
          from (select s.unit_id, s.findings as n, s.repeats as r from hot_spots_by_unit s, w
                 where s.unit_type_key = $1 and s.month >= w.m0 and s.month < w.m1
                union all
                select unit_id, count(*), count(*) filter (where rep) from e group by 1) x
         group by unit_id having sum(n) > 0
      ),
      out_months as (
        select month, sum(n)::int as n, sum(r)::int as r
          from (select s.month, s.findings as n, s.repeats as r from hot_spots_by_label s, w
                 where s.unit_type_key = $1 and s.month >= w.m0 and s.month < w.m1
                union all
                select date_trunc('month', created_at at time zone $4::text)::date, count(*), count(*) filter (where rep) from e group by 1) x
         group by month having sum(n) > 0
      ),
      out_cells as (
        select least(greatest(x.col, 0), d.cols - 1)::int as col, least(greatest(x.row, 0), d.rows - 1)::int as row, sum(x.n)::int as n
          from (select s.col, s.row, s.findings as n from hot_spots_by_cell s, w where s.unit_type_key = $1 and s.month >= w.m0 and s.month < w.m1
                union all
                select floor(e.front_along / $6::float8), floor((e.front_left + d.half) / $6::float8), count(*) from e, d group by 1, 2) x, d
         group by 1, 2 having sum(x.n) > 0
      ),
      -- The fleet baseline: every other unit type's findings by part kind, whole months from the summary, partial ones from findings.
      out_fleet as (
        select type, kind, sum(n)::int as n
          from (select s.unit_type_key as type, s.part_kind as kind, s.findings as n from hot_spots_by_label s, w
                 where s.unit_type_key = any($7::text[]) and s.month >= w.m0 and s.month < w.m1
                union all
                select f.unit_type_key, f.part_kind, 1 from findings f
                 where f.unit_type_key = any($7::text[]) and f.created_at >= $2::timestamptz and f.created_at < (select t0 from w) and f.state <> 'voided'
                union all
                select f.unit_type_key, f.part_kind, 1 from findings f
                 where f.unit_type_key = any($7::text[]) and f.created_at >= (select t1 from w) and f.created_at < $3::timestamptz and f.state <> 'voided'
                union all
                select $1, part_kind, n from parts) x
         group by 1, 2 having sum(n) > 0
      )
      ${screenSelect({ type: '$1', t0: '$2::timestamptz', t1: '$3::timestamptz', yards: null })}`;

/** Folds the changes single writes left in hot_spots_pending into the summary (drizzle/0007). */
export async function foldSummary(pool: pg.Pool): Promise<void> {
  await pool.query('select hot_spots_fold()');
}

export const hotSpotsRepository = (pool: pg.Pool, opts: { summary?: boolean } = {}) => ({
  /** Settings the statements need; the service caches them. */
  async settings(): Promise<Settings | null> {
    const r = await pool.query<Settings>(`select time_zone as "timeZone", repeat_window_days as "repeatWindowDays" from railroad_settings where id = 1`);
    return r.rows[0] ?? null;
  },

  /**
   * Everything the screen shows, in one statement. `otherTypes`: the unit types the fleet baseline adds.
   * From the summary when it can answer (opts.summary = false forces the raw statement), else from findings.
   */
  async aggregate(f: HotSpotFilter, cellIn: number, s: Settings, otherTypes: string[]): Promise<Aggregate> {
    if (opts.summary !== false && summaryAnswers(f, cellIn)) {
      // What single writes left waiting goes into the summary first, so the answer counts every committed finding.
      await foldSummary(pool);
      const values = [f.unitType, f.start, f.end, s.timeZone, s.repeatWindowDays, cellIn, otherTypes];
      return inTx(pool, async (c) => (await c.query<Aggregate>(SUMMARY_SCREEN, values)).rows[0]);
    }
    // Index-only passes with no per-row work beyond hashing: the selection once, grouped two ways at
    // once (by part and unit; by grid cell and month), and the other unit types' findings counted by
    // part kind, one index range per (type, kind). Months are found by searching the month starts (no
    // zone arithmetic per row); the part's name and kind are group keys, as min() of text copies per row.
    const REP = `f.prior_repair_days <= ${WIN}`;
    const text = `
      with recursive ${YARD_INSPECTIONS},
      -- First instant of each month the range touches (railroad zone), and its civil month.
      mb as (
        select array_agg(m order by m) as local, array_agg(m at time zone $7::text order by m) as at
          from generate_series(date_trunc('month', ${T0} at time zone $7::text), ${T1} at time zone $7::text, interval '1 month') m
      ),
      g as materialized (
        select grouping(f.label, f.unit_id, f.part_kind, f.part_label) = 0 as by_part,
               f.label, f.unit_id, f.part_kind, f.part_label,
               least(greatest(floor(f.front_along / $9::float8), 0), d.cols - 1)::int as col,
               least(greatest(floor((f.front_left + d.half) / $9::float8), 0), d.rows - 1)::int as row,
               width_bucket(f.created_at, mb.at) as b,
               count(*)::int as n, (count(*) filter (where ${REP}))::int as r, sum(f.front_along) as sa, sum(f.front_left) as sl
          from findings f, mb,
               (select ceil(length_in / $9::float8) as cols, ceil(width_in / $9::float8) as rows, width_in / 2 as half from unit_types where key = $1) d
         where f.unit_type_key = $1 and ${FINDING_FILTERS}
         group by grouping sets ((f.label, f.unit_id, f.part_kind, f.part_label), (6, 7, 8))
      ),
      lu as materialized (
        select label, unit_id, min(part_kind) as part_kind, min(part_label) as part_label, sum(n)::int as n, sum(r)::int as r,
               sum(sa) as sa, sum(sl) as sl
          from g where by_part group by label, unit_id
      ),
      -- The part kinds each other type has findings of, found by skipping through the index.
      kinds(type, kind) as (
        select ty.key, (select min(f.part_kind) from findings f where f.unit_type_key = ty.key)
          from unnest($10::text[]) as ty(key)
        union all
        select k.type, (select min(f.part_kind) from findings f where f.unit_type_key = k.type and f.part_kind > k.kind)
          from kinds k where k.kind is not null
      ),
      fleet as materialized (
        select k.type, k.kind, (select count(*)::int from findings f where f.unit_type_key = k.type and f.part_kind = k.kind and ${FINDING_FILTERS}) as n
          from kinds k where k.kind is not null
      ),
      out_fleet as (
        select type, kind, n from fleet where n > 0
        union all
        select $1, part_kind, sum(n)::int from g where by_part group by part_kind
      ),
      out_rows as (
        select label, min(part_kind) as part_kind, min(part_label) as part_label, sum(n)::int as n, count(*)::int as units,
               sum(r)::int as r, sum(sa) as sa, sum(sl) as sl
          from lu group by label
      ),
      out_cells as (select col, row, sum(n)::int as n from g where not by_part group by 1, 2),
      out_months as (
        select mb.local[m.b]::date as month, m.n, m.r
          from (select b, sum(n)::int as n, sum(r)::int as r from g where not by_part group by 1) m, mb
      ),
      out_units as (select unit_id, sum(n)::int as n, sum(r)::int as r from lu group by unit_id)
      ${screenSelect({ type: '$1', t0: T0, t1: T1, yards: '$6::uuid[]' })}`;
    return inTx(pool, async (c) => (await c.query<Aggregate>(text, [...params(f, s), cellIn, otherTypes])).rows[0]);
  },

  /** Findings of the selection (one row's when `label` is given), newest first, with the total. */
  async findings(f: HotSpotFilter, s: Settings, label: string | null, limit: number): Promise<{ items: FindingRow[]; total: number; settings: Settings | null }> {
    const text = `
      with
      ${selected('and ($9::text is null or f.label = $9::text)')}
      select (select count(*)::int from sel) as total, ${CURRENT},
             (select coalesce(json_agg(x order by x."createdAt" desc, x.id), '[]') from (
                select p.id, p.unit_id as "unitId", u.road_number as "roadNumber", u.unit_type_key as "unitTypeKey", fd.front_end as "frontEnd",
                       p.label, p.part_label as "partLabel", p.part_kind as "partKind", fd.instance_id as "instanceId",
                       fd.defect_type as "defectType", fd.weight, fd.state, fd.created_at as "createdAt", fd.repaired_at as "repairedAt",
                       p.rep as repeat, p.front_along as along, p.front_left as "left"
                  from sel p join findings fd on fd.id = p.id join units u on u.id = p.unit_id
                 order by p.created_at desc, p.id limit $10) x) as items`;
    const r = await inTx(pool, (c) => c.query<{ total: number; settings: Settings | null; items: (Omit<FindingRow, 'createdAt' | 'repairedAt'> & { createdAt: string; repairedAt: string | null })[] }>(text, [...params(f, s), label, limit]));
    const row = r.rows[0];
    return { total: row.total, settings: row.settings, items: row.items.map((i) => ({ ...i, createdAt: new Date(i.createdAt), repairedAt: i.repairedAt ? new Date(i.repairedAt) : null })) };
  },
});
export type HotSpotsRepository = ReturnType<typeof hotSpotsRepository>;

/*
 * findings.prior_repair_days, the one number the repeat rule needs, kept right by every write:
 * calendar days (railroad zone) from the latest repair of a non-voided finding of the same unit,
 * physical part and defect type with repaired_at ≤ this finding's created_at, to this finding's
 * day; null when there is none. A finding is a repeat when it is ≤ the repeat window.
 */
const ZONE = `(select time_zone as tz from railroad_settings where id = 1)`;
/** The number for the findings row `f`, from the rows as they are now. */
const PRIOR_REPAIR_DAYS = (f: string) => `(
  select (${f}.created_at at time zone z.tz)::date - (max(p.repaired_at) at time zone z.tz)::date
    from findings p, ${ZONE} z
   where p.unit_id = ${f}.unit_id and p.instance_id = ${f}.instance_id and p.defect_type = ${f}.defect_type
     and p.state <> 'voided' and p.repaired_at <= ${f}.created_at
   group by z.tz)`;

/**
 * Every finding at once, in one pass (seeds, and the migration holds the same statement): repairs
 * and findings of each key in time order, a repair before a finding at the same instant, and the
 * running latest repair. Writes only rows whose number changes.
 */
export const REFRESH_ALL_PRIOR_REPAIR_DAYS = `
  update findings f
     set prior_repair_days = (f.created_at at time zone z.tz)::date - (w.last_repair at time zone z.tz)::date
    from (select id, kind, max(repaired_at) over (partition by unit_id, instance_id, defect_type order by at, kind rows unbounded preceding) as last_repair
            from (select id, unit_id, instance_id, defect_type, repaired_at as at, 0 as kind, repaired_at
                    from findings where repaired_at is not null and state <> 'voided'
                  union all
                  select id, unit_id, instance_id, defect_type, created_at, 1, null from findings) e) w,
         ${ZONE} z
   where w.kind = 1 and w.id = f.id
     and f.prior_repair_days is distinct from (f.created_at at time zone z.tz)::date - (w.last_repair at time zone z.tz)::date`;

/**
 * The hot spots summary (drizzle/0005) is kept by triggers on findings; a bulk load that turns
 * triggers off (session_replication_role = replica) fills it afterwards with this, from findings.
 */
export const REBUILD_HOT_SPOTS_SUMMARY = `select hot_spots_summary_rebuild()`;

/** The key whose writes take turns: a unit's physical part and a defect type. */
export interface PinKey {
  unitId: string;
  instanceId: string;
  defectType: string;
}
/** The lock a key's writes take turns on (drizzle/0006's trigger takes the same one), from its three parts as SQL. */
const turnOn = (unitId: SQL, instanceId: SQL, defectType: SQL) => sql`pg_advisory_xact_lock(4242006, hashtext(${unitId}::text || '/' || ${instanceId} || '/' || ${defectType}))`;
/** The key's turn, as an expression for a statement that needs it before a new finding exists. */
export const pinTurn = (k: PinKey) => turnOn(sql`${k.unitId}::uuid`, sql`${k.instanceId}::text`, sql`${k.defectType}::text`);

export const priorRepairs = (db: DbOrTx) => {
  const self = {
    /**
     * Writes of one key (unit, physical part, defect type) take turns: a transaction-scoped lock, taken
     * before any row lock, so a finding added while a precedent is voided or repaired is computed from,
     * or recomputed after, the other's commit, and two such changes never wait on each other's rows.
     */
    async lockKey(findingId: string) {
      await db.execute(sql`
        select ${turnOn(sql`unit_id`, sql`instance_id`, sql`defect_type`)} from findings where id = ${findingId}`);
    },
    /** A new finding (walkaround): its own number, read as it is inserted; its key's turn (`turn`) is taken first, in an earlier statement. */
    // `at` is the finding's created_at: the transaction's now(), the column's default.
    onInsert: (k: PinKey, at: SQL = sql`now()`) => sql`(
      select (${at} at time zone z.tz)::date - (max(p.repaired_at) at time zone z.tz)::date
        from findings p, ${sql.raw(ZONE)} z
       where p.unit_id = ${k.unitId} and p.instance_id = ${k.instanceId} and p.defect_type = ${k.defectType}
         and p.state <> 'voided' and p.repaired_at <= ${at}
       group by z.tz)`,
    /** A finding voided or repaired: the findings of its key found since may gain or lose it as their precedent. */
    async refreshAfter(findingId: string) {
      await self.lockKey(findingId);
      await db.execute(sql`
        update findings f set prior_repair_days = ${sql.raw(PRIOR_REPAIR_DAYS('f'))}
          from findings a
         where a.id = ${findingId} and f.unit_id = a.unit_id and f.instance_id = a.instance_id and f.defect_type = a.defect_type
           and f.created_at >= a.created_at`);
    },
    /** Every finding (bulk loads; needed again if the railroad's time zone changes). */
    async refreshAll() {
      await db.execute(sql.raw(REFRESH_ALL_PRIOR_REPAIR_DAYS));
    },
  };
  return self;
};
