// The run sheet's outbox for the whole app: opened once, following who is signed in. Every action
// is written to the device first and sent from here, so a tap with no signal waits on the phone,
// survives a reload and goes, in tap order, when the connection returns (the `online` event, the
// app's start, and the browser's Background Sync where the service worker passes it on). It also
// keeps the run sheets the network gave, for a reload with no signal.
import { HttpClient, HttpHeaders } from '@angular/common/http';
import { Injectable, InjectionToken, computed, effect, inject, signal, untracked } from '@angular/core';
import type { Me } from '@shared/schemas/auth';
import type { OutboxAnswer, RunSheet } from '@shared/schemas/run-sheet';
import { firstValueFrom, timeout } from 'rxjs';
import { AuthStore } from '../../core/auth/auth-store';
import { ApiError } from '../../core/http/api-error';
import { API } from '../../core/http/api-paths';
import { addDays } from '../board/board-day';
import { runSheetUrl } from './run-sheet-api';
import { Outbox, type BatchAnswer, type KeptSheet, type OutboxEntry, type QueuedAction, type SendAnswer } from './outbox/outbox';
import { OutboxSync, othersLine, statusLine, type OutboxView } from './outbox/outbox-sync';

/**
 * How many days after the one shown the phone reads ahead and keeps, so a day or two of field work
 * with no signal still has its sheet (common practice, no published source).
 */
export const DAYS_KEPT_AHEAD = 3;

/** The Background Sync tag, and the message a service worker posts to the page when it fires. */
export const OUTBOX_SYNC_TAG = 'furlong-outbox';

/**
 * Asks the answer to a queued action to be short (RFC 7240 `Prefer: return=minimal`): the outbox
 * reads the day once after sending, not the whole job after every action.
 */
const MINIMAL = new HttpHeaders({ Prefer: 'return=minimal' });

/**
 * How long a send of the outbox may go unanswered before it counts as no answer, in milliseconds.
 * A weak signal can hold a request for minutes without failing it, and the actions after it wait
 * their turn; given up on, it is sent again later (OutboxSync's retries), and the server applies
 * each action once whatever the number of sends (its client event id).
 */
export const OUTBOX_SEND_WAIT_MS = new InjectionToken<number>('outbox send wait', { providedIn: 'root', factory: () => 30_000 });

interface SyncRegistration {
  sync?: { register(tag: string): Promise<void> };
}

@Injectable({ providedIn: 'root' })
export class OutboxStore {
  private readonly http = inject(HttpClient);
  private readonly auth = inject(AuthStore);
  private readonly sendWaitMs = inject(OUTBOX_SEND_WAIT_MS);
  private opened: Promise<Outbox | null> | null = null;
  /** The sender of the person signed in now; null while nobody is. */
  private current: Promise<OutboxSync | null> = Promise.resolve(null);
  private following: string | null = null;

  readonly view = signal<OutboxView | null>(null);
  /** "Offline — 3 actions waiting", "Sending…", "All sent 10:42", or null. */
  readonly line = computed(() => {
    const v = this.view();
    return v ? statusLine(v.status, this.auth.farm()?.timeZone) : null;
  });
  readonly offline = computed(() => this.view()?.status.online === false);
  /** Another person's actions waiting on this device, said in words; null when there are none. */
  readonly othersLine = computed(() => {
    const v = this.view();
    return v ? othersLine(v.others) : null;
  });
  readonly entries = computed<readonly OutboxEntry[]>(() => this.view()?.entries ?? []);
  readonly pendingJobs = computed<ReadonlySet<number>>(() => this.view()?.pendingJobs ?? new Set());
  /** Grows each time the server answered an action: the run sheet reads the day again. */
  readonly answered = computed(() => this.view()?.answered ?? 0);
  /** Set when the device's storage cannot be opened: actions are then not kept. */
  readonly storageProblem = signal<string | null>(null);

  constructor() {
    this.follow(this.auth.me());
    effect(() => {
      const me = this.auth.me();
      untracked(() => this.follow(me));
    });
    if (typeof navigator !== 'undefined')
      navigator.serviceWorker?.addEventListener('message', (e: MessageEvent) => {
        if ((e.data as { type?: string } | null)?.type === OUTBOX_SYNC_TAG) void this.current.then((s) => s?.flush());
      });
  }

  /** Writes a tap to the device, then sends it when it can; rejects only when the device cannot keep it. */
  async tap(jobId: number, action: QueuedAction, tappedAt: Date): Promise<OutboxEntry> {
    this.follow(this.auth.me());
    const sync = await this.current;
    if (!sync) throw new Error(this.storageProblem() ?? 'Sign in again to log this job.');
    const entry = await sync.tap(jobId, action, tappedAt);
    this.askBackgroundSync();
    return entry;
  }

  /** True while the signed-in person has actions not yet sent (signing out asks first). */
  hasWaiting(): boolean {
    return this.entries().length > 0;
  }

  /** Keeps a run sheet the network gave, under the signed-in person. */
  async keepSheet(address: string, sheet: RunSheet): Promise<void> {
    const key = this.sheetKey(address);
    const box = key && (await this.outbox());
    if (box) await box.keepSheet(key, sheet).catch(() => undefined);
  }

  /**
   * The person's own day as the network gave it: kept under its date too, and the days after it
   * read and kept, so they open with no signal. Stops at the first that does not come.
   */
  async keepAhead(sheet: RunSheet): Promise<void> {
    await this.keepSheet(runSheetUrl(sheet.date), sheet);
    for (let i = 1; i <= DAYS_KEPT_AHEAD; i++) {
      const address = runSheetUrl(addDays(sheet.date, i));
      try {
        await this.keepSheet(address, await firstValueFrom(this.http.get<RunSheet>(address)));
      } catch {
        return;
      }
    }
  }

  /** The signed-in person's copy of a run sheet kept on this device, if any. */
  async keptSheet(address: string): Promise<KeptSheet | undefined> {
    const key = this.sheetKey(address);
    const box = key && (await this.outbox());
    return box ? box.keptSheet(key).catch(() => undefined) : undefined;
  }

  private sheetKey(address: string): string | null {
    const me = this.auth.me();
    return me ? `${me.user.id}:${me.farm.id}:${address}` : null;
  }

  private outbox(): Promise<Outbox | null> {
    this.opened ??=
      typeof indexedDB === 'undefined'
        ? Promise.resolve(null)
        : Outbox.open().catch((err: unknown) => {
            this.storageProblem.set(`This device cannot keep actions offline (${(err as Error)?.message ?? err}); they are sent at once.`);
            return null;
          });
    return this.opened;
  }

  /** Starts the sender of whoever signed in; the one before stops, and its actions stay on the device. */
  private follow(me: Me | null): void {
    const key = me ? `${me.user.id}:${me.farm.id}` : null;
    if (key === this.following) return;
    this.following = key;
    const before = this.current;
    this.current = (async () => {
      (await before)?.stop();
      if (!me) {
        this.view.set(null);
        return null;
      }
      const box = await this.outbox();
      if (!box || this.following !== key) return null;
      const who = { userId: me.user.id, farmId: me.farm.id, name: me.user.name };
      const sync = new OutboxSync(
        box,
        who,
        (jobId, body) => this.send(jobId, body),
        window,
        (v) => {
          if (this.following === key) this.view.set(v);
        },
        { sendBatch: (entries) => this.sendBatch(entries) },
      );
      await sync.start().catch(() => undefined);
      return sync;
    })();
  }

  private async send(jobId: number, body: OutboxEntry['body']): Promise<SendAnswer> {
    const { type, ...rest } = body;
    const [url, payload] = type === 'problem' ? [API.assignmentProblems(jobId), rest] : [API.assignmentEvents(jobId), body];
    try {
      const res = await firstValueFrom(
        this.http.post(url, payload, { observe: 'response', headers: MINIMAL }).pipe(timeout(this.sendWaitMs)),
      );
      return { status: res.status, body: res.body };
    } catch (err) {
      // No answer at all: the action waits. An answer, even a refusal, is the server's word on it.
      if (!(err instanceof ApiError) || err.status === 0) throw err;
      return { status: err.status, body: { error: { code: err.code, message: err.message } } };
    }
  }

  /** The waiting actions in one request, each answered as the single route answers it. */
  private async sendBatch(entries: readonly OutboxEntry[]): Promise<BatchAnswer> {
    const events = entries.map((e) => ({ assignmentId: e.jobId, ...e.body }));
    try {
      const res = await firstValueFrom(
        this.http.post<OutboxAnswer>(API.runSheetOutbox, { events }, { observe: 'response' }).pipe(timeout(this.sendWaitMs)),
      );
      return { status: res.status, results: res.body?.results.map((r) => ({ status: r.status, body: r.body })) };
    } catch (err) {
      if (!(err instanceof ApiError) || err.status === 0) throw err;
      return { status: err.status };
    }
  }

  /** Where the browser has Background Sync, it wakes the service worker when the connection returns. */
  private askBackgroundSync(): void {
    const sw = typeof navigator === 'undefined' ? undefined : navigator.serviceWorker;
    if (!sw?.controller) return;
    sw.ready.then((reg) => (reg as unknown as SyncRegistration).sync?.register(OUTBOX_SYNC_TAG)).catch(() => undefined);
  }
}
