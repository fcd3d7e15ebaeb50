import { sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import type { QueueItem, QueueQuery } from '../../../shared/api/repairs';
import { defectTypeByKey } from '../../../shared/defects/catalogue';

type Row = Omit<QueueItem, 'defectLabel'> & Record<string, unknown>;

export const repairsRepository = (db: DbOrTx) => ({
  /** The queue: non-complying units first, then federal, then oldest. One query. */
  async queue(q: QueueQuery): Promise<QueueItem[]> {
    const r = await db.execute<Row>(sql`
      select f.id, f.unit_id as "unitId", u.road_number as "roadNumber", u.yard_id as "yardId", y.name as "yardName",
             (u.non_complying_since is not null) as "nonComplying", f.label, f.defect_type as "defectType", f.weight, f.rule,
             f.state, f.assigned_to as "assignedTo", a.name as "assigneeName", f.created_at as "createdAt",
             c.name as "createdByName", floor(extract(epoch from now() - f.created_at) / 86400)::int as "ageDays", f.version
        from findings f
        join units u on u.id = f.unit_id
        left join yards y on y.id = u.yard_id
        left join people a on a.id = f.assigned_to
        join people c on c.id = f.created_by
       where (${q.state ?? null}::text is null and f.state in ('open', 'in_repair', 'repaired') or f.state = ${q.state ?? null}::text)
         and (${q.yard ?? null}::uuid is null or u.yard_id = ${q.yard ?? null}::uuid)
         and (${q.unit ?? null}::uuid is null or f.unit_id = ${q.unit ?? null}::uuid)
         and (${q.weight ?? null}::text is null or f.weight = ${q.weight ?? null}::text)
         and (${q.assignee ?? null}::uuid is null or f.assigned_to = ${q.assignee ?? null}::uuid)
         and (${q.q ?? null}::text is null or u.road_number ilike '%' || ${q.q ?? null}::text || '%' or f.label ilike '%' || ${q.q ?? null}::text || '%')
       order by (u.non_complying_since is null), case f.weight when 'federal' then 0 when 'shop' then 1 else 2 end, f.created_at
       limit 2000`);
    return r.rows.map((x) => ({ ...x, createdAt: new Date(x.createdAt as unknown as string).toISOString(), defectLabel: defectTypeByKey(x.defectType)?.label ?? x.defectType }));
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
