import bcrypt from 'bcryptjs';
import { sql } from 'drizzle-orm';
import type { Drawing } from '../../shared/drawings/types';
import type { Db } from '../db/client';
import { seedHistory } from './demo-history';
import { people, railroadSettings, unitTypes, units, yards } from '../db/schema';
import { BCRYPT_COST } from '../modules/auth/service';
import { addDays, civilDateInZone } from '../../shared/checks/civil-date';
import { DEMO_PASSWORD, DEMO_PEOPLE, DEMO_RAILROAD, DEMO_UNIT_TYPES, DEMO_UNITS, DEMO_YARDS } from './demo-data';


/** Calendar day `days` before today in the railroad's zone, for believable last-test dates. */
const daysAgo = (now: Date, days: number) => addDays(civilDateInZone(now, DEMO_RAILROAD.timeZone), -days);

/**
 * Seeds the demo railroad once. Idempotent: when the railroad row exists nothing is touched, so a
 * second start neither duplicates nor wipes; an advisory lock keeps two starting servers apart.
 */
export async function seedDemo(db: Db, drawings: ReadonlyMap<string, Drawing>, opts: { now?: Date; historyDays?: number } = {}): Promise<boolean> {
  const now = opts.now ?? new Date();
  const dims = (key: string) => {
    const d = drawings.get(key);
    if (!d) throw new Error(`No drawing for unit type ${key}`);
    return { lengthIn: d.lengthIn, widthIn: d.widthIn, axleCount: d.axleCount };
  };
  return db.transaction(async (tx) => {
    await tx.execute(sql`select pg_advisory_xact_lock(4242001)`);
    const existing = await tx.select({ id: railroadSettings.id }).from(railroadSettings).limit(1);
    if (existing.length) return false;
    await tx.insert(railroadSettings).values({ id: 1, ...DEMO_RAILROAD });
    const yardRows = await tx.insert(yards).values([...DEMO_YARDS]).returning();
    const yardId = (code: string | null) => (code ? yardRows.find((y) => y.code === code)!.id : null);
    const hash = await bcrypt.hash(DEMO_PASSWORD, BCRYPT_COST);
    await tx.insert(people).values(DEMO_PEOPLE.map((p) => ({ email: p.email, name: p.name, role: p.role, yardId: yardId(p.yard), passwordHash: hash })));
    await tx.insert(unitTypes).values(DEMO_UNIT_TYPES.map((t) => ({ key: t.key, name: t.name, drawingFile: t.file, ...dims(t.key) })));
    await tx.insert(units).values(
      DEMO_UNITS.map((u, i) => ({
        roadNumber: u.roadNumber,
        unitTypeKey: u.type,
        frontEnd: u.frontEnd,
        yardId: yardId(u.yard),
        conditionMonitoring: !!u.cm,
        humpStencilled: !!u.hump,
        // Spread the test dates so the due board shows good, due-soon and overdue units.
        lastPeriodicOn: daysAgo(now, [20, 88, 45, 95, 10, 60, 91, 30, 5, 70, 86, 40][i]),
        lastAnnualOn: daysAgo(now, [100, 200, 365, 30, 250, 362, 120, 300, 369, 50, 180, 220][i]),
        lastHandBrakeOn: daysAgo(now, [100, 200, 360, 30, 250, 362, 120, 300, 371, 50, 180, 220][i]),
        lastMainReservoirOn: daysAgo(now, [400, 700, 120, 731, 300, 500, 60, 640, 200, 740, 10, 333][i]),
        lastCmCheckOn: u.cm ? daysAgo(now, 28) : null,
      })),
    );
    const days = opts.historyDays ?? 120;
    if (days > 0) await seedHistory(tx, { drawings, now, timeZone: DEMO_RAILROAD.timeZone, days });
    return true;
  });
}
