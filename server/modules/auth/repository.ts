import { and, eq, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { people, session } from '../../db/schema';

export const authRepository = (db: Db) => ({
  async byEmail(email: string) {
    const rows = await db.select().from(people).where(sql`lower(${people.email}) = ${email.toLowerCase()}`).limit(1);
    return rows[0] ?? null;
  },
  async byId(id: string) {
    const rows = await db.select().from(people).where(eq(people.id, id)).limit(1);
    return rows[0] ?? null;
  },
  async recordFailure(id: string, lockAfter: number, lockMinutes: number) {
    await db
      .update(people)
      .set({
        failedLogins: sql`${people.failedLogins} + 1`,
        lockedUntil: sql`case when ${people.failedLogins} + 1 >= ${lockAfter} then now() + make_interval(mins => ${lockMinutes}) else ${people.lockedUntil} end`,
      })
      .where(eq(people.id, id));
  },
  async recordSuccess(id: string) {
    await db.update(people).set({ failedLogins: 0, lockedUntil: null }).where(eq(people.id, id));
  },
  async setPassword(id: string, hash: string) {
    await db.update(people).set({ passwordHash: hash, updatedAt: new Date() }).where(eq(people.id, id));
  },
  /** Refuses every session issued so far and deletes the stored ones. */
  async endAllSessions(id: string) {
    await db.update(people).set({ sessionsValidAfter: new Date() }).where(eq(people.id, id));
    await db.delete(session).where(sql`${session.sess}->>'personId' = ${id}`);
  },
  async isActive(id: string) {
    const r = await db.select({ active: people.active }).from(people).where(and(eq(people.id, id))).limit(1);
    return r[0]?.active ?? false;
  },
});
