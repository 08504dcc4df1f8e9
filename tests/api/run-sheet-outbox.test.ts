import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import type { Board } from '../../shared/schemas/board';
import { dayIn } from '../../shared/calendar';
import { OUTBOX_BATCH_MAX } from '../../shared/limits';
import type { OutboxResult } from '../../shared/schemas/run-sheet';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';

// A phone's waiting actions sent in one request (POST /api/run-sheet/outbox): each answered as
// POST /api/assignments/:id/events (or /problems) answers it with Prefer: return=minimal, in the
// order sent, exactly once per device-made id.
describe('a phone outbox sent in one request', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let tomasC: Client;
  let adaC: Client;
  let ada: number;
  let tractor: number;
  let harrow: number;
  let n = 0;
  const base = Date.now() - 10 * 3_600_000;
  const tap = (minutes: number) => new Date(base + minutes * 60_000).toISOString();
  // The farm's day of the first tap (America/Chicago): a start is taken from the job's day on at the farm.
  const day = dayIn('America/Chicago', new Date(base));

  const board = async (): Promise<Board> => (await owner.get(`/api/board?date=${day}`)).body;
  const job = async (operatorId = farm.operator.membershipId): Promise<number> => {
    const [f] = await t
      .db('fields')
      .insert({
        farm_id: farm.id,
        name: `Quarter ${++n}`,
        boundary: JSON.stringify(rect(-98.5 + n * 0.01, 46.9, 0.005, 0.005)),
        area_m2: 100 * 4046.86,
        acres: 100,
      })
      .returning('id');
    const res = await owner.post('/api/assignments', {
      version: (await board()).version,
      date: day,
      fieldId: f.id,
      operation: 'harrowing',
      machineId: tractor,
      implementId: harrow,
      operatorId,
    });
    expect(res.status).toBe(201);
    return res.body.savedAssignmentId;
  };
  const batch = (c: Client, events: object[]) => c.post('/api/run-sheet/outbox', { events });
  const single = (c: Client, id: number, body: { type: string }) => {
    const { type, ...rest } = body;
    return type === 'problem'
      ? c.post(`/api/assignments/${id}/problems`, rest).set('Prefer', 'return=minimal')
      : c.post(`/api/assignments/${id}/events`, body).set('Prefer', 'return=minimal');
  };
  const logged = async (id: number) =>
    (await t.db('assignment_events').where({ assignment_id: id }).orderBy(['at', 'id'])).map((e) => ({
      type: e.type,
      at: (e.at as Date).toISOString(),
    }));
  const recorded = async () => Number((await t.db('client_events').where({ farm_id: farm.id }).count({ n: '*' }))[0].n);

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Outbox Batch');
    await t.db('farms').where({ id: farm.id }).update({ time_zone: 'America/Chicago' });
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    tomasC = new Client(t.app);
    await tomasC.signIn(farm.operator.email, farm.operator.password);
    const email = `ada-batch-${farm.id}@furlong.test`;
    const [u] = await t
      .db('users')
      .insert({ email, name: 'Ada', password_hash: bcrypt.hashSync('operator-password', 4) })
      .returning('id');
    ada = (await t.db('memberships').insert({ farm_id: farm.id, user_id: u.id, role: 'operator', status: 'active' }).returning('id'))[0].id;
    adaC = new Client(t.app);
    await adaC.signIn(email, 'operator-password');
    tractor = await insertMachine(t.db, farm.id, { name: '4WD No. 3', engine_hours: 1500 });
    harrow = await insertImplement(t.db, farm.id, { name: '60 ft harrow', width_m: 18.288 });
  });
  afterAll(() => t.close());

  it('when the same actions go to one job one at a time and to its twin in one batch, then every answer has the same status and the same body (ids aside)', async () => {
    // Applied, kept as a log (a resume of a job not paused), refused alone (negative acres, not
    // recorded), applied again, and the first action sent again (a replay).
    const script = (ids: string[]) => [
      { type: 'start', at: tap(0), clientEventId: ids[0] },
      { type: 'resume', at: tap(10), clientEventId: ids[1] },
      { type: 'pause', at: tap(20), clientEventId: ids[2] },
      { type: 'finish', acres: -5, at: tap(30), clientEventId: ids[3] },
      { type: 'problem', kind: 'other', note: 'Gate chain broken', at: tap(35), clientEventId: ids[4] },
      { type: 'finish', acres: 90, at: tap(40), clientEventId: ids[5] },
      { type: 'start', at: tap(0), clientEventId: ids[0] },
    ];
    const oneByOne = await job();
    const twin = await job();
    const singleIds = Array.from({ length: 6 }, () => randomUUID());
    const batchIds = Array.from({ length: 6 }, () => randomUUID());
    const singles: Array<{ status: number; body: unknown }> = [];
    for (const action of script(singleIds)) {
      const res = await single(tomasC, oneByOne, action);
      singles.push({ status: res.status, body: res.body });
    }
    const res = await batch(
      tomasC,
      script(batchIds).map((a) => ({ assignmentId: twin, ...a })),
    );
    expect(res.status).toBe(200);
    const results: OutboxResult[] = res.body.results;
    expect(results.map((r) => [r.clientEventId, r.assignmentId])).toEqual(script(batchIds).map((a) => [a.clientEventId, twin]));
    // The ids each side made differ (job, device ids, log entries, kept records, request ids): name them alike.
    const same = (v: unknown, job: number, ids: string[]): unknown =>
      JSON.parse(
        JSON.stringify(v, (k, x) =>
          k === 'requestId' ? undefined : k === 'eventId' || (k === 'id' && typeof x === 'number' && x !== job) ? 'ID' : x,
        ),
        (k, x) => (k === 'id' && x === job ? 'JOB' : typeof x === 'string' && ids.includes(x) ? `device-${ids.indexOf(x)}` : x),
      );
    expect(results.map((r) => same({ status: r.status, body: r.body }, twin, batchIds))).toEqual(
      singles.map((s) => same(s, oneByOne, singleIds)),
    );
    expect(results.map((r) => r.status)).toEqual([201, 409, 201, 400, 201, 201, 201]);
    expect((results[1].body as { error: { message: string } }).error.message).toMatch(
      /was not applied; it is kept on record with the job\.$/,
    );
    expect(await logged(twin)).toEqual([
      { type: 'start', at: tap(0) },
      { type: 'pause', at: tap(20) },
      { type: 'problem', at: tap(35) },
      { type: 'finish', at: tap(40) },
    ]);
    expect((await t.db('assignments').where({ id: twin }).first()).state).toBe('finished');
    // Five ids recorded (the refused finish is not, as with the single route).
    expect(await t.db('client_events').whereIn('client_event_id', batchIds)).toHaveLength(5);
  });

  it('when a batch is sent again (its answers lost on the way), then nothing changes and every answer is the first one again', async () => {
    const id = await job();
    const events = [
      { assignmentId: id, type: 'start', at: tap(100), clientEventId: randomUUID() },
      { assignmentId: id, type: 'pause', at: tap(110), clientEventId: randomUUID() },
      { assignmentId: id, type: 'pause', at: tap(115), clientEventId: randomUUID() },
      { assignmentId: id, type: 'resume', at: tap(120), clientEventId: randomUUID() },
    ];
    const first = await batch(tomasC, events);
    expect(first.body.results.map((r: OutboxResult) => r.status)).toEqual([201, 201, 409, 201]);
    const before = { log: await logged(id), recorded: await recorded() };
    const again = await batch(tomasC, events);
    expect(again.status).toBe(200);
    expect(again.body).toEqual(first.body);
    expect({ log: await logged(id), recorded: await recorded() }).toEqual(before);
    // Each one sent alone gets the same answer too.
    const alone = await single(tomasC, id, events[1]);
    expect({ status: alone.status, body: alone.body }).toEqual({ status: first.body.results[1].status, body: first.body.results[1].body });
  });

  it('when the same id comes twice in one batch, then it is applied once and the second gets the first answer', async () => {
    const id = await job();
    const start = { assignmentId: id, type: 'start', at: tap(200), clientEventId: randomUUID() };
    const res = await batch(tomasC, [start, start]);
    expect(res.body.results[1]).toEqual(res.body.results[0]);
    expect(res.body.results[0].status).toBe(201);
    expect(await logged(id)).toEqual([{ type: 'start', at: tap(200) }]);
  });

  it('when actions arrive out of tap order in a batch, then they are judged in tap order, as one at a time', async () => {
    const id = await job();
    const res = await batch(tomasC, [
      { assignmentId: id, type: 'start', at: tap(300), clientEventId: randomUUID() },
      { assignmentId: id, type: 'finish', acres: 80, at: tap(360), clientEventId: randomUUID() },
      { assignmentId: id, type: 'pause', at: tap(320), clientEventId: randomUUID() },
      { assignmentId: id, type: 'resume', at: tap(340), clientEventId: randomUUID() },
    ]);
    expect(res.body.results.map((r: OutboxResult) => r.status)).toEqual([201, 201, 201, 201]);
    expect((await logged(id)).map((e) => e.type)).toEqual(['start', 'pause', 'resume', 'finish']);
    expect((await t.db('assignments').where({ id }).first()).state).toBe('finished');
  });

  it("when a batch holds an action on another person's job, or another person's action id, then those are refused (403) and recorded nowhere, and the rest is applied", async () => {
    const hers = await job(ada);
    const mine = await job();
    const tomasStart = { assignmentId: mine, type: 'start', at: tap(400), clientEventId: randomUUID() };
    expect((await batch(tomasC, [tomasStart])).body.results[0].status).toBe(201);
    const before = await recorded();
    const res = await batch(adaC, [
      { assignmentId: mine, type: 'pause', at: tap(410), clientEventId: randomUUID() },
      { ...tomasStart, assignmentId: hers },
      { assignmentId: hers, type: 'start', at: tap(420), clientEventId: randomUUID() },
    ]);
    expect(res.status).toBe(200);
    const [onHisJob, reused, own] = res.body.results as OutboxResult[];
    expect(onHisJob).toMatchObject({
      status: 403,
      body: { error: { code: 'forbidden', message: "This job is on someone else's run sheet" } },
    });
    expect(reused).toMatchObject({
      status: 403,
      body: { error: { message: 'That action was sent by someone else; nothing was changed' } },
    });
    expect(own.status).toBe(201);
    expect((await logged(mine)).map((e) => e.type)).toEqual(['start']);
    expect((await logged(hers)).map((e) => e.type)).toEqual(['start']);
    expect(await recorded()).toBe(before + 1);
  });

  it('when the batch itself is malformed (no device id, too many actions, not signed in), then 400 or 401 with the reason and nothing is applied', async () => {
    const id = await job();
    const noId = await batch(tomasC, [{ assignmentId: id, type: 'start', at: tap(500) }]);
    expect(noId.status).toBe(400);
    expect(noId.body.error.message).toBe('Check the form: events.0.clientEventId: The action id must be a UUID made on the device');
    const many = Array.from({ length: OUTBOX_BATCH_MAX + 1 }, (_, i) => ({
      assignmentId: id,
      type: 'pause',
      at: tap(500 + i),
      clientEventId: randomUUID(),
    }));
    const tooMany = await batch(tomasC, many);
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.message).toBe(`Check the form: events: Send at most ${OUTBOX_BATCH_MAX} actions at once`);
    const nobody = new Client(t.app);
    await nobody.prime();
    const anon = await batch(nobody, [{ assignmentId: id, type: 'start', at: tap(500), clientEventId: randomUUID() }]);
    expect(anon.status).toBe(401);
    expect(await logged(id)).toEqual([]);
  });
});
