import { sql } from 'drizzle-orm';
import type { Db, DbOrTx } from '../../db/client';
import { outbox } from '../../db/schema';
import type { Mailer } from '../../mail/mailer';

export interface OutgoingMail {
  kind: string;
  to: string;
  subject: string;
  body: string;
  /** Same key + same address is queued once only (e.g. one digest per yard per day). */
  dedupeKey?: string;
}

export const MAX_ATTEMPTS = 8;
/** Retry delay after the n-th failed attempt: 30 s, 1 min, 2 min ... capped at an hour. */
export const backoffSeconds = (attempts: number) => Math.min(3600, 30 * 2 ** Math.max(0, attempts - 1));

/** Queues mail in the caller's transaction, so a finding and its mail commit together or not at all. */
export async function enqueueMail(db: DbOrTx, mails: OutgoingMail[]): Promise<number> {
  if (!mails.length) return 0;
  const r = await db
    .insert(outbox)
    .values(mails.map((m) => ({ kind: m.kind, toAddress: m.to, subject: m.subject, body: m.body, dedupeKey: m.dedupeKey ?? null })))
    .onConflictDoNothing()
    .returning({ id: outbox.id });
  return r.length;
}

export function outboxService(db: Db, mailer: Mailer) {
  return {
    /**
     * Sends what is due. Rows are claimed with SKIP LOCKED and leased for five minutes, so several app
     * servers can run this side by side without sending anything twice.
     */
    async runOnce(batch = 20): Promise<{ sent: number; failed: number }> {
      const claimed = await db.execute<{ id: string; to_address: string; subject: string; body: string; attempts: number }>(sql`
        update notifications_outbox o set attempts = o.attempts + 1, next_attempt_at = now() + interval '5 minutes'
         where o.id in (select id from notifications_outbox where status = 'pending' and next_attempt_at <= now()
                         order by created_at limit ${batch} for update skip locked)
        returning o.id, o.to_address, o.subject, o.body, o.attempts`);
      let sent = 0;
      let failed = 0;
      for (const m of claimed.rows) {
        try {
          await mailer.send({ to: m.to_address, subject: m.subject, text: m.body });
          await db.execute(sql`update notifications_outbox set status = 'sent', sent_at = now(), last_error = null where id = ${m.id}`);
          sent++;
        } catch (e) {
          failed++;
          const msg = (e instanceof Error ? e.message : String(e)).slice(0, 500);
          await db.execute(sql`
            update notifications_outbox
               set last_error = ${msg},
                   status = case when attempts >= ${MAX_ATTEMPTS} then 'failed' else 'pending' end,
                   next_attempt_at = now() + make_interval(secs => ${backoffSeconds(m.attempts)})
             where id = ${m.id}`);
        }
      }
      return { sent, failed };
    },
    async list(limit = 200) {
      const r = await db.execute(sql`
        select id, kind, to_address as "to", subject, body, status, attempts, next_attempt_at as "nextAttemptAt",
               last_error as "lastError", created_at as "createdAt", sent_at as "sentAt"
          from notifications_outbox order by created_at desc limit ${limit}`);
      return r.rows;
    },
    async retry(id: string): Promise<boolean> {
      const r = await db.execute(sql`update notifications_outbox set status = 'pending', next_attempt_at = now() where id = ${id} and status <> 'sent' returning id`);
      return r.rows.length > 0;
    },
  };
}
export type OutboxService = ReturnType<typeof outboxService>;
