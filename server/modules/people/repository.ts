import { asc, eq, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { people } from '../../db/schema';
import type { PersonRow } from '../../../shared/api/people';

const cols = {
  id: people.id,
  email: people.email,
  name: people.name,
  role: people.role,
  active: people.active,
  yardId: people.yardId,
  lockedUntil: people.lockedUntil,
  version: people.version,
};

type Raw = { id: string; email: string; name: string; role: string; active: boolean; yardId: string | null; lockedUntil: Date | null; version: number };
const toRow = (r: Raw): PersonRow => ({
  id: r.id,
  email: r.email,
  name: r.name,
  role: r.role as PersonRow['role'],
  active: r.active,
  yardId: r.yardId,
  locked: !!r.lockedUntil && r.lockedUntil > new Date(),
  version: r.version,
});

export const peopleRepository = (db: DbOrTx) => ({
  async list(): Promise<PersonRow[]> {
    return (await db.select(cols).from(people).orderBy(asc(people.name))).map(toRow);
  },
  async get(id: string): Promise<PersonRow | null> {
    const r = await db.select(cols).from(people).where(eq(people.id, id)).limit(1);
    return r[0] ? toRow(r[0]) : null;
  },
  async emailTaken(email: string): Promise<boolean> {
    const r = await db.select({ id: people.id }).from(people).where(sql`lower(${people.email}) = ${email.toLowerCase()}`).limit(1);
    return r.length > 0;
  },
  async insert(v: { email: string; name: string; role: string; yardId: string | null; passwordHash: string }): Promise<PersonRow> {
    const [r] = await db.insert(people).values(v).returning(cols);
    return toRow(r);
  },
  /** Updates only when the stored version matches; returns null on a stale version. */
  async update(id: string, version: number, patch: Partial<{ name: string; role: string; active: boolean; yardId: string | null }>) {
    const r = await db
      .update(people)
      .set({ ...patch, version: sql`${people.version} + 1`, updatedAt: new Date() })
      .where(sql`${people.id} = ${id} and ${people.version} = ${version}`)
      .returning(cols);
    return r[0] ? toRow(r[0]) : null;
  },
  async unlock(id: string) {
    await db.update(people).set({ failedLogins: 0, lockedUntil: null }).where(eq(people.id, id));
  },
  async byRoleInYard(role: string, yardId: string | null) {
    return db
      .select({ id: people.id, email: people.email, name: people.name })
      .from(people)
      .where(sql`${people.role} = ${role} and ${people.active} and (${yardId}::uuid is null or ${people.yardId} = ${yardId}::uuid)`);
  },
});
