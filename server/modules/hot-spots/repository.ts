import type pg from 'pg';
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
  and ($6::uuid[] is null or exists (
        select 1 from inspections yi join units yu on yu.id = yi.unit_id
         where yi.id = f.inspection_id and coalesce(yi.yard_id, yu.yard_id) = any($6::uuid[])))`;

/** Selected rows, their candidate precedents and the repeats among them; used by the screen, the row list and the export. */
const selected = (extra = '') => `
  sel as materialized (
    select f.id, f.unit_id, f.label, f.part_label, f.part_kind, f.instance_id, f.defect_type, f.created_at,
           f.front_along, f.front_left, (f.created_at at time zone $7::text)::date as day
      from findings f
     where f.unit_type_key = $1 and ${FINDING_FILTERS} ${extra}
  ),
  -- Voided findings are few; a repair recorded on one of them is no precedent.
  voided as materialized (
    select unit_id, instance_id, defect_type, repaired_at from findings where state = 'voided' and repaired_at is not null
  ),
  -- Repairs that could make a selected finding a repeat: the type's units, repaired from WIN + 2 days
  -- before the range to its end (two days of margin cover any zone offset); index-only on findings_repeat.
  prec as (
    select p.unit_id, p.instance_id, p.defect_type, p.repaired_at, (p.repaired_at at time zone $7::text)::date as rday
      from findings p
     where p.unit_id in (select id from units where unit_type_key = $1)
       and p.repaired_at >= ${T0} - (${WIN} + 2) * interval '1 day' and p.repaired_at < ${T1}
       and not exists (select 1 from voided v
                        where v.unit_id = p.unit_id and v.instance_id = p.instance_id
                          and v.defect_type = p.defect_type and v.repaired_at = p.repaired_at)
  ),
  -- The repeat rule: same unit, same physical part, same defect type, a repair no later than the
  -- finding and at most WIN calendar days (railroad zone) before it. A hash semi-join, one probe per row.
  reps as materialized (
    select s.id, s.label, s.unit_id, s.day
      from sel s
     where exists (select 1 from prec p
                    where p.unit_id = s.unit_id and p.instance_id = s.instance_id and p.defect_type = s.defect_type
                      and p.repaired_at <= s.created_at and s.day - p.rday <= ${WIN})
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

export const hotSpotsRepository = (pool: pg.Pool) => ({
  /** Settings the statements need; the service caches them. */
  async settings(): Promise<Settings | null> {
    const r = await pool.query<Settings>(`select time_zone as "timeZone", repeat_window_days as "repeatWindowDays" from railroad_settings where id = 1`);
    return r.rows[0] ?? null;
  },

  /** Everything the screen shows, in one statement. `otherTypes`: the unit types the fleet baseline adds. */
  async aggregate(f: HotSpotFilter, cellIn: number, s: Settings, otherTypes: string[]): Promise<Aggregate> {
    const text = `
      with
      ${selected()},
      lu as (
        select a.label, a.part_kind, a.part_label, a.unit_id, a.n, coalesce(b.r, 0) as r, a.sa, a.sl
          from (select label, min(part_kind) as part_kind, min(part_label) as part_label, unit_id, count(*)::int as n,
                       sum(front_along) as sa, sum(front_left) as sl
                  from sel group by label, unit_id) a
          left join (select label, unit_id, count(*)::int as r from reps group by label, unit_id) b
            on b.label = a.label and b.unit_id = a.unit_id
      )
      select
        (select json_build_object('key', t.key, 'name', t.name, 'lengthIn', t.length_in, 'widthIn', t.width_in)
           from unit_types t where t.key = $1) as "unitType",
        ${CURRENT},
        (select coalesce(json_agg(json_build_object('unitTypeKey', e.type, 'inspections', e.n)), '[]')
           from (select u.unit_type_key as type, count(*)::int as n
                   from inspections i join units u on u.id = i.unit_id
                  where i.started_at >= ${T0} and i.started_at < ${T1}
                    and ($6::uuid[] is null or coalesce(i.yard_id, u.yard_id) = any($6::uuid[]))
                  group by 1) e) as exposure,
        (select coalesce(json_agg(json_build_object('unitTypeKey', k.type, 'partKind', k.kind, 'findings', k.n)), '[]')
           from (select f.unit_type_key as type, f.part_kind as kind, count(*)::int as n
                   from findings f
                  where f.unit_type_key = any($10::text[]) and ${FINDING_FILTERS}
                  group by 1, 2
                 union all
                 select $1, part_kind, count(*)::int from sel group by part_kind) k) as fleet,
        (select coalesce(json_agg(json_build_object('label', x.label, 'partLabel', x.part_label, 'partKind', x.part_kind,
                  'findings', x.n, 'units', x.units, 'repeats', x.r, 'along', x.sa / x.n, 'left', x.sl / x.n) order by x.n desc, x.label), '[]')
           from (select label, min(part_kind) as part_kind, min(part_label) as part_label, sum(n)::int as n, count(*)::int as units,
                        sum(r)::int as r, sum(sa) as sa, sum(sl) as sl
                   from lu group by label) x) as rows,
        (select coalesce(json_agg(json_build_object('col', c.col, 'row', c.row, 'count', c.n) order by c.col, c.row), '[]')
           from (select least(greatest(floor(front_along / $9::float8), 0), ceil(t.length_in / $9::float8) - 1)::int as col,
                        least(greatest(floor((front_left + t.width_in / 2) / $9::float8), 0), ceil(t.width_in / $9::float8) - 1)::int as row,
                        count(*)::int as n
                   from sel, unit_types t where t.key = $1 group by 1, 2) c) as cells,
        (select coalesce(json_agg(json_build_object('month', m.month, 'findings', m.n, 'repeats', m.r) order by m.month), '[]')
           from (select a.month, a.n, coalesce(b.r, 0) as r
                   from (select to_char(m0, 'YYYY-MM') as month, n
                           from (select date_trunc('month', day) as m0, count(*)::int as n from sel group by 1) a0) a
                   left join (select to_char(m0, 'YYYY-MM') as month, r
                                from (select date_trunc('month', day) as m0, count(*)::int as r from reps group by 1) b0) b using (month)) m) as months,
        (select coalesce(json_agg(json_build_object('unitId', w.unit_id, 'roadNumber', un.road_number, 'frontEnd', un.front_end,
                  'repeats', w.r, 'findings', w.n) order by w.r desc, un.road_number), '[]')
           from (select unit_id, sum(r)::int as r, sum(n)::int as n from lu group by unit_id having sum(r) > 0
                  order by 2 desc, 1 limit 10) w join units un on un.id = w.unit_id) as "repeatUnits",
        (select json_build_object('findings', coalesce(sum(n), 0)::int, 'units', count(distinct unit_id)::int, 'repeats', coalesce(sum(r), 0)::int)
           from lu) as totals`;
    return inTx(pool, async (c) => (await c.query<Aggregate>(text, [...params(f, s), cellIn, otherTypes])).rows[0]);
  },

  /** Findings of the selection (one row's when `label` is given), newest first, with the total. */
  async findings(f: HotSpotFilter, s: Settings, label: string | null, limit: number): Promise<{ items: FindingRow[]; total: number; settings: Settings | null }> {
    const text = `
      with
      ${selected('and ($9::text is null or f.label = $9::text)')},
      picked as (select s.*, (r.id is not null) as rep from sel s left join reps r on r.id = s.id)
      select (select count(*)::int from picked) as total, ${CURRENT},
             (select coalesce(json_agg(x order by x."createdAt" desc, x.id), '[]') from (
                select p.id, p.unit_id as "unitId", u.road_number as "roadNumber", u.unit_type_key as "unitTypeKey", fd.front_end as "frontEnd",
                       p.label, p.part_label as "partLabel", p.part_kind as "partKind", p.instance_id as "instanceId",
                       p.defect_type as "defectType", fd.weight, fd.state, fd.created_at as "createdAt", fd.repaired_at as "repairedAt",
                       p.rep as repeat, p.front_along as along, p.front_left as "left"
                  from picked p join findings fd on fd.id = p.id join units u on u.id = p.unit_id
                 order by p.created_at desc, p.id limit $10) x) as items`;
    const r = await inTx(pool, (c) => c.query<{ total: number; settings: Settings | null; items: (Omit<FindingRow, 'createdAt' | 'repairedAt'> & { createdAt: string; repairedAt: string | null })[] }>(text, [...params(f, s), label, limit]));
    const row = r.rows[0];
    return { total: row.total, settings: row.settings, items: row.items.map((i) => ({ ...i, createdAt: new Date(i.createdAt), repairedAt: i.repairedAt ? new Date(i.repairedAt) : null })) };
  },
});
export type HotSpotsRepository = ReturnType<typeof hotSpotsRepository>;
