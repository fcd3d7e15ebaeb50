import type { DbOrTx } from '../db/client';
import { auditLog } from '../db/schema';

export interface AuditEntry {
  actorId: string | null;
  action: string;
  entity: string;
  entityId?: string | null;
  ip?: string | null;
  details?: unknown;
}

/** The audit row's insert, for a statement that writes it beside other rows (a pin's trail). */
export const auditInsert = (db: DbOrTx, e: AuditEntry) =>
  db.insert(auditLog).values({
    actorId: e.actorId,
    action: e.action,
    entity: e.entity,
    entityId: e.entityId ?? null,
    ip: e.ip ?? null,
    details: (e.details ?? null) as object | null,
  });

/** Every write records who, when, what and from where; the table refuses UPDATE and DELETE. */
export async function audit(db: DbOrTx, e: AuditEntry): Promise<void> {
  await auditInsert(db, e);
}
