import type { Tx } from '../db/knex';
import type { DbMailRow } from '../db/rows';

export interface OutgoingMail {
  farmId: number | null;
  kind: string;
  ref?: string | null;
  to: string;
  subject: string;
  text: string;
  html?: string | null;
}

export async function enqueueMail(db: Tx, mail: OutgoingMail): Promise<number> {
  const [row] = await db<DbMailRow>('mail_outbox')
    .insert({
      farm_id: mail.farmId,
      kind: mail.kind,
      ref: mail.ref ?? null,
      to_address: mail.to,
      subject: mail.subject,
      text_body: mail.text,
      html_body: mail.html ?? null,
    })
    .returning('id');
  return row.id;
}

/** Locks up to `limit` due messages for this worker; other workers skip them. */
export function claimDue(tx: Tx, limit: number): Promise<DbMailRow[]> {
  return tx<DbMailRow>('mail_outbox')
    .where('status', 'queued')
    .andWhere('next_attempt_at', '<=', tx.fn.now())
    .orderBy('id')
    .limit(limit)
    .forUpdate()
    .skipLocked();
}

export async function markSent(db: Tx, id: number): Promise<void> {
  await db('mail_outbox').where({ id }).update({ status: 'sent', sent_at: db.fn.now(), attempts: db.raw('attempts + 1'), last_error: null });
}

export async function markRetry(db: Tx, id: number, attempts: number, error: string, giveUp: boolean, delayMs: number): Promise<void> {
  await db('mail_outbox')
    .where({ id })
    .update({
      status: giveUp ? 'failed' : 'queued',
      attempts,
      last_error: error.slice(0, 1000),
      next_attempt_at: db.raw(`now() + make_interval(secs => ?)`, [delayMs / 1000]),
    });
}
