import type { PersonCache } from '../auth/person-cache';
import bcrypt from 'bcryptjs';
import type { Db } from '../../db/client';
import { AppError, notFound } from '../../http/errors';
import type { Person } from '../../http/routes';
import { audit } from '../../lib/audit';
import type { CreatePersonBody, UpdatePersonBody } from '../../../shared/api/people';
import { BCRYPT_COST } from '../auth/service';
import { authRepository } from '../auth/repository';
import { peopleRepository } from './repository';

export function peopleService(db: Db, signedIn?: PersonCache) {
  return {
    list: () => peopleRepository(db).list(),
    async create(actor: Person, ip: string, body: CreatePersonBody) {
      const hash = await bcrypt.hash(body.password, BCRYPT_COST);
      return db.transaction(async (tx) => {
        const repo = peopleRepository(tx);
        if (await repo.emailTaken(body.email)) {
          throw new AppError('conflict', 'Someone already has that e-mail address', { email: 'Already in use' });
        }
        const row = await repo.insert({ email: body.email, name: body.name, role: body.role, yardId: body.yardId ?? null, passwordHash: hash });
        await audit(tx, { actorId: actor.id, action: 'person_created', entity: 'person', entityId: row.id, ip, details: { role: row.role } });
        return row;
      });
    },
    async update(actor: Person, ip: string, id: string, body: UpdatePersonBody) {
      const { version, ...patch } = body;
      if (id === actor.id && (patch.active === false || (patch.role && patch.role !== 'admin'))) {
        throw new AppError('conflict', 'You cannot deactivate yourself or take away your own admin role');
      }
      const row = await db.transaction(async (tx) => {
        const repo = peopleRepository(tx);
        const current = await repo.get(id);
        if (!current) throw notFound('Person');
        const updated = await repo.update(id, version, patch);
        if (!updated) {
          throw new AppError('stale', `${current.name} was changed by someone else since you opened it; reload to see the change`, undefined, {
            current,
          });
        }
        await audit(tx, { actorId: actor.id, action: 'person_updated', entity: 'person', entityId: id, ip, details: patch });
        return updated;
      });
      signedIn?.forget(id);
      // A deactivated person loses every session at once.
      if (patch.active === false) await authRepository(db).endAllSessions(id);
      return row;
    },
    async unlock(actor: Person, ip: string, id: string) {
      const repo = peopleRepository(db);
      if (!(await repo.get(id))) throw notFound('Person');
      await repo.unlock(id);
      await audit(db, { actorId: actor.id, action: 'person_unlocked', entity: 'person', entityId: id, ip });
      return repo.get(id);
    },
  };
}
