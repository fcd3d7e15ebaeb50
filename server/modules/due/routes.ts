import { sql } from 'drizzle-orm';
import { IdParams } from '../../../shared/api/common';
import { DueQuery, UnitDateBody } from '../../../shared/api/due';
import { CAN } from '../../../shared/domain/roles';
import { notFound } from '../../http/errors';
import { route, type RouteDef } from '../../http/routes';
import { audit } from '../../lib/audit';
import { sendCsv } from '../../lib/csv';
import type { Deps } from '../../deps';

export function dueRoutes(deps: Deps): RouteDef[] {
  const svc = deps.services.due;
  return [
    route({
      method: 'get',
      path: '/due',
      access: CAN.readRecords,
      summary: 'The due board: every unit’s intervals as good, due soon or overdue',
      query: DueQuery,
      handler: async ({ query }) => {
        const t = await svc.today();
        const on = query.on ?? t.on;
        return { body: { on, timeZone: t.tz, items: await svc.board(on, t.tz, { yard: query.yard, state: query.state }) } };
      },
    }),
    route({
      method: 'get',
      path: '/due.csv',
      access: CAN.readRecords,
      summary: 'The due board as CSV, one row per unit and item',
      query: DueQuery,
      handler: async ({ query, res }) => {
        const t = await svc.today();
        const on = query.on ?? t.on;
        const rows = (await svc.board(on, t.tz, { yard: query.yard, state: query.state })).flatMap((u) =>
          u.items.map((i) => ({ unit: u.roadNumber, yard: u.yardName, unitState: u.state, item: i.label, lastDone: i.lastDone, lastGoodDay: i.lastGoodDay, daysLeft: i.daysLeft, status: i.status, source: i.source })),
        );
        sendCsv(
          res,
          `due-board-${on}.csv`,
          [
            { key: 'unit', header: 'Unit' },
            { key: 'yard', header: 'Yard' },
            { key: 'unitState', header: 'Unit state' },
            { key: 'item', header: 'Item' },
            { key: 'lastDone', header: 'Last done' },
            { key: 'lastGoodDay', header: 'Last good day' },
            { key: 'daysLeft', header: 'Days left' },
            { key: 'status', header: 'Status' },
            { key: 'source', header: 'Source' },
          ],
          rows,
        );
      },
    }),
    route({
      method: 'post',
      path: '/units/:id/dates',
      access: CAN.administer,
      summary: 'Add a dated item the railroad tracks for a unit',
      params: IdParams,
      body: UnitDateBody,
      handler: async ({ params, body, person, ip }) => {
        return deps.db.transaction(async (tx) => {
          const u = await tx.execute(sql`select id from units where id = ${params.id}`);
          if (!u.rows.length) throw notFound('Unit');
          const r = await tx.execute<{ id: string }>(sql`insert into unit_dates (unit_id, label, interval_days, last_done_on) values (${params.id}, ${body.label}, ${body.intervalDays}, ${body.lastDoneOn}) returning id`);
          await audit(tx, { actorId: person.id, action: 'unit_date_added', entity: 'unit', entityId: params.id, ip, details: body });
          return { status: 201, body: { id: r.rows[0].id, ...body } };
        });
      },
    }),
    route({
      method: 'get',
      path: '/units/:id/history',
      access: CAN.readRecords,
      summary: 'Every inspection, finding, repair and change of a unit, newest first',
      params: IdParams,
      handler: async ({ params }) => ({ body: { items: await svc.history(params.id) } }),
    }),
  ];
}
