import { sql } from 'drizzle-orm';
import { addDays, civilDateInZone } from '../../shared/checks/civil-date';
import { defectTypeByKey } from '../../shared/defects/catalogue';
import type { FrontEnd } from '../../shared/domain/frames';
import type { Drawing } from '../../shared/drawings/types';
import { unitLayout, type LayoutPart } from '../../shared/layout/unit-layout';
import { bodyToFront, pinLabel } from '../../shared/orientation';
import { bodyPoint } from '../../shared/domain/frames';
import { defaultRoutine } from '../../shared/walkaround/routine';
import type { Tx } from '../db/client';
import { priorRepairs } from '../modules/hot-spots/repository';

/** Small deterministic generator so every demo database tells the same story. */
function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * What tends to go wrong on the invented fleet, by how a person names the part (front-relative), so the
 * hot spots show the same weak spots on units with the F on either end.
 */
const TROUBLE: { part: string; side?: 'left' | 'right'; defect: string; weight: number; measurement?: () => { value: number; unit: 'in' | 'mm'; nominal?: number } }[] = [
  { part: '#1 traction motor', side: 'left', defect: 'gear_case_leaking', weight: 9 },
  { part: 'Front pilot', defect: 'pilot_height_out_of_limit', weight: 4 },
  { part: 'Left side, #1 sand box', defect: 'sander_inoperative', weight: 5 },
  { part: 'Right side, #2 sand box', defect: 'sand_low', weight: 3 },
  { part: 'Hand brake chain', defect: 'chain_worn', weight: 3 },
  { part: 'Front left uncoupling lever', defect: 'uncoupling_lever_bent', weight: 3 },
  { part: 'Left side, #3 wheel', defect: 'tread_hollow', weight: 2 },
  { part: 'Front headlight', defect: 'headlight_inoperative', weight: 2 },
  { part: 'Right side, #2 stanchion', defect: 'stanchion_loose', weight: 2 },
  { part: 'Left side walkway', defect: 'walkway_slip_trip', weight: 2 },
];

interface SeedCtx {
  drawings: ReadonlyMap<string, Drawing>;
  now: Date;
  timeZone: string;
  days: number;
}

/**
 * A few months of signed daily inspections with findings and their repairs. Runs inside the demo seed's
 * transaction, once.
 */
export async function seedHistory(tx: Tx, ctx: SeedCtx): Promise<{ inspections: number; findings: number }> {
  const rand = rng(20261201);
  const today = civilDateInZone(ctx.now, ctx.timeZone);
  const units = (await tx.execute<{ id: string; road_number: string; unit_type_key: string; front_end: FrontEnd; yard_id: string }>(sql`select id, road_number, unit_type_key, front_end, yard_id from units order by road_number`)).rows;
  const people = (await tx.execute<{ id: string; role: string; yard_id: string | null; email: string }>(sql`select id, role, yard_id, email from people`)).rows;
  const inspectorOf = (yard: string) => people.find((p) => p.role === 'inspector' && p.yard_id === yard) ?? people.find((p) => p.role === 'inspector')!;
  const foremanOf = (yard: string) => people.find((p) => p.role === 'foreman' && p.yard_id === yard) ?? people.find((p) => p.role === 'foreman')!;
  const layouts = new Map<string, LayoutPart[]>();
  const layoutOf = (type: string, fe: FrontEnd) => {
    const k = `${type}:${fe}`;
    if (!layouts.has(k)) layouts.set(k, unitLayout(ctx.drawings.get(type)!, fe).parts.filter((p) => p.view === 'plan'));
    return layouts.get(k)!;
  };
  const totalWeight = TROUBLE.reduce((s, t) => s + t.weight, 0);
  const pick = () => {
    let r = rand() * totalWeight;
    for (const t of TROUBLE) if ((r -= t.weight) < 0) return t;
    return TROUBLE[0];
  };

  const inspRows: Record<string, unknown>[] = [];
  const findingRows: Record<string, unknown>[] = [];
  const eventRows: Record<string, unknown>[] = [];
  const openFederal = new Set<string>();

  for (let d = ctx.days; d >= 1; d--) {
    const day = addDays(today, -d);
    for (const u of units) {
      if (rand() < 0.08) continue; // not every unit is used every day
      const drawing = ctx.drawings.get(u.unit_type_key)!;
      const insp = inspectorOf(u.yard_id);
      const at = new Date(`${day}T13:${String(Math.floor(rand() * 50)).padStart(2, '0')}:00Z`); // morning in the Central zone
      const inspectionId = crypto.randomUUID();
      const routine = defaultRoutine(drawing);
      inspRows.push({ id: inspectionId, unit_id: u.id, inspector_id: insp.id, kind: 'daily', status: 'signed', front_end_seen: u.front_end, front_end_recorded: u.front_end, yard_id: u.yard_id, routine_snapshot: JSON.stringify({ id: null, unitTypeKey: drawing.key, personal: false, ...routine, version: 0 }), started_at: new Date(at.getTime() - 40 * 60_000), signed_at: at });
      if (rand() > 0.09) continue;
      const trouble = pick();
      const layout = layoutOf(u.unit_type_key, u.front_end);
      const part = layout.find((p) => p.label === trouble.part || p.label.toLowerCase() === trouble.part.toLowerCase());
      const defect = defectTypeByKey(trouble.defect);
      if (!part || !defect || defect.partKind !== part.kind) continue;
      // Centred parts pinned on one side: left is -y with the F on the short hood, +y with it on the long hood.
      const leftY = u.front_end === 'short_hood' ? -1 : 1;
      const y = trouble.side ? (trouble.side === 'left' ? leftY : -leftY) * (8 + rand() * 10) : part.y + (rand() - 0.5) * 4;
      const x = part.x + (rand() - 0.5) * 6;
      const body = bodyPoint(x, y, part.z);
      const front = bodyToFront(body, u.front_end, drawing.lengthIn);
      const pinSideOf = part.side === 'center' ? (trouble.side ?? 'center') : part.side;
      const label = pinLabel({ instanceId: part.instanceId, kind: part.kind, side: part.side, end: part.end, number: part.number, count: part.count, label: part.label, front: { along: part.along, left: part.left, z: part.z } as never }, pinSideOf);
      const findingId = crypto.randomUUID();
      const age = d;
      // Older findings went through the whole repair; the last two weeks still have work open.
      const state = age > 14 ? 'verified' : age > 8 ? (rand() < 0.5 ? 'repaired' : 'verified') : age > 3 ? 'in_repair' : 'open';
      const foreman = foremanOf(u.yard_id);
      const repairedAt = state === 'verified' || state === 'repaired' ? new Date(at.getTime() + (1 + Math.floor(rand() * 3)) * 86400_000) : null;
      const weight = defect.weight;
      findingRows.push({
        id: findingId, inspection_id: inspectionId, unit_id: u.id, unit_type_key: u.unit_type_key, part_id: part.partId, instance_id: part.instanceId, part_kind: part.kind,
        view: 'plan', body_x: x, body_y: y, body_z: part.z, front_along: front.along, front_left: front.left, front_end: u.front_end, label, part_label: part.label,
        side: pinSideOf, end_role: part.end ?? null, number: part.number ?? null, defect_type: defect.key, weight, rule: defect.rule ?? null,
        note: 'Found on the daily walk', state, assigned_to: state === 'open' ? null : foreman.id, created_by: insp.id, created_at: at, updated_at: repairedAt ?? at, repaired_at: repairedAt,
      });
      eventRows.push({ finding_id: findingId, kind: 'created', from_state: null, to_state: 'open', actor_id: insp.id, at, details: JSON.stringify({ label, weight }) });
      if (state !== 'open') eventRows.push({ finding_id: findingId, kind: 'assigned', from_state: 'open', to_state: 'in_repair', actor_id: foreman.id, at: new Date(at.getTime() + 3600_000), details: JSON.stringify({ assigneeId: foreman.id }) });
      if (repairedAt) eventRows.push({ finding_id: findingId, kind: 'repaired', from_state: 'in_repair', to_state: 'repaired', actor_id: foreman.id, at: repairedAt, details: JSON.stringify({ whatDone: 'Repaired and tested', minutes: 30 + Math.floor(rand() * 90) }) });
      if (state === 'verified') eventRows.push({ finding_id: findingId, kind: 'verified', from_state: 'repaired', to_state: 'verified', actor_id: insp.id, at: new Date(repairedAt!.getTime() + 86400_000), details: null });
      if (weight === 'federal' && (state === 'open' || state === 'in_repair')) openFederal.add(u.id);
    }
  }

  const insertJson = async (table: string, rows: Record<string, unknown>[]) => {
    for (let i = 0; i < rows.length; i += 500) {
      const chunk = rows.slice(i, i + 500);
      await tx.execute(sql`insert into ${sql.raw(table)} select * from json_populate_recordset(null::${sql.raw(table)}, ${JSON.stringify(chunk)}::json)`);
    }
  };
  // json_populate_recordset fills defaults as null, so give every not-null column a value above.
  for (const r of inspRows) Object.assign(r, { version: 1, routine_snapshot: JSON.parse(String(r.routine_snapshot)) });
  await insertJson('inspections', inspRows);
  // Every historical record covered its whole routine: parts with a finding as such, the rest passed.
  await tx.execute(sql`
    insert into inspection_items (inspection_id, instance_id, state, updated_at)
    select i.id, ids.instance_id, 'passed', i.signed_at
      from inspections i
      cross join lateral (select distinct jsonb_array_elements_text(a->'instanceIds') as instance_id from jsonb_array_elements(i.routine_snapshot->'areas') a) ids
     where i.status = 'signed'`);
  for (const r of findingRows) Object.assign(r, { version: 1 });
  await insertJson('findings', findingRows);
  // Days since each finding's part last had this defect repaired (the hot spots repeat rule), in one pass.
  await priorRepairs(tx).refreshAll();
  for (const r of eventRows) Object.assign(r, { id: crypto.randomUUID(), details: r.details ? JSON.parse(String(r.details)) : null });
  await insertJson('finding_events', eventRows);
  await tx.execute(sql`
    update inspection_items it set state = 'finding' from findings f
     where f.inspection_id = it.inspection_id and f.instance_id = it.instance_id`);
  for (const unitId of openFederal) {
    const first = findingRows.find((f) => f.unit_id === unitId && f.weight === 'federal' && (f.state === 'open' || f.state === 'in_repair'))!;
    await tx.execute(sql`update units set non_complying_since = ${first.created_at as Date} where id = ${unitId}`);
    const yard = await tx.execute<{ name: string }>(sql`select y.name from units u join yards y on y.id = u.yard_id where u.id = ${unitId}`);
    await tx.execute(sql`insert into unit_tags (unit_id, opened_at, opened_by, place) values (${unitId}, ${first.created_at as Date}, ${first.created_by as string}, ${yard.rows[0]?.name ?? ''})`);
  }
  return { inspections: inspRows.length, findings: findingRows.length };
}
