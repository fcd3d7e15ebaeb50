import { sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { likeLiteral } from '../../lib/like';
import type { UnitRow } from '../../../shared/api/units';

export interface UnitFilter {
  q?: string;
  yard?: string;
  type?: string;
  frontEnd?: string;
  state?: string;
  id?: string;
}

/** Units with their type, yard and count of open findings, in one query. */
export const unitsRepository = (db: DbOrTx) => ({
  async list(f: UnitFilter): Promise<UnitRow[]> {
    const r = await db.execute<UnitRow & Record<string, unknown>>(sql`
      select u.id, u.road_number as "roadNumber", u.unit_type_key as "unitTypeKey", t.name as "unitTypeName",
             u.front_end as "frontEnd", u.yard_id as "yardId", y.name as "yardName", u.service_state as "serviceState",
             (u.non_complying_since is not null) as "nonComplying", u.non_complying_since as "nonComplyingSince",
             u.condition_monitoring as "conditionMonitoring", u.hump_stencilled as "humpStencilled",
             u.last_periodic_on as "lastPeriodicOn", u.last_annual_on as "lastAnnualOn", u.last_hand_brake_on as "lastHandBrakeOn",
             u.last_main_reservoir_on as "lastMainReservoirOn", u.last_cm_check_on as "lastCmCheckOn",
             (select count(*)::int from findings f where f.unit_id = u.id and f.state in ('open', 'in_repair', 'repaired')) as "openFindings",
             u.version
        from units u
        join unit_types t on t.key = u.unit_type_key
        left join yards y on y.id = u.yard_id
       where (${f.id ?? null}::uuid is null or u.id = ${f.id ?? null}::uuid)
         and (${f.q ?? null}::text is null or u.road_number ilike '%' || ${f.q ? likeLiteral(f.q) : null}::text || '%')
         and (${f.yard ?? null}::uuid is null or u.yard_id = ${f.yard ?? null}::uuid)
         and (${f.type ?? null}::text is null or u.unit_type_key = ${f.type ?? null}::text)
         and (${f.frontEnd ?? null}::text is null or u.front_end = ${f.frontEnd ?? null}::text)
         and (${f.state ?? null}::text is null
              or (${f.state ?? null}::text = 'non_complying' and u.non_complying_since is not null)
              or u.service_state = ${f.state ?? null}::text)
       order by (u.non_complying_since is null), u.road_number`);
    return r.rows;
  },
  async get(id: string): Promise<UnitRow | null> {
    return (await this.list({ id }))[0] ?? null;
  },
  /** Applies a patch only when the stored version matches; null means stale. */
  async update(id: string, version: number, patch: Record<string, unknown>) {
    const cols: Record<string, string> = {
      frontEnd: 'front_end', yardId: 'yard_id', serviceState: 'service_state', conditionMonitoring: 'condition_monitoring',
      humpStencilled: 'hump_stencilled', lastPeriodicOn: 'last_periodic_on', lastAnnualOn: 'last_annual_on',
      lastHandBrakeOn: 'last_hand_brake_on', lastMainReservoirOn: 'last_main_reservoir_on', lastCmCheckOn: 'last_cm_check_on',
    };
    const sets = Object.entries(patch)
      .filter(([k, v]) => k in cols && v !== undefined)
      .map(([k, v]) => sql`${sql.raw(cols[k])} = ${v}`);
    const r = await db.execute<{ id: string }>(sql`
      update units set ${sql.join([...sets, sql`version = version + 1`, sql`updated_at = now()`], sql`, `)}
       where id = ${id} and version = ${version} returning id`);
    return r.rows.length > 0;
  },
});
