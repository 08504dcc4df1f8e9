// Reads of pg-boss's job table for the owner's "Mail and background jobs" list. pg-boss offers no
// listing by state, so this reads its `job` table (schema JOB_SCHEMA) directly. Failed jobs stay
// in that table for 30 days (`archiveFailedAfterSeconds` of the working process).
import type { Tx } from '../db/knex';
import { JOB_SCHEMA, type QueueName } from './queue';

export interface FailedJobRow {
  id: string;
  name: QueueName;
  attempts: number;
  failed_at: Date;
  error: string | null;
  mail_kind: string | null;
  mail_to: string | null;
  mail_subject: string | null;
}

const FAILED = `
  SELECT j.id::text, j.name, j.retry_count + 1 AS attempts, j.completed_on AS failed_at,
         coalesce(j.output->>'message', o.last_error) AS error,
         o.kind AS mail_kind, o.to_address AS mail_to, o.subject AS mail_subject
    FROM ${JOB_SCHEMA}.job j
    LEFT JOIN mail_outbox o ON j.name = 'mail' AND o.id = (j.data->>'mailId')::int
   WHERE j.state = 'failed' AND (j.data->>'farmId')::int = ?`;

/** The farm's jobs that failed for good (the dead letters), newest first. */
export async function failedJobs(db: Tx, farmId: number, limit = 100): Promise<FailedJobRow[]> {
  const { rows } = await db.raw<{ rows: FailedJobRow[] }>(`${FAILED} ORDER BY failed_at DESC LIMIT ?`, [farmId, limit]);
  return rows;
}

/** Which queue a failed job of this farm is in, or nothing (another farm's, not failed, gone). */
export async function failedJobQueue(db: Tx, farmId: number, id: string): Promise<QueueName | undefined> {
  const { rows } = await db.raw<{ rows: { name: QueueName }[] }>(
    `SELECT name FROM ${JOB_SCHEMA}.job WHERE id = ?::uuid AND state = 'failed' AND (data->>'farmId')::int = ?`,
    [id, farmId],
  );
  return rows[0]?.name;
}

/**
 * Makes the job's next failure its last: pg-boss has no "fail for good" call, and its retry
 * limit is the job's own column, so the limit is lowered to the retries already used. For a
 * refusal that no retry can mend (a mail server's 5xx "no such mailbox").
 */
export async function lastAttempt(db: Tx, queue: QueueName, id: string): Promise<void> {
  await db.raw(`UPDATE ${JOB_SCHEMA}.job SET retry_limit = retry_count WHERE name = ? AND id = ?::uuid`, [queue, id]);
}
