import { z } from 'zod';
import { IdParams } from '../../../shared/api/common';
import { AssignBody, QueueFilterQuery, QueueQuery, RepairBody, SendBackBody, VerifyBody, VoidBody } from '../../../shared/api/repairs';
import { CAN } from '../../../shared/domain/roles';
import type { FindingAction } from '../../../shared/repairs/transitions';
import { AppError } from '../../http/errors';
import { route, type RouteDef } from '../../http/routes';
import { sendCsv } from '../../lib/csv';
import type { Deps } from '../../deps';
import { photoService, photoUpload } from '../walkaround/photos';
import { repairsRepository } from './repository';
import { repairsService } from './service';

const ACTIONS: { action: FindingAction; body: z.ZodType; summary: string; access: readonly ('inspector' | 'foreman')[] }[] = [
  { action: 'assign', body: AssignBody, summary: 'Assign a finding to a person (starts the repair)', access: CAN.repair },
  { action: 'repair', body: RepairBody, summary: 'Record the repair: what was done, parts, time', access: CAN.repair },
  { action: 'verify', body: VerifyBody, summary: 'Verify a repaired finding', access: CAN.inspect },
  { action: 'send_back', body: SendBackBody, summary: 'Send a repair back with a reason', access: CAN.inspect },
  { action: 'void', body: VoidBody, summary: 'Void a finding entered in error, with a reason (never deleted)', access: CAN.inspect },
];

export function repairsRoutes(deps: Deps): RouteDef[] {
  const svc = repairsService(deps.db);
  const photos = photoService(deps.db, deps.storage);
  return [
    route({
      method: 'get',
      path: '/repairs',
      access: CAN.readRecords,
      summary:
        'The repair queue, one page at a time: open, in repair and repaired findings, non-complying units first under `sort` (`unit`, `finding`, `weight`, `state`, `assignee` or `age`, `.asc` or `.desc`); `limit` (default 100, at most 500) and `cursor` (the `nextCursor` of the page before). Answers `{ items, total, nextCursor, assignees, toVerify, tagsToClear }`',
      query: QueueQuery,
      handler: async ({ query }) => ({ body: await svc.queue(query) }),
    }),
    route({
      method: 'get',
      path: '/repairs.csv',
      access: CAN.readRecords,
      summary: 'The whole repair queue matching the filters as CSV, in the same `sort` as the screen',
      query: QueueFilterQuery,
      handler: async ({ query, res }) => {
        const rows = await svc.queueAll(query);
        sendCsv(
          res,
          'repair-queue.csv',
          [
            { key: 'roadNumber', header: 'Unit' },
            { key: 'yardName', header: 'Yard' },
            { key: 'nonComplying', header: 'Non-complying' },
            { key: 'label', header: 'Part' },
            { key: 'defectLabel', header: 'Defect' },
            { key: 'weight', header: 'Weight' },
            { key: 'rule', header: 'Rule' },
            { key: 'state', header: 'State' },
            { key: 'assigneeName', header: 'Assigned to' },
            { key: 'createdAt', header: 'Found at' },
            { key: 'createdByName', header: 'Found by' },
            { key: 'ageDays', header: 'Age (days)' },
          ],
          rows as unknown as Record<string, unknown>[],
        );
      },
    }),
    route({
      method: 'get',
      path: '/findings/:id',
      access: CAN.readRecords,
      summary: 'One finding with its history of events and photos',
      params: IdParams,
      handler: async ({ params }) => ({ body: await svc.detail(params.id) }),
    }),
    ...ACTIONS.map((a) =>
      route({
        method: 'post',
        path: `/findings/:id/${a.action.replace('_', '-')}`,
        access: a.access,
        summary: a.summary,
        params: IdParams,
        body: a.body,
        handler: async ({ params, body, person, ip }) => ({ body: await svc.act(person, ip, params.id, a.action, body as never) }),
      }),
    ),
    route({
      method: 'post',
      path: '/findings/:id/repair-photos',
      access: CAN.repair,
      summary: 'Attach a photo of the repair',
      params: IdParams,
      multipart: photoUpload(deps.config.PHOTO_MAX_BYTES),
      handler: async ({ req, params, person, ip }) => {
        const last = await repairsRepository(deps.db).lastRepairer(params.id);
        const d = await svc.detail(params.id);
        if (!['in_repair', 'repaired'].includes(String(d.state))) throw new AppError('conflict', 'Repair photos go on a finding that is in repair or repaired');
        return { status: 201, body: await photos.add(person, ip, { findingId: params.id, findingEventId: last?.id }, req.file) };
      },
    }),
    route({
      method: 'post',
      path: '/units/:id/tag/clear',
      access: CAN.repair,
      summary: 'Clear the non-complying tag once no federal finding is open (who and when recorded)',
      params: IdParams,
      handler: async ({ params, person, ip }) => ({ body: await svc.clearTag(person, ip, params.id) }),
    }),
  ];
}
