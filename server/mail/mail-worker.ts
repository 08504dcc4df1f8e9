import type { Transporter } from 'nodemailer';
import type PgBoss from 'pg-boss';
import { lastAttempt } from '../background/failed-jobs.repository';
import { jobQueue, sqlOn, type JobData } from '../background/queue';
import type { Db } from '../db/knex';
import { logMessage } from '../http/errors';
import { silentLogger, type Logger } from '../logging/logger';
import { attachmentsOf, mailById, markAttempt, markSent } from './outbox.repository';

export interface MailWorkerOptions {
  from: string;
  /** How often to look for due mail when nobody nudges, ms. */
  pollMs?: number;
  /**
   * Attempts before a message that keeps failing is given up, at most the queue's own cap
   * (`QUEUE_POLICY.mail`: 10); lower in tests.
   */
  maxAttempts?: number;
  /** Where each attempt's outcome is logged (mail id and kind, never the address or body); default silent. */
  logger?: Logger;
}

/** One send attempt as the log shows it. */
export interface MailAttemptLog {
  mailId: number;
  jobId: string;
  kind: string;
  attempt: number;
  outcome: 'sent' | 'retry' | 'failed';
  error?: string;
}

type MailJob = PgBoss.JobWithMetadata<JobData['mail']>;

/** Mail servers quote the address they refused ("550 <x@y>: no such user"); the log keeps neither. */
const ADDRESS = /[^\s<>"'(),;:]+@[^\s<>"'(),;:]+/g;
const withoutAddresses = (message: string): string => message.replace(ADDRESS, '[address]').slice(0, 300);

/** After this many failures in a row, one run stops and leaves the rest for the next poll. */
const FAILURES_PER_RUN = 20;

/**
 * Works the `mail` queue. pg-boss hands out each job to one worker (its fetch locks and marks it
 * active in one statement); the message is sent with no transaction open, then the outcome is
 * recorded in one short transaction: the outbox row for the board, and the job completed or
 * failed. A failed job is retried by pg-boss with back-off up to its cap; a permanent refusal
 * (5xx, e.g. no such mailbox) fails for good at once. A job whose worker died mid-send is
 * expired by pg-boss's maintenance and retried.
 *
 * Delivery is at least once: if the mail server took the message but the database cannot be
 * told (it is down that moment), the worker keeps the fact and records it when the job comes
 * back; only if this process also ends before then is the message sent again.
 */
export class MailWorker {
  private timer: NodeJS.Timeout | null = null;
  private running: Promise<number> | null = null;
  private readonly boss: PgBoss;
  private readonly pollMs: number;
  private readonly maxAttempts: number;
  /** Messages the mail server took whose `sent` mark did not reach the database yet. */
  private readonly unrecorded = new Set<number>();
  private readonly log: Logger;
  private announced = false;

  constructor(
    private readonly db: Db,
    private readonly transport: Transporter,
    private readonly options: MailWorkerOptions,
  ) {
    this.boss = jobQueue(db);
    this.pollMs = options.pollMs ?? 5000;
    this.maxAttempts = options.maxAttempts ?? Infinity;
    this.log = options.logger ?? silentLogger();
  }

  start(): void {
    if (this.timer) return;
    // nudge() restarts the timer through here: say it once.
    if (!this.announced) this.log.info({ pollMs: this.pollMs }, 'mail worker started');
    this.announced = true;
    const tick = () => {
      void this.drain()
        // logMessage: a failed statement's message holds its SQL and values; the log gets neither.
        .catch((err: unknown) => this.log.warn({ error: withoutAddresses(logMessage(err)) }, 'mail run stopped early'))
        .finally(() => {
          if (this.timer) this.timer = setTimeout(tick, this.pollMs);
        });
    };
    this.timer = setTimeout(tick, 0);
  }

  async stop(): Promise<void> {
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    await this.running?.catch(() => undefined);
    if (this.announced) this.log.info('mail worker stopped');
    this.announced = false;
  }

  /** Ask for a send soon (after a commit that queued mail). */
  nudge(): void {
    if (this.timer) {
      clearTimeout(this.timer);
      this.timer = null;
      this.start();
    }
  }

  /** Sends every message that is due now; returns how many were sent. One run at a time. */
  drain(): Promise<number> {
    this.running ??= this.sendDue().finally(() => (this.running = null));
    return this.running;
  }

  private async sendDue(): Promise<number> {
    let sent = 0;
    let failuresInARow = 0;
    // A job that fails now is due again after its retry delay (at least a second), so one run
    // does not try the same message twice.
    for (;;) {
      const [job] = (await this.boss.fetch<JobData['mail']>('mail', { batchSize: 1, includeMetadata: true })) as MailJob[];
      if (!job) return sent;
      if (await this.work(job)) {
        sent++;
        failuresInARow = 0;
      } else if (++failuresInARow >= FAILURES_PER_RUN) return sent;
    }
  }

  /** One attempt at one job; true when the mail server took the message. */
  private async work(job: MailJob): Promise<boolean> {
    const attempt = job.retryCount + 1;
    // The job's start, by its id only; the attempt's line below names the mail.
    this.log.info({ jobId: job.id, queue: 'mail', attempt }, 'job started');
    const mail = await mailById(this.db, job.data.mailId);
    if (!mail || mail.status === 'sent' || this.unrecorded.has(mail.id)) {
      // Sent before (the mark or the completion was lost), or the message is gone with its farm.
      if (mail && mail.status !== 'sent') await markSent(this.db, mail.id, attempt);
      if (mail) this.unrecorded.delete(mail.id);
      await this.boss.complete('mail', job.id);
      return false;
    }
    const attachments = await attachmentsOf(this.db, mail.id);
    try {
      await this.transport.sendMail({
        from: this.options.from,
        to: mail.to_address,
        subject: mail.subject,
        text: mail.text_body,
        html: mail.html_body ?? undefined,
        ...(attachments.length ? { attachments } : {}),
      });
    } catch (err) {
      const e = err as { responseCode?: number; message?: string };
      const permanent = typeof e.responseCode === 'number' && e.responseCode >= 500;
      const last = attempt >= Math.min(job.retryLimit + 1, this.maxAttempts);
      const message = `${e.message ?? String(err)}${last && !permanent ? ` (gave up after ${attempt} attempts)` : ''}`;
      this.attempt(job, attempt, permanent || last ? 'failed' : 'retry', message);
      await this.db.transaction(async (tx) => {
        await markAttempt(tx, mail.id, attempt, message, permanent || last);
        if (permanent || last) await lastAttempt(tx, 'mail', job.id);
        await this.boss.fail('mail', job.id, { message: withoutAddresses(message) }, { db: sqlOn(tx) });
      });
      return false;
    }
    this.attempt(job, attempt, 'sent');
    try {
      await this.db.transaction(async (tx) => {
        await markSent(tx, mail.id, attempt);
        await this.boss.complete('mail', job.id, {}, { db: sqlOn(tx) });
      });
    } catch (err) {
      this.unrecorded.add(mail.id);
      throw err;
    }
    return true;
  }

  /** Logs one attempt's outcome: the mail's id and kind, never its address, subject or body. */
  private attempt(job: MailJob, attempt: number, outcome: MailAttemptLog['outcome'], error?: string): void {
    const line: MailAttemptLog = {
      mailId: job.data.mailId,
      jobId: job.id,
      kind: job.data.kind,
      attempt,
      outcome,
      ...(error ? { error: withoutAddresses(error) } : {}),
    };
    const level = outcome === 'sent' ? 'info' : outcome === 'retry' ? 'warn' : 'error';
    this.log[level](line, `mail ${outcome}`);
  }
}
