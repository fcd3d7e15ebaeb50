import type { Db } from '../../db/client';
import type { Drawing } from '../../../shared/drawings/types';
import type { FrontEnd } from '../../../shared/domain/frames';
import { unitLayout, type UnitLayout } from '../../../shared/layout/unit-layout';
import type { UpdateUnitBody } from '../../../shared/api/units';
import { AppError, notFound } from '../../http/errors';
import { frozenJson, type FrozenJson } from '../../http/frozen-json';
import type { Person } from '../../http/routes';
import { audit } from '../../lib/audit';
import { unitsRepository, type UnitFilter } from './repository';

export function unitsService(db: Db, drawings: ReadonlyMap<string, Drawing>) {
  // Layouts depend only on (unit type, front end): derive each once.
  const layouts = new Map<string, UnitLayout>();
  const layoutJsons = new Map<string, FrozenJson>();
  const drawing = (typeKey: string): Drawing => {
    const d = drawings.get(typeKey);
    if (!d) throw notFound('Unit type');
    return d;
  };
  const drawingJsons = new Map<string, FrozenJson>();
  const layoutFor = (typeKey: string, frontEnd: FrontEnd): UnitLayout => {
    const k = `${typeKey}:${frontEnd}`;
    let l = layouts.get(k);
    if (!l) {
      const d = drawings.get(typeKey);
      if (!d) throw notFound('Drawing for this unit type');
      l = unitLayout(d, frontEnd);
      layouts.set(k, l);
    }
    return l;
  };
  return {
    layoutFor,
    /** The layout as sent: serialised and tagged once, since it never changes while the process runs. */
    layoutJson(typeKey: string, frontEnd: FrontEnd): FrozenJson {
      const k = `${typeKey}:${frontEnd}`;
      let j = layoutJsons.get(k);
      if (!j) layoutJsons.set(k, (j = frozenJson(layoutFor(typeKey, frontEnd))));
      return j;
    },
    drawingJson(typeKey: string): FrozenJson {
      let j = drawingJsons.get(typeKey);
      if (!j) drawingJsons.set(typeKey, (j = frozenJson(drawing(typeKey))));
      return j;
    },
    drawing,
    list: (f: UnitFilter) => unitsRepository(db).list(f),
    async get(id: string) {
      const u = await unitsRepository(db).get(id);
      if (!u) throw notFound('Unit');
      return u;
    },
    async update(actor: Person, ip: string, id: string, body: UpdateUnitBody) {
      const { version, reason, ...patch } = body;
      return db.transaction(async (tx) => {
        const repo = unitsRepository(tx);
        const before = await repo.get(id);
        if (!before) throw notFound('Unit');
        if (!(await repo.update(id, version, patch))) {
          throw new AppError('stale', `${before.roadNumber} was changed by someone else since you opened it (now version ${before.version}); reload to see the change`, undefined, { current: before });
        }
        const changed = Object.fromEntries(Object.entries(patch).map(([k, v]) => [k, { from: (before as unknown as Record<string, unknown>)[k], to: v }]));
        await audit(tx, { actorId: actor.id, action: patch.frontEnd && patch.frontEnd !== before.frontEnd ? 'unit_front_end_changed' : 'unit_updated', entity: 'unit', entityId: id, ip, details: { changed, reason } });
        return (await repo.get(id))!;
      });
    },
  };
}
export type UnitsService = ReturnType<typeof unitsService>;
