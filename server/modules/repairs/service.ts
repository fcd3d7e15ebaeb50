import type { FindingState } from '../../../shared/domain/states';
import type { Role } from '../../../shared/domain/roles';
import { OPEN_STATES, transition, TRANSITIONS, type FindingAction } from '../../../shared/repairs/transitions';
import { defectTypeByKey } from '../../../shared/defects/catalogue';
import type { Db } from '../../db/client';
import { AppError, forbidden, notFound } from '../../http/errors';
import type { Person } from '../../http/routes';
import { audit } from '../../lib/audit';
import { priorRepairs } from '../hot-spots/repository';
import type { QueueFilterQuery, QueuePage, QueueQuery } from '../../../shared/api/repairs';
import { queueCursorFits, repairsRepository } from './repository';

const EVENT_WORDS: Record<string, string> = {
  created: 'pinned it',
  assigned: 'assigned it',
  repaired: 'recorded its repair',
  verified: 'verified it',
  sent_back: 'sent it back',
  voided: 'voided it',
  repair_started: 'started the repair',
  noted: 'added a note',
};

export interface ActionInput {
  version: number;
  assigneeId?: string;
  whatDone?: string;
  partsUsed?: string;
  minutes?: number;
  reason?: string;
}

/**
 * The cursor is the sort and the key values of the last row shown, so the next page starts right after
 * that row even when rows were added or changed meanwhile (no row twice, none skipped). Opaque to clients.
 */
function encodeCursor(sort: QueueFilterQuery['sort'], keys: readonly unknown[]): string {
  return Buffer.from(JSON.stringify({ s: sort ?? '', k: keys })).toString('base64url');
}

function decodeCursor(cursor: string, sort: QueueFilterQuery['sort']): unknown[] {
  let c: unknown;
  try {
    c = JSON.parse(Buffer.from(cursor, 'base64url').toString('utf8'));
  } catch {
    c = null;
  }
  const ok = typeof c === 'object' && c !== null && (c as { s?: unknown }).s === (sort ?? '') && Array.isArray((c as { k?: unknown }).k) && queueCursorFits(sort, (c as { k: unknown[] }).k);
  if (!ok) throw new AppError('validation', 'The query is not valid', { cursor: 'Not a cursor of this queue and sort: start again from the first page' });
  return (c as { k: unknown[] }).k;
}

export function repairsService(db: Db) {
  return {
    /** One page of the queue, how many rows match, and the filter-independent summary the screen shows. */
    async queue(q: QueueQuery): Promise<QueuePage> {
      const { limit, cursor, ...filters } = q;
      const afterKeys = cursor === undefined ? null : decodeCursor(cursor, filters.sort);
      const repo = repairsRepository(db);
      const [page, summary] = await Promise.all([repo.queuePage(filters, limit, afterKeys), repo.queueSummary(filters)]);
      return { items: page.items, ...summary, nextCursor: page.lastKeys ? encodeCursor(filters.sort, page.lastKeys) : null };
    },

    /** Every row matching the filters, in the same order as the pages (the CSV export). */
    queueAll: (q: QueueFilterQuery) => repairsRepository(db).queueAll(q),

    async detail(id: string) {
      const d = await repairsRepository(db).findingDetail(id);
      if (!d) throw notFound('Finding');
      const r = d.row;
      return {
        id: r.id,
        unitId: r.unit_id,
        roadNumber: r.road_number,
        inspectionId: r.inspection_id,
        label: r.label,
        partLabel: r.part_label,
        partId: r.part_id,
        view: r.view,
        body: { x: r.body_x, y: r.body_y, z: r.body_z },
        frontEnd: r.front_end,
        defectType: r.defect_type,
        defectLabel: defectTypeByKey(String(r.defect_type))?.label ?? r.defect_type,
        weight: r.weight,
        rule: r.rule,
        measurement: r.measurement_value != null ? { value: r.measurement_value, unit: r.measurement_unit, inches: r.measurement_in } : null,
        checkResult: r.check_result,
        note: r.note,
        state: r.state,
        voidReason: r.void_reason,
        assignedTo: r.assigned_to,
        assigneeName: r.assignee_name,
        createdByName: r.created_by_name,
        createdAt: r.created_at,
        version: r.version,
        events: d.events,
        photos: d.photos.map((p) => ({ id: p.id, eventId: p.eventId, thumb: `/api/photos/${p.id}?size=thumb`, full: `/api/photos/${p.id}` })),
      };
    },

    /**
     * One change of a finding, based on the version the person saw. Refuses a stale version with who
     * changed what, refuses transitions the state machine does not allow, and records an event.
     */
    async act(person: Person, ip: string, id: string, action: FindingAction, input: ActionInput) {
      return db.transaction(async (tx) => {
        const repo = repairsRepository(tx);
        // A void or a repair changes which later findings of the part are repeats (hot spots): take
        // that part's turn before any row lock, then recompute them below.
        const changesRepeats = action === 'void' || action === 'repair';
        if (changesRepeats) await priorRepairs(tx).lockKey(id);
        const f = await repo.lockFinding(id);
        if (!f) throw notFound('Finding');
        if (f.version !== input.version) {
          const last = await repo.lastEvent(id);
          const who = last ? `${last.name} ${EVENT_WORDS[last.kind] ?? last.kind} at ${new Date(last.at).toISOString().slice(11, 16)} UTC` : 'Someone changed it';
          throw new AppError('stale', `This finding changed since you opened it: ${who}. Reload to see it.`, undefined, { currentVersion: f.version, state: f.state });
        }
        const from = f.state as FindingState;
        const verdict = transition(action, from, person.role as Role);
        if (!verdict.ok) {
          if (verdict.reason === 'role') throw forbidden(`Your role cannot ${action.replace('_', ' ')} a finding`);
          throw new AppError('conflict', `A finding that is ${from.replace('_', ' ')} cannot be ${action === 'send_back' ? 'sent back' : action === 'void' ? 'voided' : action + 'ed'}`);
        }
        let details: Record<string, unknown> = {};
        let assignedTo: string | null | undefined;
        if (action === 'assign') {
          const who = input.assigneeId ? await repo.personActive(input.assigneeId) : null;
          if (!who) throw new AppError('validation', 'Assign to an active person', { assigneeId: 'No active person with that id' });
          assignedTo = input.assigneeId!;
          details = { assigneeId: assignedTo, assigneeName: who.name };
        }
        if (action === 'repair') details = { whatDone: input.whatDone, partsUsed: input.partsUsed ?? null, minutes: input.minutes ?? null };
        if (action === 'verify' || action === 'send_back') {
          const rep = await repo.lastRepairer(id);
          // A second pair of eyes: whoever recorded the repair does not verify it.
          if (rep && rep.actor_id === person.id) throw forbidden('Someone other than the person who recorded the repair verifies it');
          if (action === 'send_back') details = { reason: input.reason };
        }
        if (action === 'void') details = { reason: input.reason };
        await repo.applyState(id, { state: verdict.to, assignedTo, repaired: action === 'repair', voidReason: action === 'void' ? input.reason : undefined });
        if (changesRepeats) await priorRepairs(tx).refreshAfter(id);
        const eventId = await repo.insertEvent({ findingId: id, kind: TRANSITIONS[action].event, fromState: from, toState: verdict.to, actorId: person.id, details });
        const federalLeft = f.weight === 'federal' ? await repo.openFederalCount(f.unit_id) : null;
        await audit(tx, { actorId: person.id, action: `finding_${action}`, entity: 'finding', entityId: id, ip, details: { from, to: verdict.to, ...details } });
        return { id, state: verdict.to, version: f.version + 1, eventId, unitId: f.unit_id, federalOpenOnUnit: federalLeft };
      });
    },

    /** The foreman clears the non-complying tag once no federal finding on the unit needs work. */
    async clearTag(person: Person, ip: string, unitId: string) {
      return db.transaction(async (tx) => {
        const repo = repairsRepository(tx);
        if (!(await repo.lockUnit(unitId))) throw notFound('Unit');
        const n = await repo.openFederalCount(unitId);
        if (n > 0) throw new AppError('conflict', `${n} federal finding${n === 1 ? ' is' : 's are'} still open on this unit; repair ${n === 1 ? 'it' : 'them'} first`);
        const tagId = await repo.clearTag(unitId, person.id);
        if (!tagId) throw notFound('Open tag for this unit');
        await audit(tx, { actorId: person.id, action: 'tag_cleared', entity: 'unit_tag', entityId: tagId, ip, details: { unitId } });
        return { unitId, tagId, clearedBy: person.name, clearedAt: new Date().toISOString() };
      });
    },
    OPEN_STATES,
  };
}
export type RepairsService = ReturnType<typeof repairsService>;
