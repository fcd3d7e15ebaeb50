import { z } from 'zod';
import { IdParams, Uuid } from '../../../shared/api/common';
import { UnitTypeParams } from '../../../shared/api/units';
import { CorrectionBody, CoverageBody, FindingBody, IdempotencyKey, RoutineBody, SignBody, StartInspectionBody, TagBody } from '../../../shared/api/walkaround';
import { defectTypeByKey } from '../../../shared/defects/catalogue';
import { CAN } from '../../../shared/domain/roles';
import { AppError, notFound } from '../../http/errors';
import { route, type RouteDef } from '../../http/routes';
import { audit } from '../../lib/audit';
import type { Deps } from '../../deps';
import { photoService, photoUpload } from './photos';
import { walkaroundRepository } from './repository';
import { walkaroundService } from './service';

const ListQuery = z.object({
  mine: z.enum(['1', '0']).optional(),
  unitId: Uuid.optional(),
  status: z.enum(['in_progress', 'signed']).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});

/** The Idempotency-Key header wins over a key in the body, so any client can retry safely. */
function idemKey(req: { get(h: string): string | undefined }, bodyKey?: string) {
  const h = req.get('idempotency-key');
  if (h === undefined) return bodyKey;
  const r = IdempotencyKey.safeParse(h);
  if (!r.success) throw new AppError('validation', 'The Idempotency-Key header is not valid', { 'Idempotency-Key': r.error.issues[0].message });
  return r.data;
}

export function walkaroundRoutes(deps: Deps): RouteDef[] {
  const svc = walkaroundService(deps.db, { drawings: deps.drawings, units: deps.services.units, auth: deps.services.auth });
  const photos = photoService(deps.db, deps.storage);
  return [
    route({
      method: 'get',
      path: '/routines/:key',
      access: CAN.inspect,
      summary: 'Your routine for a unit type (your own, or the default)',
      params: UnitTypeParams,
      handler: async ({ params, person }) => ({ body: await svc.routineFor(person.id, params.key) }),
    }),
    route({
      method: 'put',
      path: '/routines/:key',
      access: CAN.inspect,
      summary: 'Save your own routine for a unit type',
      params: UnitTypeParams,
      body: RoutineBody,
      handler: async ({ params, person, ip, body }) => ({ body: await svc.saveRoutine(person, ip, params.key, body) }),
    }),
    route({
      method: 'get',
      path: '/inspections',
      access: CAN.readRecords,
      summary: 'Inspections, newest first (mine=1 for your own)',
      query: ListQuery,
      handler: async ({ query, person }) => ({
        body: { items: await svc.list({ inspectorId: query.mine === '1' ? person.id : undefined, unitId: query.unitId, status: query.status, limit: query.limit }) },
      }),
    }),
    route({
      method: 'post',
      path: '/inspections',
      access: CAN.inspect,
      summary: 'Start (or resume) a daily or periodic inspection of a unit',
      selfIdempotent: true,
      body: StartInspectionBody,
      handler: async ({ req, body, person, ip }) => {
        const r = await svc.start(person, ip, { ...body, idempotencyKey: idemKey(req, body.idempotencyKey) });
        return { status: r.created ? 201 : 200, body: r.inspection };
      },
    }),
    route({
      method: 'get',
      path: '/inspections/:id',
      access: CAN.readRecords,
      summary: 'One inspection with routine, coverage and findings (also the printable record)',
      params: IdParams,
      handler: async ({ params }) => ({ body: await svc.get(params.id) }),
    }),
    route({
      method: 'post',
      path: '/inspections/:id/coverage',
      access: CAN.inspect,
      summary: 'Mark parts of the routine passed, not applicable, or a gap with its reason',
      params: IdParams,
      body: CoverageBody,
      handler: async ({ params, body, person, ip }) => ({ body: await svc.setCoverage(person, ip, params.id, body) }),
    }),
    route({
      method: 'post',
      path: '/inspections/:id/findings',
      access: CAN.inspect,
      summary: 'Pin a finding on a part',
      selfIdempotent: true,
      params: IdParams,
      body: FindingBody,
      handler: async ({ req, params, body, person, ip }) => {
        const r = await svc.addFinding(person, ip, params.id, { ...body, idempotencyKey: idemKey(req, body.idempotencyKey) });
        return { status: r.replayed ? 200 : 201, body: r.finding };
      },
    }),
    route({
      method: 'post',
      path: '/inspections/:id/sign',
      access: CAN.inspect,
      summary: 'Sign the record by re-entering your password; it never changes afterwards',
      params: IdParams,
      body: SignBody,
      handler: async ({ params, body, person, ip }) => ({ body: await svc.sign(person, ip, params.id, body.password) }),
    }),
    route({
      method: 'post',
      path: '/inspections/:id/corrections',
      access: CAN.inspect,
      summary: 'Add a signed correction linked to a signed record',
      params: IdParams,
      body: CorrectionBody,
      handler: async ({ params, body, person, ip }) => ({ status: 201, body: await svc.correct(person, ip, params.id, body.note, body.password) }),
    }),
    route({
      method: 'post',
      path: '/findings/:id/photos',
      access: CAN.inspect,
      summary: 'Attach a photo (JPEG, PNG or WebP) to a finding',
      params: IdParams,
      before: [
        async (req, _res, next) => {
          // Check the target before reading the upload, so a refused request does not cost a whole file.
          try {
            const parsed = IdParams.safeParse(req.params);
            if (parsed.success && req.person) await svc.photoTarget(req.person, parsed.data.id);
            next();
          } catch (e) {
            next(e);
          }
        },
      ],
      multipart: photoUpload(deps.config.PHOTO_MAX_BYTES),
      handler: async ({ req, params, person, ip }) => {
        await svc.photoTarget(person, params.id);
        return { status: 201, body: await photos.add(person, ip, { findingId: params.id }, req.file) };
      },
    }),
    route({
      method: 'get',
      path: '/photos/:id',
      access: CAN.readRecords,
      summary: 'A photo, or its thumbnail with ?size=thumb',
      params: IdParams,
      query: z.object({ size: z.enum(['full', 'thumb']).default('full') }),
      handler: async ({ params, query, res }) => {
        const p = await photos.read(params.id, query.size);
        if (!p) throw notFound('Photo');
        res.setHeader('Content-Type', p.contentType);
        res.setHeader('Cache-Control', 'private, max-age=86400, immutable');
        res.setHeader('X-Content-Type-Options', 'nosniff');
        res.end(p.bytes);
      },
    }),
    route({
      method: 'get',
      path: '/units/:id/tag',
      access: CAN.readRecords,
      summary: 'The non-complying tag of a unit (49 CFR 229.9), if one is open',
      params: IdParams,
      handler: async ({ params }) => {
        const repo = walkaroundRepository(deps.db);
        const unit = await repo.unit(params.id);
        if (!unit) throw notFound('Unit');
        const tag = await repo.openTag(unit.id);
        const settings = await repo.settings();
        const defects = await repo.openFederalFindings(unit.id);
        return {
          body: {
            open: !!tag,
            railroad: { name: settings?.name ?? '', reportingMark: settings?.reportingMark ?? '', timeZone: settings?.timeZone ?? 'UTC' },
            unit: { id: unit.id, roadNumber: unit.roadNumber, yardName: unit.yardName },
            tag: tag && {
              id: tag.id,
              openedAt: tag.openedAt.toISOString(),
              openedBy: await repo.personName(tag.openedBy),
              place: tag.place,
              destination: tag.destination,
              restrictions: tag.restrictions,
            },
            defects: defects.map((f) => ({ id: f.id, label: f.label, defect: defectTypeByKey(f.defectType)?.label ?? f.defectType, rule: f.rule, createdAt: f.createdAt.toISOString(), state: f.state })),
          },
        };
      },
    }),
    route({
      method: 'patch',
      path: '/units/:id/tag',
      access: CAN.repair,
      summary: 'Set the destination and movement restrictions on the open tag',
      params: IdParams,
      body: TagBody,
      handler: async ({ params, body, person, ip }) => {
        const repo = walkaroundRepository(deps.db);
        const tag = await repo.openTag(params.id);
        if (!tag) throw notFound('Open tag for this unit');
        const r = await repo.updateTag(tag.id, body);
        await audit(deps.db, { actorId: person.id, action: 'tag_updated', entity: 'unit_tag', entityId: tag.id, ip, details: body });
        return { body: { id: r.id, destination: r.destination, restrictions: r.restrictions } };
      },
    }),
  ];
}
