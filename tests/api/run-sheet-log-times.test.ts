// When a logged time does not fit the job's log in tap order, the message names the times at the
// farm's clock, not as UTC timestamps. The expected text comes from
// luxon with the IANA time zone database, not from the app's code.
import { DateTime } from 'luxon';
import type { Board } from '../../shared/schemas/board';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';

describe("run-sheet log times in the farm's zone", () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let operator: Client;

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Log zones');
    await t.db('farms').where({ id: farm.id }).update({ time_zone: 'America/Winnipeg' });
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    operator = new Client(t.app);
    await operator.signIn(farm.operator.email, farm.operator.password);
    await t
      .db('crew_skills')
      .insert({ farm_id: farm.id, membership_id: farm.operator.membershipId, operation: 'harrowing', level: 'qualified' });
  });
  afterAll(() => t.close());

  it('when a pause is logged before the start, then the refusal names both times at the farm clock', async () => {
    const d = '2026-03-08';
    const [{ id: fieldId }] = await t
      .db('fields')
      .insert({
        farm_id: farm.id,
        name: 'Yard Quarter',
        boundary: JSON.stringify(rect(-97.2, 49.8, 0.003, 0.003)),
        area_m2: 40 * 4046.86,
        acres: 40,
      })
      .returning('id');
    const version = ((await owner.get(`/api/board?date=${d}`)).body as Board).version;
    const created = await owner.post('/api/assignments', {
      version,
      date: d,
      operation: 'harrowing',
      fieldId,
      operatorId: farm.operator.membershipId,
      machineId: await insertMachine(t.db, farm.id),
      implementId: await insertImplement(t.db, farm.id),
    });
    expect(created.status).toBe(201);
    const id = created.body.savedAssignmentId as number;
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
