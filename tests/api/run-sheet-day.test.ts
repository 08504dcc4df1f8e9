// The run sheet's day and its hours: it opens on the person's next day with work, and a finished
// job's worked engine hours come from the meter, apart from the clock time between the taps.
import { dayIn } from '../../shared/calendar';
import type { Board } from '../../shared/schemas/board';
import type { RunSheet } from '../../shared/schemas/run-sheet';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';

/** The day `n` days after an ISO day, counted on the calendar (UTC arithmetic: no clock shifts). */
const plus = (day: string, n: number): string => new Date(Date.parse(`${day}T00:00:00Z`) + n * 86_400_000).toISOString().slice(0, 10);

describe('run sheet: the day it opens on, and hours from the meter', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let operator: Client;
  let tractor: number;
  let harrow: number;
  let today: string;
  let n = 0;

  const field = async (): Promise<number> => {
    const [f] = await t
      .db('fields')
      .insert({
        farm_id: farm.id,
        name: `Section ${++n}`,
        boundary: JSON.stringify(rect(-98.9 + n * 0.01, 46.6, 0.005, 0.005)),
        area_m2: 160 * 4046.86,
        acres: 160,
      })
      .returning('id');
    return f.id;
  };
  const board = async (date: string): Promise<Board> => (await owner.get(`/api/board?date=${date}`)).body;
  const add = async (date: string, card: Record<string, unknown> = {}): Promise<number> => {
    const res = await owner.post('/api/assignments', {
      version: (await board(date)).version,
      date,
      operation: 'harrowing',
      fieldId: await field(),
      machineId: tractor,
      implementId: harrow,
      operatorId: farm.operator.membershipId,
      ...card,
    });
    expect(res.status).toBe(201);
    return res.body.savedAssignmentId;
  };
  const publish = async (date: string) => {
    const res = await owner.post(`/api/board/${date}/publish`, { version: (await board(date)).version });
    expect([res.status, res.body.error?.message]).toEqual([200, undefined]);
  };
  const open = async (c: Client = operator): Promise<RunSheet> => {
    const res = await c.get('/api/run-sheet');
    expect(res.status).toBe(200);
    return res.body;
  };

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Day');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    operator = new Client(t.app);
    await operator.signIn(farm.operator.email, farm.operator.password);
    tractor = await insertMachine(t.db, farm.id, { name: '4WD No. 2', engine_hours: 2781 });
    harrow = await insertImplement(t.db, farm.id);
    // Today at the farm, the way the server reckons it: the farm's own time zone (America/Chicago by default).
    const { time_zone } = await t.db('farms').where({ id: farm.id }).first('time_zone');
    today = dayIn(time_zone);
  });
  afterAll(() => t.close());

  it('when the operator has no work at all, then the sheet opens on today, empty, and says there is no work ahead', async () => {
    const sheet = await open();
    expect(sheet).toMatchObject({ date: today, today, opened: 'no-work-ahead', assignments: [] });
  });

  it('when the only later work is on a board not yet published, then the sheet stays on today', async () => {
    await add(plus(today, 2));
    expect(await open()).toMatchObject({ date: today, opened: 'no-work-ahead' });
  });

  it('when there is no work today, then the sheet opens on the first published day after with work for that person, and says so', async () => {
    // Day +2 holds unpublished work (above); day +3 is published but holds only someone else's job;
    // day +4 is published with the operator's job: that is the day.
    const other = farm.owner.membershipId;
    await t.db('crew_skills').insert(
      [other, farm.operator.membershipId].map((membership_id) => ({
        farm_id: farm.id,
        membership_id,
        operation: 'harrowing',
        level: 'qualified',
      })),
    );
    await add(plus(today, 3), { operatorId: other });
    await publish(plus(today, 3));
    const id = await add(plus(today, 4));
    await add(plus(today, 6));
    await publish(plus(today, 4));
    await publish(plus(today, 6));
    const sheet = await open();
    expect(sheet).toMatchObject({ date: plus(today, 4), today, opened: 'next-day-with-work' });
    expect(sheet.assignments.map((a) => a.id)).toEqual([id]);
    // A date in the address is kept as asked.
    expect((await operator.get(`/api/run-sheet?date=${plus(today, 6)}`)).body).toMatchObject({ date: plus(today, 6), opened: 'asked' });
    // The owner opening the operator's sheet gets the operator's day, not their own.
    expect(await open(owner)).toMatchObject({ date: plus(today, 3), opened: 'next-day-with-work' });
    expect((await owner.get(`/api/run-sheet?membershipId=${farm.operator.membershipId}`)).body).toMatchObject({ date: plus(today, 4) });
  });

  it('when a published later job is called off, then it is not work to open on', async () => {
    const first = (await open()).assignments[0].id;
    expect((await operator.post(`/api/assignments/${first}/events`, { type: 'call-off', reason: 'weather' })).status).toBe(201);
    expect(await open()).toMatchObject({ date: plus(today, 6), opened: 'next-day-with-work' });
  });

  it('when the operator has work today (published or not), then the sheet opens on today', async () => {
    await add(today);
    expect(await open()).toMatchObject({ date: today, opened: 'today' });
  });

  it('when a job starts at meter 2781 and finishes at 2789.4 a minute later, then it worked 8.4 engine hours, and the clock time is kept apart', async () => {
    const id = (await open()).assignments[0].id;
    const started = new Date(Date.now() - 60_000).toISOString();
    expect((await operator.post(`/api/assignments/${id}/events`, { type: 'start', engineHours: 2781, at: started })).status).toBe(201);
    const done = await operator.post(`/api/assignments/${id}/events`, { type: 'finish', engineHours: 2789.4, acres: 160 });
    expect(done.status).toBe(201);
    // The worked example: 2789.4 − 2781 = 8.4 h on the meter (plain subtraction to the meter's tenth).
    expect(done.body.worked.engineHours).toBe(8.4);
    // The taps were about a minute apart: 1/60 h ≈ 0.02 h of clock time (hours to two decimals).
    expect(done.body.worked.clockHours).toBeGreaterThanOrEqual(0.01);
    expect(done.body.worked.clockHours).toBeLessThanOrEqual(0.03);
    expect(done.body.log).toMatchObject({ engineHoursStart: 2781, engineHoursEnd: 2789.4 });
    // The sheet read afresh says the same.
    const again = (await open()).assignments.find((a) => a.id === id)!;
    expect(again.worked.engineHours).toBe(8.4);
    // The owner corrects the end reading: the worked engine hours follow (2790 − 2781 = 9).
    const fixed = await owner.patch(`/api/assignments/${id}/log`, { engineHoursEnd: 2790 });
    expect(fixed.body.worked).toMatchObject({ engineHours: 9 });
  });

  it('when a job has no meter reading at the start, then its engine hours are unknown rather than 0', async () => {
    const id = await add(today, { machineId: await insertMachine(t.db, farm.id, { engine_hours: 500 }) });
    await operator.post(`/api/assignments/${id}/events`, { type: 'start' });
    const done = await operator.post(`/api/assignments/${id}/events`, { type: 'finish', engineHours: 504 });
    expect(done.body.worked.engineHours).toBeNull();
    expect(done.body.worked.clockHours).not.toBeNull();
  });
});
