import { sql, type SQL } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { likeLiteral } from '../../lib/like';
import type { QueueFilterQuery, QueueItem, QueuePage, QueueSort, QueueSortColumn } from '../../../shared/api/repairs';
import { defectTypeByKey } from '../../../shared/defects/catalogue';

type Row = Omit<QueueItem, 'defectLabel'> & { _keys?: unknown[] } & Record<string, unknown>;

/** One sort key of the queue: a fixed SQL expression (never built from the request), its type for the cursor, its direction. */
interface SortKey {
  expr: SQL;
  type: 'int' | 'text' | 'timestamptz' | 'uuid';
  desc: boolean;
}
const NC_LAST = sql`(case when u.non_complying_since is null then 1 else 0 end)`;
const WEIGHT_ORDER = sql`(case f.weight when 'federal' then 0 when 'shop' then 1 else 2 end)`;
const COLUMNS: Record<QueueSortColumn, Omit<SortKey, 'desc'> & { flip?: boolean }> = {
  unit: { expr: sql`u.road_number`, type: 'text' },
  finding: { expr: sql`f.label`, type: 'text' },
  weight: { expr: WEIGHT_ORDER, type: 'int' },
  state: { expr: sql`(case f.state when 'open' then 0 when 'in_repair' then 1 when 'repaired' then 2 when 'verified' then 3 else 4 end)`, type: 'int' },
  // Nobody yet sorts as the empty name, as the table always showed it.
  assignee: { expr: sql`coalesce(a.name, '')`, type: 'text' },
  // Age descending is oldest first: the found time ascending.
  age: { expr: sql`f.created_at`, type: 'timestamptz', flip: true },
};

/**
 * Non-complying units first (49 CFR 229.9), then the person's sort, then federal before shop before
 * note and oldest first as the queue has always read, then the id so the order is total and a page
 * boundary falls between two rows that can never swap.
 */
function sortKeys(sort: QueueSort | undefined): SortKey[] {
  const keys: SortKey[] = [{ expr: NC_LAST, type: 'int', desc: false }];
  if (sort) {
    const [col, dir] = sort.split('.') as [QueueSortColumn, 'asc' | 'desc'];
    const c = COLUMNS[col];
    keys.push({ expr: c.expr, type: c.type, desc: (dir === 'desc') !== !!c.flip });
  }
  keys.push({ expr: WEIGHT_ORDER, type: 'int', desc: false }, { expr: sql`f.created_at`, type: 'timestamptz', desc: false }, { expr: sql`f.id`, type: 'uuid', desc: false });
  return keys;
}

const CAST = { int: sql.raw('int'), text: sql.raw('text'), timestamptz: sql.raw('timestamptz'), uuid: sql.raw('uuid') };
const UUID_RE = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Whether cursor values fit the sort's keys (count and type), so a stale or foreign cursor is refused before SQL. */
export function queueCursorFits(sort: QueueSort | undefined, values: readonly unknown[]): boolean {
  const keys = sortKeys(sort);
  return (
    values.length === keys.length &&
    keys.every((k, i) => {
      const v = values[i];
      if (k.type === 'int') return Number.isSafeInteger(v);
      if (typeof v !== 'string' || v.length > 500) return false;
      if (k.type === 'uuid') return UUID_RE.test(v);
      if (k.type === 'timestamptz') return !Number.isNaN(Date.parse(v));
      return true;
    })
  );
}

/** Rows strictly after `values` in the key order: past on the first key, or equal on it and past on the rest. */
function after(keys: readonly SortKey[], values: readonly unknown[]): SQL {
  const [k, ...rest] = keys;
  const v = sql`${values[0]}::${CAST[k.type]}`;
  const past = k.desc ? sql`${k.expr} < ${v}` : sql`${k.expr} > ${v}`;
  return rest.length ? sql`(${past} or (${k.expr} = ${v} and ${after(rest, values.slice(1))}))` : past;
}

/** The filters as SQL conditions, only those that are set (each value a parameter). */
function filterWhere(q: QueueFilterQuery): SQL[] {
  const w: SQL[] = [q.state ? sql`f.state = ${q.state}` : sql`f.state in ('open', 'in_repair', 'repaired')`];
  if (q.yard) w.push(sql`u.yard_id = ${q.yard}::uuid`);
  if (q.unit) w.push(sql`f.unit_id = ${q.unit}::uuid`);
  if (q.weight) w.push(sql`f.weight = ${q.weight}`);
  if (q.assignee) w.push(sql`f.assigned_to = ${q.assignee}::uuid`);
  if (q.q) w.push(sql`(u.road_number ilike '%' || ${likeLiteral(q.q)}::text || '%' or f.label ilike '%' || ${likeLiteral(q.q)}::text || '%')`);
  return w;
}

const toItem = ({ _keys, ...x }: Row): QueueItem => ({
  ...x,
  createdAt: new Date(x.createdAt as unknown as string).toISOString(),
  defectLabel: defectTypeByKey(x.defectType)?.label ?? x.defectType,
});

const ITEM_COLUMNS = sql`
  f.id, f.unit_id as "unitId", u.road_number as "roadNumber", u.yard_id as "yardId", y.name as "yardName",
  (u.non_complying_since is not null) as "nonComplying", f.label, f.defect_type as "defectType", f.weight, f.rule,
  f.state, f.assigned_to as "assignedTo", a.name as "assigneeName", f.created_at as "createdAt",
  c.name as "createdByName", floor(extract(epoch from now() - f.created_at) / 86400)::int as "ageDays", f.version`;
const ITEM_JOINS = sql`
  join units u on u.id = f.unit_id
  left join yards y on y.id = u.yard_id
  left join people a on a.id = f.assigned_to
  join people c on c.id = f.created_by`;
const orderBy = (keys: readonly SortKey[], exprs: readonly SQL[]) =>
  sql.join(
    keys.map((k, i) => sql`${exprs[i]} ${sql.raw(k.desc ? 'desc' : 'asc')}`),
    sql`, `,
  );

/**
 * One page of the queue's rows, after the given key values, with each row's key values. The inner
 * query orders only ids and sort keys (a top-N sort over narrow rows); names, yards and the rest are
 * joined for the page's rows alone.
 */
async function queuePageRows(db: DbOrTx, q: QueueFilterQuery, limit: number, afterKeys: readonly unknown[] | null) {
  const keys = sortKeys(q.sort);
  const where = filterWhere(q);
  if (afterKeys) where.push(after(keys, afterKeys));
  const p = keys.map((_, i) => sql.raw(`p.k${i}`));
  const r = await db.execute<Row>(sql`
    select ${ITEM_COLUMNS}, json_build_array(${sql.join(p, sql`, `)}) as "_keys"
      from (select ${sql.join(keys.map((k, i) => sql`${k.expr} as ${sql.raw(`k${i}`)}`), sql`, `)}
              from findings f
              join units u on u.id = f.unit_id
              ${q.sort?.startsWith('assignee.') ? sql`left join people a on a.id = f.assigned_to` : sql``}
             where ${sql.join(where, sql` and `)}
             order by ${orderBy(keys, keys.map((k) => k.expr))}
             limit ${limit}) p
      join findings f on f.id = ${p[p.length - 1]}
      ${ITEM_JOINS}
     order by ${orderBy(keys, p)}`);
  return r.rows;
}

export const repairsRepository = (db: DbOrTx) => ({
  /**
   * One page of the queue in its sort order (see sortKeys), after the key values of the previous page's
   * last row; `lastKeys` are this page's, for the next cursor, or null when nothing follows.
   */
  async queuePage(q: QueueFilterQuery, limit: number, afterKeys: readonly unknown[] | null) {
    const rows = await queuePageRows(db, q, limit + 1, afterKeys);
    const page = rows.slice(0, limit);
    return { items: page.map(toItem), lastKeys: rows.length > limit ? (page[page.length - 1]._keys ?? null) : null };
  },
  /** Every row matching the filters, in the sort order (the CSV export). One statement, so one snapshot. */
  async queueAll(q: QueueFilterQuery): Promise<QueueItem[]> {
    const keys = sortKeys(q.sort);
    const r = await db.execute<Row>(sql`
      select ${ITEM_COLUMNS} from findings f ${ITEM_JOINS}
       where ${sql.join(filterWhere(q), sql` and `)}
       order by ${orderBy(keys, keys.map((k) => k.expr))}`);
    return r.rows.map(toItem);
  },
  /** How many rows match the filters, and what the screen shows whatever the filters. One statement. */
  async queueSummary(q: QueueFilterQuery): Promise<Pick<QueuePage, 'total' | 'assignees' | 'toVerify' | 'tagsToClear'>> {
    const r = await db.execute<Pick<QueuePage, 'total' | 'assignees' | 'toVerify' | 'tagsToClear'>>(sql`
      select (select count(*)::int from findings f join units u on u.id = f.unit_id where ${sql.join(filterWhere(q), sql` and `)}) as total,
             (select count(*)::int from findings where state = 'repaired') as "toVerify",
             (select coalesce(json_agg(json_build_object('id', p.id, 'name', p.name) order by p.name, p.id), '[]'::json)
                from people p
               where p.id in (select assigned_to from findings where state in ('open', 'in_repair', 'repaired') and assigned_to is not null)) as assignees,
             (select coalesce(json_agg(json_build_object('unitId', u.id, 'roadNumber', u.road_number) order by u.road_number), '[]'::json)
                from units u
               where u.non_complying_since is not null
                 and not exists (select 1 from findings f where f.unit_id = u.id and f.weight = 'federal' and f.state in ('open', 'in_repair'))) as "tagsToClear"`);
    return r.rows[0];
  },
  async lockFinding(id: string) {
    const r = await db.execute<{ id: string; state: string; version: number; weight: string; unit_id: string; created_by: string; label: string; inspection_id: string }>(
      sql`select id, state, version, weight, unit_id, created_by, label, inspection_id from findings where id = ${id} for update`,
    );
    return r.rows[0] ?? null;
  },
  async lastEvent(findingId: string) {
    const r = await db.execute<{ kind: string; at: string; name: string }>(sql`
      select e.kind, e.at, p.name from finding_events e join people p on p.id = e.actor_id
       where e.finding_id = ${findingId} order by e.at desc limit 1`);
    return r.rows[0] ?? null;
  },
  async lastRepairer(findingId: string) {
    const r = await db.execute<{ actor_id: string; id: string }>(sql`
      select actor_id, id from finding_events where finding_id = ${findingId} and kind = 'repaired' order by at desc limit 1`);
    return r.rows[0] ?? null;
  },
  async applyState(id: string, patch: { state: string; assignedTo?: string | null; repaired?: boolean; voidReason?: string }) {
    await db.execute(sql`
      update findings set state = ${patch.state},
             assigned_to = case when ${patch.assignedTo === undefined} then assigned_to else ${patch.assignedTo ?? null}::uuid end,
             repaired_at = case when ${!!patch.repaired} then now() else repaired_at end,
             void_reason = coalesce(${patch.voidReason ?? null}, void_reason),
             version = version + 1, updated_at = now()
       where id = ${id}`);
  },
  async insertEvent(v: { findingId: string; kind: string; fromState: string; toState: string; actorId: string; details?: unknown }) {
    const r = await db.execute<{ id: string }>(sql`
      insert into finding_events (finding_id, kind, from_state, to_state, actor_id, details)
      values (${v.findingId}, ${v.kind}, ${v.fromState}, ${v.toState}, ${v.actorId}, ${JSON.stringify(v.details ?? null)}::jsonb) returning id`);
    return r.rows[0].id;
  },
  async personActive(id: string) {
    const r = await db.execute<{ name: string; role: string }>(sql`select name, role from people where id = ${id} and active`);
    return r.rows[0] ?? null;
  },
  async lockUnit(id: string) {
    const r = await db.execute<{ id: string }>(sql`select id from units where id = ${id} for update`);
    return r.rows.length > 0;
  },
  async openFederalCount(unitId: string) {
    const r = await db.execute<{ n: number }>(sql`select count(*)::int n from findings where unit_id = ${unitId} and weight = 'federal' and state in ('open', 'in_repair')`);
    return r.rows[0].n;
  },
  async clearTag(unitId: string, by: string) {
    const r = await db.execute<{ id: string }>(sql`update unit_tags set cleared_at = now(), cleared_by = ${by} where unit_id = ${unitId} and cleared_at is null returning id`);
    await db.execute(sql`update units set non_complying_since = null, version = version + 1, updated_at = now() where id = ${unitId}`);
    return r.rows[0]?.id ?? null;
  },
  async findingDetail(id: string) {
    const f = await db.execute(sql`
      select f.*, u.road_number, c.name as created_by_name, a.name as assignee_name
        from findings f join units u on u.id = f.unit_id join people c on c.id = f.created_by left join people a on a.id = f.assigned_to
       where f.id = ${id}`);
    if (!f.rows[0]) return null;
    const events = await db.execute(sql`
      select e.id, e.kind, e.from_state as "fromState", e.to_state as "toState", e.at, e.details, p.name as "actor"
        from finding_events e join people p on p.id = e.actor_id where e.finding_id = ${id} order by e.at desc, e.id`);
    const photos = await db.execute(sql`select id, finding_event_id as "eventId" from photos where finding_id = ${id} order by created_at`);
    return { row: f.rows[0] as Record<string, unknown>, events: events.rows, photos: photos.rows as { id: string; eventId: string | null }[] };
  },
});
