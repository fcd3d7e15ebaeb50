import { IdParams } from '../../../shared/api/common';
import { CAN } from '../../../shared/domain/roles';
import { notFound } from '../../http/errors';
import { route, type RouteDef } from '../../http/routes';
import type { Deps } from '../../deps';

export function outboxRoutes(deps: Deps): RouteDef[] {
  const svc = deps.services.outbox;
  return [
    route({
      method: 'get',
      path: '/outbox',
      access: CAN.readOutbox,
      summary: 'E-mail queued, sent and failed, newest first',
      handler: async () => ({ body: { items: await svc.list() } }),
    }),
    route({
      method: 'post',
      path: '/outbox/:id/retry',
      access: CAN.readOutbox,
      summary: 'Send a failed message again',
      params: IdParams,
      handler: async ({ params }) => {
        if (!(await svc.retry(params.id))) throw notFound('Unsent message');
        return { body: { ok: true } };
      },
    }),
    route({
      method: 'get',
      path: '/outbox/received',
      access: CAN.readOutbox,
      summary: 'What the local fake SMTP server received (dev and test only)',
      handler: () => ({ body: { enabled: !!deps.mailbox(), items: [...(deps.mailbox() ?? [])].reverse() } }),
    }),
  ];
}
