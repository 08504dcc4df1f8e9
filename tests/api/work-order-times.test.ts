// A work order's times are the farm's clock and say which zone they are in, so an operator whose
// phone or laptop is set to another zone reads them right. The expected zone names come from luxon
// with the IANA time zone database, not from the app's code.
import { DateTime } from 'luxon';
import type { Board } from '../../shared/schemas/board';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';

describe("work-order e-mail times in the farm's zone", () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let fieldId: number;
  let machineId: number;
  let implementId: number;

  const board = async (date: string): Promise<Board> => (await owner.get(`/api/board?date=${date}`)).body;
  const publishOne = async (date: string, startTime: string, endTime: string): Promise<string> => {
    const res = await owner.post('/api/assignments', {
      version: (await board(date)).version,
      date,
      operation: 'harrowing',
      fieldId,
      operatorId: farm.operator.membershipId,
      machineId,
      implementId,
      startTime,
      endTime,
    });
    expect(res.status).toBe(201);
    expect((await owner.post(`/api/board/${date}/publish`, {})).status).toBe(200);
    for (let i = 0; i < 50; i++) {
      await t.flushMail();
      const [{ n }] = await t.db('mail_outbox').where({ farm_id: farm.id, status: 'queued' }).count({ n: '*' });
      if (Number(n) === 0) break;
      await new Promise((r) => setTimeout(r, 100));
    }
    const label = DateTime.fromISO(date).setLocale('en-US').toFormat('LLLL d, yyyy');
    const mails = t.mail.to(farm.operator.email).filter((m) => m.subject.includes(label));
    expect(mails).toHaveLength(1);
    return mails[0].text;
  };
  /** The zone's abbreviation at a wall-clock time on a day there (luxon, IANA data). */
  const zoneAt = (date: string, hhmm: string, zone: string) => DateTime.fromISO(`${date}T${hhmm}`, { zone }).toFormat('ZZZZ');

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Zones');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    await t
      .db('crew_skills')
      .insert({ farm_id: farm.id, membership_id: farm.operator.membershipId, operation: 'harrowing', level: 'qualified' });
    // A small field, so a few hours' window holds the work.
    [{ id: fieldId }] = await t
      .db('fields')
      .insert({
        farm_id: farm.id,
        name: 'Home Quarter',
        boundary: JSON.stringify(rect(-97.1, 49.9, 0.003, 0.003)),
        area_m2: 40 * 4046.86,
        acres: 40,
      })
      .returning('id');
    machineId = await insertMachine(t.db, farm.id, { name: '4WD No. 3' });
    implementId = await insertImplement(t.db, farm.id, { name: '84 ft harrow', width_m: 25.6032 });
  });
  afterAll(() => t.close());

  it('when a Regina farm publishes a summer day, then the order says CST (Saskatchewan keeps standard time all year)', async () => {
    await t.db('farms').where({ id: farm.id }).update({ time_zone: 'America/Regina' });
    const d = '2026-07-07';
    const text = await publishOne(d, '07:00', '11:00');
    // tz database "northamerica": America/Regina is CST (UTC-6) all year.
    expect(zoneAt(d, '07:00', 'America/Regina')).toBe('CST');
    expect(text).toContain(`Home Quarter: Harrowing, 07:00–11:00 ${zoneAt(d, '07:00', 'America/Regina')}, 40.0 ac`);
  });

  it('when a Winnipeg farm publishes a summer day, then the same times say CDT', async () => {
    await t.db('farms').where({ id: farm.id }).update({ time_zone: 'America/Winnipeg' });
    const d = '2026-07-08';
    const text = await publishOne(d, '07:00', '11:00');
    expect(zoneAt(d, '07:00', 'America/Winnipeg')).toBe('CDT');
    expect(text).toContain(`Home Quarter: Harrowing, 07:00–11:00 ${zoneAt(d, '07:00', 'America/Winnipeg')}, 40.0 ac`);
  });

  it('when a Winnipeg job runs across the night the clocks go forward (2026-03-08 02:00), then its start says CST and its end CDT', async () => {
    await t.db('farms').where({ id: farm.id }).update({ time_zone: 'America/Winnipeg' });
    const d = '2026-03-08';
    const text = await publishOne(d, '01:00', '06:00');
    const [from, to] = [zoneAt(d, '01:00', 'America/Winnipeg'), zoneAt(d, '06:00', 'America/Winnipeg')];
    expect([from, to]).toEqual(['CST', 'CDT']);
    expect(text).toContain(`Home Quarter: Harrowing, 01:00 ${from}–06:00 ${to}, 40.0 ac`);
  });
});
