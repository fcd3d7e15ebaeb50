import { IdParams } from '../../../shared/api/common';
import { UnitTypeParams, UnitsQuery, UpdateUnitBody } from '../../../shared/api/units';
import { CAN } from '../../../shared/domain/roles';
import { sendFrozen } from '../../http/frozen-json';
import { route, type RouteDef } from '../../http/routes';
import type { Deps } from '../../deps';

// Trainers read unit types for the lab; units and their records are for the record-keeping roles.
const READ_TYPES = [...CAN.readRecords, 'trainer'] as const;

export function unitsRoutes(deps: Deps): RouteDef[] {
  const svc = deps.services.units;
  return [
    route({
      method: 'get',
      path: '/unit-types',
      access: READ_TYPES,
      summary: 'Unit types with their drawing dimensions',
      handler: () => ({
        body: {
          items: [...deps.drawings.values()].map((d) => ({ key: d.key, name: d.name, lengthIn: d.lengthIn, widthIn: d.widthIn, axleCount: d.axleCount, views: d.views.map((v) => v.key) })),
        },
      }),
    }),
    route({
      method: 'get',
      path: '/unit-types/:key',
      access: READ_TYPES,
      summary: 'One unit type: its views and parts with geometry',
      params: UnitTypeParams,
      handler: ({ params, req, res }) => sendFrozen(req, res, svc.drawingJson(params.key)),
    }),
    route({
      method: 'get',
      path: '/unit-types/:key/layout/:frontEnd',
      access: READ_TYPES,
      summary: 'Labels of every part of a unit type under a given front end',
      params: UnitTypeParams.extend({ frontEnd: UpdateUnitBody.shape.frontEnd.unwrap() }),
      handler: ({ params, req, res }) => sendFrozen(req, res, svc.layoutJson(svc.drawing(params.key).key, params.frontEnd)),
    }),
    route({
      method: 'get',
      path: '/units',
      access: CAN.readRecords,
      summary: 'The roster, non-complying units first',
      query: UnitsQuery,
      handler: async ({ query }) => ({ body: { items: await svc.list(query) } }),
    }),
    route({
      method: 'get',
      path: '/units/:id',
      access: CAN.readRecords,
      summary: 'One unit',
      params: IdParams,
      handler: async ({ params }) => ({ body: await svc.get(params.id) }),
    }),
    route({
      method: 'get',
      path: '/units/:id/layout',
      access: CAN.readRecords,
      summary: "Every part of the unit with the labels its front end gives it",
      params: IdParams,
      handler: async ({ params, req, res }) => {
        const u = await svc.get(params.id);
        sendFrozen(req, res, svc.layoutJson(u.unitTypeKey, u.frontEnd));
      },
    }),
    route({
      method: 'patch',
      path: '/units/:id',
      access: CAN.administer,
      summary: "Change a unit's front end, yard, state or dates (audited)",
      params: IdParams,
      body: UpdateUnitBody,
      handler: async ({ person, ip, params, body }) => ({ body: await svc.update(person, ip, params.id, body) }),
    }),
  ];
}
