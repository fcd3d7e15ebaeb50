import { randomUUID } from 'node:crypto';
import type { z } from 'zod';
import { runCheck, type CheckKey } from '../../../shared/api/checks';
import type { CoverageBody, FindingBody, FindingView, InspectionView, Routine, RoutineBody, StartInspectionBody } from '../../../shared/api/walkaround';
import { civilDateInZone } from '../../../shared/checks/civil-date';
import { toInches } from '../../../shared/checks/units';
import { defectTypeByKey, type DefectType } from '../../../shared/defects/catalogue';
import { bodyPoint, type FrontEnd, type ViewKey } from '../../../shared/domain/frames';
import type { Drawing } from '../../../shared/drawings/types';
import type { LayoutPart } from '../../../shared/layout/unit-layout';
import { bodyToFront, pinLabel, pinSide, viewPointToBody, type DerivedPart } from '../../../shared/orientation';
import { areaLabel, canSign, coverageOf, defaultRoutine } from '../../../shared/walkaround/routine';
import { checkInputFor as sharedCheckInputFor } from '../../../shared/walkaround/check-input';
import type { Db } from '../../db/client';
import { AppError, forbidden, notFound } from '../../http/errors';
import type { Person } from '../../http/routes';
import { audit } from '../../lib/audit';
import type { AuthService } from '../auth/service';
import { enqueueMail } from '../outbox/service';
import { priorRepairs } from '../hot-spots/repository';
import type { UnitsService } from '../units/service';
import { walkaroundRepository, type FindingRow, type InspectionRow } from './repository';

/** How far (inches) a pin may sit outside its part's outline and still belong to it. */
export const PIN_SLACK_IN = 12;

const isUniqueViolation = (e: unknown) => (e as { code?: string })?.code === '23505' || (e as { cause?: { code?: string } })?.cause?.code === '23505';

export function toFindingView(f: FindingRow, photoIds: string[] = []): FindingView {
  const d = defectTypeByKey(f.defectType);
  return {
    id: f.id,
    inspectionId: f.inspectionId,
    unitId: f.unitId,
    partId: f.partId,
    instanceId: f.instanceId,
    partKind: f.partKind,
    view: f.view,
    body: { x: f.bodyX, y: f.bodyY, z: f.bodyZ },
    front: { along: f.frontAlong, left: f.frontLeft },
    frontEnd: f.frontEnd as FrontEnd,
    label: f.label,
    partLabel: f.partLabel,
    side: f.side,
    endRole: f.endRole,
    number: f.number,
    defectType: f.defectType,
    defectLabel: d?.label ?? f.defectType,
    weight: f.weight as FindingView['weight'],
    rule: f.rule,
    measurement: f.measurementValue != null ? { value: f.measurementValue, unit: f.measurementUnit!, inches: f.measurementIn! } : null,
    checkResult: (f.checkResult as Record<string, unknown> | null) ?? null,
    note: f.note,
    state: f.state as FindingView['state'],
    assignedTo: f.assignedTo,
    createdBy: f.createdBy,
    createdAt: f.createdAt.toISOString(),
    version: f.version,
    photos: photoIds.map((id) => ({ id, thumb: `/api/photos/${id}?size=thumb`, full: `/api/photos/${id}` })),
  };
}

/** Builds the input of a defect's rule check; the same function the finding form runs live. */
export const checkInputFor = (defect: DefectType, body: Pick<FindingBody, 'measurement' | 'lastDone'>, ctx: { humpStencilled: boolean; today: string }) =>
  sharedCheckInputFor(defect, { ...body.measurement, lastDone: body.lastDone }, ctx);

const asDerived = (p: LayoutPart): DerivedPart => ({
  instanceId: p.instanceId,
  kind: p.kind,
  side: p.side,
  end: p.end,
  number: p.number,
  count: p.count,
  label: p.label,
  front: { along: p.along, left: p.left, z: p.z } as DerivedPart['front'],
});

export function walkaroundService(db: Db, deps: { drawings: ReadonlyMap<string, Drawing>; units: UnitsService; auth: AuthService }) {
  const drawingOf = (key: string) => {
    const d = deps.drawings.get(key);
    if (!d) throw notFound('Drawing of this unit type');
    return d;
  };

  const today = async () => {
    const s = await walkaroundRepository(db).settings();
    return civilDateInZone(new Date(), s?.timeZone ?? 'UTC');
  };

  async function routineFor(personId: string | null, unitTypeKey: string): Promise<Routine> {
    const repo = walkaroundRepository(db);
    const own = personId ? await repo.routine(personId, unitTypeKey) : null;
    const row = own ?? (await repo.routine(null, unitTypeKey));
    if (row) {
      return { id: row.id, unitTypeKey, personal: !!row.personId, name: row.name, startPoint: row.startPoint, direction: row.direction as Routine['direction'], areas: row.areas as Routine['areas'], version: row.version };
    }
    const d = defaultRoutine(drawingOf(unitTypeKey));
    return { id: null, unitTypeKey, personal: false, ...d, version: 0 };
  }

  function validateRoutine(unitTypeKey: string, body: RoutineBody) {
    const known = new Set(drawingOf(unitTypeKey).instances.map((i) => i.instanceId));
    const seen = new Set<string>();
    const fields: Record<string, string> = {};
    body.areas.forEach((a, ai) =>
      a.instanceIds.forEach((id, ii) => {
        if (!known.has(id)) fields[`areas.${ai}.instanceIds.${ii}`] = `No part ${id} on this unit type`;
        else if (seen.has(id)) fields[`areas.${ai}.instanceIds.${ii}`] = `${id} is already in the routine`;
        seen.add(id);
      }),
    );
    if (Object.keys(fields).length) throw new AppError('validation', 'The routine names parts this unit type does not have, or a part twice', fields);
  }

  async function view(insp: InspectionRow): Promise<InspectionView> {
    const repo = walkaroundRepository(db);
    const [parts, fs] = await Promise.all([repo.viewParts(insp.id), repo.findingsOfInspection(insp.id)]);
    const { unit, inspectorName, railroad: settings, items, photos: photoRows, corrections } = parts!;
    const photosBy = new Map<string, string[]>();
    for (const p of photoRows) photosBy.set(p.findingId, [...(photosBy.get(p.findingId) ?? []), p.id]);
    const routine = insp.routineSnapshot as Routine;
    const frontEnd = insp.frontEndSeen as FrontEnd;
    const areas = routine.areas.map((a) => ({ ...a, label: areaLabel(a.key, frontEnd, a.label) }));
    const liveFindings = fs.filter((f) => f.state !== 'voided');
    const effectiveItems = items.map((i) => ({ ...i, state: i.state as 'passed' | 'finding' | 'not_applicable' | 'gap' }));
    // A part whose only findings were voided is open again.
    for (const it of effectiveItems) if (it.state === 'finding' && !liveFindings.some((f) => f.instanceId === it.instanceId)) it.state = 'gap';
    return {
      id: insp.id,
      unit: { id: unit!.id, roadNumber: unit!.roadNumber, unitTypeKey: unit!.unitTypeKey, frontEnd: unit!.frontEnd as FrontEnd, yardName: unit!.yardName },
      inspector: { id: insp.inspectorId, name: inspectorName },
      kind: insp.kind as InspectionView['kind'],
      status: insp.status as InspectionView['status'],
      frontEndSeen: frontEnd,
      frontEndRecorded: insp.frontEndRecorded as FrontEnd,
      startedAt: insp.startedAt.toISOString(),
      signedAt: insp.signedAt?.toISOString() ?? null,
      place: unit!.yardName,
      routine: { ...routine, areas },
      items: effectiveItems,
      coverage: coverageOf(routine.areas, effectiveItems),
      findings: fs.map((f) => toFindingView(f, photosBy.get(f.id) ?? [])),
      corrections: corrections.map((c) => ({ id: c.id, note: c.note ?? '', signedAt: c.signedAt ? new Date(c.signedAt).toISOString() : '', by: c.by })),
      correctsId: insp.correctsId,
      railroad: { name: settings?.name ?? '', reportingMark: settings?.reportingMark ?? '', timeZone: settings?.timeZone ?? 'UTC' },
      version: insp.version,
    };
  }

  async function load(id: string) {
    const insp = await walkaroundRepository(db).inspection(id);
    if (!insp) throw notFound('Inspection');
    return insp;
  }
  const assertOwner = (insp: InspectionRow, person: Person) => {
    if (insp.inspectorId !== person.id) throw forbidden('Only the inspector who started this inspection can change it');
  };
  const assertOpen = (status: string | null) => {
    if (status !== 'in_progress') throw new AppError('conflict', 'This record is signed and can no longer change; add a correction instead');
  };

  /** Pins a finding in one transaction: the pin, its event, coverage, the tag and the foremen's mail. */
  async function addFinding(person: Person, ip: string, inspectionId: string, body: FindingBody, opts: { systemFinding?: boolean } = {}) {
    const repo = walkaroundRepository(db);
    // A replay is rare: its context is read beside it rather than after it.
    const [prior, ctx] = await Promise.all([body.idempotencyKey ? repo.findingByKey(person.id, body.idempotencyKey) : null, repo.findingContext(inspectionId)]);
    if (prior) return { replayed: true, finding: toFindingView(prior, (await repo.photosOf([prior.id])).map((p) => p.id)) };
    if (!ctx) throw notFound('Inspection');
    const { insp, unit } = ctx;
    assertOwner(insp, person);
    assertOpen(insp.status);
    const drawing = drawingOf(unit.unitTypeKey);
    const view = drawing.views.find((v) => v.key === body.view);
    if (!view) throw new AppError('validation', `This unit type has no ${body.view} view`, { view: 'Not a view of this unit type' });
    const part = view.parts.find((p) => p.id === body.partId);
    if (!part) {
      const elsewhere = drawing.views.some((v) => v.parts.some((p) => p.id === body.partId));
      const otherType = [...deps.drawings.values()].some((d) => d.key !== drawing.key && d.views.some((v) => v.parts.some((p) => p.id === body.partId)));
      const msg = elsewhere
        ? `Part ${body.partId} is not drawn in the ${body.view} view`
        : otherType
          ? `Part ${body.partId} belongs to another unit type, not to ${unit.roadNumber}`
          : `No part ${body.partId} on this unit type`;
      throw new AppError('validation', msg, { partId: msg });
    }
    const b = view.bounds;
    if (body.x < b.umin || body.x > b.umax || body.y < b.vmin || body.y > b.vmax) {
      throw new AppError('validation', 'The pin is outside the view', { x: 'Outside the view', y: 'Outside the view' });
    }
    const bb = part.bbox;
    // The F is shown where the unit carries it, which may be the other end from the drawing's stencil.
    if (part.kind !== 'front_marking' && body.x < bb.umin - PIN_SLACK_IN || body.x > bb.umax + PIN_SLACK_IN || body.y < bb.vmin - PIN_SLACK_IN || body.y > bb.vmax + PIN_SLACK_IN) {
      throw new AppError('validation', 'The pin is not on the part it names', { x: 'Not on the part', y: 'Not on the part' });
    }
    const defect = defectTypeByKey(body.defectType);
    if (!defect) throw new AppError('validation', 'Unknown defect type', { defectType: 'Unknown defect type' });
    if (defect.partKind !== part.kind) {
      throw new AppError('validation', `“${defect.label}” is not a defect of a ${part.kind.replace(/_/g, ' ')}`, { defectType: 'Not a defect of this part' });
    }
    const day = civilDateInZone(new Date(), ctx.timeZone);
    let checkResult: Record<string, unknown> | null = null;
    const input = defect.check ? checkInputFor(defect, body, { humpStencilled: unit.humpStencilled, today: day }) : null;
    if (defect.check && input) {
      const outcome = runCheck(defect.check as CheckKey, input);
      if (!outcome.ok) {
        const fields: Record<string, string> = {};
        for (const i of outcome.error.issues) fields[`measurement.${i.path.join('.')}`] ??= i.message;
        throw new AppError('validation', 'The measurement is not valid', fields);
      }
      checkResult = outcome.output as unknown as Record<string, unknown>;
      if (checkResult.result === 'pass' && !body.keepAsNote) {
        throw new AppError('check_passed', `The reading is within the limit (${checkResult.limit}, ${checkResult.source}). Keep it as a note, or drop it.`, undefined, { check: checkResult });
      }
    }
    const weight = checkResult?.result === 'pass' ? 'note' : defect.weight;

    const frontEnd = insp.frontEndSeen as FrontEnd;
    const layout = deps.units.layoutFor(unit.unitTypeKey, frontEnd);
    const lp = layout.parts.find((p) => p.partId === part.id)!;
    const centre = bodyPoint(lp.x, lp.y, lp.z);
    const at = viewPointToBody(body.view as ViewKey, { u: body.x, v: body.y }, centre);
    const front = bodyToFront(at, frontEnd, drawing.lengthIn);
    const side = pinSide(body.view as ViewKey, { u: body.x, v: body.y }, frontEnd);
    const label = pinLabel(asDerived(lp), side);

    try {
      const row = await db.transaction(async (tx) => {
        const r = walkaroundRepository(tx);
        // One statement takes the part's turn, locks the record, bumps its version and says whether it is still open;
        // a second writes the finding with its trail.
        const key = { unitId: unit.id, instanceId: part.instanceId, defectType: defect.key };
        if ((await r.lockForPin(insp.id, key)) !== 'in_progress') throw new AppError('conflict', 'This record was signed meanwhile; the finding was not added to it');
        const f = await r.insertFindingWithTrail({
          id: randomUUID(),
          inspectionId: insp.id,
          unitId: unit.id,
          unitTypeKey: unit.unitTypeKey,
          partId: part.id,
          instanceId: part.instanceId,
          partKind: part.kind,
          view: body.view,
          bodyX: at.x,
          bodyY: at.y,
          bodyZ: at.z,
          frontAlong: front.along,
          frontLeft: front.left,
          frontEnd,
          label,
          partLabel: lp.label,
          side: lp.side === 'center' ? side : lp.side,
          endRole: lp.end ?? null,
          number: lp.number ?? null,
          defectType: defect.key,
          weight,
          rule: defect.rule ?? null,
          measurementValue: body.measurement?.value ?? null,
          measurementUnit: body.measurement?.unit ?? null,
          measurementIn: body.measurement ? toInches(body.measurement.value, body.measurement.unit) : null,
          checkResult,
          note: body.note || null,
          createdBy: person.id,
          idempotencyKey: body.idempotencyKey ?? null,
          // Hot spots' repeat rule reads the days since this part's last repair; kept at write time.
          priorRepairDays: priorRepairs(tx).onInsert(key),
        }, {
          inspectionId: insp.id,
          instanceId: part.instanceId,
          actorId: person.id,
          event: { label, weight },
          ip,
          action: opts.systemFinding ? 'finding_raised_by_system' : 'finding_created',
          audit: { inspectionId: insp.id, partId: part.id, defectType: defect.key, weight },
        });
        if (weight === 'federal') {
          const wasOpen = await r.openTag(unit.id);
          await r.markNonComplying(unit.id, person.id, unit.yardName ?? '');
          const to = await r.recipients(['foreman'], unit.yardId);
          await enqueueMail(
            tx,
            to.map((addr) => ({
              kind: 'non_complying',
              to: addr,
              subject: `${unit.roadNumber} is non-complying: ${label}, ${defect.label}`,
              body: [
                `${unit.roadNumber} has a federal defect and is non-complying under 49 CFR 229.9 until it is repaired.`,
                ``,
                `Part: ${label}`,
                `Defect: ${defect.label}${defect.rule ? ` (${defect.rule})` : ''}`,
                checkResult ? `Reading: ${body.measurement?.value ?? ''} ${body.measurement?.unit ?? ''} — limit ${checkResult.limit}` : '',
                `Found by: ${person.name}, ${unit.yardName ?? 'no yard'}, ${new Date().toISOString()}`,
                wasOpen ? `The unit was already tagged; this defect joins the open tag.` : `A non-complying tag is open for the unit; print it for the control stand.`,
                ``,
                `Blue-signal protection (49 CFR Part 218 Subpart B) before anyone goes on, under or between the unit.`,
              ]
                .filter((l) => l !== '')
                .join('\n'),
              dedupeKey: `finding:${f.id}`,
            })),
          );
        }
        return f;
      });
      return { replayed: false, finding: toFindingView(row) };
    } catch (e) {
      // A double submit raced us to the unique key: answer with the first one.
      if (body.idempotencyKey && isUniqueViolation(e)) {
        const prior = await repo.findingByKey(person.id, body.idempotencyKey);
        if (prior) return { replayed: true, finding: toFindingView(prior) };
      }
      throw e;
    }
  }

  return {
    routineFor,
    async saveRoutine(person: Person, ip: string, unitTypeKey: string, body: RoutineBody) {
      drawingOf(unitTypeKey);
      validateRoutine(unitTypeKey, body);
      const repo = walkaroundRepository(db);
      const existing = await repo.routine(person.id, unitTypeKey);
      const values = { name: body.name, startPoint: body.startPoint, direction: body.direction, areas: body.areas };
      let saved;
      if (existing) {
        saved = await repo.updateRoutine(existing.id, body.version ?? existing.version, values);
        if (!saved) throw new AppError('stale', 'Your routine was changed in another window since you opened it; reload to see it');
      } else {
        saved = await repo.insertRoutine({ personId: person.id, unitTypeKey, ...values });
      }
      await audit(db, { actorId: person.id, action: 'routine_saved', entity: 'routine', entityId: saved.id, ip });
      return routineFor(person.id, unitTypeKey);
    },

    async start(person: Person, ip: string, body: StartInspectionBody) {
      const repo = walkaroundRepository(db);
      if (body.idempotencyKey) {
        const prior = await repo.inspectionByKey(person.id, body.idempotencyKey);
        if (prior) return { created: false, inspection: await view(prior) };
      }
      const unit = await repo.unit(body.unitId);
      if (!unit) throw new AppError('validation', 'No such unit', { unitId: 'No such unit' });
      // Resume rather than duplicate: the same inspector's unsigned inspection of the same kind on this unit.
      const open = (await repo.listInspections({ inspectorId: person.id, unitId: unit.id, status: 'in_progress', limit: 5 })).find((i) => i.kind === body.kind);
      if (open) return { created: false, inspection: await view((await repo.inspection(open.id))!) };
      const seen = body.frontEndSeen ?? (unit.frontEnd as FrontEnd);
      const routine = await routineFor(person.id, unit.unitTypeKey);
      const insp = await db.transaction(async (tx) => {
        const r = walkaroundRepository(tx);
        const row = await r.insertInspection({
          unitId: unit.id,
          inspectorId: person.id,
          kind: body.kind,
          frontEndSeen: seen,
          frontEndRecorded: unit.frontEnd,
          yardId: unit.yardId,
          routineId: routine.id,
          routineSnapshot: routine,
          idempotencyKey: body.idempotencyKey ?? null,
        });
        await audit(tx, { actorId: person.id, action: 'inspection_started', entity: 'inspection', entityId: row.id, ip, details: { unitId: unit.id, kind: body.kind, frontEndSeen: seen } });
        return row;
      });
      if (seen !== unit.frontEnd) {
        // The inspector's eyes win for this inspection; the record is for the foreman and admin to correct.
        const drawing = drawingOf(unit.unitTypeKey);
        const fm = drawing.views.flatMap((v) => v.parts.map((p) => ({ v, p }))).find((x) => x.p.kind === 'front_marking');
        if (fm) {
          await addFinding(person, ip, insp.id, {
            partId: fm.p.id,
            view: fm.v.key,
            x: fm.p.centre.u,
            y: fm.p.centre.v,
            defectType: 'front_marking_mismatch',
            note: `Record says the F is on the ${unit.frontEnd.replace('_', ' ')}; the inspector found it on the ${seen.replace('_', ' ')}.`,
          }, { systemFinding: true });
        }
        const to = await repo.recipients(['foreman', 'admin'], unit.yardId);
        await enqueueMail(
          db,
          to.map((addr) => ({
            kind: 'front_end_mismatch',
            to: addr,
            subject: `${unit.roadNumber}: F found on the ${seen.replace('_', ' ')}, record says ${unit.frontEnd.replace('_', ' ')}`,
            body: `${person.name} started a ${body.kind} inspection of ${unit.roadNumber} and found the F on the ${seen.replace('_', ' ')}. The unit record says ${unit.frontEnd.replace('_', ' ')}. The inspection uses what the inspector saw. Check the unit and correct the record (Units screen) if needed.`,
            dedupeKey: `front_mismatch:${insp.id}`,
          })),
        );
      }
      return { created: true, inspection: await view((await repo.inspection(insp.id))!) };
    },

    async get(id: string) {
      return view(await load(id));
    },

    list: (f: { inspectorId?: string; unitId?: string; status?: string; limit: number }) => walkaroundRepository(db).listInspections(f),

    async setCoverage(person: Person, ip: string, id: string, body: z.infer<typeof CoverageBody>) {
      const insp = await load(id);
      assertOwner(insp, person);
      assertOpen(insp.status);
      const routine = insp.routineSnapshot as Routine;
      const inRoutine = new Set(routine.areas.flatMap((a) => a.instanceIds));
      const unknown = body.instanceIds.filter((i) => !inRoutine.has(i));
      if (unknown.length) throw new AppError('validation', `Not in this inspection's routine: ${unknown.slice(0, 5).join(', ')}`, { instanceIds: 'Unknown part' });
      if (body.state === 'not_applicable' && !body.reason) throw new AppError('validation', 'Say why the part does not apply', { reason: 'A reason is required' });
      await db.transaction(async (tx) => {
        const r = walkaroundRepository(tx);
        assertOpen(await r.lockAndTouch(id));
        const live = (await r.findingsOfInspection(id)).filter((f) => f.state !== 'voided');
        // A part with a live finding stays "finding": passing it would hide the defect.
        const rows = body.instanceIds
          .filter((i) => !live.some((f) => f.instanceId === i))
          .map((instanceId) => ({ instanceId, state: body.state, reason: body.reason ?? null }));
        await r.setItems(id, rows);
        await audit(tx, { actorId: person.id, action: 'coverage_set', entity: 'inspection', entityId: id, ip, details: { state: body.state, count: rows.length } });
      });
      return view(await load(id));
    },

    addFinding,

    async sign(person: Person, ip: string, id: string, password: string) {
      const insp = await load(id);
      assertOwner(insp, person);
      if (insp.status === 'signed') throw new AppError('conflict', 'This record is already signed');
      if (!(await deps.auth.verifyPassword(person.id, password))) throw new AppError('validation', 'The password is wrong; the record was not signed', { password: 'Wrong password' });
      const current = await view(insp);
      if (!canSign(current.coverage)) {
        const n = current.coverage.gaps.filter((g) => !g.reason).length;
        throw new AppError('conflict', `${n} part${n === 1 ? '' : 's'} of the routine ${n === 1 ? 'has' : 'have'} no result and no reason; finish the walk or give a reason for each gap`, undefined, { gaps: n });
      }
      const day = await today();
      await db.transaction(async (tx) => {
        const r = walkaroundRepository(tx);
        const signed = await r.signInspection(id, insp.version);
        if (!signed) throw new AppError('stale', 'The inspection changed while you were signing; check it and sign again');
        if (insp.kind === 'periodic') await r.setUnitDate(insp.unitId, 'last_periodic_on', day);
        await audit(tx, { actorId: person.id, action: 'inspection_signed', entity: 'inspection', entityId: id, ip, details: { coverage: { total: current.coverage.total, done: current.coverage.done } } });
      });
      return view(await load(id));
    },

    async correct(person: Person, ip: string, id: string, note: string, password: string) {
      const insp = await load(id);
      if (insp.status !== 'signed') throw new AppError('conflict', 'Only a signed record takes corrections; change the open inspection itself');
      if (insp.correctsId) throw new AppError('conflict', 'Correct the original record, not a correction');
      if (insp.inspectorId !== person.id && person.role !== 'foreman') throw forbidden('Only the inspector who signed the record, or a foreman, adds a correction to it');
      if (!(await deps.auth.verifyPassword(person.id, password))) throw new AppError('validation', 'The password is wrong', { password: 'Wrong password' });
      const row = await db.transaction(async (tx) => {
        const r = walkaroundRepository(tx);
        const c = await r.insertInspection({
          unitId: insp.unitId,
          inspectorId: person.id,
          kind: insp.kind,
          status: 'signed',
          signedAt: new Date(),
          frontEndSeen: insp.frontEndSeen,
          frontEndRecorded: insp.frontEndRecorded,
          yardId: insp.yardId,
          routineSnapshot: insp.routineSnapshot,
          correctsId: insp.id,
          correctionNote: note,
        });
        await audit(tx, { actorId: person.id, action: 'inspection_corrected', entity: 'inspection', entityId: insp.id, ip, details: { correctionId: c.id } });
        return c;
      });
      return { id: row.id, correctsId: insp.id };
    },

    async photoTarget(person: Person, findingId: string) {
      const repo = walkaroundRepository(db);
      const f = await repo.finding(findingId);
      if (!f) throw notFound('Finding');
      const insp = (await repo.inspection(f.inspectionId))!;
      if (insp.inspectorId !== person.id) throw forbidden('Only the inspector who pinned this finding can add photos to it');
      if (insp.status !== 'in_progress') throw new AppError('conflict', 'The record is signed; photos can no longer be added to it');
      return f;
    },
  };
}
export type WalkaroundService = ReturnType<typeof walkaroundService>;
