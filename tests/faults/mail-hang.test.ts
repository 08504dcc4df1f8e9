// A mail server that accepts connections and then never answers: the outbox worker gives up on
// the attempt after its timeouts, holds no database transaction or lock while it waits, and the
// message is delivered once, later, by a mail server that works.
import net from 'node:net';
import { createDb, type Db } from '../../server/db/knex';
import { FakeMailServer } from '../../server/mail/fake-smtp';
import { OutboxWorker } from '../../server/mail/outbox-worker';
import { claimNext, enqueueMail } from '../../server/mail/outbox.repository';
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
  beforeEach(() =>
    db('mail_outbox').where({ status: 'queued' }).update({ status: 'failed', last_error: 'set aside by the mail fault tests' }),
  );

  const queue = (to: string) =>
    enqueueMail(db, { farmId: farm.id, kind: 'invite', to, subject: `Fault test ${to}`, text: 'You are invited to Mail Farm on Furlong.' });
  const row = (id: number) => db('mail_outbox').where({ id }).first();
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
    const hanging = new OutboxWorker(db, createTransport(null, silentPort, SHORT), {
      from: 'Furlong <furlong@localhost>',
      baseDelayMs: 50,
      maxDelayMs: 200,
    });
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
      // Its lease keeps the message from a second sender meanwhile.
      expect(await claimNext(db, id - 1, 1000)).toBeUndefined();
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
      const working = new OutboxWorker(db, createTransport(null, port, SHORT), {
        from: 'Furlong <furlong@localhost>',
        baseDelayMs: 50,
        maxDelayMs: 200,
      });
      await sleep(100); // the 50 ms retry delay
      await working.drain();
      await working.drain();
      expect(mail.to(to)).toHaveLength(1);
      expect(await row(id)).toMatchObject({ status: 'sent', attempts: 2, last_error: null });
    } finally {
      await mail.stop();
    }
  });

  it('when a worker died while sending, then the message is sent again once its lease runs out, and only once', async () => {
    const to = `lease.${tag}@furlong.test`;
    const id = await queue(to);
    // A sender claims it for 700 ms and then "dies" (never sends, never marks it).
    expect((await claimNext(db, id - 1, 700))?.id).toBe(id);
    const mail = new FakeMailServer();
    const port = await mail.start(0);
    try {
      const worker = new OutboxWorker(db, createTransport(null, port, SHORT), { from: 'Furlong <furlong@localhost>' });
      await worker.drain();
      expect(mail.to(to)).toHaveLength(0);
      await sleep(900);
      await worker.drain();
      await worker.drain();
      expect(mail.to(to)).toHaveLength(1);
      expect(await row(id)).toMatchObject({ status: 'sent', attempts: 2 });
    } finally {
      await mail.stop();
    }
  });

  it('when every attempt fails, then after the last allowed attempt the message is marked failed with its last error', async () => {
    const to = `cap.${tag}@furlong.test`;
    const id = await queue(to);
    const closedPort = await freePort(); // nobody listens: each attempt is refused at once
    const worker = new OutboxWorker(db, createTransport(null, closedPort, SHORT), {
      from: 'Furlong <furlong@localhost>',
      baseDelayMs: 20,
      maxDelayMs: 20,
      maxAttempts: 3,
    });
    for (let i = 0; i < 3; i++) {
      await worker.drain();
      await sleep(60);
    }
    const r = await row(id);
    expect(r).toMatchObject({ status: 'failed', attempts: 3 });
    expect(r.last_error).toMatch(/ECONNREFUSED.*gave up after 3 attempts/s);
    await worker.drain();
    expect((await row(id)).attempts).toBe(3);
  });
});
