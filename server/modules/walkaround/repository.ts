import { and, asc, eq, inArray, isNull, sql } from 'drizzle-orm';
import type { PgInsertValue } from 'drizzle-orm/pg-core';
import type { DbOrTx } from '../../db/client';
import { auditInsert } from '../../lib/audit';
import { pinTurn, type PinKey } from '../hot-spots/repository';
import {
  findingEvents,
  findings,
  inspectionItems,
  inspections,
  people,
  photos,
  railroadSettings,
  routines,
  unitTags,
  units,
  yards,
} from '../../db/schema';

export type FindingRow = typeof findings.$inferSelect;
export type InspectionRow = typeof inspections.$inferSelect;

/** Everything the walkaround reads and writes; the only place its SQL lives. */
export interface ViewParts {
  unit: { id: string; roadNumber: string; unitTypeKey: string; frontEnd: string; yardName: string | null };
  inspectorName: string;
  railroad: { name: string | null; reportingMark: string | null; timeZone: string | null };
  items: { instanceId: string; state: string; reason: string | null }[];
  photos: { id: string; findingId: string }[];
  /** signedAt as PostgreSQL writes a timestamptz in JSON. */
  corrections: { id: string; note: string | null; signedAt: string | null; by: string }[];
}

export const walkaroundRepository = (db: DbOrTx) => ({
  async settings() {
    const [s] = await db.select().from(railroadSettings).limit(1);
    return s;
  },
  async unit(id: string) {
    const r = await db
      .select({ unit: units, yardName: yards.name })
      .from(units)
      .leftJoin(yards, eq(yards.id, units.yardId))
      .where(eq(units.id, id))
      .limit(1);
    return r[0] ? { ...r[0].unit, yardName: r[0].yardName } : null;
  },
  /** What pinning a finding needs before its transaction, in one query: the inspection, its unit and yard, and the railroad's time zone. */
  async findingContext(inspectionId: string) {
    const r = await db
      .select({ insp: inspections, unit: units, yardName: yards.name, timeZone: railroadSettings.timeZone })
      .from(inspections)
      .innerJoin(units, eq(units.id, inspections.unitId))
      .leftJoin(yards, eq(yards.id, units.yardId))
      .leftJoin(railroadSettings, eq(railroadSettings.id, 1))
      .where(eq(inspections.id, inspectionId))
      .limit(1);
    const row = r[0];
    return row ? { insp: row.insp, unit: { ...row.unit, yardName: row.yardName }, timeZone: row.timeZone ?? 'UTC' } : null;
  },
  /**
   * A new finding and its trail in one statement: the finding, its "created" event, its part marked as a
   * finding in the coverage, and the audit entry (inside the caller's transaction). The id is chosen by
   * the caller so the trail can name it; the foreign keys are checked at the end of the statement.
   */
  async insertFindingWithTrail(v: PgInsertValue<typeof findings> & { id: string }, t: { inspectionId: string; instanceId: string; actorId: string; event: unknown; ip: string | null; action: string; audit: unknown }) {
    const ev = db.$with('ev', {}).as(sql`
      insert into finding_events (finding_id, kind, to_state, actor_id, details)
      values (${v.id}, 'created', 'open', ${t.actorId}, ${JSON.stringify(t.event)}::jsonb)`);
    const item = db.$with('item', {}).as(sql`
      insert into inspection_items (inspection_id, instance_id, state, reason, updated_at)
      values (${t.inspectionId}, ${t.instanceId}, 'finding', null, now())
      on conflict (inspection_id, instance_id) do update set state = 'finding', reason = null, updated_at = now()`);
    const au = db.$with('au', {}).as(auditInsert(db, { actorId: t.actorId, action: t.action, entity: 'finding', entityId: v.id, ip: t.ip, details: t.audit }).getSQL());
    const [r] = await db.with(ev, item, au).insert(findings).values(v).returning();
    return r;
  },

  async lockUnit(id: string) {
    await db.execute(sql`select id from units where id = ${id} for update`);
  },
  async routine(personId: string | null, unitTypeKey: string) {
    const r = await db
      .select()
      .from(routines)
      .where(and(personId ? eq(routines.personId, personId) : isNull(routines.personId), eq(routines.unitTypeKey, unitTypeKey)))
      .limit(1);
    return r[0] ?? null;
  },
  async insertRoutine(v: typeof routines.$inferInsert) {
    const [r] = await db.insert(routines).values(v).returning();
    return r;
  },
  async updateRoutine(id: string, version: number, v: Partial<typeof routines.$inferInsert>) {
    const r = await db
      .update(routines)
      .set({ ...v, version: sql`${routines.version} + 1`, updatedAt: new Date() })
      .where(and(eq(routines.id, id), eq(routines.version, version)))
      .returning();
    return r[0] ?? null;
  },
  async inspection(id: string) {
    const r = await db.select().from(inspections).where(eq(inspections.id, id)).limit(1);
    return r[0] ?? null;
  },
  async inspectionByKey(inspectorId: string, key: string) {
    const r = await db
      .select()
      .from(inspections)
      .where(and(eq(inspections.inspectorId, inspectorId), eq(inspections.idempotencyKey, key)))
      .limit(1);
    return r[0] ?? null;
  },
  async insertInspection(v: typeof inspections.$inferInsert) {
    const [r] = await db.insert(inspections).values(v).returning();
    return r;
  },
  async signInspection(id: string, version: number) {
    const r = await db
      .update(inspections)
      .set({ status: 'signed', signedAt: new Date(), version: sql`${inspections.version} + 1` })
      .where(and(eq(inspections.id, id), eq(inspections.status, 'in_progress'), eq(inspections.version, version)))
      .returning();
    return r[0] ?? null;
  },
  /** Locks the inspection for this transaction and bumps its version in one statement; its status, or null. */
  async lockAndTouch(id: string) {
    const r = await db.execute<{ status: string }>(sql`update inspections set version = version + 1 where id = ${id} returning status`);
    return r.rows[0]?.status ?? null;
  },
  /** lockAndTouch for a new pin, which also takes its part's turn first (see priorRepairs) in the same round trip. */
  async lockForPin(id: string, key: PinKey) {
    const r = await db.execute<{ status: string }>(sql`
      with turn as materialized (select ${pinTurn(key)})
      update inspections i set version = i.version + 1 from turn where i.id = ${id} returning i.status`);
    return r.rows[0]?.status ?? null;
  },
  async listInspections(f: { inspectorId?: string; unitId?: string; status?: string; limit: number }) {
    return db
      .select({
        id: inspections.id,
        kind: inspections.kind,
        status: inspections.status,
        startedAt: inspections.startedAt,
        signedAt: inspections.signedAt,
        unitId: inspections.unitId,
        roadNumber: units.roadNumber,
        inspector: people.name,
        correctsId: inspections.correctsId,
      })
      .from(inspections)
      .innerJoin(units, eq(units.id, inspections.unitId))
      .innerJoin(people, eq(people.id, inspections.inspectorId))
      .where(
        and(
          f.inspectorId ? eq(inspections.inspectorId, f.inspectorId) : undefined,
          f.unitId ? eq(inspections.unitId, f.unitId) : undefined,
          f.status ? eq(inspections.status, f.status) : undefined,
        ),
      )
      .orderBy(sql`${inspections.startedAt} desc`)
      .limit(f.limit);
  },

  /**
   * Everything an inspection's view shows besides the record and its findings, in one statement: the unit
   * and yard, the inspector's name, the railroad, the coverage marks, the photos and the corrections.
   */
  async viewParts(inspectionId: string) {
    const r = await db.execute<ViewParts & Record<string, unknown>>(sql`
      select json_build_object('id', u.id, 'roadNumber', u.road_number, 'unitTypeKey', u.unit_type_key, 'frontEnd', u.front_end, 'yardName', y.name) as unit,
             coalesce(pe.name, '') as "inspectorName",
             json_build_object('name', s.name, 'reportingMark', s.reporting_mark, 'timeZone', s.time_zone) as railroad,
             (select coalesce(json_agg(json_build_object('instanceId', it.instance_id, 'state', it.state, 'reason', it.reason)), '[]')
                from inspection_items it where it.inspection_id = i.id) as items,
             (select coalesce(json_agg(json_build_object('id', p.id, 'findingId', p.finding_id) order by p.created_at), '[]')
                from photos p join findings f on f.id = p.finding_id where f.inspection_id = i.id) as photos,
             (select coalesce(json_agg(json_build_object('id', c.id, 'note', c.correction_note, 'signedAt', c.signed_at, 'by', cp.name) order by c.signed_at), '[]')
                from inspections c join people cp on cp.id = c.inspector_id where c.corrects_id = i.id) as corrections
        from inspections i
        join units u on u.id = i.unit_id
        left join yards y on y.id = u.yard_id
        left join people pe on pe.id = i.inspector_id
        left join railroad_settings s on s.id = 1
       where i.id = ${inspectionId}`);
    return r.rows[0] ?? null;
  },
  async setItems(inspectionId: string, rows: { instanceId: string; state: string; reason: string | null }[]) {
    if (!rows.length) return;
    await db
      .insert(inspectionItems)
      .values(rows.map((r) => ({ inspectionId, ...r })))
      .onConflictDoUpdate({
        target: [inspectionItems.inspectionId, inspectionItems.instanceId],
        set: { state: sql`excluded.state`, reason: sql`excluded.reason`, updatedAt: new Date() },
      });
  },
  async findingsOfInspection(inspectionId: string) {
    return db.select().from(findings).where(eq(findings.inspectionId, inspectionId)).orderBy(asc(findings.createdAt));
  },
  async findingByKey(createdBy: string, key: string) {
    const r = await db.select().from(findings).where(and(eq(findings.createdBy, createdBy), eq(findings.idempotencyKey, key))).limit(1);
    return r[0] ?? null;
  },
  async finding(id: string) {
    const r = await db.select().from(findings).where(eq(findings.id, id)).limit(1);
    return r[0] ?? null;
  },

  async photosOf(findingIds: string[]) {
    if (!findingIds.length) return [];
    return db.select({ id: photos.id, findingId: photos.findingId }).from(photos).where(inArray(photos.findingId, findingIds)).orderBy(asc(photos.createdAt));
  },
  async insertPhoto(v: typeof photos.$inferInsert) {
    const [r] = await db.insert(photos).values(v).returning();
    return r;
  },
  async photo(id: string) {
    const r = await db.select().from(photos).where(eq(photos.id, id)).limit(1);
    return r[0] ?? null;
  },
  async openTag(unitId: string) {
    const r = await db.select().from(unitTags).where(and(eq(unitTags.unitId, unitId), isNull(unitTags.clearedAt))).limit(1);
    return r[0] ?? null;
  },
  /** Opens the unit's non-complying tag and flag once; a second federal finding joins the same tag. */
  async markNonComplying(unitId: string, openedBy: string, place: string) {
    await db.execute(sql`update units set non_complying_since = coalesce(non_complying_since, now()) where id = ${unitId}`);
    await db.insert(unitTags).values({ unitId, openedBy, place }).onConflictDoNothing();
  },
  async updateTag(id: string, v: { destination?: string; restrictions?: string }) {
    const [r] = await db.update(unitTags).set(v).where(eq(unitTags.id, id)).returning();
    return r;
  },
  async openFederalFindings(unitId: string) {
    return db
      .select()
      .from(findings)
      .where(and(eq(findings.unitId, unitId), eq(findings.weight, 'federal'), inArray(findings.state, ['open', 'in_repair', 'repaired'])))
      .orderBy(asc(findings.createdAt));
  },

  async personName(id: string) {
    const r = await db.select({ name: people.name }).from(people).where(eq(people.id, id)).limit(1);
    return r[0]?.name ?? '';
  },
  async recipients(roles: string[], yardId: string | null) {
    // Foremen of the unit's yard; with no yard (or nobody there), every active foreman.
    const rows = await db
      .select({ email: people.email, role: people.role, yardId: people.yardId })
      .from(people)
      .where(and(eq(people.active, true), inArray(people.role, roles)));
    const out = new Set<string>();
    for (const role of roles) {
      const ofRole = rows.filter((r) => r.role === role);
      const here = role === 'foreman' && yardId ? ofRole.filter((r) => r.yardId === yardId) : ofRole;
      for (const r of here.length ? here : ofRole) out.add(r.email);
    }
    return [...out];
  },
  async setUnitDate(unitId: string, column: 'last_periodic_on', date: string) {
    await db.execute(sql`update units set ${sql.raw(column)} = ${date}, version = version + 1, updated_at = now() where id = ${unitId}`);
  },
});
