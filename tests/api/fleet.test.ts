import { makeFarm, type TestFarm } from '../support/farm-factory';
import { Client, startTestApp, type TestApp } from '../support/test-app';

describe('fleet and crew', () => {
  let t: TestApp;
  let farm: TestFarm;
  let other: TestFarm;
  let owner: Client;
  let operator: Client;
  let viewer: Client;
  const count = async (table: string) => Number((await t.db(table).where({ farm_id: farm.id }).count({ n: '*' }))[0].n);

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Fleet');
    other = await makeFarm(t.db, 'Neighbour');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    operator = new Client(t.app);
    await operator.signIn(farm.operator.email, farm.operator.password);
    viewer = new Client(t.app);
    await viewer.signIn(farm.viewer.email, farm.viewer.password);
  });
  afterAll(() => t.close());

  it('when a tractor runs past its service interval, then serviceDueInHours goes negative with a warning', async () => {
    const res = await owner.post('/api/fleet/machines', {
      name: '4WD No. 1',
      kind: 'tractor-4wd',
      powerHp: 450,
      engineHours: 1200,
      serviceIntervalHours: 250,
      hoursAtLastService: 1000,
    });
    expect(res.status).toBe(201);
    // 1000 + 250 − 1200 = 50 h left: no warning yet (warning from 25 h).
    expect(res.body).toMatchObject({
      name: '4WD No. 1',
      kind: 'tractor-4wd',
      powerHp: 450,
      engineHours: 1200,
      serviceDueInHours: 50,
      serviceWarning: null,
    });
    const soon = await owner.patch(`/api/fleet/machines/${res.body.id}`, { engineHours: 1240 });
    expect(soon.body).toMatchObject({ serviceDueInHours: 10, serviceWarning: 'Service due in 10.0 h' });
    const late = await owner.patch(`/api/fleet/machines/${res.body.id}`, { engineHours: 1262.5 });
    expect(late.body).toMatchObject({ serviceDueInHours: -12.5, serviceWarning: 'Service overdue by 12.5 h' });
    const serviced = await owner.patch(`/api/fleet/machines/${res.body.id}`, { hoursAtLastService: 1262.5 });
    expect(serviced.body).toMatchObject({ serviceDueInHours: 250, serviceWarning: null });
    const seen = await viewer.get(`/api/fleet/machines/${res.body.id}`);
    expect(seen.status).toBe(200);
    expect(seen.body.name).toBe('4WD No. 1');
  });

  it('when the owner adds an implement, then its width (m), operations and machines come back and every member can read it', async () => {
    const sprayer = await owner.post('/api/fleet/machines', { name: 'Sprayer', kind: 'sprayer-sp', powerHp: 340 });
    const boom = await owner.post('/api/fleet/implements', {
      name: '120 ft boom',
      kind: 'sprayer',
      widthM: 36.576,
      transportWidthM: 4.2,
      operations: ['spraying'],
      machineIds: [sprayer.body.id],
    });
    expect(boom.status).toBe(201);
    expect(boom.body).toMatchObject({
      name: '120 ft boom',
      kind: 'sprayer',
      widthM: 36.576,
      transportWidthM: 4.2,
      operations: ['spraying'],
      machineIds: [sprayer.body.id],
      minPowerHp: null,
    });
    const list = await operator.get('/api/fleet/implements');
    expect(list.body.map((i: { id: number }) => i.id)).toContain(boom.body.id);
    const changed = await owner.patch(`/api/fleet/implements/${boom.body.id}`, { widthM: 27.432 });
    expect(changed.body).toMatchObject({ widthM: 27.432, machineIds: [sprayer.body.id] });
  });

  it('when the working width is negative, then 400 and nothing is stored', async () => {
    const before = await count('implements');
    const res = await owner.post('/api/fleet/implements', {
      name: 'Backwards harrow',
      kind: 'harrow',
      widthM: -25,
      operations: ['harrowing'],
    });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('widthM');
    expect(res.body.error.message).toMatch(/Working width must be more than 0/);
    expect(await count('implements')).toBe(before);
  });

  it('when the operation is unknown or the kind cannot do it, then 400 and nothing is stored', async () => {
    const before = await count('implements');
    const unknown = await owner.post('/api/fleet/implements', { name: 'Mystery', kind: 'harrow', widthM: 25, operations: ['ploughing'] });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.message).toMatch(/Operation must be one of/);
    const wrong = await owner.post('/api/fleet/implements', {
      name: 'Seeding harrow',
      kind: 'harrow',
      widthM: 25,
      operations: ['seeding'],
    });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.message).toMatch(/A harrow cannot do seeding/);
    expect(await count('implements')).toBe(before);
  });

  it("when an implement names another farm's machine, then 422 and nothing is stored or changed", async () => {
    const [theirs] = await t
      .db('machines')
      .insert({ farm_id: other.id, name: 'Their tractor', kind: 'tractor-4wd', power_hp: 400 })
      .returning('id');
    const before = await count('implements');
    const res = await owner.post('/api/fleet/implements', {
      name: 'Borrowed drill',
      kind: 'air-drill',
      widthM: 18.288,
      operations: ['seeding'],
      machineIds: [theirs.id],
    });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/is not in this farm's fleet/);
    expect(await count('implements')).toBe(before);

    const mine = await owner.post('/api/fleet/implements', {
      name: 'Own drill',
      kind: 'air-drill',
      widthM: 18.288,
      operations: ['seeding'],
    });
    const patched = await owner.patch(`/api/fleet/implements/${mine.body.id}`, { machineIds: [theirs.id] });
    expect(patched.status).toBe(422);
    expect(await t.db('implement_hitches').where({ implement_id: mine.body.id })).toEqual([]);
  });

  it('when a machine has bad numbers or a taken name, then 4xx and nothing is stored', async () => {
    const before = await count('machines');
    expect((await owner.post('/api/fleet/machines', { name: 'Weak', kind: 'tractor-mfwd', powerHp: 0 })).status).toBe(400);
    expect((await owner.post('/api/fleet/machines', { name: 'Odd', kind: 'hovercraft', powerHp: 100 })).status).toBe(400);
    const late = await owner.post('/api/fleet/machines', {
      name: 'Late',
      kind: 'tractor-mfwd',
      powerHp: 180,
      engineHours: 100,
      hoursAtLastService: 150,
    });
    expect(late.status).toBe(422);
    expect(late.body.error.message).toMatch(/last service \(150\.0 h\) cannot be later than the meter reading \(100\.0 h\)/);
    expect((await owner.post('/api/fleet/machines', { name: '4wd no. 1', kind: 'tractor-4wd', powerHp: 400 })).status).toBe(409);
    expect(await count('machines')).toBe(before);
  });

  it('when an operator or viewer tries to change the fleet, then 403 and nothing changes', async () => {
    const before = await count('machines');
    expect((await operator.post('/api/fleet/machines', { name: 'Sneaky', kind: 'tractor-4wd', powerHp: 400 })).status).toBe(403);
    expect((await viewer.post('/api/fleet/machines', { name: 'Sneaky', kind: 'tractor-4wd', powerHp: 400 })).status).toBe(403);
    expect(await count('machines')).toBe(before);
  });

  it('when the owner sets skills, then the crew lists them and "none" removes one', async () => {
    const op = farm.operator.membershipId;
    expect((await owner.put(`/api/crew/${op}/skills/harrowing`, { level: 'learning' })).body.skills).toEqual({ harrowing: 'learning' });
    await owner.put(`/api/crew/${op}/skills/seeding`, { level: 'mentor' });
    const crew = await viewer.get('/api/crew');
    expect(crew.status).toBe(200);
    expect(crew.body.find((c: { membershipId: number }) => c.membershipId === op)).toMatchObject({
      role: 'operator',
      skills: { harrowing: 'learning', seeding: 'mentor' },
    });
    const none = await owner.put(`/api/crew/${op}/skills/harrowing`, { level: 'none' });
    expect(none.body.skills).toEqual({ seeding: 'mentor' });
  });

  it('when a skill is bad or for a viewer or another farm, then 4xx and nothing is stored', async () => {
    const before = await count('crew_skills');
    expect((await owner.put(`/api/crew/${farm.operator.membershipId}/skills/harrowing`, { level: 'expert' })).status).toBe(400);
    expect((await owner.put(`/api/crew/${farm.operator.membershipId}/skills/ploughing`, { level: 'qualified' })).status).toBe(400);
    const v = await owner.put(`/api/crew/${farm.viewer.membershipId}/skills/harrowing`, { level: 'qualified' });
    expect(v.status).toBe(422);
    expect(v.body.error.message).toMatch(/is a viewer/);
    expect((await owner.put(`/api/crew/${other.operator.membershipId}/skills/harrowing`, { level: 'qualified' })).status).toBe(404);
    expect(await count('crew_skills')).toBe(before);
  });

  it('when a machine has jobs in the log, then it cannot be deleted (409) and stays', async () => {
    const m = await owner.post('/api/fleet/machines', { name: 'Old MFWD', kind: 'tractor-mfwd', powerHp: 180 });
    const i = await owner.post('/api/fleet/implements', { name: 'Old harrow', kind: 'harrow', widthM: 15, operations: ['harrowing'] });
    const [f] = await t
      .db('fields')
      .insert({
        farm_id: farm.id,
        name: 'Used field',
        boundary: JSON.stringify({ type: 'Polygon', coordinates: [] }),
        area_m2: 1,
        acres: 1,
      })
      .returning('id');
    await t.db('assignments').insert({
      farm_id: farm.id,
      day: '2026-05-01',
      field_id: f.id,
      operation: 'harrowing',
      operator_id: farm.operator.membershipId,
      machine_id: m.body.id,
      implement_id: i.body.id,
      run_order: 1,
      acres_planned: 1,
    });
    const res = await owner.delete(`/api/fleet/machines/${m.body.id}`);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/Old MFWD has jobs/);
    expect((await owner.get(`/api/fleet/machines/${m.body.id}`)).status).toBe(200);
  });
});
