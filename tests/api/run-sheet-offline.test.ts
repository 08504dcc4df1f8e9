import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import type { Board, BoardAssignment } from '../../shared/schemas/board';
import { dayIn } from '../../shared/calendar';
import type { FieldReports } from '../../shared/schemas/run-sheet';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';

// Actions tapped on a phone with no signal and sent later: each carries an id made on the device
// and the time it was tapped.
describe('run sheet actions sent later from a phone', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let tomasC: Client;
  let adaC: Client;
  let tomas: number;
  let ada: number;
  let tractor: number;
  let harrow: number;
  let n = 0;
  // Taps counted in minutes from a base ten hours back (so the latest, at 520 min, is in the past).
  const base = Date.now() - 10 * 3_600_000;
  const tap = (minutes: number) => new Date(base + minutes * 60_000).toISOString();
  // The farm's day of the first tap (America/Chicago): a start is taken from the job's day on at the farm.
  const day = dayIn('America/Chicago', new Date(base));
  const hhmm = (iso: string) =>
    new Intl.DateTimeFormat('en-GB', { timeZone: 'America/Chicago', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).format(
      new Date(iso),
    );

  const board = async (): Promise<Board> => (await owner.get(`/api/board?date=${day}`)).body;
  const job = async (operatorId = tomas): Promise<number> => {
    const [f] = await t
      .db('fields')
      .insert({
        farm_id: farm.id,
        name: `Section ${++n}`,
        boundary: JSON.stringify(rect(-98.9 + n * 0.01, 46.6, 0.005, 0.005)),
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
  const send = (c: Client, id: number, body: object) => c.post(`/api/assignments/${id}/events`, body);
  const logged = async (id: number) =>
    (await t.db('assignment_events').where({ assignment_id: id }).orderBy(['at', 'id'])).map((e) => ({
      type: e.type,
      at: (e.at as Date).toISOString(),
    }));
  const kept = async (): Promise<FieldReports['keptActions']> => (await owner.get('/api/reports')).body.keptActions;

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Offline');
    await t.db('farms').where({ id: farm.id }).update({ time_zone: 'America/Chicago' });
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    tomasC = new Client(t.app);
    await tomasC.signIn(farm.operator.email, farm.operator.password);
    tomas = farm.operator.membershipId;
    const email = `ada-${farm.id}@furlong.test`;
    const [u] = await t
      .db('users')
      .insert({ email, name: 'Ada', password_hash: bcrypt.hashSync('operator-password', 4) })
      .returning('id');
    ada = (await t.db('memberships').insert({ farm_id: farm.id, user_id: u.id, role: 'operator', status: 'active' }).returning('id'))[0].id;
    adaC = new Client(t.app);
    await adaC.signIn(email, 'operator-password');
    tractor = await insertMachine(t.db, farm.id, { name: '4WD No. 2', engine_hours: 1500 });
    harrow = await insertImplement(t.db, farm.id, { name: '70 ft harrow', width_m: 21.336 });
  });
  afterAll(() => t.close());

  it('when the same action id is sent twice, then it is recorded once and both answers are the same status and body', async () => {
    const id = await job();
    const start = { type: 'start', at: tap(0), clientEventId: randomUUID() };
    const first = await send(tomasC, id, start);
    const again = await send(tomasC, id, start);
    expect(first.status).toBe(201);
    expect(again.status).toBe(201);
    expect(again.body).toEqual(first.body);
    expect(await logged(id)).toEqual([{ type: 'start', at: tap(0) }]);
    expect(await t.db('client_events').where({ client_event_id: start.clientEventId })).toHaveLength(1);
  });

  it('when two copies of one action arrive at the same moment, then the unique id decides: one record, the same answer twice', async () => {
    const id = await job();
    await send(tomasC, id, { type: 'start', at: tap(0), clientEventId: randomUUID() });
    const pause = { type: 'pause', at: tap(60), clientEventId: randomUUID() };
    const [a, b] = await Promise.all([send(tomasC, id, pause), send(tomasC, id, pause)]);
    expect([a.status, b.status]).toEqual([201, 201]);
    expect(b.body).toEqual(a.body);
    expect(a.body.state).toBe('paused');
    expect((await logged(id)).map((e) => e.type)).toEqual(['start', 'pause']);
  });

  it('when a finish tapped at 16:40 arrives before a pause tapped at 16:00 and a resume at 16:20, then they are judged in tap order', async () => {
    const id = await job();
    // 08:00 start … 16:00 pause, 16:20 resume, 16:40 finish (minutes after the base).
    await send(tomasC, id, { type: 'start', at: tap(0), clientEventId: randomUUID() });
    const finish = await send(tomasC, id, { type: 'finish', at: tap(520), acres: 100, clientEventId: randomUUID() });
    expect(finish.body).toMatchObject({ state: 'finished', log: { hoursWorked: 8.67 } });
    const pause = await send(tomasC, id, { type: 'pause', at: tap(480), clientEventId: randomUUID() });
    expect(pause.status).toBe(201);
    const resume = await send(tomasC, id, { type: 'resume', at: tap(500), clientEventId: randomUUID() });
    expect(resume.status).toBe(201);
    // Underway 08:00–16:00 and 16:20–16:40: 8 h 20 min = 8.33 h (worked by hand from the taps).
    expect(resume.body).toMatchObject({ state: 'finished', log: { hoursWorked: 8.33, acresDone: 100 } });
    expect(resume.body.events.map((e: { type: string }) => e.type)).toEqual(['start', 'pause', 'resume', 'finish']);
    expect(await logged(id)).toEqual([
      { type: 'start', at: tap(0) },
      { type: 'pause', at: tap(480) },
      { type: 'resume', at: tap(500) },
      { type: 'finish', at: tap(520) },
    ]);
    expect((await t.db('assignments').where({ id }).first()).finished_at.toISOString()).toBe(tap(520));
  });

  it('when another phone of the same person finished first, then a later-sent finish tapped earlier is kept as a log with its outcome, not applied', async () => {
    const id = await job();
    await send(tomasC, id, { type: 'start', at: tap(0), clientEventId: randomUUID() });
    await send(tomasC, id, { type: 'finish', at: tap(520), acres: 100, clientEventId: randomUUID() });
    const other = { type: 'finish', at: tap(510), acres: 60, clientEventId: randomUUID() };
    const res = await send(tomasC, id, other);
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({
      code: 'invalid_transition',
      message: `This job was already finished at ${hhmm(tap(520))}: a finish at ${hhmm(tap(510))} does not fit before it. Your finish at ${hhmm(tap(510))} was not applied; it is kept on record with the job.`,
      kept: { type: 'finish', at: tap(510) },
    });
    expect((await t.db('assignments').where({ id }).first()).acres_done).toBe(100);
    expect((await logged(id)).map((e) => e.type)).toEqual(['start', 'finish']);
    expect((await send(tomasC, id, other)).body).toEqual(res.body);
    expect(await kept()).toContainEqual(
      expect.objectContaining({
        job: { id, exists: true },
        type: 'finish',
        at: tap(510),
        by: farm.operator.name,
        outcome: 'invalid_transition',
      }),
    );
  });

  it('when the owner deleted the job meanwhile, then the action is kept as a log with its outcome, and a replay answers the same', async () => {
    const id = await job();
    const b = await board();
    expect((await owner.delete(`/api/assignments/${id}?version=${b.version}`)).status).toBe(200);
    const start = { type: 'start', at: tap(5), clientEventId: randomUUID() };
    const res = await send(tomasC, id, start);
    expect(res.status).toBe(410);
    expect(res.body.error).toMatchObject({
      code: 'job_deleted',
      message: `The owner deleted this job; your start at ${hhmm(tap(5))} was kept as your log.`,
    });
    expect(await send(tomasC, id, start)).toMatchObject({ status: 410, body: res.body });
    expect(await kept()).toContainEqual(
      expect.objectContaining({
        job: { id, exists: false },
        type: 'start',
        at: tap(5),
        outcome: 'job_deleted',
        message: res.body.error.message,
      }),
    );
  });

  it('when the owner moved the job to another person, then the answer says so in a sentence and the finish is kept as a log', async () => {
    const id = await job();
    await send(tomasC, id, { type: 'start', at: tap(0), clientEventId: randomUUID() });
    await t.db('assignments').where({ id }).update({ state: 'planned', started_at: null });
    await t.db('assignment_events').where({ assignment_id: id }).delete();
    const b = await board();
    expect((await owner.patch(`/api/assignments/${id}`, { version: b.version, operatorId: ada })).status).toBe(200);
    const finish = { type: 'finish', at: tap(520), acres: 80, clientEventId: randomUUID() };
    const res = await send(tomasC, id, finish);
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({
      code: 'job_moved',
      message: `The owner moved this job to Ada; your finish at ${hhmm(tap(520))} was kept as your log.`,
    });
    expect((await t.db('assignments').where({ id }).first()).state).toBe('planned');
    expect(await kept()).toContainEqual(
      expect.objectContaining({ job: { id, exists: true }, outcome: 'job_moved', input: { acres: 80 }, by: farm.operator.name }),
    );
    // Ada has the job now: her start applies.
    expect((await send(adaC, id, { type: 'start', at: tap(530), clientEventId: randomUUID() })).status).toBe(201);
  });

  it("when someone sends an action on another person's job, or reuses another person's action id, then 403 and nothing is recorded", async () => {
    const mine = await job();
    const hers = await job(ada);
    const recorded = async () => Number((await t.db('client_events').where({ farm_id: farm.id }).count({ n: '*' }))[0].n);
    const before = await recorded();
    const notMine = await send(tomasC, hers, { type: 'start', at: tap(0), clientEventId: randomUUID() });
    expect(notMine.status).toBe(403);
    const tomasStart = { type: 'start', at: tap(0), clientEventId: randomUUID() };
    expect((await send(tomasC, mine, tomasStart)).status).toBe(201);
    const reused = await send(adaC, hers, tomasStart);
    expect(reused.status).toBe(403);
    expect(reused.body.error.message).toBe('That action was sent by someone else; nothing was changed');
    expect((await t.db('assignments').where({ id: hers }).first()).state).toBe('planned');
    expect(await recorded()).toBe(before + 1);
  });

  it('when the tapped time is far ahead of the server or long before the job, then 400 with the reason and nothing is logged', async () => {
    const id = await job();
    const ahead = await send(tomasC, id, {
      type: 'start',
      at: new Date(Date.now() + 30 * 60_000).toISOString(),
      clientEventId: randomUUID(),
    });
    expect(ahead.status).toBe(400);
    expect(ahead.body.error).toMatchObject({ code: 'at_in_future', fields: { at: 'In the future' } });
    const old = await send(tomasC, id, { type: 'start', at: new Date(base - 20 * 86_400_000).toISOString(), clientEventId: randomUUID() });
    expect(old.status).toBe(400);
    expect(old.body.error.code).toBe('at_too_old');
    expect(old.body.error.message).toMatch(/more than 14 days before the job's day/);
    const ancient = await send(tomasC, id, { type: 'start', at: '2020-01-01T08:00:00Z' });
    expect(ancient.status).toBe(400);
    expect(await logged(id)).toEqual([]);
    expect((await board()).assignments.find((a: BoardAssignment) => a.id === id)!.state).toBe('planned');
  });

  it('when the phone asks for the short answer (Prefer: return=minimal, RFC 7240), then the action applies and the answer is its record; a replay answers the same', async () => {
    const id = await job();
    const start = { type: 'start', at: tap(0), engineHours: 1500, clientEventId: randomUUID() };
    const first = await send(tomasC, id, start).set('Prefer', 'return=minimal');
    expect(first.status).toBe(201);
    expect(first.headers['preference-applied']).toBe('return=minimal');
    const eventId = (await t.db('assignment_events').where({ assignment_id: id, type: 'start' }).first()).id;
    expect(first.body).toEqual({ clientEventId: start.clientEventId, id, state: 'underway', eventId });
    const again = await send(tomasC, id, start);
    expect({ status: again.status, body: again.body }).toEqual({ status: first.status, body: first.body });
    expect(await logged(id)).toEqual([{ type: 'start', at: tap(0) }]);
    // Without the preference, the answer is the whole job as before.
    const pause = await send(tomasC, id, { type: 'pause', at: tap(30), clientEventId: randomUUID() });
    expect(pause.body).toMatchObject({ id, state: 'paused', field: expect.objectContaining({ name: expect.any(String) }) });
  });

  it('when a problem report carries a device id and its time, then it is recorded once at that time; one for a deleted job is kept as a log', async () => {
    const id = await job();
    const report = { kind: 'other', note: 'Gate chain broken at the approach', at: tap(45), clientEventId: randomUUID() };
    const first = await tomasC.post(`/api/assignments/${id}/problems`, report).set('Prefer', 'return=minimal');
    expect(first.status).toBe(201);
    const again = await tomasC.post(`/api/assignments/${id}/problems`, report);
    expect({ status: again.status, body: again.body }).toEqual({ status: 201, body: first.body });
    expect(await logged(id)).toEqual([{ type: 'problem', at: tap(45) }]);

    const gone = await job();
    const b = await board();
    expect((await owner.delete(`/api/assignments/${gone}?version=${b.version}`)).status).toBe(200);
    const late = { kind: 'breakdown', note: 'Hydraulic hose split', at: tap(50), clientEventId: randomUUID() };
    const res = await tomasC.post(`/api/assignments/${gone}/problems`, late);
    expect(res.status).toBe(410);
    expect(res.body.error.message).toBe(`The owner deleted this job; your problem report at ${hhmm(tap(50))} was kept as your log.`);
    expect(await kept()).toContainEqual(
      expect.objectContaining({ job: { id: gone, exists: false }, type: 'problem', at: tap(50), outcome: 'job_deleted' }),
    );
  });
});
