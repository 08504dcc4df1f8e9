// When a logged time does not fit the job's log in tap order, the message names the times at the
// farm's clock, not as UTC timestamps. The expected text comes from
// luxon with the IANA time zone database, not from the app's code.
import { randomUUID } from 'node:crypto';
import { DateTime } from 'luxon';
import type { Board } from '../../shared/schemas/board';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';

/** A test app with a farm in `zone`, its operator qualified for harrowing; owner and operator signed in. */
async function farmIn(name: string, zone: string): Promise<{ t: TestApp; farm: TestFarm; owner: Client; operator: Client }> {
  const t = await startTestApp();
  const farm = await makeFarm(t.db, name);
  await t.db('farms').where({ id: farm.id }).update({ time_zone: zone });
  const owner = new Client(t.app);
  await owner.signIn(farm.owner.email, farm.owner.password);
  const operator = new Client(t.app);
  await operator.signIn(farm.operator.email, farm.operator.password);
  await t
    .db('crew_skills')
    .insert({ farm_id: farm.id, membership_id: farm.operator.membershipId, operation: 'harrowing', level: 'qualified' });
  return { t, farm, owner, operator };
}

/** A harrowing job on `day`, for the farm's operator, on a new 40 ac field; its id. */
async function harrowingJob(
  { t, farm, owner }: { t: TestApp; farm: TestFarm; owner: Client },
  day: string,
  field: { name: string; boundary: object },
): Promise<number> {
  const [{ id: fieldId }] = await t
    .db('fields')
    .insert({ farm_id: farm.id, name: field.name, boundary: JSON.stringify(field.boundary), area_m2: 40 * 4046.86, acres: 40 })
    .returning('id');
  const version = ((await owner.get(`/api/board?date=${day}`)).body as Board).version;
  const created = await owner.post('/api/assignments', {
    version,
    date: day,
    operation: 'harrowing',
    fieldId,
    operatorId: farm.operator.membershipId,
    machineId: await insertMachine(t.db, farm.id),
    implementId: await insertImplement(t.db, farm.id),
  });
  expect(created.status).toBe(201);
  return created.body.savedAssignmentId as number;
}

describe("run-sheet log times in the farm's zone", () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let operator: Client;

  beforeAll(async () => {
    ({ t, farm, owner, operator } = await farmIn('Log zones', 'America/Winnipeg'));
  });
  afterAll(() => t.close());

  it('when a pause is logged before the start, then the refusal names both times at the farm clock', async () => {
    const d = '2026-03-08';
    const id = await harrowingJob({ t, farm, owner }, d, { name: 'Yard Quarter', boundary: rect(-97.2, 49.8, 0.003, 0.003) });
    // The first minute of daylight time in Winnipeg: 02:00 CST became 03:00 CDT at 08:00 UTC.
    const started = '2026-03-08T08:00:00Z';
    expect((await operator.post(`/api/assignments/${id}/events`, { type: 'start', at: started })).status).toBe(201);
    const res = await operator.post(`/api/assignments/${id}/events`, { type: 'pause', at: '2026-03-08T07:30:00Z' });
    expect(res.status).toBe(409);
    const clock = (iso: string) => DateTime.fromISO(iso, { zone: 'America/Winnipeg' }).toFormat('HH:mm');
    expect(clock(started)).toBe('03:00');
    expect(clock('2026-03-08T07:30:00Z')).toBe('01:30');
    expect(res.body.error.message).toBe('This job had not been started by 01:30: it cannot be paused then.');
  });
});

// Kiritimati keeps UTC+14 all year (IANA tz database): its day starts at 10:00 UTC the day before,
// so the farm's date of a tap and its UTC date differ for most of the day. Expected days and
// labels come from luxon with that database, not from the app's code.
describe("a start before the job's day at the farm", () => {
  const zone = 'Pacific/Kiritimati';
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let operator: Client;
  let n = 0;
  const today = () => DateTime.now().setZone(zone).toISODate()!;
  const plusDays = (day: string, d: number) => DateTime.fromISO(day).plus({ days: d }).toISODate()!;
  /** The instant of `clock` ('HH:mm') on `day` at the farm. */
  const farmInstant = (day: string, clock: string) => DateTime.fromISO(`${day}T${clock}`, { zone }).toUTC().toISO()!;
  const label = (day: string) => DateTime.fromISO(day).setLocale('en-US').toFormat('ccc, LLL d');

  const job = (day: string): Promise<number> =>
    harrowingJob({ t, farm, owner }, day, { name: `Atoll ${++n}`, boundary: rect(-157.4 + n * 0.01, 1.9, 0.003, 0.003) });
  const start = (id: number, body: object = {}) => operator.post(`/api/assignments/${id}/events`, { type: 'start', ...body });
  const stateOf = async (id: number) => (await t.db('assignments').where({ id }).first()).state as string;
  const events = async (id: number) => Number((await t.db('assignment_events').where({ assignment_id: id }).count({ n: '*' }))[0].n);

  beforeAll(async () => {
    ({ t, farm, owner, operator } = await farmIn('Start day', zone));
  });
  afterAll(() => t.close());

  it("when an operator taps Start on tomorrow's job, then 409 with the job's day in words and the job stays planned", async () => {
    const tomorrow = plusDays(today(), 1);
    const id = await job(tomorrow);
    const res = await start(id);
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({
      code: 'start_before_day',
      message: `This job is for ${label(tomorrow)}; it can be started from that day.`,
    });
    expect(await stateOf(id)).toBe('planned');
    expect(await events(id)).toBe(0);
  });

  it('when a start tapped at 23:59 the evening before arrives from the outbox, then it is kept with that reason, a replay answers the same, and a start at 00:01 on the day applies', async () => {
    const day = today();
    const id = await job(day);
    const evening = farmInstant(plusDays(day, -1), '23:59');
    // 23:59 at the farm (UTC+14) is 09:59 UTC the same calendar day.
    expect(evening.slice(0, 10)).toBe(plusDays(day, -1));
    const tap = { at: evening, clientEventId: randomUUID() };
    const first = await start(id, tap);
    expect(first.status).toBe(409);
    expect(first.body.error).toMatchObject({
      code: 'start_before_day',
      message: `This job is for ${label(day)}; it can be started from that day. Your start at 23:59 was not applied; it is kept on record with the job.`,
    });
    const again = await start(id, tap);
    expect(again.status).toBe(409);
    expect(again.body).toEqual(first.body);
    expect(await stateOf(id)).toBe('planned');

    // 00:01 at the farm on the job's day: 10:01 UTC on the calendar day before, which a UTC date would refuse.
    const justAfterMidnight = farmInstant(day, '00:01');
    expect(justAfterMidnight.slice(0, 10)).toBe(plusDays(day, -1));
    const ok = await start(id, { at: justAfterMidnight, clientEventId: randomUUID() });
    expect(ok.status).toBe(201);
    expect(await stateOf(id)).toBe('underway');
  });

  it('when a job of three days ago is started now, then the late start applies', async () => {
    const id = await job(plusDays(today(), -3));
    expect((await start(id)).status).toBe(201);
    expect(await stateOf(id)).toBe('underway');
  });
});
