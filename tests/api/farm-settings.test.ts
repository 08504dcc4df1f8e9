// The farm's own settings: the owner changes them, every member's session follows, bad values are
// refused with a reason and change nothing.
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { Client, startTestApp, type TestApp } from '../support/test-app';

describe('farm settings', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let operator: Client;

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Settings');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    operator = new Client(t.app);
    await operator.signIn(farm.operator.email, farm.operator.password);
  });
  afterAll(() => t.close());

  it('when a farm is new, then it keeps Central time and members see its settings', async () => {
    const res = await operator.get('/api/farm');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ id: farm.id, name: farm.name, units: 'us', dayHoursLimit: 12, timeZone: 'America/Chicago' });
    expect((await operator.get('/api/auth/me')).body.farm.timeZone).toBe('America/Chicago');
  });

  it('when the owner sets a time zone and the day hours, then both are saved and every session follows', async () => {
    const res = await owner.patch('/api/farm', { timeZone: 'America/Regina', dayHoursLimit: 10.5 });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ timeZone: 'America/Regina', dayHoursLimit: 10.5 });
    expect((await operator.get('/api/auth/me')).body.farm.timeZone).toBe('America/Regina');
    const row = await t.db('farms').where({ id: farm.id }).first('time_zone', 'day_hours_limit');
    expect(row).toEqual({ time_zone: 'America/Regina', day_hours_limit: 10.5 });
  });

  it.each([
    [{ timeZone: 'America/Chicgo' }, 'timeZone', /not a time zone we know/],
    [{ timeZone: 'Central' }, 'timeZone', /not a time zone we know/],
    [{ timeZone: '../../etc/passwd' }, 'timeZone', /not a time zone we know/],
    [{ dayHoursLimit: 25 }, 'dayHoursLimit', /24 hours/],
    [{ dayHoursLimit: 0 }, 'dayHoursLimit', /at least 1 hour/],
    [{ name: '   ' }, 'name', /needs a name/],
  ])('when the owner sends %j, then 400 names the field and nothing changes', async (patch, field, message) => {
    const before = await t.db('farms').where({ id: farm.id }).first();
    const res = await owner.patch('/api/farm', patch);
    expect(res.status).toBe(400);
    expect(res.body.error.fields[field]).toMatch(message);
    expect(await t.db('farms').where({ id: farm.id }).first()).toEqual(before);
  });

  it('when an operator tries to change the time zone, then 403 and nothing changes', async () => {
    const res = await operator.patch('/api/farm', { timeZone: 'UTC' });
    expect(res.status).toBe(403);
    expect((await t.db('farms').where({ id: farm.id }).first('time_zone')).time_zone).toBe('America/Regina');
  });

  it("when the season picker is opened, then its current season is the year at the farm (its zone, not the server's)", async () => {
    // The year boundary itself is checked in shared/calendar.spec.ts.
    const viewer = new Client(t.app);
    await viewer.signIn(farm.viewer.email, farm.viewer.password);
    const index = await viewer.get('/api/season');
    expect(index.status).toBe(200);
    const farmYear = Number(new Intl.DateTimeFormat('en-US', { timeZone: 'America/Regina', year: 'numeric' }).format(new Date()));
    expect(index.body.current).toBe(farmYear);
  });
});
