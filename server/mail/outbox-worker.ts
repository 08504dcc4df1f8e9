import type { Transporter } from 'nodemailer';
import type { Db } from '../db/knex';
import type { DbMailRow } from '../db/rows';
import { logMessage } from '../http/errors';
import { silentLogger, type Logger } from '../logging/logger';
import { claimNext, markRetry, markSent } from './outbox.repository';

export interface OutboxOptions {
  from: string;
  /** How often to look for due mail when nobody nudges, ms. */
  pollMs?: number;
  /** First retry delay, doubled per attempt up to `maxDelayMs`. */
  baseDelayMs?: number;
  maxDelayMs?: number;
  /**
   * How long a claimed message is kept from other runs while it is sent, ms. Longer than one
   * send can take (the transport's connection, greeting and socket timeouts: 10 + 10 + 30 s).
   */
  leaseMs?: number;
  /** Attempts before a message that keeps failing is marked failed with its last error. */
  maxAttempts?: number;
  /** Where each attempt's outcome is logged (mail id and kind, never the address or body); default silent. */
  logger?: Logger;
}

/** One send attempt as the log shows it. */
export interface MailAttemptLog {
  mailId: number;
  kind: string;
  attempt: number;
  outcome: 'sent' | 'retry' | 'failed';
  error?: string;
}

/** Mail servers quote the address they refused ("550 <x@y>: no such user"); the log keeps neither. */
const ADDRESS = /[^\s<>"'(),;:]+@[^\s<>"'(),;:]+/g;
const withoutAddresses = (message: string): string => message.replace(ADDRESS, '[address]').slice(0, 300);

/** After this many failures in a row, one run stops and leaves the rest for the next poll. */
const FAILURES_PER_RUN = 20;

/**
 * Sends what the outbox holds. Each message is claimed in one short statement (a lease, see
 * `claimNext`), sent with no database transaction open, then marked in another short statement,
 * so a mail server that hangs holds no row lock and no connection. A message is marked sent only
 * after the mail server took it; a temporary failure (server down or silent, 4xx) retries with
 * exponential backoff, up to `maxAttempts` attempts; a permanent refusal (5xx, e.g. no such
 * mailbox) or the last allowed attempt is marked failed so the board can show it.
 *
 * Delivery is at least once: if the message was taken but the database cannot be told (it is
 * down that moment), the worker keeps the fact and records it on its next run; only if this
 * process also ends before then is the message sent again when its lease runs out.
 */
export class OutboxWorker {
  private timer: NodeJS.Timeout | null = null;
  private running: Promise<number> | null = null;
  private readonly pollMs: number;
  private readonly baseDelayMs: number;
  private readonly maxDelayMs: number;
  private readonly leaseMs: number;
  private readonly maxAttempts: number;
  /** Messages the mail server took whose `sent` mark did not reach the database yet. */
  private readonly unrecorded = new Set<number>();
  private readonly log: Logger;
  private announced = false;

  constructor(
    private readonly db: Db,
    private readonly transport: Transporter,
    private readonly options: OutboxOptions,
  ) {
    this.pollMs = options.pollMs ?? 5000;
    this.baseDelayMs = options.baseDelayMs ?? 5000;
    this.maxDelayMs = options.maxDelayMs ?? 15 * 60_000;
    this.leaseMs = options.leaseMs ?? 5 * 60_000;
    this.maxAttempts = options.maxAttempts ?? 10;
    this.log = options.logger ?? silentLogger();
  }

  start(): void {
    if (this.timer) return;
    // nudge() restarts the timer through here: say it once.
    if (!this.announced) this.log.info({ pollMs: this.pollMs, maxAttempts: this.maxAttempts }, 'mail worker started');
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
    for (const id of [...this.unrecorded]) {
      await markSent(this.db, id);
      this.unrecorded.delete(id);
    }
    let sent = 0;
    let failuresInARow = 0;
    // Ids go up within one run, so each message is tried at most once per run, even one whose
    // short retry delay has already passed.
    let afterId = 0;
    for (;;) {
      const mail = await claimNext(this.db, afterId, this.leaseMs);
      if (!mail) return sent;
      afterId = mail.id;
      if (await this.send(mail)) {
        sent++;
        failuresInARow = 0;
      } else if (++failuresInARow >= FAILURES_PER_RUN) return sent;
    }
  }

  /** One attempt at one claimed message; true when the mail server took it. */
  private async send(mail: DbMailRow): Promise<boolean> {
    if (mail.attempts > this.maxAttempts) {
      // Its earlier attempts never came back (the sender died each time): give up now.
      this.attempt(mail, 'failed', `no answer after ${mail.attempts - 1} attempts`);
      await markRetry(this.db, mail.id, `${mail.last_error ?? 'no answer'} (gave up after ${mail.attempts - 1} attempts)`, true, 0);
      return false;
    }
    try {
      await this.transport.sendMail({
        from: this.options.from,
        to: mail.to_address,
        subject: mail.subject,
        text: mail.text_body,
        html: mail.html_body ?? undefined,
      });
    } catch (err) {
      const e = err as { responseCode?: number; message?: string };
      const permanent = typeof e.responseCode === 'number' && e.responseCode >= 500;
      const last = mail.attempts >= this.maxAttempts;
      const delay = Math.min(this.baseDelayMs * 2 ** (mail.attempts - 1), this.maxDelayMs);
      const message = `${e.message ?? String(err)}${last && !permanent ? ` (gave up after ${mail.attempts} attempts)` : ''}`;
      this.attempt(mail, permanent || last ? 'failed' : 'retry', message);
      await markRetry(this.db, mail.id, message, permanent || last, delay);
      return false;
    }
    this.attempt(mail, 'sent');
    try {
      await markSent(this.db, mail.id);
    } catch (err) {
      this.unrecorded.add(mail.id);
      throw err;
    }
    return true;
  }

  /** Logs one attempt's outcome: the mail's id and kind, never its address, subject or body. */
  private attempt(mail: DbMailRow, outcome: MailAttemptLog['outcome'], error?: string): void {
    const line: MailAttemptLog = {
      mailId: mail.id,
      kind: mail.kind,
      attempt: mail.attempts,
      outcome,
      ...(error ? { error: withoutAddresses(error) } : {}),
    };
    const level = outcome === 'sent' ? 'info' : outcome === 'retry' ? 'warn' : 'error';
    this.log[level](line, `mail ${outcome}`);
  }
}
