/**
 * Seeds a bench database for the hot spots API: units over the drawn unit types (F on either
 * end), inspections spread over two years, and findings pinned on real parts of each drawing with
 * the labels the orientation engine derives under each unit's F. Everything bulk is generated in
 * PostgreSQL with generate_series; only the small part table is built here.
 */
import bcrypt from 'bcryptjs';
import type pg from 'pg';
import { defectTypesFor } from '../shared/defects/catalogue';
import { FRONT_ENDS } from '../shared/domain/frames';
import { isPartKind } from '../shared/domain/parts';
import type { Drawing } from '../shared/drawings/types';
import { deriveLayout, pinLabel } from '../shared/orientation';
import { REBUILD_HOT_SPOTS_SUMMARY, REFRESH_ALL_PRIOR_REPAIR_DAYS } from '../server/modules/hot-spots/repository';

export interface BenchSize {
  units: number;
  inspections: number;
  findings: number;
  /** Days of history, ending today. */
  days: number;
}

export const BENCH_PASSWORD = 'bench-only-password';
export const BENCH_ENGINEER = 'engineer@bench.example';

interface PartVariant {
  type: string;
  frontEnd: string;
  partId: string;
  instanceId: string;
  kind: string;
  view: string;
  x: number;
  y: number;
  z: number;
  along: number;
  left: number;
  label: string;
  partLabel: string;
  side: string;
  endRole: string | null;
  number: number | null;
  defects: string[];
  weights: string[];
}

/** Every part of every drawing under both F positions; centred parts also as pinned from each side. */
export function partVariants(drawings: ReadonlyMap<string, Drawing>): PartVariant[] {
  const out: PartVariant[] = [];
  for (const d of drawings.values()) {
    for (const frontEnd of FRONT_ENDS) {
      const derived = deriveLayout(d.instances.map((i) => ({ instanceId: i.instanceId, kind: i.kind, centre: i.centre })), frontEnd, d.lengthIn);
      derived.forEach((p, i) => {
        const inst = d.instances[i];
        if (!isPartKind(p.kind)) return;
        const defects = defectTypesFor(p.kind).slice(0, 4);
        const sides = p.side === 'center' ? (['center', 'left', 'right'] as const) : [p.side];
        for (const side of sides) {
          out.push({
            type: d.key,
            frontEnd,
            partId: inst.partIds[0] ?? inst.instanceId,
            instanceId: inst.instanceId,
            kind: p.kind,
            view: inst.views[0] ?? 'plan',
            x: inst.centre.x,
            y: inst.centre.y,
            z: inst.centre.z,
            along: p.front.along,
            left: p.front.left,
            label: pinLabel(p, side),
            partLabel: p.label,
            side,
            endRole: p.end ?? null,
            number: p.number ?? null,
            defects: defects.map((t) => t.key),
            weights: defects.map((t) => t.weight),
          });
        }
      });
    }
  }
  return out;
}

async function originalIndexes(c: pg.PoolClient, table: string) {
  const r = await c.query<{ indexname: string; indexdef: string }>(
    `select i.indexname, i.indexdef from pg_indexes i
      where i.schemaname = 'public' and i.tablename = $1
        and not exists (select 1 from pg_constraint k where k.conname = i.indexname)`,
    [table],
  );
  return r.rows;
}

/**
 * Empties the database and fills it. Foreign-key triggers are off during the bulk inserts
 * (session_replication_role = replica; the ids are consistent by construction) and the
 * secondary indexes of the two big tables are dropped and re-created from their own
 * definitions afterwards, which is how a bulk load is done; the schema ends as it began.
 */
export async function seedBench(pool: pg.Pool, drawings: ReadonlyMap<string, Drawing>, size: BenchSize, log: (s: string) => void) {
  const variants = partVariants(drawings);
  const types = [...drawings.values()];
  if (!types.length) throw new Error('No drawings to seed from');
  const c = await pool.connect();
  try {
    const tables = await c.query<{ tablename: string }>(`select tablename from pg_tables where schemaname = 'public'`);
    await c.query(`truncate ${tables.rows.map((t) => `"${t.tablename}"`).join(', ')} restart identity cascade`);
    const hash = await bcrypt.hash(BENCH_PASSWORD, 4);
    await c.query('begin');
    await c.query(`insert into railroad_settings (id, name, reporting_mark, time_zone, repeat_window_days) values (1, 'Bench Railroad', 'BNCH', 'America/Chicago', 90)`);
    await c.query(`insert into yards (id, code, name) values ('00000000-0000-4000-8000-000000000001', 'BY1', 'Bench Yard One'), ('00000000-0000-4000-8000-000000000002', 'BY2', 'Bench Yard Two')`);
    await c.query(
      `insert into people (id, email, name, role, password_hash) values
        ('00000000-0000-4000-8000-0000000000a1', 'inspector@bench.example', 'Bench Inspector', 'inspector', $1),
        ('00000000-0000-4000-8000-0000000000a2', $2, 'Bench Engineer', 'engineer', $1)`,
      [hash, BENCH_ENGINEER],
    );
    for (const t of types) {
      await c.query(`insert into unit_types (key, name, length_in, width_in, axle_count, drawing_file) values ($1, $2, $3, $4, $5, $6)`, [t.key, t.name, t.lengthIn, t.widthIn, t.axleCount, `${t.key}.svg`]);
    }
    const typeKeys = types.map((t) => t.key);
    // Unit u: type u mod n, F on the long hood for every third unit, yard by parity.
    await c.query(
      `insert into units (id, road_number, unit_type_key, front_end, yard_id)
       select md5('unit' || u)::uuid, 'BN ' || lpad(u::text, 4, '0'), ($1::text[])[1 + u % $2],
              case when u % 3 = 2 then 'long_hood' else 'short_hood' end,
              case when u % 2 = 0 then '00000000-0000-4000-8000-000000000001'::uuid else '00000000-0000-4000-8000-000000000002'::uuid end
         from generate_series(0, $3 - 1) u`,
      [typeKeys, typeKeys.length, size.units],
    );
    await c.query('commit');

    await c.query(`create temp table bench_parts (type text, front_end text, idx int, part_id text, instance_id text, kind text, view text,
      x float8, y float8, z float8, along float8, "left" float8, label text, part_label text, side text, end_role text, number smallint,
      defects text[], weights text[])`);
    const byGroup = new Map<string, PartVariant[]>();
    for (const v of variants) {
      const k = `${v.type}|${v.frontEnd}`;
      byGroup.set(k, [...(byGroup.get(k) ?? []), v]);
    }
    const flat = [...byGroup.values()].flatMap((g) => g.map((v, idx) => ({ ...v, idx })));
    await c.query(
      `insert into bench_parts select * from json_to_recordset($1::json) as r(type text, "frontEnd" text, idx int, "partId" text, "instanceId" text,
        kind text, view text, x float8, y float8, z float8, along float8, "left" float8, label text, "partLabel" text, side text, "endRole" text,
        number smallint, defects text[], weights text[])`,
      [JSON.stringify(flat)],
    );
    await c.query(`create temp table bench_groups as select type, front_end, count(*)::int as n from bench_parts group by 1, 2`);
    await c.query('analyze bench_parts; analyze bench_groups');

    const t0 = Date.now();
    await c.query(`set session_replication_role = replica`);
    const insIdx = await originalIndexes(c, 'inspections');
    const finIdx = await originalIndexes(c, 'findings');
    for (const i of [...insIdx, ...finIdx]) await c.query(`drop index "${i.indexname}"`);
    await c.query(`select setseed(0.42)`);
    // Inspection n: unit n mod units, started in time order over the last `days` days.
    await c.query(
      `insert into inspections (id, unit_id, inspector_id, kind, status, front_end_seen, front_end_recorded, yard_id, started_at, signed_at)
       select md5('insp' || n)::uuid, md5('unit' || (n % $1))::uuid, '00000000-0000-4000-8000-0000000000a1',
              case when n % 30 = 0 then 'periodic' else 'daily' end, 'signed', u.front_end, u.front_end, u.yard_id,
              now() - make_interval(secs => ($2::float8 * 86400) * (1 - n::float8 / $3)),
              now() - make_interval(secs => ($2::float8 * 86400) * (1 - n::float8 / $3)) + interval '40 minutes'
         from generate_series(0, $3 - 1) n
         join units u on u.id = md5('unit' || (n % $1))::uuid`,
      [size.units, size.days, size.inspections],
    );
    log(`  inspections: ${size.inspections.toLocaleString('en-US')} in ${((Date.now() - t0) / 1000).toFixed(1)} s`);
    const t1 = Date.now();
    // Finding m belongs to inspection m / per; its part is skewed towards the low indexes of the
    // part list (squared uniform), so some parts are hot; most findings are repaired within days.
    const per = size.findings / size.inspections;
    await c.query(
      `insert into findings (id, inspection_id, unit_id, unit_type_key, part_id, instance_id, part_kind, view, body_x, body_y, body_z,
                             front_along, front_left, front_end, label, part_label, side, end_role, number, defect_type, weight,
                             state, created_by, created_at, updated_at, repaired_at)
       select md5('find' || s.m)::uuid, i.id, i.unit_id, u.unit_type_key, p.part_id, p.instance_id, p.kind, p.view,
              p.x + s.jx, p.y + s.jy, p.z, p.along + case when u.front_end = 'short_hood' then s.jx else -s.jx end,
              p."left" + case when u.front_end = 'short_hood' then -s.jy else s.jy end,
              u.front_end, p.label, p.part_label, p.side, p.end_role, p.number,
              p.defects[1 + (s.r3 * array_length(p.defects, 1))::int % array_length(p.defects, 1)],
              p.weights[1 + (s.r3 * array_length(p.defects, 1))::int % array_length(p.defects, 1)],
              case when s.r4 < 0.9 then 'repaired' when s.r4 < 0.97 then 'open' else 'in_repair' end,
              '00000000-0000-4000-8000-0000000000a1', i.started_at + make_interval(mins => 1 + (s.m % $2::int)),
              i.started_at + make_interval(mins => 1 + (s.m % $2::int)),
              case when s.r4 < 0.9 then i.started_at + make_interval(hours => 2 + (s.r3 * 200)::int) end
         from (select m, random() as r1, random() as r3, random() as r4, (random() - 0.5) * 10 as jx, (random() - 0.5) * 10 as jy
                 from generate_series(0, $1 - 1) m) s
         join inspections i on i.id = md5('insp' || (s.m / $2::int))::uuid
         join units u on u.id = i.unit_id
         join bench_groups g on g.type = u.unit_type_key and g.front_end = u.front_end
         join bench_parts p on p.type = u.unit_type_key and p.front_end = u.front_end and p.idx = floor(g.n * s.r1 * s.r1)::int
        order by s.m`,
      [size.findings, per],
    );
    log(`  findings: ${size.findings.toLocaleString('en-US')} in ${((Date.now() - t1) / 1000).toFixed(1)} s`);
    // The days since each finding's part last had its defect repaired (the repeat rule), in one pass, as the app keeps it.
    const tp = Date.now();
    await c.query(REFRESH_ALL_PRIOR_REPAIR_DAYS);
    log(`  prior_repair_days filled in ${((Date.now() - tp) / 1000).toFixed(1)} s`);
    // Triggers are off for the load: the hot spots summary from the findings, by the function the migration backfills with.
    const ts = Date.now();
    await c.query(REBUILD_HOT_SPOTS_SUMMARY);
    log(`  hot spots summary rebuilt in ${((Date.now() - ts) / 1000).toFixed(1)} s`);
    const t2 = Date.now();
    for (const i of [...insIdx, ...finIdx]) await c.query(i.indexdef);
    await c.query(`set session_replication_role = origin`);
    log(`  indexes rebuilt in ${((Date.now() - t2) / 1000).toFixed(1)} s`);
    const t3 = Date.now();
    await c.query('vacuum (analyze) inspections');
    await c.query('vacuum (analyze) findings');
    await c.query('analyze units');
    for (const t of ['hot_spots_by_label', 'hot_spots_by_cell', 'hot_spots_by_unit', 'hot_spots_label_units']) await c.query(`vacuum (analyze) ${t}`);
    log(`  vacuum analyze in ${((Date.now() - t3) / 1000).toFixed(1)} s`);
  } catch (e) {
    await c.query('rollback').catch(() => {});
    throw e;
  } finally {
    await c.query(`set session_replication_role = origin`).catch(() => {});
    c.release();
  }
}
