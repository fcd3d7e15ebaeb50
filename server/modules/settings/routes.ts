import { asc, desc, eq, sql } from 'drizzle-orm';
import { z } from 'zod';
import { SettingsBody } from '../../../shared/api/settings';
import { CAN } from '../../../shared/domain/roles';
import { auditLog, people, railroadSettings, yards } from '../../db/schema';
import { AppError } from '../../http/errors';
import { route, type RouteDef } from '../../http/routes';
import { audit } from '../../lib/audit';
import { priorRepairs } from '../hot-spots/repository';
import type { Deps } from '../../deps';

const settingsCols = {
  name: railroadSettings.name,
  reportingMark: railroadSettings.reportingMark,
  timeZone: railroadSettings.timeZone,
  digestHour: railroadSettings.digestHour,
  repeatWindowDays: railroadSettings.repeatWindowDays,
};

export function settingsRoutes({ db }: Deps): RouteDef[] {
  return [
    route({
      method: 'get',
      path: '/health',
      access: 'public',
      summary: 'Liveness and database reachability',
      handler: async () => {
        await db.execute(sql`select 1`);
        return { body: { status: 'ok', db: 'ok' } };
      },
    }),
    route({
      method: 'get',
      path: '/settings',
      access: 'signed_in',
      summary: "The railroad's name, reporting mark, time zone and settings",
      handler: async () => {
        const [s] = await db.select(settingsCols).from(railroadSettings).limit(1);
        if (!s) throw new AppError('not_found', 'The railroad is not set up yet');
        return { body: s };
      },
    }),
    route({
      method: 'patch',
      path: '/settings',
      access: CAN.administer,
      summary: 'Change railroad settings',
      body: SettingsBody,
      handler: async ({ body, person, ip }) => {
        return db.transaction(async (tx) => {
          const [before] = await tx.select({ timeZone: railroadSettings.timeZone }).from(railroadSettings).where(eq(railroadSettings.id, 1));
          const [s] = await tx.update(railroadSettings).set({ ...body, updatedAt: new Date() }).where(eq(railroadSettings.id, 1)).returning(settingsCols);
          // Repeat day counts are calendar days in the railroad's zone: recount them when the zone moves.
          if (body.timeZone && before && body.timeZone !== before.timeZone) await priorRepairs(tx).refreshAll();
          await audit(tx, { actorId: person.id, action: 'settings_updated', entity: 'settings', ip, details: body });
          return { body: s };
        });
      },
    }),
    route({
      method: 'get',
      path: '/yards',
      access: 'signed_in',
      summary: 'Yards of the railroad',
      handler: async () => ({ body: { items: await db.select().from(yards).orderBy(asc(yards.name)) } }),
    }),
    route({
      method: 'get',
      path: '/audit',
      access: CAN.administer,
      summary: 'The audit log, newest first (read only)',
      query: z.object({ limit: z.coerce.number().int().min(1).max(500).default(100), before: z.coerce.number().int().positive().optional() }),
      handler: async ({ query }) => {
        const rows = await db
          .select({ id: auditLog.id, at: auditLog.at, action: auditLog.action, entity: auditLog.entity, entityId: auditLog.entityId, ip: auditLog.ip, details: auditLog.details, actor: people.name })
          .from(auditLog)
          .leftJoin(people, eq(people.id, auditLog.actorId))
          .where(query.before ? sql`${auditLog.id} < ${query.before}` : undefined)
          .orderBy(desc(auditLog.id))
          .limit(query.limit);
        return { body: { items: rows } };
      },
    }),
  ];
}
