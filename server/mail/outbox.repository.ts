import type { Db, Tx } from '../db/knex';
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

/**
 * Claims the next due message after `afterId` for one send, in one statement (its own short
 * transaction): the attempt is counted and `next_attempt_at` moves `leaseMs` ahead, which is the
 * lease: no other run takes the message while it is being sent, and no lock is held meanwhile.
 * If the sender dies mid-send, the message is due again when the lease runs out.
 */
export async function claimNext(db: Db, afterId: number, leaseMs: number): Promise<DbMailRow | undefined> {
  const next = db('mail_outbox')
    .select('id')
    .where('status', 'queued')
    .andWhere('next_attempt_at', '<=', db.fn.now())
    .andWhere('id', '>', afterId)
    .orderBy('id')
    .limit(1)
    .forUpdate()
    .skipLocked();
  const [row] = await db<DbMailRow>('mail_outbox')
    .where('id', next)
    .update({ attempts: db.raw('attempts + 1'), next_attempt_at: db.raw('now() + make_interval(secs => ?)', [leaseMs / 1000]) })
    .returning('*');
  return row;
}

/** The mail server took the message. */
export async function markSent(db: Db, id: number): Promise<void> {
  await db('mail_outbox').where({ id, status: 'queued' }).update({ status: 'sent', sent_at: db.fn.now(), last_error: null });
}

/** The attempt failed: try again after `delayMs`, or give up (`failed`, shown on the board). */
export async function markRetry(db: Db, id: number, error: string, giveUp: boolean, delayMs: number): Promise<void> {
  await db('mail_outbox')
    .where({ id, status: 'queued' })
    .update({
      status: giveUp ? 'failed' : 'queued',
      last_error: error.slice(0, 1000),
      next_attempt_at: db.raw('now() + make_interval(secs => ?)', [delayMs / 1000]),
    });
}
