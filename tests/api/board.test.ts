import bcrypt from 'bcryptjs';
import type { Board, Conflict } from '../../shared/schemas/board';
import { effectiveCapacityAcPerH } from '../../shared/plan/field-capacity';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';

describe('work board', () => {
  let t: TestApp;
  let farm: TestFarm;
  let other: TestFarm;
  let owner: Client;
  let operator: Client;
  let tomas: number; // the farm's operator
  let ingrid: number; // the owner
  let milo: number;
  let ada: number;
  let n = 0;

  const addPerson = async (name: string): Promise<number> => {
    const [u] = await t
      .db('users')
      .insert({ email: `${name.toLowerCase()}-${farm.id}@furlong.test`, name, password_hash: bcrypt.hashSync('x', 4) })
      .returning('id');
    const [m] = await t.db('memberships').insert({ farm_id: farm.id, user_id: u.id, role: 'operator', status: 'active' }).returning('id');
    return m.id;
  };
  const field = async (acres: number, farmId = farm.id): Promise<number> => {
    const [f] = await t
      .db('fields')
      .insert({
        farm_id: farmId,
        name: `Field ${++n}`,
        boundary: JSON.stringify(rect(-99.9 + n * 0.01, 47.6, 0.005, 0.005)),
        area_m2: acres * 4046.8564224,
        acres,
      })
      .returning('id');
    return f.id;
  };
  const skill = (membershipId: number, operation: string, level: string) =>
    t.db('crew_skills').insert({ farm_id: farm.id, membership_id: membershipId, operation, level });
  const board = async (date: string): Promise<Board> => (await owner.get(`/api/board?date=${date}`)).body;
  /** Adds a card on the board as it is now (the version read first). */
  const add = async (date: string, card: Record<string, unknown>) => {
    const { version } = await board(date);
    return owner.post('/api/assignments', { version, date, operation: 'harrowing', ...card });
  };
  const codes = (b: Board, code: Conflict['code']) => b.conflicts.filter((c) => c.code === code);
  let harrow: number;
  let tractor: number;

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Board');
    other = await makeFarm(t.db, 'Other');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    operator = new Client(t.app);
    await operator.signIn(farm.operator.email, farm.operator.password);
    tomas = farm.operator.membershipId;
    ingrid = farm.owner.membershipId;
    milo = await addPerson('Milo');
    ada = await addPerson('Ada');
    for (const op of ['harrowing', 'seeding', 'spraying']) {
      await skill(tomas, op, op === 'harrowing' ? 'mentor' : 'qualified');
      await skill(ingrid, op, 'qualified');
      await skill(ada, op, 'qualified');
    }
    await skill(milo, 'harrowing', 'learning');
    harrow = await insertImplement(t.db, farm.id, { width_m: 25.6032 }); // 84 ft
    tractor = await insertMachine(t.db, farm.id, { power_hp: 450 });
  });
  afterAll(() => t.close());

  describe('reading and planning', () => {
    it('when cards have no times, then they run back-to-back from 07:00 on the estimate (acres ÷ effective field capacity)', async () => {
      const f = await field(160);
      const day = '2026-04-20';
      const first = await add(day, { fieldId: f, operatorId: tomas, machineId: tractor, implementId: harrow });
      expect(first.status).toBe(201);
      const seedDrill = await insertImplement(t.db, farm.id, { kind: 'air-drill', width_m: 18.288, operations: ['seeding'] });
      const second = await add(day, { fieldId: f, operation: 'seeding', operatorId: tomas, machineId: tractor, implementId: seedDrill });
      const [a, b] = second.body.assignments;
      // AEN-73: 84 ft × 7.0 mph × 0.85 / 8.25; speeds and efficiencies from the harrow and drill defaults.
      const harrowHours = 160 / effectiveCapacityAcPerH(84, 7.0, 0.85);
      expect(a).toMatchObject({
        order: 1,
        startTime: '07:00',
        planSource: 'estimate',
        acresPlanned: 160,
        acresToDo: 160,
        state: 'planned',
      });
      expect(a.planHours).toBeCloseTo(harrowHours, 2);
      const end = 7 * 60 + Math.round(harrowHours * 60);
      const hhmm = `${String(Math.floor(end / 60)).padStart(2, '0')}:${String(end % 60).padStart(2, '0')}`;
      expect(a.endTime).toBe(hhmm);
      expect(b).toMatchObject({ order: 2, startTime: hhmm, operation: 'seeding' });
      expect(second.body.operators.find((o: { membershipId: number }) => o.membershipId === tomas).plannedHours).toBeCloseTo(
        a.planHours + b.planHours,
        1,
      );
    });

    it('when the field has a saved pass plan, then planHours come from it (scaled to the acres planned)', async () => {
      const f = await field(200);
      await t.db('pass_plans').insert({
        farm_id: farm.id,
        field_id: f,
        operation: 'harrowing',
        width_m: 25.6,
        headland_passes: 2,
        heading_deg: 90,
        coverage: 'gaps-ok',
        speed_mps: 3.57632, // 8 mph
        efficiency: 0.85,
        turn_seconds: 20,
        summary: JSON.stringify({ hours: 3.6, headingDeg: 90, passCount: 31 }),
      });
      const res = await add('2026-04-21', { fieldId: f, operatorId: tomas, machineId: tractor, implementId: harrow });
      expect(res.body.assignments[0]).toMatchObject({ planSource: 'pass-plan', planHours: 3.6 });
      const half = await add('2026-04-22', { fieldId: f, operatorId: tomas, machineId: tractor, implementId: harrow, acresPlanned: 100 });
      expect(half.body.assignments[0]).toMatchObject({ planSource: 'pass-plan', planHours: 1.8 });
    });

    it('when part of a field is finished this season, then a new card defaults to the acres still to do', async () => {
      const f = await field(100);
      await t.db('assignments').insert({
        farm_id: farm.id,
        day: '2026-04-01',
        field_id: f,
        operation: 'harrowing',
        operator_id: tomas,
        machine_id: tractor,
        implement_id: harrow,
        run_order: 1,
        acres_planned: 100,
        state: 'finished',
        acres_done: 40,
      });
      const res = await add('2026-04-23', { fieldId: f, operatorId: tomas, machineId: tractor, implementId: harrow });
      expect(res.body.assignments[0]).toMatchObject({ acresPlanned: 60, acresToDo: 60 });
    });

    it("when a card names another farm's machine or field, or a viewer as operator, then 422 and nothing is stored", async () => {
      const f = await field(80);
      const theirs = await insertMachine(t.db, other.id);
      const theirField = await field(80, other.id);
      const before = Number((await t.db('assignments').where({ farm_id: farm.id }).count({ n: '*' }))[0].n);
      const m = await add('2026-04-24', { fieldId: f, operatorId: tomas, machineId: theirs, implementId: harrow });
      expect(m.status).toBe(422);
      expect(m.body.error.fields).toHaveProperty('machineId');
      expect((await add('2026-04-24', { fieldId: theirField, operatorId: tomas, machineId: tractor, implementId: harrow })).status).toBe(
        422,
      );
      expect(
        (await add('2026-04-24', { fieldId: f, operatorId: farm.viewer.membershipId, machineId: tractor, implementId: harrow })).status,
      ).toBe(422);
      expect(
        (await add('2026-04-24', { fieldId: f, operation: 'ploughing', operatorId: tomas, machineId: tractor, implementId: harrow }))
          .status,
      ).toBe(400);
      expect(
        (
          await add('2026-04-24', {
            fieldId: f,
            operatorId: tomas,
            machineId: tractor,
            implementId: harrow,
            startTime: '10:00',
            endTime: '09:00',
          })
        ).status,
      ).toBe(400);
      expect(Number((await t.db('assignments').where({ farm_id: farm.id }).count({ n: '*' }))[0].n)).toBe(before);
      expect((await board('2026-04-24')).version).toBe(0);
    });

    it('when an operator asks for the board or tries to change it, then 403', async () => {
      expect((await operator.get('/api/board?date=2026-04-20')).status).toBe(403);
      const res = await operator.post('/api/assignments', {
        version: 0,
        date: '2026-04-25',
        fieldId: await field(10),
        operation: 'harrowing',
        operatorId: tomas,
        machineId: tractor,
        implementId: harrow,
      });
      expect(res.status).toBe(403);
      expect(await t.db('assignments').where({ farm_id: farm.id, day: '2026-04-25' })).toEqual([]);
    });
  });

  describe('versions', () => {
    const day = '2026-05-20';
    it('when each write is made, then the version goes up by one and the answer is the new board', async () => {
      const f = await field(120);
      expect((await board(day)).version).toBe(0);
      const a = await add(day, { fieldId: f, operatorId: tomas, machineId: tractor, implementId: harrow });
      expect(a.body).toMatchObject({ date: day, version: 1, savedAssignmentId: expect.any(Number) });
      const id = a.body.savedAssignmentId;
      const p = await owner.patch(`/api/assignments/${id}`, { version: 1, note: 'Start at the east gate' });
      expect(p.status).toBe(200);
      expect(p.body.version).toBe(2);
      expect(p.body.assignments[0].note).toBe('Start at the east gate');
      const viaHeader = await owner.agent
        .patch(`/api/assignments/${id}`)
        .set('X-XSRF-TOKEN', owner.xsrf)
        .set('If-Match', '"2"')
        .send({ startTime: '08:00' });
      expect(viaHeader.status).toBe(200);
      expect(viaHeader.body.version).toBe(3);
      expect(viaHeader.body.assignments[0]).toMatchObject({ plannedStart: '08:00', startTime: '08:00' });
    });

    it('when a save is made on an old version, then 409 stale_board says what changed, shows the board now, and saves nothing', async () => {
      const now = await board(day);
      const id = now.assignments[0].id;
      const res = await owner.patch(`/api/assignments/${id}`, { version: now.version - 2, note: 'My older idea' });
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('stale_board');
      expect(res.body.error.message).toMatch(/^Someone else changed this board/);
      expect(res.body.error.changes.map((c: { version: number }) => c.version)).toEqual([now.version - 1, now.version]);
      expect(res.body.error.changes[0]).toMatchObject({
        by: farm.owner.name,
        summary: expect.stringMatching(/^Changed Field \d+ harrowing \(note\)$/),
        assignmentIds: [id],
      });
      expect(res.body.error.current).toMatchObject({ date: day, version: now.version });
      const after = await board(day);
      expect(after.version).toBe(now.version);
      expect(after.assignments[0].note).toBe('Start at the east gate');
    });

    it('when a save names no version, then 428 and nothing is saved', async () => {
      const now = await board(day);
      const res = await owner.patch(`/api/assignments/${now.assignments[0].id}`, { note: 'No version' });
      expect(res.status).toBe(428);
      expect((await board(day)).version).toBe(now.version);
    });

    it('when a card is dragged to another operator, then both columns are renumbered; an old version is refused', async () => {
      const d = '2026-05-21';
      const f = await field(90);
      const a1 = (await add(d, { fieldId: f, operatorId: tomas, machineId: tractor, implementId: harrow })).body.savedAssignmentId;
      const a2 = (
        await add(d, {
          fieldId: f,
          operation: 'spraying',
          operatorId: tomas,
          machineId: await insertMachine(t.db, farm.id),
          implementId: await insertImplement(t.db, farm.id, { kind: 'sprayer', operations: ['spraying'] }),
        })
      ).body.savedAssignmentId;
      const a3 = (
        await add(d, {
          fieldId: await field(50),
          operatorId: ada,
          machineId: await insertMachine(t.db, farm.id),
          implementId: await insertImplement(t.db, farm.id),
        })
      ).body.savedAssignmentId;
      const { version } = await board(d);
      const moved = await owner.post(`/api/board/${d}/order`, { version, columns: [{ membershipId: ada, assignmentIds: [a2, a3] }] });
      expect(moved.status).toBe(200);
      const byId = new Map(moved.body.assignments.map((a: { id: number }) => [a.id, a]));
      expect(byId.get(a2)).toMatchObject({ operator: { membershipId: ada }, order: 1 });
      expect(byId.get(a3)).toMatchObject({ operator: { membershipId: ada }, order: 2 });
      expect(byId.get(a1)).toMatchObject({ operator: { membershipId: tomas }, order: 1 });
      const stale = await owner.post(`/api/board/${d}/order`, { version, columns: [{ membershipId: tomas, assignmentIds: [a2] }] });
      expect(stale.status).toBe(409);
      expect(stale.body.error.changes.at(-1).summary).toBe('Moved 1 job between operators');
    });

    it('when a card moves to another day, then both days go up a version and it runs last in the new column', async () => {
      const from = '2026-05-23';
      const to = '2026-05-24';
      const id = (await add(from, { fieldId: await field(30), operatorId: tomas, machineId: tractor, implementId: harrow })).body
        .savedAssignmentId;
      await add(to, { fieldId: await field(30), operatorId: tomas, machineId: tractor, implementId: harrow });
      const toBefore = (await board(to)).version;
      const moved = await owner.patch(`/api/assignments/${id}`, { version: (await board(from)).version, date: to });
      expect(moved.status).toBe(200);
      expect(moved.body.assignments).toEqual([]);
      const target = await board(to);
      expect(target.version).toBe(toBefore + 1);
      expect(target.assignments.find((a) => a.id === id)).toMatchObject({ date: to, order: 2 });
    });

    it('when a card is deleted, then it leaves the board; a started job cannot be deleted or re-planned', async () => {
      const d = '2026-05-22';
      const a = (await add(d, { fieldId: await field(40), operatorId: tomas, machineId: tractor, implementId: harrow })).body
        .savedAssignmentId;
      const b = (await add(d, { fieldId: await field(40), operatorId: tomas, machineId: tractor, implementId: harrow })).body
        .savedAssignmentId;
      const gone = await owner.delete(`/api/assignments/${a}?version=${(await board(d)).version}`);
      expect(gone.status).toBe(200);
      expect(gone.body.assignments.map((x: { id: number }) => x.id)).toEqual([b]);
      expect(gone.body.assignments[0].order).toBe(1);
      expect((await operator.post(`/api/assignments/${b}/events`, { type: 'start' })).status).toBe(201);
      const v = (await board(d)).version;
      const del = await owner.delete(`/api/assignments/${b}?version=${v}`);
      expect(del.status).toBe(409);
      expect(del.body.error.message).toMatch(/call it off/);
      const move = await owner.patch(`/api/assignments/${b}`, { version: v, operatorId: ada });
      expect(move.status).toBe(409);
      expect((await owner.patch(`/api/assignments/${b}`, { version: v, note: 'Watch the wet corner' })).status).toBe(200);
    });
  });

  describe('conflicts', () => {
    it('when one machine is on two cards at overlapping times, then a hard conflict; at separate times, none', async () => {
      const d = '2026-06-01';
      const f = await field(160);
      const h2 = await insertImplement(t.db, farm.id);
      await add(d, { fieldId: f, operatorId: tomas, machineId: tractor, implementId: harrow });
      const both = await add(d, { fieldId: await field(160), operatorId: ada, machineId: tractor, implementId: h2 });
      const c = codes(both.body, 'machine_double_booked');
      expect(c).toHaveLength(1);
      expect(c[0]).toMatchObject({
        severity: 'hard',
        assignmentIds: both.body.assignments.map((a: { id: number }) => a.id).sort((x: number, y: number) => x - y),
      });
      expect(c[0].message).toMatch(/^Tractor .* is on two jobs at once/);
      const later = await owner.patch(`/api/assignments/${both.body.savedAssignmentId}`, {
        version: both.body.version,
        startTime: '13:00',
      });
      expect(codes(later.body, 'machine_double_booked')).toEqual([]);
    });

    it('when one implement is on two cards at overlapping times, then a hard conflict; with two implements, none', async () => {
      const d = '2026-06-02';
      const m2 = await insertMachine(t.db, farm.id);
      await add(d, { fieldId: await field(160), operatorId: tomas, machineId: tractor, implementId: harrow });
      const both = await add(d, { fieldId: await field(160), operatorId: ada, machineId: m2, implementId: harrow });
      expect(codes(both.body, 'implement_double_booked')).toHaveLength(1);
      const apart = await owner.patch(`/api/assignments/${both.body.savedAssignmentId}`, {
        version: both.body.version,
        implementId: await insertImplement(t.db, farm.id),
      });
      expect(codes(apart.body, 'implement_double_booked')).toEqual([]);
    });

    it('when a person has two jobs at overlapping times, then a hard conflict; back-to-back, none', async () => {
      const d = '2026-06-03';
      const one = await add(d, { fieldId: await field(100), operatorId: ada, machineId: tractor, implementId: harrow });
      const two = await add(d, {
        fieldId: await field(100),
        operatorId: ada,
        machineId: await insertMachine(t.db, farm.id),
        implementId: await insertImplement(t.db, farm.id),
      });
      expect(codes(two.body, 'person_double_booked')).toEqual([]);
      const clash = await owner.patch(`/api/assignments/${two.body.savedAssignmentId}`, { version: two.body.version, startTime: '07:30' });
      const c = codes(clash.body, 'person_double_booked');
      expect(c).toHaveLength(1);
      expect(c[0].message).toMatch(/^Ada is on two jobs at once/);
      expect(c[0].assignmentIds).toContain(one.body.savedAssignmentId);
    });

    it('when an implement does not do the operation, then a hard conflict; the right implement, none', async () => {
      const d = '2026-06-04';
      const f = await field(100);
      const wrong = await add(d, { fieldId: f, operation: 'seeding', operatorId: tomas, machineId: tractor, implementId: harrow });
      expect(codes(wrong.body, 'implement_wrong_operation')).toHaveLength(1);
      expect(codes(wrong.body, 'implement_wrong_operation')[0].message).toMatch(/does not do seeding/);
      const drill = await insertImplement(t.db, farm.id, { kind: 'air-drill', operations: ['seeding'] });
      const right = await owner.patch(`/api/assignments/${wrong.body.savedAssignmentId}`, {
        version: wrong.body.version,
        implementId: drill,
      });
      expect(codes(right.body, 'implement_wrong_operation')).toEqual([]);
    });

    it('when the machine cannot pull the implement (too little power, or a self-propelled machine), then a hard conflict; a big enough tractor, none', async () => {
      const d = '2026-06-05';
      const mfwd = await insertMachine(t.db, farm.id, { kind: 'tractor-mfwd', power_hp: 180 });
      const heavy = await insertImplement(t.db, farm.id, { min_power_hp: 350 });
      const weak = await add(d, { fieldId: await field(100), operatorId: tomas, machineId: mfwd, implementId: heavy });
      const c = codes(weak.body, 'implement_wrong_machine');
      expect(c).toHaveLength(1);
      expect(c[0].message).toMatch(/has 180 hp; .* needs at least 350 hp/);
      const sprayer = await insertMachine(t.db, farm.id, { kind: 'sprayer-sp', power_hp: 400 });
      const selfProp = await owner.patch(`/api/assignments/${weak.body.savedAssignmentId}`, {
        version: weak.body.version,
        machineId: sprayer,
      });
      expect(codes(selfProp.body, 'implement_wrong_machine')[0].message).toMatch(/self-propelled/);
      const strong = await owner.patch(`/api/assignments/${weak.body.savedAssignmentId}`, {
        version: selfProp.body.version,
        machineId: tractor,
      });
      expect(codes(strong.body, 'implement_wrong_machine')).toEqual([]);
    });

    it('when a learner has no mentor (or a mentor who is only qualified), then a hard conflict; with a mentor beside them in the same field, none', async () => {
      const d = '2026-06-06';
      const f = await field(300);
      const alone = await add(d, {
        fieldId: f,
        operatorId: milo,
        machineId: await insertMachine(t.db, farm.id),
        implementId: await insertImplement(t.db, farm.id),
      });
      const id = alone.body.savedAssignmentId;
      expect(codes(alone.body, 'learner_without_mentor')[0].message).toBe(
        `Milo is learning harrowing and has no mentor on ${alone.body.assignments[0].field.name}`,
      );
      const withAda = await owner.patch(`/api/assignments/${id}`, { version: alone.body.version, mentorId: ada });
      expect(codes(withAda.body, 'learner_without_mentor')[0].message).toMatch(/Ada is not a mentor for harrowing/);
      // Tomas mentors while running his own harrow in the same field at the same time: not double-booked.
      const own = await add(d, { fieldId: f, operatorId: tomas, machineId: tractor, implementId: harrow });
      const withTomas = await owner.patch(`/api/assignments/${id}`, { version: own.body.version, mentorId: tomas });
      expect(codes(withTomas.body, 'learner_without_mentor')).toEqual([]);
      expect(codes(withTomas.body, 'person_double_booked')).toEqual([]);
      // His own job moved to another field at the same time: now he is in two places.
      const elsewhere = await owner.patch(`/api/assignments/${own.body.savedAssignmentId}`, {
        version: withTomas.body.version,
        fieldId: await field(300),
      });
      expect(codes(elsewhere.body, 'person_double_booked')).toHaveLength(1);
    });

    it('when someone has no skill at all for the operation, then they count as a learner', async () => {
      const res = await add('2026-06-07', {
        fieldId: await field(50),
        operation: 'seeding',
        operatorId: milo,
        machineId: tractor,
        implementId: await insertImplement(t.db, farm.id, { kind: 'air-drill', operations: ['seeding'] }),
      });
      expect(codes(res.body, 'learner_without_mentor')[0].message).toMatch(/Milo is not trained for seeding/);
    });

    it('when the field is already finished for the operation this season, then a soft conflict; last season or another operation, none', async () => {
      const d = '2026-06-08';
      const f = await field(80);
      const done = {
        farm_id: farm.id,
        field_id: f,
        operator_id: tomas,
        machine_id: tractor,
        implement_id: harrow,
        run_order: 1,
        acres_planned: 80,
        state: 'finished',
        acres_done: 80,
      };
      await t.db('assignments').insert([
        { ...done, day: '2026-04-02', operation: 'harrowing' },
        { ...done, day: '2025-09-02', operation: 'spraying' },
      ]);
      const again = await add(d, { fieldId: f, operatorId: tomas, machineId: tractor, implementId: harrow, acresPlanned: 10 });
      const c = codes(again.body, 'field_finished');
      expect(c).toHaveLength(1);
      expect(c[0]).toMatchObject({ severity: 'soft', message: expect.stringMatching(/already finished for harrowing this season/) });
      const spray = await add(d, {
        fieldId: f,
        operation: 'spraying',
        operatorId: ada,
        machineId: await insertMachine(t.db, farm.id, { kind: 'sprayer-sp' }),
        implementId: await insertImplement(t.db, farm.id, { kind: 'sprayer', operations: ['spraying'] }),
      });
      expect(codes(spray.body, 'field_finished').map((x) => x.assignmentIds)).toEqual([[again.body.savedAssignmentId]]);
    });

    it("when a person has more planned hours than the farm's day, then a soft conflict; within it, none", async () => {
      const d = '2026-06-09';
      const long = await add(d, {
        fieldId: await field(100),
        operatorId: ada,
        machineId: tractor,
        implementId: harrow,
        startTime: '06:00',
        endTime: '19:00',
      });
      const c = codes(long.body, 'over_day_hours');
      expect(c).toHaveLength(1);
      expect(c[0]).toMatchObject({ severity: 'soft', message: "Ada has 13.0 h planned, more than the farm's 12.0 h day" });
      const shorter = await owner.patch(`/api/assignments/${long.body.savedAssignmentId}`, {
        version: long.body.version,
        endTime: '17:00',
      });
      expect(codes(shorter.body, 'over_day_hours')).toEqual([]);
    });

    it('when a machine is past its service interval, then a soft conflict; once serviced, none', async () => {
      const d = '2026-06-10';
      const worn = await insertMachine(t.db, farm.id, { engine_hours: 1300, service_interval_hours: 250, hours_at_last_service: 1000 });
      const res = await add(d, { fieldId: await field(100), operatorId: tomas, machineId: worn, implementId: harrow });
      expect(codes(res.body, 'service_overdue')).toEqual([
        {
          code: 'service_overdue',
          severity: 'soft',
          message: expect.stringMatching(/is 50\.0 h past its service interval/),
          assignmentIds: [res.body.savedAssignmentId],
        },
      ]);
      await owner.patch(`/api/fleet/machines/${worn}`, { hoursAtLastService: 1300 });
      expect(codes(await board(d), 'service_overdue')).toEqual([]);
    });
  });
});
