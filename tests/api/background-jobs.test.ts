// Mail runs on the pg-boss job queue: a job exists exactly when the change that caused it
// commits, a message that keeps failing ends in pg-boss's failed state (the dead letters), and
// the owner sees those for their farm only and can try each again.
import net from 'node:net';
import { JOB_SCHEMA } from '../../server/background/queue';
import { MailWorker } from '../../server/mail/mail-worker';
import { enqueueMail } from '../../server/mail/outbox.repository';
import { createTransport } from '../../server/mail/transport';
import type { FailedJob } from '../../shared/schemas/background';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { signedIn, startTestApp, type Client, type TestApp } from '../support/test-app';

async function closedPort(): Promise<number> {
  const s = net.createServer().listen(0, '127.0.0.1');
  await new Promise((r) => s.once('listening', r));
  const port = (s.address() as net.AddressInfo).port;
  await new Promise((r) => s.close(r));
  return port;
}

describe('background jobs', () => {
  let t: TestApp;
  let farm: TestFarm;
  let other: TestFarm;
  let owner: Client;
  let otherOwner: Client;
  const jobsOf = async (mailId: number) =>
    (await t.db.raw(`SELECT id::text, state FROM ${JOB_SCHEMA}.job WHERE name = 'mail' AND (data->>'mailId')::int = ?`, [mailId])).rows as {
      id: string;
      state: string;
    }[];

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Jobs');
    other = await makeFarm(t.db, 'Other Jobs');
    owner = await signedIn(t.app, farm.owner.email, farm.owner.password);
    otherOwner = await signedIn(t.app, other.owner.email, other.owner.password);
  });
  afterAll(() => t.close());

  it('when the change that queues a mail rolls back, then neither the mail nor its job exists', async () => {
    let mailId = 0;
    await expect(
      t.db.transaction(async (tx) => {
        mailId = await enqueueMail(tx, { farmId: farm.id, kind: 'invite', to: 'rolled.back@furlong.test', subject: 'x', text: 'y' });
        throw new Error('the change failed');
      }),
    ).rejects.toThrow('the change failed');
    expect(mailId).toBeGreaterThan(0);
    expect(await t.db('mail_outbox').where({ id: mailId }).first()).toBeUndefined();
    expect(await jobsOf(mailId)).toEqual([]);
  });

  it('when a mail fails for good, then its owner sees it in the failed list (no other farm does) and can send it again once', async () => {
    const to = `dead.letter.${farm.id}@furlong.test`;
    const invited = await owner.post('/api/members/invite', { email: to, name: 'Dead Letter', role: 'viewer' });
    expect(invited.status).toBe(201);
    const mail = await t.db('mail_outbox').where({ to_address: to }).first();
    expect(await jobsOf(mail.id)).toEqual([expect.objectContaining({ state: 'created' })]);

    // A mail server nobody answers on, and a worker that gives up after one attempt.
    const refusing = new MailWorker(t.db, createTransport(null, await closedPort()), { from: t.config.mailFrom, maxAttempts: 1 });
    await refusing.drain();
    expect(await t.db('mail_outbox').where({ id: mail.id }).first()).toMatchObject({ status: 'failed', attempts: 1 });
    expect(await jobsOf(mail.id)).toEqual([expect.objectContaining({ state: 'failed' })]);

    const list = await owner.get('/api/background/failed');
    expect(list.status).toBe(200);
    const entry = (list.body.jobs as FailedJob[]).find((j) => j.to === to);
    expect(entry).toMatchObject({ queue: 'mail', what: 'Invitation e-mail', attempts: 1, subject: mail.subject });
    expect(entry!.error).toMatch(/ECONNREFUSED|connect/i);
    expect(((await otherOwner.get('/api/background/failed')).body.jobs as FailedJob[]).map((j) => j.id)).not.toContain(entry!.id);
    expect((await otherOwner.post(`/api/background/failed/${entry!.id}/retry`)).status).toBe(404);

    expect((await owner.post(`/api/background/failed/${entry!.id}/retry`)).status).toBe(204);
    expect(await t.db('mail_outbox').where({ id: mail.id }).first()).toMatchObject({ status: 'queued' });
    await t.flushMail();
    expect(t.mail.to(to)).toHaveLength(1);
    expect(await t.db('mail_outbox').where({ id: mail.id }).first()).toMatchObject({ status: 'sent', attempts: 2 });
    expect(((await owner.get('/api/background/failed')).body.jobs as FailedJob[]).map((j) => j.id)).not.toContain(entry!.id);
    // Retried already: a second click finds nothing to retry, and nothing is sent twice.
    expect((await owner.post(`/api/background/failed/${entry!.id}/retry`)).status).toBe(404);
    await t.flushMail();
    expect(t.mail.to(to)).toHaveLength(1);
  });

  it('when the job id is not a job id, then the answer is 400 naming it', async () => {
    const res = await owner.post('/api/background/failed/not-a-job/retry');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/not a job id/);
  });
});
