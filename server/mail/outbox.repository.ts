import { enqueue } from '../background/queue';
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
  /** Files sent with the message (an invoice's PDF), kept with it so every attempt sends the same bytes. */
  attachments?: MailAttachment[];
}

export interface MailAttachment {
  filename: string;
  contentType: string;
  content: Buffer;
}

/**
 * Writes the message to the outbox and its send job to the `mail` queue, both inside `db` (the
 * caller's transaction): the mail exists, and will be sent, exactly when the change that causes
 * it commits.
 */
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
  if (mail.attachments?.length)
    await db('mail_attachments').insert(
      mail.attachments.map((a) => ({ mail_id: row.id, filename: a.filename, content_type: a.contentType, content: a.content })),
    );
  await enqueue(db, 'mail', { mailId: row.id, farmId: mail.farmId, kind: mail.kind });
  return row.id;
}

export const mailById = (db: Tx, id: number): Promise<DbMailRow | undefined> => db<DbMailRow>('mail_outbox').where({ id }).first();

export async function attachmentsOf(db: Tx, mailId: number): Promise<MailAttachment[]> {
  const rows = (await db('mail_attachments')
    .where({ mail_id: mailId })
    .orderBy('id')
    .select('filename', 'content_type', 'content')) as Array<{
    filename: string;
    content_type: string;
    content: Buffer;
  }>;
  return rows.map((r) => ({ filename: r.filename, contentType: r.content_type, content: r.content }));
}

/** The mail server took the message. */
export async function markSent(db: Tx, id: number, attempts: number): Promise<void> {
  await db('mail_outbox').where({ id }).update({ status: 'sent', sent_at: db.fn.now(), last_error: null, attempts });
}

/** An attempt failed: the message waits for its retry (`queued`) or was given up (`failed`, shown on the board). */
export async function markAttempt(db: Tx, id: number, attempts: number, error: string, gaveUp: boolean): Promise<void> {
  await db('mail_outbox')
    .where({ id })
    .whereNot({ status: 'sent' })
    .update({ status: gaveUp ? 'failed' : 'queued', attempts, last_error: error.slice(0, 1000) });
}

/** The owner asked for another try of a message that was given up. */
export async function requeue(db: Tx, id: number): Promise<void> {
  await db('mail_outbox').where({ id, status: 'failed' }).update({ status: 'queued' });
}
