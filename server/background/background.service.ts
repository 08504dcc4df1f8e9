// The owner's view of background work that failed for good, and the way to try it again.
import type { FailedJob, FailedJobList } from '../../shared/schemas/background';
import type { AppDeps } from '../app-deps';
import { AppError } from '../http/errors';
import { requeue } from '../mail/outbox.repository';
import { failedJobQueue, failedJobs } from './failed-jobs.repository';
import { jobQueue, sqlOn } from './queue';

const MAIL_KINDS: Record<string, string> = {
  'work-order': 'Work order e-mail',
  invite: 'Invitation e-mail',
  reset: 'Password link e-mail',
  invoice: 'Invoice e-mail',
  'credit-note': 'Credit note e-mail',
};

export async function listFailed(deps: AppDeps, farmId: number): Promise<FailedJobList> {
  const rows = await failedJobs(deps.db, farmId);
  const jobs: FailedJob[] = rows.map((r) => ({
    id: r.id,
    queue: r.name,
    what: (r.mail_kind && MAIL_KINDS[r.mail_kind]) ?? 'E-mail',
    to: r.mail_to,
    subject: r.mail_subject,
    attempts: r.attempts,
    failedAt: r.failed_at.toISOString(),
    error: r.error,
  }));
  return { jobs };
}

/** Puts a failed job of this farm back in its queue (one more attempt), and its mail back to "queued". */
export async function retryFailed(deps: AppDeps, farmId: number, id: string): Promise<void> {
  await deps.db.transaction(async (tx) => {
    const queue = await failedJobQueue(tx, farmId, id);
    if (!queue) throw new AppError(404, 'not_found', 'That job is not in the failed list any more (it was retried or removed)');
    const boss = jobQueue(deps.db);
    const job = await boss.getJobById<{ mailId: number }>(queue, id, { db: sqlOn(tx), includeArchive: false });
    await boss.retry(queue, id, { db: sqlOn(tx) });
    if (queue === 'mail' && job) await requeue(tx, job.data.mailId);
  });
  deps.nudgeMail();
}
