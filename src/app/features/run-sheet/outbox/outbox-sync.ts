// Keeps the outbox moving: a tap is written to the outbox first, then sent when there is a
// connection; what waits is sent in tap order when the phone comes back online and when the app
// starts. It says what it is doing in the words the run sheet shows ("Offline — 3 actions
// waiting", "Sending…", "All sent 10:42"), which jobs still have actions waiting, and what the
// server said of an action it could not apply. Free of Angular, so it is tested on its own.
import { farmTime } from '@shared/farm-time';
import type { Outbox, OutboxEntry, OutboxOutcome, QueuedAction, SendAnswer, SendBatch, Tapper } from './outbox';

export interface OutboxStatus {
  online: boolean;
  sending: boolean;
  /** Actions of this person still in the outbox. */
  waiting: number;
  /** When the outbox was last emptied by a send, or null before any. */
  allSentAt: Date | null;
}

/** What the run sheet is told after each change. */
export interface OutboxView {
  status: OutboxStatus;
  /** Jobs with at least one action not yet sent. */
  pendingJobs: ReadonlySet<number>;
  /** The person's waiting actions, in tap order (for showing each job's state before the server answers). */
  entries: readonly OutboxEntry[];
  /** Refusals of the last send, newest answer per job (the server kept each as a log). */
  outcomes: ReadonlyMap<number, OutboxOutcome>;
  /** Actions other people tapped on this device: they wait for that person, never sent under this one. */
  others: { count: number; names: readonly string[] };
  /** Grows each time the server answered an action: the run sheet reads the day again. */
  answered: number;
}

/** The line for another person's waiting actions; null when there are none. */
export function othersLine(others: OutboxView['others']): string | null {
  if (!others.count) return null;
  const one = others.count === 1;
  const who = others.names.length === 1 ? others.names[0] : 'other people';
  const whoAgain = others.names.length === 1 ? 'that person signs' : 'each of them signs';
  return `${others.count} action${one ? '' : 's'} tapped by ${who} ${one ? 'waits' : 'wait'} on this device. ${one ? 'It is' : 'They are'} sent only when ${whoAgain} in here again.`;
}

/** The line the run sheet shows; null when there is nothing to say (nothing tapped yet). */
export function statusLine(s: OutboxStatus, timeZone: string | undefined): string | null {
  const actions = (n: number) => `${n} action${n === 1 ? '' : 's'}`;
  if (s.sending) return 'Sending…';
  if (s.waiting > 0) return s.online ? `${actions(s.waiting)} waiting to be sent` : `Offline — ${actions(s.waiting)} waiting`;
  if (s.allSentAt) return `All sent ${farmTime(s.allSentAt, timeZone, 'clock')}`;
  return null;
}

/** The parts of `window` the outbox needs: whether there is a connection, and word when it changes. */
export interface Connection {
  readonly navigator: { readonly onLine: boolean };
  addEventListener(type: 'online' | 'offline', listener: () => void): void;
  removeEventListener(type: 'online' | 'offline', listener: () => void): void;
}

export type Send = (jobId: number, body: OutboxEntry['body']) => Promise<SendAnswer>;

/**
 * How long to wait before sending again after a send got no answer (or the server was in trouble)
 * while the phone says it is online, in milliseconds; the last is repeated. The `online` event comes
 * once, and the first request after it often still fails (the radio, or the service worker's own
 * network, not quite up yet): without a retry the actions would wait for the next lost signal.
 * Doubling from one second to half a minute: common practice, no published source.
 */
export const RETRY_DELAYS_MS: readonly number[] = [1000, 2000, 4000, 8000, 16000, 30000];

export class OutboxSync {
  private status: OutboxStatus;
  private entries: OutboxEntry[] = [];
  private outcomes = new Map<number, OutboxOutcome>();
  private others: OutboxView['others'] = { count: 0, names: [] };
  private answered = 0;
  private chain: Promise<void> = Promise.resolve();
  private queued = false;
  private retries = 0;
  private retryTimer: ReturnType<typeof setTimeout> | null = null;
  private readonly changed = () => void this.flush();
  private readonly wentOffline = () => {
    this.status = { ...this.status, online: false };
    this.tell();
  };

  constructor(
    private readonly outbox: Outbox,
    private readonly who: Tapper,
    private readonly send: Send,
    private readonly connection: Connection,
    private readonly onChange: (view: OutboxView) => void,
    private readonly options: {
      /** Sends many actions in one request; without it, one at a time. */
      sendBatch?: SendBatch;
      retryDelaysMs?: readonly number[];
    } = {},
  ) {
    this.status = { online: connection.navigator.onLine, sending: false, waiting: 0, allSentAt: null };
  }

  /** At app start: shows what waits from an earlier visit and sends it when there is a connection. */
  async start(): Promise<void> {
    this.connection.addEventListener('online', this.changed);
    this.connection.addEventListener('offline', this.wentOffline);
    await this.reload();
    await this.flush();
  }

  stop(): void {
    this.cancelRetry();
    this.connection.removeEventListener('online', this.changed);
    this.connection.removeEventListener('offline', this.wentOffline);
  }

  /** A tap: written to the outbox with its tap time before anything is sent, then sent if it can be. */
  async tap(jobId: number, action: QueuedAction, tappedAt = new Date()): Promise<OutboxEntry> {
    const entry = await this.outbox.add(this.who, jobId, action, tappedAt);
    this.outcomes.delete(jobId);
    await this.reload();
    void this.flush();
    return entry;
  }

  /**
   * Sends what waits, one run at a time: a call queues a run after the current one (unless one is
   * already queued and not yet started: it will see the same outbox), and settles when that run is
   * over. A run that fails (the device's storage) leaves the actions waiting for the next call.
   */
  flush(): Promise<void> {
    if (this.queued) return this.chain;
    this.queued = true;
    this.chain = this.chain
      .then(() => {
        this.queued = false;
        return this.run();
      })
      .catch(() => {
        this.queued = false;
        this.status = { ...this.status, sending: false };
        this.tell();
      });
    return this.chain;
  }

  /** Settles when the runs asked for so far are over (queues none). */
  settled(): Promise<void> {
    return this.chain;
  }

  /** True while any action of this person is not yet sent (signing out then asks first). */
  hasWaiting(): boolean {
    return this.entries.length > 0;
  }

  private async run(): Promise<void> {
    this.cancelRetry();
    this.status = { ...this.status, online: this.connection.navigator.onLine };
    if (!this.status.online || !this.entries.length) return this.tell();
    this.status = { ...this.status, sending: true };
    this.tell();
    const result = await this.outbox.flush(this.who, this.send, this.options.sendBatch);
    for (const o of result.notApplied) this.outcomes.set(o.entry.jobId, o);
    if (result.sent || result.notApplied.length) this.answered++;
    await this.reload(false);
    // No answer or a server in trouble while online: try again a little later. An ended session
    // (401) waits for the person to sign in again, which starts a new sender.
    if (this.entries.length && result.stoppedBy !== null && result.stoppedBy !== 401) this.retryLater();
    else this.retries = 0;
    this.status = {
      ...this.status,
      sending: false,
      allSentAt: result.waiting === 0 && this.entries.length === 0 ? new Date() : this.status.allSentAt,
    };
    this.tell();
  }

  private retryLater(): void {
    const delays = this.options.retryDelaysMs ?? RETRY_DELAYS_MS;
    const delay = delays[Math.min(this.retries, delays.length - 1)];
    this.retries++;
    this.retryTimer = setTimeout(() => {
      this.retryTimer = null;
      void this.flush();
    }, delay);
  }

  private cancelRetry(): void {
    if (this.retryTimer !== null) clearTimeout(this.retryTimer);
    this.retryTimer = null;
  }

  private async reload(tell = true): Promise<void> {
    this.entries = await this.outbox.waiting(this.who);
    const others = await this.outbox.others(this.who);
    this.others = { count: others.length, names: [...new Set(others.map((e) => e.name))] };
    this.status = { ...this.status, waiting: this.entries.length };
    if (tell) this.tell();
  }

  private tell(): void {
    this.onChange({
      status: this.status,
      pendingJobs: new Set(this.entries.map((e) => e.jobId)),
      entries: this.entries,
      outcomes: new Map(this.outcomes),
      others: this.others,
      answered: this.answered,
    });
  }
}
