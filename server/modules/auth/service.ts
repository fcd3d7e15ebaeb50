import type { PersonCache } from './person-cache';
import bcrypt from 'bcryptjs';
import type { Request } from 'express';
import type { Config } from '../../config';
import type { Db } from '../../db/client';
import { AppError } from '../../http/errors';
import type { Person } from '../../http/routes';
import { audit } from '../../lib/audit';
import type { Role } from '../../../shared/domain/roles';
import { authRepository } from './repository';

export const BCRYPT_COST = 11;
// Compared against when the e-mail is unknown, so both paths cost the same time.
const DUMMY_HASH = bcrypt.hashSync('not-a-real-password', BCRYPT_COST);

declare module 'express-session' {
  interface SessionData {
    personId: string;
    issuedAt: number;
  }
}

const regenerate = (req: Request) => new Promise<void>((ok, fail) => req.session.regenerate((e) => (e ? fail(e) : ok())));
const save = (req: Request) => new Promise<void>((ok, fail) => req.session.save((e) => (e ? fail(e) : ok())));

export const toPerson = (p: { id: string; email: string; name: string; role: string; yardId: string | null }): Person => ({
  id: p.id,
  email: p.email,
  name: p.name,
  role: p.role as Role,
  yardId: p.yardId,
});

export function authService(db: Db, config: Config, signedIn?: PersonCache) {
  const repo = authRepository(db);
  return {
    async login(req: Request, email: string, password: string): Promise<Person> {
      const found = await repo.byEmail(email);
      const ok = await bcrypt.compare(password, found?.passwordHash ?? DUMMY_HASH);
      if (!found) throw new AppError('unauthenticated', 'Wrong e-mail or password');
      if (found.lockedUntil && found.lockedUntil > new Date()) {
        throw new AppError('locked', 'Too many wrong passwords: this account is locked for a while, or until an admin unlocks it');
      }
      if (!ok) {
        await repo.recordFailure(found.id, config.LOCKOUT_AFTER, config.LOCKOUT_MINUTES);
        await audit(db, { actorId: found.id, action: 'login_failed', entity: 'person', entityId: found.id, ip: req.ip });
        throw new AppError('unauthenticated', 'Wrong e-mail or password');
      }
      if (!found.active) throw new AppError('forbidden', 'This account is deactivated; ask an admin');
      await repo.recordSuccess(found.id);
      // A fresh session id at sign-in defeats session fixation.
      await regenerate(req);
      req.session.personId = found.id;
      req.session.issuedAt = Date.now();
      await save(req);
      await audit(db, { actorId: found.id, action: 'login', entity: 'person', entityId: found.id, ip: req.ip });
      return toPerson(found);
    },
    async logout(req: Request, person: Person | null): Promise<void> {
      await regenerate(req);
      await save(req);
      if (person) await audit(db, { actorId: person.id, action: 'logout', entity: 'person', entityId: person.id, ip: req.ip });
    },
    async logoutEverywhere(req: Request, person: Person): Promise<void> {
      await repo.endAllSessions(person.id);
      signedIn?.forget(person.id);
      await regenerate(req);
      await save(req);
      await audit(db, { actorId: person.id, action: 'logout_everywhere', entity: 'person', entityId: person.id, ip: req.ip });
    },
    async changePassword(req: Request, person: Person, current: string, next: string): Promise<void> {
      const found = await repo.byId(person.id);
      if (!found || !(await bcrypt.compare(current, found.passwordHash))) {
        throw new AppError('validation', 'The current password is wrong', { currentPassword: 'Wrong password' });
      }
      if (next.toLowerCase().includes(found.email.split('@')[0].toLowerCase())) {
        throw new AppError('validation', 'The new password must not contain your e-mail name', { newPassword: 'Contains your e-mail name' });
      }
      await repo.setPassword(person.id, await bcrypt.hash(next, BCRYPT_COST));
      signedIn?.forget(person.id);
      await audit(db, { actorId: person.id, action: 'password_changed', entity: 'person', entityId: person.id, ip: req.ip });
    },
    async verifyPassword(personId: string, password: string): Promise<boolean> {
      const found = await repo.byId(personId);
      return !!found && (await bcrypt.compare(password, found.passwordHash));
    },
  };
}
export type AuthService = ReturnType<typeof authService>;
