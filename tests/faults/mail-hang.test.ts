// A mail server that accepts connections and then never answers: the mail worker gives up on
// the attempt after its timeouts, holds no database transaction or lock while it waits, and the
// message is delivered once, later, by a mail server that works. The jobs are pg-boss's, in the
// fault cluster's database (prepared with retries due a second later).
import net from 'node:net';
import { createDb, type Db } from '../../server/db/knex';
import { FakeMailServer } from '../../server/mail/fake-smtp';
import PgBoss from 'pg-boss';
import { jobQueue, JOB_SCHEMA } from '../../server/background/queue';
import { MailWorker } from '../../server/mail/mail-worker';
import { enqueueMail } from '../../server/mail/outbox.repository';
import { createTransport } from '../../server/mail/transport';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { faultCluster, freePort, isPostgresRunning, sleep, startPostgres } from './support/fault-cluster';

const SHORT = { connectionTimeout: 1500, greetingTimeout: 1500, socketTimeout: 1500 };

describe('the mail server hangs', () => {
  const cluster = faultCluster();
  let db: Db;
  let farm: TestFarm;
  let silent: net.Server;
  let silentPort: number;
  let accepted = 0;
  const sockets = new Set<net.Socket>();
  const tag = Date.now().toString(36);

  beforeAll(async () => {
    if (!isPostgresRunning(cluster)) startPostgres(cluster);
    db = createDb(cluster.url, { min: 0, max: 4 });
    farm = await makeFarm(db, 'Mail');
    // Accepts every connection and never says a word (no SMTP greeting).
    silent = net.createServer((s) => {
      accepted++;
      sockets.add(s);
      s.on('close', () => sockets.delete(s));
    });
    await new Promise<void>((resolve) => silent.listen(0, '127.0.0.1', resolve));
    silentPort = (silent.address() as net.AddressInfo).port;
  });

  afterAll(async () => {
    for (const s of sockets) s.destroy();
    await new Promise((resolve) => silent.close(resolve));
    await db.destroy();
  });

  // Each worker here sends whatever is due in this database: mail other fault tests left queued
  // is set aside, so the counts below are this file's own.
  beforeEach(async () => {
    await db('mail_outbox').where({ status: 'queued' }).update({ status: 'failed', last_error: 'set aside by the mail fault tests' });
    await db.raw(`UPDATE ${JOB_SCHEMA}.job SET state = 'cancelled' WHERE name = 'mail' AND state < 'completed'`);
  });

  const queue = (to: string) =>
    enqueueMail(db, { farmId: farm.id, kind: 'invite', to, subject: `Fault test ${to}`, text: 'You are invited to Mail Farm on Furlong.' });
  const row = (id: number) => db('mail_outbox').where({ id }).first();
  const jobOf = async (mailId: number) =>
    (await db.raw(`SELECT id::text, state FROM ${JOB_SCHEMA}.job WHERE name = 'mail' AND (data->>'mailId')::int = ?`, [mailId]))
      .rows[0] as {
      id: string;
      state: string;
    };
  /** Sessions of this database sitting in an open transaction, and locks anyone holds on the outbox. */
  const openTransactions = async () =>
    Number(
      (await db.raw(`SELECT count(*) AS n FROM pg_stat_activity WHERE datname = current_database() AND state LIKE 'idle in transaction%'`))
        .rows[0].n,
    );
  const outboxLocks = async () =>
    Number(
      (
        await db.raw(
          `SELECT count(*) AS n FROM pg_locks l JOIN pg_class c ON c.oid = l.relation WHERE c.relname = 'mail_outbox' AND l.pid <> pg_backend_pid()`,
        )
      ).rows[0].n,
    );

  it('when the mail server never answers, then the attempt times out with no transaction open meanwhile, and a working server later gets the message exactly once', async () => {
    const to = `hang.${tag}@furlong.test`;
    const id = await queue(to);
    const hanging = new MailWorker(db, createTransport(null, silentPort, SHORT), { from: 'Furlong <furlong@localhost>' });
    const before = accepted;
    const started = Date.now();
    const run = hanging.drain();
    try {
      // The worker is connected and waiting for a greeting that never comes.
      while (accepted === before && Date.now() - started < 1000) await sleep(20);
      expect(accepted).toBeGreaterThan(before);
      await sleep(300);
      expect(await openTransactions()).toBe(0);
      expect(await outboxLocks()).toBe(0);
      // pg-boss holds the job active: a second worker is given nothing meanwhile.
      expect(await jobQueue(db).fetch('mail')).toEqual([]);
      expect((await jobOf(id)).state).toBe('active');
    } finally {
      await run.catch(() => undefined);
    }
    expect(await run).toBe(0);
    expect(Date.now() - started).toBeGreaterThanOrEqual(1000);
    const failed = await row(id);
    expect(failed).toMatchObject({ status: 'queued', attempts: 1 });
    expect(failed.last_error).toMatch(/Greeting never received|timeout/i);

    const mail = new FakeMailServer();
    const port = await mail.start(await freePort());
    try {
      const working = new MailWorker(db, createTransport(null, port, SHORT), { from: 'Furlong <furlong@localhost>' });
      await sleep(1100); // the retry delay (a second in tests)
      await working.drain();
      await working.drain();
      expect(mail.to(to)).toHaveLength(1);
      expect(await row(id)).toMatchObject({ status: 'sent', attempts: 2, last_error: null });
    } finally {
      await mail.stop();
    }
  });

  it('when a worker died while sending, then the message is sent again once pg-boss expires its job, and only once', async () => {
    const to = `lease.${tag}@furlong.test`;
    const id = await queue(to);
    // A worker takes the job and then "dies" (never sends, never reports). Its time to run is cut
    // to 1 s so pg-boss's upkeep finds it expired at once.
    const [taken] = await jobQueue(db).fetch('mail');
    expect(taken.id).toBe((await jobOf(id)).id);
    await db.raw(`UPDATE ${JOB_SCHEMA}.job SET expire_in = interval '1 second' WHERE name = 'mail' AND id = ?::uuid`, [taken.id]);
    const upkeep = new PgBoss({
      connectionString: cluster.url,
      schema: JOB_SCHEMA,
      migrate: false,
      schedule: false,
      maintenanceIntervalSeconds: 1,
    });
    upkeep.on('error', () => undefined);
    const mail = new FakeMailServer();
    const port = await mail.start(0);
    try {
      const worker = new MailWorker(db, createTransport(null, port, SHORT), { from: 'Furlong <furlong@localhost>' });
      await worker.drain();
      expect(mail.to(to)).toHaveLength(0);
      await upkeep.start();
      for (let i = 0; i < 40 && mail.to(to).length === 0; i++) {
        await sleep(250);
        await worker.drain();
      }
      await worker.drain();
      expect(mail.to(to)).toHaveLength(1);
      expect(await row(id)).toMatchObject({ status: 'sent', attempts: 2 });
    } finally {
      await upkeep.stop({ graceful: false, wait: true });
      await mail.stop();
    }
  });

  it('when every attempt fails, then after the last allowed attempt the message is marked failed with its last error', async () => {
    const to = `cap.${tag}@furlong.test`;
    const id = await queue(to);
    const closedPort = await freePort(); // nobody listens: each attempt is refused at once
    const worker = new MailWorker(db, createTransport(null, closedPort, SHORT), { from: 'Furlong <furlong@localhost>', maxAttempts: 3 });
    for (let i = 0; i < 3; i++) {
      await worker.drain();
      await sleep(1100); // the retry delay (a second in tests)
    }
    const r = await row(id);
    expect(r).toMatchObject({ status: 'failed', attempts: 3 });
    expect(r.last_error).toMatch(/ECONNREFUSED.*gave up after 3 attempts/s);
    // The job is in pg-boss's failed state: the owner's "Mail and background jobs" list shows it.
    expect((await jobOf(id)).state).toBe('failed');
    await worker.drain();
    expect((await row(id)).attempts).toBe(3);
  });
});
