import bcrypt from 'bcryptjs';
import { OPERATION_INFO } from '../../shared/operations';
import type { Board } from '../../shared/schemas/board';
import type { RunSheet, RunSheetItem } from '../../shared/schemas/run-sheet';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';

describe('run sheet', () => {
  let t: TestApp;
  let farm: TestFarm;
  let other: TestFarm;
  let owner: Client;
  let tomasC: Client;
  let adaC: Client;
  let viewer: Client;
  let tomas: number;
  let ada: number;
  let milo: number;
  let tractor: number;
  let harrow: number;
  let n = 0;

  const field = async (acres: number): Promise<number> => {
    const [f] = await t
      .db('fields')
      .insert({
        farm_id: farm.id,
        name: `Quarter ${++n}`,
        boundary: JSON.stringify(rect(-99.9 + n * 0.01, 47.6, 0.005, 0.005)),
        area_m2: acres * 4046.86,
        acres,
      })
      .returning('id');
    return f.id;
  };
  const board = async (date: string): Promise<Board> => (await owner.get(`/api/board?date=${date}`)).body;
  const add = async (date: string, card: Record<string, unknown>): Promise<number> => {
    const res = await owner.post('/api/assignments', {
      version: (await board(date)).version,
      date,
      operation: 'harrowing',
      machineId: tractor,
      implementId: harrow,
      operatorId: tomas,
      ...card,
    });
    expect(res.status).toBe(201);
    return res.body.savedAssignmentId;
  };
  const event = (c: Client, id: number, body: object) => c.post(`/api/assignments/${id}/events`, body);
  const meter = async (id = tractor) => (await t.db('machines').where({ id }).first()).engine_hours;

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Sheet');
    other = await makeFarm(t.db, 'Away');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    tomasC = new Client(t.app);
    await tomasC.signIn(farm.operator.email, farm.operator.password);
    viewer = new Client(t.app);
    await viewer.signIn(farm.viewer.email, farm.viewer.password);
    tomas = farm.operator.membershipId;
    const person = async (name: string) => {
      const email = `${name.toLowerCase()}-${farm.id}@furlong.test`;
      const [u] = await t
        .db('users')
        .insert({ email, name, password_hash: bcrypt.hashSync('operator-password', 4) })
        .returning('id');
      return {
        email,
        id: (await t.db('memberships').insert({ farm_id: farm.id, user_id: u.id, role: 'operator', status: 'active' }).returning('id'))[0]
          .id as number,
      };
    };
    const a = await person('Ada');
    ada = a.id;
    adaC = new Client(t.app);
    await adaC.signIn(a.email, 'operator-password');
    milo = (await person('Milo')).id;
    tractor = await insertMachine(t.db, farm.id, { name: '4WD No. 1', engine_hours: 1200 });
    harrow = await insertImplement(t.db, farm.id, { name: '84 ft heavy harrow', width_m: 25.6032 });
  });
  afterAll(() => t.close());

  it('when an operator opens the run sheet, then it lists their jobs (as operator and mentor) in running order with map, hazards, pass plan, machine, implement, cautions and note', async () => {
    const d = '2026-08-01';
    const f1 = await field(160);
    const f2 = await field(80);
    await t.db('hazards').insert({
      farm_id: farm.id,
      field_id: f1,
      kind: 'bin',
      geometry: JSON.stringify({ type: 'Point', coordinates: [-99.89, 47.601] }),
      clearance_m: 15,
      note: 'Two bins',
    });
    await t.db('pass_plans').insert({
      farm_id: farm.id,
      field_id: f1,
      operation: 'harrowing',
      width_m: 25.6,
      headland_passes: 2,
      heading_deg: null,
      coverage: 'gaps-ok',
      speed_mps: 3.12928, // 7 mph
      efficiency: 0.85,
      turn_seconds: 20,
      summary: JSON.stringify({ hours: 2.5, headingDeg: 91, passCount: 14 }),
    });
    const first = await add(d, { fieldId: f1, note: 'Fuel up first' });
    const second = await add(d, { fieldId: f2 });
    const mentored = await add(d, {
      fieldId: f2,
      operatorId: milo,
      mentorId: tomas,
      machineId: await insertMachine(t.db, farm.id),
      implementId: await insertImplement(t.db, farm.id),
      startTime: '16:00',
    });
    await add(d, {
      fieldId: await field(50),
      operatorId: ada,
      machineId: await insertMachine(t.db, farm.id),
      implementId: await insertImplement(t.db, farm.id),
    });

    const res = await tomasC.get(`/api/run-sheet?date=${d}`);
    expect(res.status).toBe(200);
    const sheet: RunSheet = res.body;
    expect(sheet.person).toEqual({ membershipId: tomas, name: farm.operator.name });
    expect(sheet.assignments.map((a) => [a.id, a.role])).toEqual([
      [first, 'operator'],
      [second, 'operator'],
      [mentored, 'mentor'],
    ]);
    const one: RunSheetItem = sheet.assignments[0];
    expect(one.field).toMatchObject({ id: f1, acres: 160, boundary: { type: 'Polygon' } });
    expect(one.field.hazards.features[0].properties).toMatchObject({ kind: 'bin', clearanceM: 15, note: 'Two bins', status: 'confirmed' });
    expect(one.passPlan).toMatchObject({ headlandPasses: 2, widthM: 25.6, summary: { passCount: 14, headingDeg: 91 } });
    expect(one).toMatchObject({
      state: 'planned',
      note: 'Fuel up first',
      startTime: '07:00',
      endTime: '09:30',
      machine: { name: '4WD No. 1', engineHours: 1200 },
      implement: { name: '84 ft heavy harrow' },
      events: [],
    });
    expect(one.cautions).toEqual(OPERATION_INFO.harrowing.cautions);
    expect(sheet.assignments[1].passPlan).toBeNull();
  });

  it("when an operator asks for someone else's run sheet, then 403; the owner may; another farm's person is 404; a viewer gets 403", async () => {
    const d = '2026-08-01';
    expect((await tomasC.get(`/api/run-sheet?date=${d}&membershipId=${ada}`)).status).toBe(403);
    const mine = await tomasC.get(`/api/run-sheet?date=${d}&membershipId=${tomas}`);
    expect(mine.status).toBe(200);
    const asOwner = await owner.get(`/api/run-sheet?date=${d}&membershipId=${ada}`);
    expect(asOwner.status).toBe(200);
    expect(asOwner.body.assignments).toHaveLength(1);
    expect((await owner.get(`/api/run-sheet?date=${d}&membershipId=${other.operator.membershipId}`)).status).toBe(404);
    expect((await viewer.get(`/api/run-sheet?date=${d}`)).status).toBe(403);
  });

  it('when the operator starts, pauses, resumes and finishes, then the state follows and the hours worked leave out the pause', async () => {
    const id = await add('2026-08-02', { fieldId: await field(100) });
    const at = (hhmm: string) => `2026-08-02T${hhmm}:00-05:00`;
    expect((await event(tomasC, id, { type: 'start', at: at('08:00') })).body.state).toBe('underway');
    const again = await event(tomasC, id, { type: 'start' });
    expect(again.status).toBe(409);
    expect(again.body.error).toMatchObject({
      code: 'invalid_transition',
      message: 'This job is underway: it cannot be started. Only a planned job can be started.',
    });
    expect((await event(tomasC, id, { type: 'pause', at: at('10:00') })).body.state).toBe('paused');
    expect((await event(tomasC, id, { type: 'resume', at: at('10:30') })).body.state).toBe('underway');
    const done = await event(tomasC, id, { type: 'finish', at: at('12:00'), acres: 100 });
    expect(done.status).toBe(201);
    expect(done.body).toMatchObject({ state: 'finished', log: { acresDone: 100, hoursWorked: 3.5 } });
    expect(done.body.events.map((e: { type: string }) => e.type)).toEqual(['start', 'pause', 'resume', 'finish']);
    expect((await event(tomasC, id, { type: 'call-off', reason: 'weather' })).status).toBe(409);
  });

  it('when a job is called off, then a reason is needed (and a note for "other"), and it cannot be finished afterwards', async () => {
    const id = await add('2026-08-03', { fieldId: await field(100) });
    expect((await event(tomasC, id, { type: 'call-off' })).status).toBe(400);
    expect((await event(tomasC, id, { type: 'call-off', reason: 'other' })).body.error.fields).toHaveProperty('note');
    const off = await event(tomasC, id, { type: 'call-off', reason: 'weather', note: 'Rain at 6' });
    expect(off.body).toMatchObject({ state: 'called-off', log: { callOffReason: 'weather' } });
    expect((await event(tomasC, id, { type: 'finish' })).status).toBe(409);
  });

  it('when the engine hours run backwards, then 422 and nothing is logged; finishing moves the meter forward', async () => {
    const id = await add('2026-08-04', { fieldId: await field(100) });
    const low = await event(tomasC, id, { type: 'start', engineHours: 1150 });
    expect(low.status).toBe(422);
    expect(low.body.error).toMatchObject({ code: 'engine_hours_backwards' });
    expect(low.body.error.message).toMatch(/1,150\.0 h is less than the last reading of 4WD No\. 1, 1,200\.0 h/);
    expect((await t.db('assignments').where({ id }).first()).state).toBe('planned');
    expect(await t.db('assignment_events').where({ assignment_id: id })).toEqual([]);
    expect((await event(tomasC, id, { type: 'start', engineHours: 1210 })).status).toBe(201);
    const back = await event(tomasC, id, { type: 'finish', engineHours: 1205 });
    expect(back.status).toBe(422);
    expect(back.body.error.message).toMatch(/less than the reading at the start of this job, 1,210\.0 h/);
    expect((await t.db('assignments').where({ id }).first()).state).toBe('underway');
    const done = await event(tomasC, id, { type: 'finish', engineHours: 1216.5 });
    expect(done.body.log).toMatchObject({ engineHoursStart: 1210, engineHoursEnd: 1216.5 });
    expect(await meter()).toBe(1216.5);
  });

  it('when part of a field is finished, then the rest is still to do; when all of it is, then the field is done for that operation this season', async () => {
    const f = await field(160);
    const first = await add('2026-08-05', { fieldId: f });
    await event(tomasC, first, { type: 'start' });
    const tooMuch = await event(tomasC, first, { type: 'finish', acres: 200 });
    expect(tooMuch.status).toBe(422);
    // Written as every area is (shared/figures.ts): one decimal, so "160.0 ac", not "160 ac".
    expect(tooMuch.body.error.message).toMatch(
      /has 160\.0 ac left to do for harrowing this season; 200\.0 ac is more than that\. Check the acres\./,
    );
    // A metric farm reads its refusal in hectares: 160 ac = 64.7 ha, 200 ac = 80.9 ha (1 ac = 0.40468564224 ha, NIST SP 811).
    expect((await owner.patch('/api/farm', { units: 'metric' })).status).toBe(200);
    const inHectares = await event(tomasC, first, { type: 'finish', acres: 200 });
    expect((await owner.patch('/api/farm', { units: 'us' })).status).toBe(200);
    expect(inHectares.status).toBe(422);
    expect(inHectares.body.error.message).toMatch(
      /has 64\.7 ha left to do for harrowing this season; 80\.9 ha is more than that\. Check the hectares\./,
    );
    expect(inHectares.body.error.fields).toEqual({ acres: 'At most 64.7 ha' });
    await event(tomasC, first, { type: 'finish', acres: 100 });
    const rest = await add('2026-08-06', { fieldId: f });
    const b = await board('2026-08-06');
    expect(b.assignments.find((a) => a.id === rest)).toMatchObject({ acresPlanned: 60, acresToDo: 60 });
    expect(b.conflicts.filter((c) => c.code === 'field_finished')).toEqual([]);
    await event(tomasC, rest, { type: 'start' });
    const all = await event(tomasC, rest, { type: 'finish' });
    expect(all.body.log.acresDone).toBe(60);
    const later = await add('2026-08-07', { fieldId: f });
    const after = await board('2026-08-07');
    expect(after.assignments.find((a) => a.id === later)).toMatchObject({ acresToDo: 0 });
    expect(after.conflicts.filter((c) => c.code === 'field_finished').map((c) => c.assignmentIds)).toEqual([[later]]);
    // The owner was warned, and sent the job anyway: the field is harrowed a second time. The
    // operator's finish is taken for the new round (up to the whole field), never refused as
    // "0 ac left", which would leave the job underway with no way to finish it.
    await event(tomasC, later, { type: 'start' });
    const overRound = await event(tomasC, later, { type: 'finish', acres: 200 });
    expect(overRound.status).toBe(422);
    expect(overRound.body.error.message).toMatch(
      /was already done for harrowing this season; this round has 160\.0 ac left; 200\.0 ac is more than that\./,
    );
    const again = await event(tomasC, later, { type: 'finish', acres: 120 });
    expect(again.status).toBe(201);
    expect(again.body).toMatchObject({ state: 'finished', log: { acresDone: 120 } });
    // The second round has 40 ac left: a fourth job may log that much and no more.
    const fourth = await add('2026-08-07', { fieldId: f });
    await event(tomasC, fourth, { type: 'start' });
    expect((await event(tomasC, fourth, { type: 'finish', acres: 50 })).body.error.fields).toEqual({ acres: 'At most 40.0 ac' });
  });

  it("when the owner edits or deletes a finished job's log, then the season totals change", async () => {
    const f = await field(120);
    const id = await add('2026-08-08', { fieldId: f });
    await event(tomasC, id, { type: 'start' });
    await event(tomasC, id, { type: 'finish' });
    const totalDone = async () =>
      Number((await t.db('assignments').where({ field_id: f, state: 'finished' }).sum({ s: 'acres_done' }))[0].s ?? 0);
    expect(await totalDone()).toBe(120);
    expect((await tomasC.patch(`/api/assignments/${id}/log`, { acresDone: 50 })).status).toBe(403);
    const edited = await owner.patch(`/api/assignments/${id}/log`, { acresDone: 50, hoursWorked: 2.25 });
    expect(edited.status).toBe(200);
    expect(edited.body.log).toMatchObject({ acresDone: 50, hoursWorked: 2.25 });
    expect(edited.body.events.at(-1)).toMatchObject({ type: 'log-edited', by: farm.owner.name });
    expect(await totalDone()).toBe(50);
    const next = await add('2026-08-09', { fieldId: f });
    expect((await board('2026-08-09')).assignments.find((a) => a.id === next)!.acresToDo).toBe(70);
    expect((await owner.patch(`/api/assignments/${id}/log`, { engineHoursStart: 1300, engineHoursEnd: 1290 })).status).toBe(422);
    const removed = await owner.delete(`/api/assignments/${id}/log`);
    expect(removed.body).toMatchObject({ state: 'planned', log: { acresDone: null, hoursWorked: null } });
    expect(await totalDone()).toBe(0);
    expect((await board('2026-08-09')).assignments.find((a) => a.id === next)!.acresToDo).toBe(120);
    expect((await owner.delete(`/api/assignments/${id}/log`)).status).toBe(409);
  });

  it("when someone else's operator logs on a job, then 403; the mentor may report a problem but not start it", async () => {
    const id = await add('2026-08-10', {
      fieldId: await field(100),
      operatorId: milo,
      mentorId: ada,
      machineId: await insertMachine(t.db, farm.id),
    });
    expect((await event(tomasC, id, { type: 'start' })).status).toBe(403);
    expect((await event(adaC, id, { type: 'start' })).status).toBe(403);
    expect((await adaC.post(`/api/assignments/${id}/problems`, { kind: 'other', note: 'Gate left open' })).status).toBe(201);
    expect((await tomasC.post(`/api/assignments/${id}/problems`, { kind: 'other', note: 'Not mine' })).status).toBe(403);
    expect((await event(owner, id, { type: 'start' })).status).toBe(201);
  });

  it('when an operator reports a new hazard, then it is on the field as reported until the owner confirms it', async () => {
    const f = await field(100);
    const id = await add('2026-08-11', { fieldId: f });
    const bad = await tomasC.post(`/api/assignments/${id}/problems`, {
      kind: 'hazard',
      note: 'Rock',
      geometry: { type: 'Point', coordinates: [-99.9, 147.6] },
    });
    expect(bad.status).toBe(422);
    const res = await tomasC.post(`/api/assignments/${id}/problems`, {
      kind: 'hazard',
      note: 'New rock near the approach',
      geometry: { type: 'Point', coordinates: [-99.898, 47.601] },
      hazardKind: 'rock',
      clearanceM: 3,
    });
    expect(res.status).toBe(201);
    const hazard = res.body.field.hazards.features.find(
      (h: { properties: { note: string } }) => h.properties.note === 'New rock near the approach',
    );
    expect(hazard.properties).toMatchObject({ kind: 'rock', clearanceM: 3, status: 'reported' });
    expect(res.body.events.at(-1)).toMatchObject({ type: 'problem', reason: 'hazard', hazardId: hazard.properties.id });
    expect(res.body.problemCount).toBe(1);
    const confirmed = await owner.patch(`/api/fields/${f}/hazards/${hazard.properties.id}`, { status: 'confirmed' });
    expect(confirmed.body.properties.status).toBe('confirmed');
  });

  it('when a breakdown is reported on a job underway, then the job pauses (unless told not to)', async () => {
    const id = await add('2026-08-12', { fieldId: await field(100) });
    await event(tomasC, id, { type: 'start' });
    const res = await tomasC.post(`/api/assignments/${id}/problems`, { kind: 'breakdown', note: 'Hydraulic hose burst' });
    expect(res.body.state).toBe('paused');
    expect(res.body.events.map((e: { type: string }) => e.type)).toEqual(['start', 'problem', 'pause']);
    await event(tomasC, id, { type: 'resume' });
    const keepGoing = await tomasC.post(`/api/assignments/${id}/problems`, {
      kind: 'breakdown',
      note: 'Light out, still working',
      pause: false,
    });
    expect(keepGoing.body.state).toBe('underway');
  });

  it("when an operator logs on a job, then the owner's open board is stale and the change says who did what", async () => {
    const d = '2026-08-13';
    const id = await add(d, { fieldId: await field(100) });
    const seen = await board(d);
    await event(tomasC, id, { type: 'start' });
    const res = await owner.patch(`/api/assignments/${id}`, { version: seen.version, note: 'Late note' });
    expect(res.status).toBe(409);
    expect(res.body.error.changes).toEqual([
      expect.objectContaining({ by: farm.operator.name, summary: expect.stringMatching(/started Quarter \d+ harrowing$/) }),
    ]);
    expect(res.body.error.current.assignments[0].state).toBe('underway');
  });
});
