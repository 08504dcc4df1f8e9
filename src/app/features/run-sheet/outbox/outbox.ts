// The phone's outbox: every run-sheet action is written here first, with an id made on the device
// and the time it was tapped, then sent. It lives in IndexedDB, so it survives a reload, a closed
// browser and an expired session; it is sent in tap order, many actions to a request, under the
// person who tapped it only (the same user on the same farm). The server records each id once, so sending an
// action twice is harmless. The same database keeps the person's run sheets as last read, so a
// reload with no signal still shows the day.
import { OUTBOX_BATCH_MAX } from '@shared/limits';
import type { EventInput, ProblemInput, RunSheet } from '@shared/schemas/run-sheet';
import { openDB, type DBSchema, type IDBPDatabase } from 'idb';

/** A logged step (start, pause, resume, finish, call off) or a problem report, without its id and tap time. */
export type QueuedAction = Omit<EventInput, 'clientEventId' | 'at'> | ({ type: 'problem' } & ProblemInput);

/** Who tapped: sent only while the same user is signed in on the same farm. */
export interface Tapper {
  userId: number;
  farmId: number;
  /** Their name, for the line that tells another person signed in on this phone that these wait. */
  name: string;
}

export interface OutboxEntry {
  clientEventId: string;
  /** Order of writing (the tap order on this device). */
  seq: number;
  userId: number;
  farmId: number;
  name: string;
  jobId: number;
  /** What is sent: the action with its id and tap time. */
  body: QueuedAction & { clientEventId: string; at: string };
}

/** What the server said of an action that could not be applied (kept as a log there). */
export interface OutboxOutcome {
  entry: OutboxEntry;
  status: number;
  code: string | null;
  message: string;
}

export interface FlushResult {
  sent: number;
  notApplied: OutboxOutcome[];
  /** The person's actions still waiting (a send got no answer, the server was in trouble, or the session ended). */
  waiting: number;
  /** Why the run stopped with actions waiting: the status answered (0 for no answer at all); null when none wait. */
  stoppedBy: number | null;
}

/** One answer from the server; a send that never got one throws. */
export interface SendAnswer {
  status: number;
  body: unknown;
}

/**
 * The answer to a batch of actions: 200 with one answer per action, in the order sent; any other
 * status is the batch's own (a session ended, a server in trouble). A batch that got no answer throws.
 */
export interface BatchAnswer {
  status: number;
  results?: SendAnswer[];
}

export type SendOne = (jobId: number, body: OutboxEntry['body']) => Promise<SendAnswer>;
export type SendBatch = (entries: readonly OutboxEntry[]) => Promise<BatchAnswer>;

/** A run sheet as the network last gave it, kept on the device. */
export interface KeptSheet {
  /** `userId:farmId:address`: one person's copy of one address (a day, or the day the server picks). */
  key: string;
  sheet: RunSheet;
  savedAt: string;
}

interface OutboxDb extends DBSchema {
  actions: { key: string; value: OutboxEntry; indexes: { seq: number } };
  sheets: { key: string; value: KeptSheet };
}

/**
 * Statuses that say "try again later": no answer, a timeout, the server in trouble, and a session
 * that ended (the actions wait until the same person signs in again).
 */
const retryLater = (status: number) => status === 0 || status === 401 || status === 408 || status === 429 || status >= 500;

const mine = (e: OutboxEntry, who: Pick<Tapper, 'userId' | 'farmId'>) => e.userId === who.userId && e.farmId === who.farmId;

export class Outbox {
  private constructor(private readonly db: IDBPDatabase<OutboxDb>) {}

  static async open(name = 'furlong-outbox'): Promise<Outbox> {
    const db = await openDB<OutboxDb>(name, 2, {
      upgrade(d, oldVersion) {
        if (oldVersion < 1) d.createObjectStore('actions', { keyPath: 'clientEventId' }).createIndex('seq', 'seq');
        if (oldVersion < 2) d.createObjectStore('sheets', { keyPath: 'key' });
      },
    });
    return new Outbox(db);
  }

  close(): void {
    this.db.close();
  }

  /** Writes a tapped action to the outbox (before anything is sent) and returns it. */
  async add(who: Tapper, jobId: number, action: QueuedAction, tappedAt = new Date()): Promise<OutboxEntry> {
    const tx = this.db.transaction('actions', 'readwrite');
    const last = await tx.store.index('seq').openCursor(null, 'prev');
    const clientEventId = crypto.randomUUID();
    const entry: OutboxEntry = {
      clientEventId,
      seq: (last?.value.seq ?? 0) + 1,
      userId: who.userId,
      farmId: who.farmId,
      name: who.name,
      jobId,
      body: { ...action, clientEventId, at: tappedAt.toISOString() },
    };
    await tx.store.add(entry);
    await tx.done;
    return entry;
  }

  /** The person's actions waiting to be sent, in tap order. */
  async waiting(who: Pick<Tapper, 'userId' | 'farmId'>): Promise<OutboxEntry[]> {
    return (await this.db.getAllFromIndex('actions', 'seq')).filter((e) => mine(e, who));
  }

  /** Actions other people tapped on this device, waiting for them to sign in again. */
  async others(who: Pick<Tapper, 'userId' | 'farmId'>): Promise<OutboxEntry[]> {
    return (await this.db.getAllFromIndex('actions', 'seq')).filter((e) => !mine(e, who));
  }

  /**
   * Sends the person's waiting actions in tap order: `batchSize` to a request when `sendBatch` is
   * given, else one at a time. An answer (applied, or a refusal the server kept as a log) takes
   * the action out; no answer or a server in trouble stops the run, and the rest waits for the
   * next try. A batch the server will not take as a batch at all (a 4xx of its own other than an
   * ended session) is sent again one action at a time, so no action waits on it for ever.
   */
  async flush(
    who: Pick<Tapper, 'userId' | 'farmId'>,
    send: SendOne,
    sendBatch?: SendBatch,
    batchSize = OUTBOX_BATCH_MAX,
  ): Promise<FlushResult> {
    const result: FlushResult = { sent: 0, notApplied: [], waiting: 0, stoppedBy: null };
    const queue = await this.waiting(who);
    let i = 0;
    const stop = (status: number) => ({ ...result, waiting: queue.length - i, stoppedBy: status });
    while (i < queue.length) {
      const chunk = queue.slice(i, sendBatch ? i + batchSize : i + 1);
      let answers: SendAnswer[];
      try {
        answers = sendBatch ? await this.sendAll(chunk, send, sendBatch) : [await send(chunk[0].jobId, chunk[0].body)];
      } catch {
        return stop(0);
      }
      // Answers in order; the first "try again later" stops the run there.
      const stopAt = answers.findIndex((a) => retryLater(a.status));
      const answered = stopAt === -1 ? answers.length : stopAt;
      await this.settle(chunk.slice(0, answered), answers, result);
      i += answered;
      if (stopAt !== -1) return stop(answers[stopAt].status);
    }
    return result;
  }

  /** One request for the chunk; one at a time when the server refuses the batch as a whole. */
  private async sendAll(chunk: OutboxEntry[], send: SendOne, sendBatch: SendBatch): Promise<SendAnswer[]> {
    const batch = await sendBatch(chunk);
    if (batch.status === 200 && batch.results?.length === chunk.length) return batch.results;
    if (retryLater(batch.status)) return [{ status: batch.status, body: null }];
    const answers: SendAnswer[] = [];
    for (const entry of chunk) {
      const answer = await send(entry.jobId, entry.body);
      answers.push(answer);
      if (retryLater(answer.status)) break;
    }
    return answers;
  }

  /** Takes the answered actions out (one storage transaction) and notes what was refused. */
  private async settle(entries: OutboxEntry[], answers: SendAnswer[], result: FlushResult): Promise<void> {
    if (!entries.length) return;
    const tx = this.db.transaction('actions', 'readwrite');
    await Promise.all([...entries.map((e) => tx.store.delete(e.clientEventId)), tx.done]);
    entries.forEach((entry, k) => {
      const answer = answers[k];
      if (answer.status < 300) result.sent++;
      else {
        const error = (answer.body as { error?: { code?: string; message?: string } } | null)?.error;
        result.notApplied.push({
          entry,
          status: answer.status,
          code: error?.code ?? null,
          message: error?.message ?? `Refused (${answer.status})`,
        });
      }
    });
  }

  /** Keeps a run sheet as the network gave it (the newest copy replaces the last). */
  async keepSheet(key: string, sheet: RunSheet, savedAt = new Date()): Promise<void> {
    await this.db.put('sheets', { key, sheet, savedAt: savedAt.toISOString() });
  }

  /** The run sheet kept for an address, or undefined when it was never read on this device. */
  keptSheet(key: string): Promise<KeptSheet | undefined> {
    return this.db.get('sheets', key);
  }
}
