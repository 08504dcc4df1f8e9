import 'fake-indexeddb/auto';
import { Outbox, type BatchAnswer, type OutboxEntry, type SendAnswer } from './outbox';

let n = 0;
const fresh = () => Outbox.open(`outbox-spec-${++n}`);
const at = (hhmm: string) => new Date(`2026-05-01T${hhmm}:00Z`);
const me = { userId: 7, farmId: 1, name: 'Tomas Reyes' };
const other = { userId: 9, farmId: 1, name: 'Milo Sorensen' };

describe('Outbox', () => {
  it('when actions are tapped, then each is written with its own UUID and tap time, in tap order, and survives reopening', async () => {
    const name = `outbox-spec-${++n}`;
    const box = await Outbox.open(name);
    await box.add(me, 11, { type: 'start' }, at('08:00'));
    await box.add(me, 11, { type: 'finish', acres: 80, engineHours: 1216.5 }, at('16:40'));
    box.close();
    const again = await Outbox.open(name);
    const waiting = await again.waiting(me);
    expect(waiting.map((e) => [e.body.type, e.body.at])).toEqual([
      ['start', '2026-05-01T08:00:00.000Z'],
      ['finish', '2026-05-01T16:40:00.000Z'],
    ]);
    // RFC 4122 version 4 layout: 8-4-4-4-12 hex digits, version nibble 4, variant 8–b.
    for (const e of waiting) expect(e.body.clientEventId).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(waiting[0].body.clientEventId).not.toBe(waiting[1].body.clientEventId);
    expect(waiting[1].body).toMatchObject({ acres: 80, engineHours: 1216.5 });
    again.close();
  });

  it('when the connection returns, then the actions go in tap order and leave the outbox once answered', async () => {
    const box = await fresh();
    await box.add(me, 11, { type: 'start' }, at('08:00'));
    await box.add(me, 12, { type: 'start' }, at('09:00'));
    await box.add(me, 11, { type: 'pause' }, at('10:00'));
    const order: string[] = [];
    const result = await box.flush(me, async (jobId, body) => {
      order.push(`${jobId} ${body.type} ${body.at.slice(11, 16)}`);
      return { status: 201, body: {} };
    });
    expect(order).toEqual(['11 start 08:00', '12 start 09:00', '11 pause 10:00']);
    expect(result).toEqual({ sent: 3, notApplied: [], waiting: 0, stoppedBy: null });
    expect(await box.waiting(me)).toEqual([]);
  });

  it('when many actions wait, then they go in batches in tap order, a refusal in a batch does not hold back the rest, and only answered ones leave', async () => {
    const box = await fresh();
    for (let i = 0; i < 5; i++) await box.add(me, 20 + i, { type: 'start' }, at(`0${i}:00`));
    const batches: string[][] = [];
    const noOne = async (): Promise<SendAnswer> => {
      throw new Error('the batch route answers for each action');
    };
    const result = await box.flush(
      me,
      noOne,
      async (entries): Promise<BatchAnswer> => {
        batches.push(entries.map((e) => `${e.jobId} ${e.body.at.slice(11, 16)}`));
        return {
          status: 200,
          results: entries.map((e) =>
            e.jobId === 21
              ? { status: 409, body: { error: { code: 'invalid_transition', message: 'Kept as your log.' } } }
              : { status: 201, body: {} },
          ),
        };
      },
      2,
    );
    expect(batches).toEqual([['20 00:00', '21 01:00'], ['22 02:00', '23 03:00'], ['24 04:00']]);
    expect(result).toMatchObject({ sent: 4, waiting: 0, stoppedBy: null });
    expect(result.notApplied.map((o) => [o.entry.jobId, o.status, o.message])).toEqual([[21, 409, 'Kept as your log.']]);
    expect(await box.waiting(me)).toEqual([]);
  });

  it('when a batch gets no answer or the server is in trouble, then every action of it waits; an action answered "try again" stops the run there', async () => {
    const box = await fresh();
    for (let i = 0; i < 3; i++) await box.add(me, 30 + i, { type: 'start' }, at(`0${i}:00`));
    const one = async (): Promise<SendAnswer> => ({ status: 201, body: {} });
    expect(await box.flush(me, one, async () => Promise.reject(new TypeError('Failed to fetch')))).toMatchObject({
      sent: 0,
      waiting: 3,
      stoppedBy: 0,
    });
    expect(await box.flush(me, one, async () => ({ status: 503 }))).toMatchObject({ sent: 0, waiting: 3, stoppedBy: 503 });
    const partly = await box.flush(me, one, async (entries) => ({
      status: 200,
      results: entries.map((_, k) => (k === 1 ? { status: 503, body: null } : { status: 201, body: {} })),
    }));
    expect(partly).toMatchObject({ sent: 1, waiting: 2, stoppedBy: 503 });
    expect((await box.waiting(me)).map((e) => e.jobId)).toEqual([31, 32]);
  });

  it('when the server will not take a batch as such (a 404 of an older server), then the same actions go one at a time', async () => {
    const box = await fresh();
    await box.add(me, 40, { type: 'start' }, at('08:00'));
    await box.add(me, 41, { type: 'start' }, at('09:00'));
    const alone: number[] = [];
    const result = await box.flush(
      me,
      async (jobId) => {
        alone.push(jobId);
        return { status: 201, body: {} };
      },
      async () => ({ status: 404 }),
    );
    expect(alone).toEqual([40, 41]);
    expect(result).toEqual({ sent: 2, notApplied: [], waiting: 0, stoppedBy: null });
  });

  it('when a send gets no answer or the session has ended, then it and everything after it wait, and the same ids go next time', async () => {
    const box = await fresh();
    const first = await box.add(me, 11, { type: 'start' }, at('08:00'));
    const second = await box.add(me, 11, { type: 'pause' }, at('10:00'));
    const third = await box.add(me, 11, { type: 'resume' }, at('10:30'));
    const sent: OutboxEntry['body'][] = [];
    const offlineAfterOne = async (_: number, body: OutboxEntry['body']): Promise<SendAnswer> => {
      if (sent.length) throw new TypeError('Failed to fetch');
      sent.push(body);
      return { status: 201, body: {} };
    };
    expect(await box.flush(me, offlineAfterOne)).toEqual({ sent: 1, notApplied: [], waiting: 2, stoppedBy: 0 });
    expect(sent[0].clientEventId).toBe(first.clientEventId);
    expect(await box.flush(me, async () => ({ status: 401, body: {} }))).toEqual({ sent: 0, notApplied: [], waiting: 2, stoppedBy: 401 });
    const later: string[] = [];
    await box.flush(me, async (_, body) => {
      later.push(body.clientEventId);
      return { status: 201, body: {} };
    });
    expect(later).toEqual([second.clientEventId, third.clientEventId]);
  });

  it("when the server kept an action as a log, then it leaves the outbox with the server's words; another person's actions are not sent", async () => {
    const box = await fresh();
    await box.add(me, 11, { type: 'finish' }, at('16:40'));
    await box.add(other, 11, { type: 'start' }, at('08:00'));
    const message = 'The owner moved this job to Ada; your finish at 16:40 was kept as your log.';
    const result = await box.flush(me, async () => ({ status: 409, body: { error: { code: 'job_moved', message } } }));
    expect(result.notApplied.map((o) => [o.status, o.code, o.message])).toEqual([[409, 'job_moved', message]]);
    expect(await box.waiting(me)).toEqual([]);
    expect((await box.waiting(other)).map((e) => e.body.type)).toEqual(['start']);
  });

  it('when the same person is signed in on another farm, then the actions tapped for the first farm wait for that farm', async () => {
    const box = await fresh();
    await box.add(me, 11, { type: 'start' }, at('08:00'));
    const sameUserOtherFarm = { ...me, farmId: 2 };
    expect(await box.waiting(sameUserOtherFarm)).toEqual([]);
    expect((await box.others(sameUserOtherFarm)).map((e) => [e.name, e.body.type])).toEqual([['Tomas Reyes', 'start']]);
    expect(await box.flush(sameUserOtherFarm, async () => ({ status: 201, body: {} }))).toEqual({
      sent: 0,
      notApplied: [],
      waiting: 0,
      stoppedBy: null,
    });
    expect(await box.waiting(me)).toHaveLength(1);
  });

  it('when a run sheet is kept, then it reads back after reopening with the time it was saved, and the newest copy wins', async () => {
    const name = `outbox-spec-${++n}`;
    const box = await Outbox.open(name);
    const sheet = {
      date: '2026-05-01',
      today: '2026-05-01',
      opened: 'asked' as const,
      person: { membershipId: 3, name: 'Tomas Reyes' },
      assignments: [],
    };
    await box.keepSheet('7:1:2026-05-01', sheet, at('06:00'));
    await box.keepSheet('7:1:2026-05-01', { ...sheet, opened: 'today' }, at('06:30'));
    box.close();
    const again = await Outbox.open(name);
    expect(await again.keptSheet('7:1:2026-05-01')).toEqual({
      key: '7:1:2026-05-01',
      sheet: { ...sheet, opened: 'today' },
      savedAt: '2026-05-01T06:30:00.000Z',
    });
    expect(await again.keptSheet('9:1:2026-05-01')).toBeUndefined();
    again.close();
  });
});
