// Background work (mail today; forecast refreshes and payment events next) runs on pg-boss, a job
// queue kept in PostgreSQL (schema `pgboss`). A job is written in the same transaction as the
// change that causes it, so a rolled-back change leaves no job and a committed one cannot lose
// its job. Its retries, back-off, cap and the failed ("dead letter") state are pg-boss's own.
import type { Knex } from 'knex';
import PgBoss from 'pg-boss';
import type { Db, Tx } from '../db/knex';

export const JOB_SCHEMA = 'pgboss';

/** Every queue Furlong uses, with what its jobs carry. */
export interface JobData {
  /** One e-mail of `mail_outbox` to send. */
  mail: { mailId: number; farmId: number | null; kind: string };
  /**
   * Refresh the forecasts of one farm's points that are due (server/weather/weather-worker.ts).
   * Not `farmId`: the owner's failed-jobs list reads that key for mail; a forecast that cannot be
   * had shows as stale weather instead.
   */
  weather: { farm: number };
}
export type QueueName = keyof JobData;

/**
 * Retry policy per queue. Mail: 10 attempts, the delay doubling from 5 s (with pg-boss's jitter)
 * to a few hours in all; a job active for longer than `expireInSeconds` is taken to have lost its
 * worker and is tried again (longer than a send can take: the transport's 10 + 10 + 30 s timeouts).
 * Failed jobs are kept 30 days so the owner can see and retry them.
 */
export const QUEUE_POLICY: Record<QueueName, PgBoss.Queue> = {
  mail: {
    name: 'mail',
    retryLimit: 9,
    retryDelay: 5,
    retryBackoff: true,
    expireInSeconds: 120,
    retentionDays: 30,
  },
  // Weather: the service's own failures are handled by the worker (the forecast is marked stale
  // and tried again next round); only a database failure fails the job, tried twice more.
  weather: {
    name: 'weather',
    retryLimit: 2,
    retryDelay: 30,
    retryBackoff: true,
    expireInSeconds: 300,
    retentionDays: 1,
  },
};

/** Short waits for tests: every retry is due a second later, and the cap stays the same. */
export const TEST_RETRY = { retryDelay: 1, retryBackoff: false } as const;

/**
 * pg-boss talking through one of our knex connections or transactions. Its SQL numbers its
 * parameters ($1 …); knex binds `?`, so each `$n` becomes `?` with the n-th value (pg-boss's SQL
 * holds no `?` of its own).
 */
export function sqlOn(db: Tx): PgBoss.Db {
  return {
    executeSql: async (text: string, values: unknown[] = []) => {
      const bindings: unknown[] = [];
      const sql = text.replace(/\$(\d+)/g, (_m, n: string) => {
        bindings.push(values[Number(n) - 1] ?? null);
        return '?';
      });
      const result = (await db.raw(sql, bindings as readonly Knex.RawBinding[])) as { rows?: unknown[] } | { rows?: unknown[] }[];
      // A multi-statement text answers with one result per statement; pg-boss reads the last.
      const last = Array.isArray(result) ? result[result.length - 1] : result;
      return { rows: last?.rows ?? [] };
    },
  };
}

/** pg-boss on our own pool: the web processes use it to read, retry and enqueue, never to work. */
export function jobQueue(db: Db): PgBoss {
  return new PgBoss({ db: sqlOn(db), schema: JOB_SCHEMA, supervise: false, schedule: false, migrate: false });
}

let sender: PgBoss | null = null;

/**
 * Puts a job in its queue inside `tx`: it exists only if `tx` commits. Returns the job's id.
 * pg-boss's insert answers nothing when the queue is missing; that is a set-up fault, said so.
 */
export async function enqueue<Q extends QueueName>(tx: Tx, queue: Q, data: JobData[Q]): Promise<string> {
  // Sending needs pg-boss's SQL, not a connection of its own: every send names its `db`.
  sender ??= new PgBoss({
    db: { executeSql: () => Promise.reject(new Error('no connection')) },
    schema: JOB_SCHEMA,
    supervise: false,
    schedule: false,
    migrate: false,
  });
  const id = await sender.send(queue, data as object, { db: sqlOn(tx) });
  if (!id) throw new Error(`the background queue "${queue}" does not exist: run the database set-up (npm start does)`);
  return id;
}

/**
 * Creates or updates pg-boss's schema and Furlong's queues (`npm start` and `npm test` run this
 * with the migrations). `policy` overrides the retry timing, for tests.
 */
export async function prepareQueues(databaseUrl: string, policy: Partial<PgBoss.Queue> = {}): Promise<void> {
  const boss = new PgBoss({ connectionString: databaseUrl, schema: JOB_SCHEMA, max: 2, supervise: false, schedule: false });
  boss.on('error', () => undefined); // start() below rejects with the same error
  await boss.start();
  try {
    for (const q of Object.values(QUEUE_POLICY)) {
      const wanted = { ...q, ...policy, name: q.name };
      if (await boss.getQueue(q.name)) await boss.updateQueue(q.name, wanted);
      else await boss.createQueue(q.name, wanted);
    }
  } finally {
    await boss.stop({ graceful: false, wait: true });
  }
}
