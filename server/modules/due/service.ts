import { sql } from 'drizzle-orm';
import { civilDateInZone, type CivilDate } from '../../../shared/checks/civil-date';
import { digestItems, dueItems, unitDueState, type DueItem, type UnitDueState } from '../../../shared/due/board';
import type { Db } from '../../db/client';
import { notFound } from '../../http/errors';
import { enqueueMail } from '../outbox/service';

export interface DueRow {
  unitId: string;
  roadNumber: string;
  unitTypeKey: string;
  yardId: string | null;
  yardName: string | null;
  serviceState: string;
  nonComplying: boolean;
  state: UnitDueState;
  items: DueItem[];
}

/** Local wall-clock hour of an instant in a zone. */
const hourInZone = (at: Date, tz: string) => Number(new Intl.DateTimeFormat('en-US', { timeZone: tz, hour: '2-digit', hourCycle: 'h23' }).format(at));

export function dueService(db: Db) {
  // This process queued today's digest already; the outbox's dedupe still guards other processes.
  let digestDoneFor: CivilDate | null = null;
  async function settings() {
    const r = await db.execute<{ time_zone: string; digest_hour: number; name: string }>(sql`select time_zone, digest_hour, name from railroad_settings where id = 1`);
    return r.rows[0] ?? { time_zone: 'UTC', digest_hour: 6, name: '' };
  }

  /** The due board in one query: unit dates, last signed daily (in the railroad's zone) and extra dates. */
  async function board(on: CivilDate, tz: string, f: { yard?: string; state?: UnitDueState; unit?: string } = {}): Promise<DueRow[]> {
    const r = await db.execute<Record<string, unknown>>(sql`
      select u.id, u.road_number, u.unit_type_key, u.yard_id, y.name as yard_name, u.service_state,
             u.non_complying_since is not null as non_complying, u.condition_monitoring,
             u.last_periodic_on, u.last_cm_check_on, u.last_annual_on, u.last_hand_brake_on, u.last_main_reservoir_on,
             (select max((i.signed_at at time zone ${tz})::date)::text from inspections i
               where i.unit_id = u.id and i.status = 'signed' and i.corrects_id is null and i.kind in ('daily', 'periodic')) as last_daily_on,
             coalesce((select json_agg(json_build_object('id', d.id, 'label', d.label, 'intervalDays', d.interval_days, 'lastDoneOn', d.last_done_on::text) order by d.label)
                         from unit_dates d where d.unit_id = u.id), '[]'::json) as custom
        from units u left join yards y on y.id = u.yard_id
       where (${f.yard ?? null}::uuid is null or u.yard_id = ${f.yard ?? null}::uuid)
         and (${f.unit ?? null}::uuid is null or u.id = ${f.unit ?? null}::uuid)
       order by u.road_number`);
    const rows = r.rows.map((x): DueRow => {
      const items = dueItems(
        {
          serviceState: String(x.service_state),
          conditionMonitoring: !!x.condition_monitoring,
          lastDailyOn: (x.last_daily_on as string) ?? null,
          lastPeriodicOn: (x.last_periodic_on as string) ?? null,
          lastCmCheckOn: (x.last_cm_check_on as string) ?? null,
          lastAnnualOn: (x.last_annual_on as string) ?? null,
          lastHandBrakeOn: (x.last_hand_brake_on as string) ?? null,
          lastMainReservoirOn: (x.last_main_reservoir_on as string) ?? null,
          custom: x.custom as DueUnitCustom[],
        },
        on,
      );
      return {
        unitId: String(x.id),
        roadNumber: String(x.road_number),
        unitTypeKey: String(x.unit_type_key),
        yardId: (x.yard_id as string) ?? null,
        yardName: (x.yard_name as string) ?? null,
        serviceState: String(x.service_state),
        nonComplying: !!x.non_complying,
        state: unitDueState(items),
        items,
      };
    });
    const order = { overdue: 0, due_soon: 1, good: 2 };
    return rows.filter((x) => !f.state || x.state === f.state).sort((a, b) => order[a.state] - order[b.state] || a.roadNumber.localeCompare(b.roadNumber));
  }

  return {
    settings,
    board,
    async today() {
      const s = await settings();
      return { on: civilDateInZone(new Date(), s.time_zone), tz: s.time_zone };
    },

    /**
     * Queues the day's digest for every yard's foremen once the local digest hour has come. The dedupe
     * key (day + yard) and the outbox's unique index make a second call, or a second server, a no-op.
     */
    async runDigest(now = new Date()): Promise<{ queued: number; day: CivilDate | null }> {
      const s = await settings();
      if (hourInZone(now, s.time_zone) < s.digest_hour) return { queued: 0, day: null };
      const day = civilDateInZone(now, s.time_zone);
      if (digestDoneFor === day) return { queued: 0, day };
      const rows = await board(day, s.time_zone);
      const yards = await db.execute<{ id: string; name: string }>(sql`select id, name from yards order by name`);
      const foremen = await db.execute<{ email: string; yard_id: string | null }>(sql`select email, yard_id from people where role = 'foreman' and active`);
      let queued = 0;
      for (const y of yards.rows) {
        const units = rows.filter((r) => r.yardId === y.id).map((r) => ({ r, due: digestItems(r.items) })).filter((x) => x.due.length);
        const lines = units.length
          ? units.flatMap(({ r, due }) => [
              `${r.roadNumber}${r.nonComplying ? ' (NON-COMPLYING)' : ''}`,
              ...due.map((i) => `  - ${i.label}: ${i.status === 'missing' ? 'no date on record' : i.daysLeft! < 0 ? `overdue by ${-i.daysLeft!} day${i.daysLeft === -1 ? '' : 's'} (last good ${i.lastGoodDay})` : `due, last good day ${i.lastGoodDay}`}${i.source ? ` [${i.source}]` : ''}`),
            ])
          : ['Nothing is overdue or due within 7 days.'];
        const to = foremen.rows.filter((f) => f.yard_id === y.id).map((f) => f.email);
        queued += await enqueueMail(
          db,
          to.map((addr) => ({
            kind: 'digest',
            to: addr,
            subject: `${y.name}: due and overdue on ${day} (${units.length} unit${units.length === 1 ? '' : 's'})`,
            body: [`${s.name} — ${y.name}, ${day} (${s.time_zone})`, '', ...lines].join('\n'),
            dedupeKey: `digest:${day}:${y.id}`,
          })),
        );
      }
      digestDoneFor = day;
      return { queued, day };
    },

    /** Everything that happened to a unit, newest first. */
    async history(unitId: string) {
      const u = await db.execute(sql`select id from units where id = ${unitId}`);
      if (!u.rows.length) throw notFound('Unit');
      const r = await db.execute<Record<string, unknown>>(sql`
        select * from (
          select 'inspection_started' as kind, i.started_at as at, p.name as actor, i.id::text as ref, i.kind || ' inspection started' as text, null::text as weight
            from inspections i join people p on p.id = i.inspector_id where i.unit_id = ${unitId} and i.corrects_id is null
          union all
          select 'inspection_signed', i.signed_at, p.name, i.id::text, i.kind || ' inspection signed', null
            from inspections i join people p on p.id = i.inspector_id where i.unit_id = ${unitId} and i.status = 'signed' and i.corrects_id is null
          union all
          select 'correction', i.signed_at, p.name, i.corrects_id::text, 'correction: ' || coalesce(i.correction_note, ''), null
            from inspections i join people p on p.id = i.inspector_id where i.unit_id = ${unitId} and i.corrects_id is not null
          union all
          select 'finding_' || e.kind, e.at, p.name, f.id::text,
                 f.label || ' — ' || f.defect_type || case when e.kind in ('voided', 'sent_back') then ': ' || coalesce(e.details->>'reason', '') when e.kind = 'repaired' then ': ' || coalesce(e.details->>'whatDone', '') else '' end,
                 f.weight
            from finding_events e join findings f on f.id = e.finding_id join people p on p.id = e.actor_id where f.unit_id = ${unitId}
          union all
          select 'tag_opened', t.opened_at, p.name, t.id::text, 'non-complying tag opened', 'federal' from unit_tags t join people p on p.id = t.opened_by where t.unit_id = ${unitId}
          union all
          select 'tag_cleared', t.cleared_at, p.name, t.id::text, 'non-complying tag cleared', null from unit_tags t join people p on p.id = t.cleared_by where t.unit_id = ${unitId} and t.cleared_at is not null
          union all
          select 'unit_changed', a.at, p.name, a.entity_id, a.action || ': ' || coalesce((a.details->'changed')::text, ''), null
            from audit_log a left join people p on p.id = a.actor_id where a.entity = 'unit' and a.entity_id = ${unitId}
        ) h order by at desc limit 500`);
      return r.rows.map((x) => ({ ...x, at: new Date(x.at as string).toISOString() }));
    },
  };
}

type DueUnitCustom = { id: string; label: string; intervalDays: number; lastDoneOn: string };
export type DueService = ReturnType<typeof dueService>;
