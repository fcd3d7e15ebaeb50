import { IdParams } from '../../../shared/api/common';
import { CreatePersonBody, UpdatePersonBody } from '../../../shared/api/people';
import { CAN } from '../../../shared/domain/roles';
import { route, type RouteDef } from '../../http/routes';
import type { Deps } from '../../deps';

export function peopleRoutes(deps: Deps): RouteDef[] {
  const svc = deps.services.people;
  return [
    route({
      method: 'get',
      path: '/people',
      access: CAN.administer,
      summary: 'Everyone with an account',
      handler: async () => ({ body: { items: await svc.list() } }),
    }),
    route({
      method: 'get',
      path: '/people/assignable',
      access: CAN.repair,
      summary: 'Active people a repair can be assigned to (foremen and inspectors)',
      handler: async () => ({
        body: { items: (await svc.list()).filter((p) => p.active && (p.role === 'foreman' || p.role === 'inspector')).map(({ id, name, role, yardId }) => ({ id, name, role, yardId })) },
      }),
    }),
    route({
      method: 'post',
      path: '/people',
      access: CAN.administer,
      summary: 'Create a person',
      body: CreatePersonBody,
      handler: async ({ person, ip, body }) => ({ status: 201, body: await svc.create(person, ip, body) }),
    }),
    route({
      method: 'patch',
      path: '/people/:id',
      access: CAN.administer,
      summary: 'Change role, name, yard or active flag (never delete)',
      params: IdParams,
      body: UpdatePersonBody,
      handler: async ({ person, ip, params, body }) => ({ body: await svc.update(person, ip, params.id, body) }),
    }),
    route({
      method: 'post',
      path: '/people/:id/unlock',
      access: CAN.administer,
      summary: 'Unlock an account locked by wrong passwords',
      params: IdParams,
      handler: async ({ person, ip, params }) => ({ body: await svc.unlock(person, ip, params.id) }),
    }),
  ];
}
