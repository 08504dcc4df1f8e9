import 'fake-indexeddb/auto';
import { until } from '../testing/device';
import { Outbox, type OutboxEntry, type SendAnswer } from './outbox';
import { OutboxSync, othersLine, statusLine, type Connection, type OutboxView } from './outbox-sync';

let n = 0;
const at = (hhmm: string) => new Date(`2026-05-01T${hhmm}:00Z`);
const me = { userId: 7, farmId: 1, name: 'Tomas Reyes' };

/** A phone's connection: `onLine` and the window's online/offline events, switched by the test. */
class FakeConnection extends EventTarget implements Connection {
  navigator = { onLine: false };
  go(online: boolean): void {
    this.navigator.onLine = online;
    this.dispatchEvent(new Event(online ? 'online' : 'offline'));
  }
}

/** A server that answers each action as the test says (201 by default) and records what it got. */
function server(answer: (body: OutboxEntry['body']) => SendAnswer = () => ({ status: 201, body: {} })) {
  const got: Array<{ jobId: number; body: OutboxEntry['body'] }> = [];
  const send = async (jobId: number, body: OutboxEntry['body']) => {
    got.push({ jobId, body });
    return answer(body);
  };
  return { got, send };
}

async function setUp(answer?: (body: OutboxEntry['body']) => SendAnswer) {
  const outbox = await Outbox.open(`outbox-sync-spec-${++n}`);
  const connection = new FakeConnection();
  const srv = server(answer);
  const views: OutboxView[] = [];
  const sync = new OutboxSync(outbox, me, srv.send, connection, (v) => views.push(v));
  await sync.start();
  return { outbox, connection, srv, views, sync, last: () => views[views.length - 1] };
}

describe('OutboxSync', () => {
  it('when actions are tapped with no signal, then nothing is sent, they wait in the outbox and their job is marked', async () => {
    const { srv, last, sync } = await setUp();
    await sync.tap(11, { type: 'start' }, at('08:00'));
    await sync.tap(11, { type: 'pause' }, at('09:15'));
    await sync.flush();
    expect(srv.got).toEqual([]);
    expect(last().status).toMatchObject({ online: false, waiting: 2, sending: false });
    expect(statusLine(last().status, 'America/Chicago')).toBe('Offline — 2 actions waiting');
    expect([...last().pendingJobs]).toEqual([11]);
    expect(last().entries.map((e) => e.body.type)).toEqual(['start', 'pause']);
    expect(sync.hasWaiting()).toBe(true);
  });

  it('when the phone comes back online, then what waited is sent in tap order with its tap times and the job mark goes', async () => {
    const { srv, last, sync, connection } = await setUp();
    await sync.tap(11, { type: 'start' }, at('08:00'));
    await sync.tap(12, { type: 'start' }, at('08:05'));
    await sync.tap(11, { type: 'finish', acres: 80, engineHours: 1216.5 }, at('16:40'));
    connection.go(true);
    await sync.settled();
    expect(srv.got.map((g) => [g.jobId, g.body.type, g.body.at])).toEqual([
      [11, 'start', '2026-05-01T08:00:00.000Z'],
      [12, 'start', '2026-05-01T08:05:00.000Z'],
      [11, 'finish', '2026-05-01T16:40:00.000Z'],
    ]);
    expect(srv.got[2].body).toMatchObject({ acres: 80, engineHours: 1216.5 });
    expect(last().status).toMatchObject({ waiting: 0, sending: false });
    expect(last().pendingJobs.size).toBe(0);
    expect(sync.hasWaiting()).toBe(false);
  });

  it('when the app starts with actions left from an earlier visit and a connection, then they are sent at start', async () => {
    const name = `outbox-sync-spec-${++n}`;
    const earlier = await Outbox.open(name);
    await earlier.add(me, 11, { type: 'start' }, at('08:00'));
    const connection = new FakeConnection();
    connection.navigator.onLine = true;
    const srv = server();
    const sync = new OutboxSync(earlier, me, srv.send, connection, () => undefined);
    await sync.start();
    await sync.settled();
    expect(srv.got.map((g) => g.body.type)).toEqual(['start']);
    expect(sync.hasWaiting()).toBe(false);
  });

  it('when the server refuses an action and keeps it as a log, then its plain sentence is shown on that job', async () => {
    const message = 'The owner deleted this job; your start at 08:00 was kept as your log.';
    const { last, sync, connection } = await setUp(() => ({ status: 410, body: { error: { code: 'job_deleted', message } } }));
    await sync.tap(11, { type: 'start' }, at('08:00'));
    connection.go(true);
    await sync.settled();
    expect(last().outcomes.get(11)).toMatchObject({ status: 410, code: 'job_deleted', message });
    expect(last().pendingJobs.size).toBe(0);
  });

  it('when the answer never comes, then the action stays waiting and the line says so', async () => {
    const { last, sync, connection } = await setUp(() => {
      throw new Error('no answer');
    });
    await sync.tap(11, { type: 'start' }, at('08:00'));
    connection.go(true);
    await sync.settled();
    expect(last().status).toMatchObject({ waiting: 1, sending: false, allSentAt: null });
    expect(statusLine(last().status, 'America/Chicago')).toBe('1 action waiting to be sent');
    sync.stop();
  });

  it('when the first sends after the signal returns get no answer, then they go again a moment later with no new online event, until all is sent', async () => {
    const outbox = await Outbox.open(`outbox-sync-spec-${++n}`);
    const connection = new FakeConnection();
    let failures = 2;
    const got: string[] = [];
    const views: OutboxView[] = [];
    const sync = new OutboxSync(
      outbox,
      me,
      async (_jobId, body) => {
        got.push(body.clientEventId);
        if (failures-- > 0) return { status: 504, body: null }; // what a service worker answers when its fetch fails
        return { status: 201, body: {} };
      },
      connection,
      (v) => views.push(v),
      { retryDelaysMs: [5, 10] },
    );
    await sync.start();
    const entry = await sync.tap(11, { type: 'start' }, at('08:00'));
    connection.go(true);
    await until(() => views[views.length - 1].status.allSentAt !== null, 'all sent');
    expect(got).toEqual([entry.clientEventId, entry.clientEventId, entry.clientEventId]);
    expect(views[views.length - 1]).toMatchObject({ status: { waiting: 0, sending: false }, answered: 1 });
    sync.stop();
  });

  it('when the session has ended (401), then nothing is sent again until the person signs in again', async () => {
    const outbox = await Outbox.open(`outbox-sync-spec-${++n}`);
    const connection = new FakeConnection();
    const srv = server(() => ({ status: 401, body: { error: { code: 'unauthenticated', message: 'Your session has ended' } } }));
    const sync = new OutboxSync(outbox, me, srv.send, connection, () => undefined, { retryDelaysMs: [5] });
    await sync.start();
    await sync.tap(11, { type: 'start' }, at('08:00'));
    connection.go(true);
    await sync.settled();
    await new Promise((r) => setTimeout(r, 50));
    expect(srv.got).toHaveLength(1);
    sync.stop();
  });
});

describe('OutboxSync across sign-ins', () => {
  it('when the session ends while sending, then nothing is lost; the same person signing in again sends it, another person does not and is told', async () => {
    const name = `outbox-sync-spec-${++n}`;
    const box = await Outbox.open(name);
    const connection = new FakeConnection();
    connection.navigator.onLine = true;
    const expired = server(() => ({ status: 401, body: { error: { code: 'unauthenticated', message: 'Your session has ended' } } }));
    const first = new OutboxSync(box, me, expired.send, connection, () => undefined);
    await first.start();
    await first.tap(11, { type: 'finish', acres: 80, engineHours: 1216.5 }, at('16:40'));
    await first.settled();
    first.stop();
    expect(expired.got).toHaveLength(1);
    expect(await box.waiting(me)).toHaveLength(1);

    // Another person signs in on the same phone: nothing of Tomas's goes under their name.
    const milo = { userId: 9, farmId: 1, name: 'Milo Sorensen' };
    const miloServer = server();
    const views: OutboxView[] = [];
    const theirs = new OutboxSync(box, milo, miloServer.send, connection, (v) => views.push(v));
    await theirs.start();
    await theirs.settled();
    theirs.stop();
    expect(miloServer.got).toEqual([]);
    expect(views[views.length - 1].others).toEqual({ count: 1, names: ['Tomas Reyes'] });
    expect(othersLine(views[views.length - 1].others)).toBe(
      '1 action tapped by Tomas Reyes waits on this device. It is sent only when that person signs in here again.',
    );

    // Tomas signs in again: his finish goes, with its first id and tap time.
    const again = server();
    const back = new OutboxSync(box, me, again.send, connection, () => undefined);
    await back.start();
    await back.settled();
    expect(again.got.map((g) => [g.body.clientEventId, g.body.at])).toEqual([
      [expired.got[0].body.clientEventId, '2026-05-01T16:40:00.000Z'],
    ]);
    expect(await box.waiting(me)).toEqual([]);
  });
});

describe('statusLine', () => {
  it('when sending, then "Sending…"', () => {
    expect(statusLine({ online: true, sending: true, waiting: 3, allSentAt: null }, 'America/Chicago')).toBe('Sending…');
  });

  it('when all was sent, then the time is read on the farm clock', () => {
    // 16:42 UTC on 2 December is 10:42 in Chicago: Central Standard Time is UTC−6 (IANA time zone database, America/Chicago).
    expect(statusLine({ online: true, sending: false, waiting: 0, allSentAt: new Date('2026-12-02T16:42:00Z') }, 'America/Chicago')).toBe(
      'All sent 10:42',
    );
  });

  it('when nothing was ever tapped, then there is no line', () => {
    expect(statusLine({ online: true, sending: false, waiting: 0, allSentAt: null }, 'America/Chicago')).toBeNull();
  });
});
