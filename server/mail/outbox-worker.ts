import type { Transporter } from 'nodemailer';
import type { Db } from '../db/knex';
import { claimDue, markRetry, markSent } from './outbox.repository';

export interface OutboxOptions {
  from: string;
  /** How often to look for due mail when nobody nudges, ms. */
  pollMs?: number;
  /** First retry delay, doubled per attempt up to `maxDelayMs`. */
  baseDelayMs?: number;
  maxDelayMs?: number;
}

/**
 * Sends what the outbox holds. A message is marked sent only after the mail server took it;
 * a temporary failure (server down, 4xx) retries with exponential backoff and never gives up;
 * a permanent refusal (5xx, e.g. no such mailbox) is marked failed so the board can show it.
 */
export class OutboxWorker {
  private timer: NodeJS.Timeout | null = null;
  private running: Promise<number> | null = null;
  private readonly pollMs: number;
  private readonly baseDelayMs: number;
  private readonly maxDelayMs: number;

  constructor(
    private readonly db: Db,
    private readonly transport: Transporter,
    private readonly options: OutboxOptions,
  ) {
    this.pollMs = options.pollMs ?? 5000;
    this.baseDelayMs = options.baseDelayMs ?? 5000;
    this.maxDelayMs = options.maxDelayMs ?? 15 * 60_000;
  }

  start(): void {
    if (this.timer) return;
    const tick = () => {
      void this.drain()
        .catch(() => undefined)
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
    for (;;) {
      const batch = await this.db.transaction(async (tx) => {
        const due = await claimDue(tx, 20);
        let n = 0;
        for (const mail of due) {
          try {
            await this.transport.sendMail({
              from: this.options.from,
              to: mail.to_address,
              subject: mail.subject,
              text: mail.text_body,
              html: mail.html_body ?? undefined,
            });
            await markSent(tx, mail.id);
            n++;
          } catch (err) {
            const e = err as { responseCode?: number; message?: string };
            const permanent = typeof e.responseCode === 'number' && e.responseCode >= 500;
            const attempts = mail.attempts + 1;
            const delay = Math.min(this.baseDelayMs * 2 ** (attempts - 1), this.maxDelayMs);
            await markRetry(tx, mail.id, attempts, e.message ?? String(err), permanent, delay);
          }
        }
        return { claimed: due.length, sent: n };
      });
      sent += batch.sent;
      if (batch.claimed < 20 || batch.sent === 0) return sent;
    }
  }
}
