// Structured logs: one JSON line per request with its route pattern and request id, the id sent
// back on every answer and in every error body, and nothing secret in any line.
import net from 'node:net';
import express from 'express';
import request from 'supertest';
import { errorHandler } from '../../server/http/errors';
import { requestLogger } from '../../server/logging/request-log';
import { MailWorker } from '../../server/mail/mail-worker';
import { enqueueMail } from '../../server/mail/outbox.repository';
import { createLogger } from '../../server/logging/logger';
import { createTransport } from '../../server/mail/transport';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { Client, cookieValue, startTestApp, type TestApp } from '../support/test-app';

// RFC 9562 section 4 (the UUID string form), version 4 (crypto.randomUUID).
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/;

/** A pino destination that keeps every line written to it. */
function captureLines() {
  const lines: string[] = [];
  return { lines, stream: { write: (line: string) => void lines.push(line) } };
}

/** The parsed lines that carry `requestId`; waits a little: a request's line is written when its answer finishes. */
async function linesOf(lines: string[], requestId: string, count = 1): Promise<Array<Record<string, unknown>>> {
  const deadline = Date.now() + 2000;
  for (;;) {
    const found = lines.map((l) => JSON.parse(l) as Record<string, unknown>).filter((l) => l.requestId === requestId);
    if (found.length >= count || Date.now() > deadline) return found;
    await new Promise((r) => setTimeout(r, 10));
  }
}

describe('request ids and request log lines', () => {
  let t: TestApp;
  let farm: TestFarm;
  const log = captureLines();
  beforeAll(async () => {
    t = await startTestApp({ LOG_LEVEL: 'info' }, { logTo: log.stream });
    farm = await makeFarm(t.db, 'Logging');
  });
  afterAll(() => t.close());

  it('when a request comes without an id, then the answer carries a new one (a UUID)', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.headers['x-request-id']).toMatch(UUID);
  });

  it('when a request brings a sane X-Request-Id, then the same id comes back', async () => {
    const res = await request(t.app).get('/api/health').set('X-Request-Id', 'edge-proxy.7f3A_91');
    expect(res.headers['x-request-id']).toBe('edge-proxy.7f3A_91');
  });

  it.each([
    ['spaces', 'id with spaces'],
    ['a quote and braces', '{"level":60}'],
    ['101 characters', 'a'.repeat(101)],
  ])('when the incoming id holds %s, then it is replaced by a new one', async (_what, given) => {
    const res = await request(t.app).get('/api/health').set('X-Request-Id', given);
    expect(res.headers['x-request-id']).toMatch(UUID);
  });

  it('when a request fails, then its error body names the same request id as its header', async () => {
    const signedOut = await request(t.app).get('/api/fields/123');
    expect(signedOut.status).toBe(401);
    expect(signedOut.body.error.requestId).toBe(signedOut.headers['x-request-id']);

    const noApi = await request(t.app).get('/api/no-such-thing').set('X-Request-Id', 'probe-404');
    expect(noApi.status).toBe(404);
    expect(noApi.body.error).toMatchObject({ code: 'not_found', requestId: 'probe-404' });
  });

  it('when a signed-in member reads a field, then one line holds method, route pattern, status, time, request id, member and farm, and no secret', async () => {
    const member = new Client(t.app);
    const signIn = await member.signIn(farm.owner.email, farm.owner.password);
    const sessionCookie = cookieValue(signIn.headers['set-cookie'], 'furlong.sid');
    expect(sessionCookie).toBeTruthy();
    expect(member.xsrf).toBeTruthy();

    const res = await member.get('/api/fields/123?token=QUERY-SECRET-4471').set('X-Request-Id', 'read-field-1');
    const [line, extra] = await linesOf(log.lines, 'read-field-1');
    expect(extra).toBeUndefined();
    expect(line).toMatchObject({
      requestId: 'read-field-1',
      method: 'GET',
      route: '/api/fields/:id',
      status: res.status,
      userId: farm.owner.id,
      farmId: farm.id,
      level: 30,
    });
    expect(typeof line.responseTime).toBe('number');

    // Nothing secret anywhere in the log so far (sign-in included): the password, the session
    // cookie, the XSRF token, the query string, the e-mail address.
    const all = log.lines.join('');
    for (const secret of [
      farm.owner.password,
      sessionCookie!,
      encodeURIComponent(sessionCookie!),
      member.xsrf,
      'QUERY-SECRET-4471',
      farm.owner.email,
    ]) {
      expect(all).not.toContain(secret);
    }
  });

  it('when someone signs in, then the sign-in line has its route and status but not the body, cookie or XSRF token', async () => {
    const c = new Client(t.app);
    await c.prime();
    const xsrf = c.xsrf;
    const res = await c.agent
      .post('/api/auth/login')
      .set('X-XSRF-TOKEN', xsrf)
      .set('X-Request-Id', 'sign-in-1')
      .send({ email: farm.operator.email, password: farm.operator.password });
    expect(res.status).toBe(200);
    const [line] = await linesOf(log.lines, 'sign-in-1');
    expect(line).toMatchObject({ method: 'POST', route: '/api/auth/login', status: 200, userId: farm.operator.id, farmId: farm.id });
    const text = JSON.stringify(line);
    expect(text).not.toContain(farm.operator.password);
    expect(text).not.toContain(xsrf);
    expect(text).not.toContain(farm.operator.email);
    expect(text).not.toContain(cookieValue(res.headers['set-cookie'], 'furlong.sid')!);
  });

  it('when a request gets a 404 from no route, then its line has no route and no path', async () => {
    const res = await request(t.app).get('/api/nothing-here/QUERYLESS-PATH-9?x=1').set('X-Request-Id', 'no-route-1');
    expect(res.status).toBe(404);
    const [line] = await linesOf(log.lines, 'no-route-1');
    expect(line).toMatchObject({ method: 'GET', status: 404 });
    expect(line.route).toBeUndefined();
  });
});

describe('failures in the log', () => {
  it('when a handler fails, then the error line carries the request id and the log callback still gets exactly the failure', async () => {
    const log = captureLines();
    const told: unknown[] = [];
    const app = express();
    app.use(requestLogger(createLogger({ env: 'test', logLevel: 'info' }, log.stream)));
    app.get('/api/boom/:id', () => {
      throw new Error('the handler broke');
    });
    app.use(errorHandler((f) => told.push(f)));

    const res = await request(app).get('/api/boom/8?token=QUERY-SECRET-8').set('X-Request-Id', 'boom-1');
    expect(res.status).toBe(500);
    expect(res.body.error).toMatchObject({ code: 'internal', requestId: 'boom-1' });
    const lines = await linesOf(log.lines, 'boom-1', 2);
    expect(lines).toEqual([
      expect.objectContaining({
        level: 50,
        msg: 'request failed',
        code: 'internal',
        message: 'the handler broke',
        route: 'GET /api/boom/8',
      }),
      expect.objectContaining({ level: 50, method: 'GET', route: '/api/boom/:id', status: 500 }),
    ]);
    expect(told).toEqual([{ code: 'internal', message: 'the handler broke', route: 'GET /api/boom/8', stack: expect.any(String) }]);
    expect(log.lines.join('')).not.toContain('QUERY-SECRET-8');
  });
});

describe('mail worker log lines', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp();
  });
  afterAll(() => t.close());

  async function queueMail(to: string): Promise<number> {
    return t.db.transaction((tx) =>
      enqueueMail(tx, { farmId: null, kind: 'invite', to, subject: 'Join the farm', text: 'BODY-SECRET-5521' }),
    );
  }

  it('when a message is sent, then one line says sent with its id, kind and attempt, and not its address or body', async () => {
    const log = captureLines();
    const id = await queueMail('sent-target@furlong.test');
    const worker = new MailWorker(t.db, createTransport(null, t.mail.port), {
      from: t.config.mailFrom,
      logger: createLogger({ env: 'test', logLevel: 'info' }, log.stream),
    });
    await worker.drain();
    const lines = log.lines.map((l) => JSON.parse(l) as Record<string, unknown>).filter((l) => l.mailId === id);
    expect(lines).toEqual([expect.objectContaining({ mailId: id, kind: 'invite', attempt: 1, outcome: 'sent' })]);
    expect(log.lines.join('')).not.toMatch(/sent-target@furlong\.test|BODY-SECRET-5521/);
  });

  it('when the mail server cannot be reached, then the attempt is logged as a retry with the reason, without the address', async () => {
    const closed = net.createServer().listen(0, '127.0.0.1');
    await new Promise((r) => closed.once('listening', r));
    const port = (closed.address() as net.AddressInfo).port;
    await new Promise((r) => closed.close(r));

    const log = captureLines();
    const id = await queueMail('retry-target@furlong.test');
    const worker = new MailWorker(t.db, createTransport(null, port), {
      from: t.config.mailFrom,
      logger: createLogger({ env: 'test', logLevel: 'info' }, log.stream),
    });
    await worker.drain();
    const [line] = log.lines.map((l) => JSON.parse(l) as Record<string, unknown>).filter((l) => l.mailId === id);
    expect(line).toMatchObject({ mailId: id, kind: 'invite', attempt: 1, outcome: 'retry', level: 40 });
    expect(line.error).toMatch(/ECONNREFUSED|connect/i);
    expect(log.lines.join('')).not.toMatch(/retry-target@furlong\.test|BODY-SECRET-5521/);
    // Take it out of the queue so no later run sends it.
    await t.db('mail_outbox').where({ id }).delete();
  });
});
