// The work board without surprises: a card's hours agree with its window everywhere, a finished
// card shows what is left, the column says what changed since publishing, and mentors follow the
// operator's skills.
import bcrypt from 'bcryptjs';
import { formatHours } from '../../shared/figures';
import type { Board, BoardAssignment, Conflict, WorkOrderState } from '../../shared/schemas/board';
import type { CaughtMail } from '../../server/mail/fake-smtp';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';

describe('work board: no surprises', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let tomas: number; // the farm's operator: mentor for harrowing
  let ada: number; // qualified for harrowing
  let milo: number; // learning harrowing
  let kai: number; // learning harrowing too
  let tractor: number;
  let harrow: number;
  let n = 0;

  const addPerson = async (name: string): Promise<number> => {
    const [u] = await t
      .db('users')
      .insert({ email: `${name.toLowerCase()}-${farm.id}@furlong.test`, name, password_hash: bcrypt.hashSync('x', 4) })
      .returning('id');
    const [m] = await t.db('memberships').insert({ farm_id: farm.id, user_id: u.id, role: 'operator', status: 'active' }).returning('id');
    return m.id;
  };
  const field = async (acres: number, name = `Field ${n + 1}`): Promise<number> => {
    const [f] = await t
      .db('fields')
      .insert({
        farm_id: farm.id,
        name,
        boundary: JSON.stringify(rect(-99.9 + ++n * 0.01, 47.6, 0.005, 0.005)),
        area_m2: acres * 4046.8564224,
        acres,
      })
      .returning('id');
    return f.id;
  };
  const skill = (membershipId: number, level: string) =>
    t.db('crew_skills').insert({ farm_id: farm.id, membership_id: membershipId, operation: 'harrowing', level });
  const board = async (date: string): Promise<Board> => (await owner.get(`/api/board?date=${date}`)).body;
  const add = async (date: string, card: Record<string, unknown>) => {
    const res = await owner.post('/api/assignments', {
      version: (await board(date)).version,
      date,
      operation: 'harrowing',
      // A machine and an implement of its own per card: no double booking unless a test wants one.
      machineId: await insertMachine(t.db, farm.id),
      implementId: await insertImplement(t.db, farm.id),
      ...card,
    });
    return res;
  };
  const patch = async (id: number, date: string, body: Record<string, unknown>) =>
    owner.patch(`/api/assignments/${id}`, { version: (await board(date)).version, ...body });
  const codes = (b: Board, code: Conflict['code']) => b.conflicts.filter((c) => c.code === code);
  const cardOf = (b: Board, id: number): BoardAssignment => b.assignments.find((a) => a.id === id)!;
  const orderOf = (b: Board, membershipId: number): WorkOrderState => b.orders.find((o) => o.membershipId === membershipId)!;
  const drain = async () => {
    for (let i = 0; i < 50; i++) {
      await t.flushMail();
      const [{ n: left }] = await t.db('mail_outbox').where({ farm_id: farm.id, status: 'queued' }).count({ n: '*' });
      if (Number(left) === 0) return;
      await new Promise((r) => setTimeout(r, 100));
    }
    throw new Error('the outbox did not drain');
  };
  const mailsTo = (email: string, dateWords: string): CaughtMail[] => t.mail.to(email).filter((m) => m.subject.includes(dateWords));

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Surprises');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    tomas = farm.operator.membershipId;
    ada = await addPerson('Ada');
    milo = await addPerson('Milo');
    kai = await addPerson('Kai');
    await skill(tomas, 'mentor');
    await skill(ada, 'qualified');
    await skill(milo, 'learning');
    await skill(kai, 'learning');
    tractor = await insertMachine(t.db, farm.id, { name: '4WD No. 1' });
    harrow = await insertImplement(t.db, farm.id, { name: '84 ft heavy harrow', width_m: 25.6032 });
  });
  afterAll(() => t.close());

  describe('a card that cannot fit its time window', () => {
    it('when the planned hours are longer than the window, then the card, the column, the day limit and the work order all count the planned hours, with a warning naming both', async () => {
      const d = '2026-05-04';
      const north = await field(822.66, 'North Section');
      // A saved pass plan for the whole field: 28.5 h (test data); the card plans the whole field, so 28.5 h.
      await t.db('pass_plans').insert({
        farm_id: farm.id,
        field_id: north,
        operation: 'harrowing',
        width_m: 25.6,
        headland_passes: 2,
        heading_deg: 90,
        coverage: 'gaps-ok',
        speed_mps: 3.12928, // 7 mph
        efficiency: 0.85,
        turn_seconds: 20,
        summary: JSON.stringify({ hours: 28.5, headingDeg: 90, passCount: 120 }),
      });
      const res = await add(d, {
        fieldId: north,
        operatorId: tomas,
        machineId: tractor,
        implementId: harrow,
        startTime: '08:00',
        endTime: '12:00',
      });
      expect(res.status).toBe(201);
      const b: Board = res.body;
      const card = cardOf(b, res.body.savedAssignmentId);
      expect(card).toMatchObject({
        planHours: 28.5,
        planSource: 'pass-plan',
        plannedStart: '08:00',
        plannedEnd: '12:00',
        fitsWindow: false,
      });
      // The card holds Tomas for the work, not for the 4 h window: 08:00 + 28.5 h = 36:30 (12:30 the next morning; arithmetic).
      expect(card.bookedHours).toBe(28.5);
      expect(card.startTime).toBe('08:00');
      expect(card.endTime).toBe('36:30');
      // 08:00–12:00 is 4 h (arithmetic).
      expect(codes(b, 'window_too_short')).toEqual([
        {
          code: 'window_too_short',
          severity: 'soft',
          message: 'Planned 28.5 h does not fit 08:00–12:00 (4.0 h): North Section harrowing',
          assignmentIds: [card.id],
        },
      ]);
      expect(b.operators.find((o) => o.membershipId === tomas)!.plannedHours).toBe(28.5);
      expect(codes(b, 'over_day_hours').map((c) => c.message)).toEqual([
        `${farm.operator.name} has 28.5 h planned, more than the farm's ${formatHours(b.dayHoursLimit)} day`,
      ]);

      const published = await owner.post(`/api/board/${d}/publish`, { version: b.version });
      expect(published.status).toBe(200);
      await drain();
      const [order] = mailsTo(farm.operator.email, 'May 4, 2026');
      // The times carry the farm's zone (CST or CDT by the day), the figures the card's decimals.
      expect(order.text).toMatch(/1\. North Section: Harrowing, 08:00–12:00 C[SD]T, 822\.7 ac, 28\.5 h planned/);
      expect(order.text).toContain('Warning: Planned 28.5 h does not fit 08:00–12:00 (4.0 h). Ask the owner before you start.');
      expect(order.html).toContain('Planned 28.5 h does not fit 08:00–12:00 (4.0 h)');

      // Half the field: 14.25 h (the plan scaled to the acres planned), in a 15 h window: it fits.
      const half = await patch(card.id, d, { acresPlanned: 411.33, startTime: '05:00', endTime: '20:00' });
      expect(cardOf(half.body, card.id)).toMatchObject({ planHours: 14.25, fitsWindow: true, bookedHours: 15, endTime: '20:00' });
      expect(codes(half.body, 'window_too_short')).toEqual([]);
    });

    it('when the window is longer than the work, then the card books the whole window and no window warning', async () => {
      const d = '2026-05-05';
      const res = await add(d, { fieldId: await field(100), operatorId: ada, startTime: '08:00', endTime: '18:00' });
      const card = cardOf(res.body, res.body.savedAssignmentId);
      expect(card.fitsWindow).toBe(true);
      expect(card.planHours).toBeLessThan(10);
      expect(card).toMatchObject({ bookedHours: 10, startTime: '08:00', endTime: '18:00' });
      expect(res.body.operators.find((o: { membershipId: number }) => o.membershipId === ada).plannedHours).toBe(10);
      expect(codes(res.body, 'window_too_short')).toEqual([]);
    });

    it('when only an end time is set and the work cannot be done by then, then the card starts at midnight and warns', async () => {
      const d = '2026-05-06';
      const f = await field(400);
      await t.db('pass_plans').insert({
        farm_id: farm.id,
        field_id: f,
        operation: 'harrowing',
        width_m: 25.6,
        headland_passes: 2,
        coverage: 'gaps-ok',
        speed_mps: 3.12928, // 7 mph
        efficiency: 0.85,
        turn_seconds: 20,
        summary: JSON.stringify({ hours: 10 }),
      });
      const res = await add(d, { fieldId: f, operatorId: ada, endTime: '06:00' });
      const card = cardOf(res.body, res.body.savedAssignmentId);
      expect(card).toMatchObject({ startTime: '00:00', endTime: '10:00', bookedHours: 10, fitsWindow: false });
      expect(codes(res.body, 'window_too_short')[0].message).toMatch(/^Planned 10\.0 h does not fit 00:00–06:00 \(6\.0 h\)/);
    });
  });

  describe('after a finish', () => {
    it('when a job finished 185.5 of 200 ac, then its card gives the acres done and the 14.5 ac left', async () => {
      const d = '2026-05-11';
      const res = await add(d, { fieldId: await field(200), operatorId: ada });
      const id = res.body.savedAssignmentId;
      expect(cardOf(res.body, id)).toMatchObject({ acresPlanned: 200, acresToDo: 200, acresLeft: 200 });
      const at = (hhmm: string) => `2026-05-11T${hhmm}:00-05:00`;
      expect((await owner.post(`/api/assignments/${id}/events`, { type: 'start', at: at('08:00') })).status).toBe(201);
      expect((await owner.post(`/api/assignments/${id}/events`, { type: 'finish', at: at('12:00'), acres: 185.5 })).status).toBe(201);
      const card = cardOf(await board(d), id);
      // 200 − 185.5 = 14.5 ac (arithmetic).
      expect(card).toMatchObject({ state: 'finished', acresPlanned: 200, acresLeft: 14.5, log: { acresDone: 185.5 } });
    });

    it('when cards are added, moved, edited and removed after publishing, then each column says what changed', async () => {
      const d = '2026-05-12';
      const a = (await add(d, { fieldId: await field(100), operatorId: tomas, startTime: '07:00' })).body.savedAssignmentId;
      const b = (await add(d, { fieldId: await field(100), operatorId: tomas, startTime: '10:00' })).body.savedAssignmentId;
      const c = (await add(d, { fieldId: await field(100), operatorId: ada, startTime: '19:00' })).body.savedAssignmentId;
      const first = await owner.post(`/api/board/${d}/publish`, { version: (await board(d)).version });
      expect(first.status).toBe(200);
      expect(orderOf(first.body.board, tomas)).toMatchObject({ changedSincePublish: false, changes: null });

      await add(d, { fieldId: await field(100), operatorId: tomas, startTime: '16:00' });
      const moved = await patch(b, d, { startTime: '13:00' });
      expect(orderOf(moved.body, tomas)).toMatchObject({
        changedSincePublish: true,
        changes: { added: 1, moved: 1, edited: 0, removed: 0 },
      });
      expect(orderOf(moved.body, ada)).toMatchObject({ changedSincePublish: false, changes: null });

      const noted = await patch(a, d, { note: 'Start at the east gate' });
      expect(orderOf(noted.body, tomas).changes).toEqual({ added: 1, moved: 1, edited: 1, removed: 0 });

      // Ada's only card goes to Tomas: one job removed from Ada's order, one more added to his.
      const v = (await board(d)).version;
      const order = await owner.post(`/api/board/${d}/order`, {
        version: v,
        columns: [
          { membershipId: ada, assignmentIds: [] },
          { membershipId: tomas, assignmentIds: [a, b, c] },
        ],
      });
      expect(order.status).toBe(200);
      expect(orderOf(order.body, ada)).toMatchObject({ changedSincePublish: true, changes: { added: 0, moved: 0, edited: 0, removed: 1 } });
      expect(orderOf(order.body, tomas).changes).toEqual({ added: 2, moved: 1, edited: 1, removed: 0 });

      const again = await owner.post(`/api/board/${d}/publish`, { version: order.body.version });
      expect(again.status).toBe(200);
      for (const o of again.body.board.orders as WorkOrderState[]) expect(o).toMatchObject({ changedSincePublish: false, changes: null });
      const gone = await owner.delete(`/api/assignments/${a}?version=${again.body.board.version}`);
      expect(orderOf(gone.body, tomas).changes).toMatchObject({ added: 0, edited: 0, removed: 1 });
    });
  });

  describe('mentors', () => {
    const learnerCard = async (d: string) => {
      const res = await add(d, { fieldId: await field(120), operatorId: milo, mentorId: tomas });
      expect(res.status).toBe(201);
      expect(codes(res.body, 'learner_without_mentor')).toEqual([]);
      return res.body.savedAssignmentId as number;
    };
    const mentorOf = async (id: number) => (await t.db('assignments').where({ id }).first()).mentor_id as number | null;

    it("when a learner's card is dragged to a qualified operator, then its mentor is dropped and no mentor conflict is left", async () => {
      const d = '2026-05-18';
      const id = await learnerCard(d);
      const res = await owner.post(`/api/board/${d}/order`, {
        version: (await board(d)).version,
        columns: [
          { membershipId: milo, assignmentIds: [] },
          { membershipId: ada, assignmentIds: [id] },
        ],
      });
      expect(res.status).toBe(200);
      expect(cardOf(res.body, id)).toMatchObject({ operator: { membershipId: ada }, mentor: null });
      expect(await mentorOf(id)).toBeNull();
      expect(res.body.conflicts).toEqual([]);
    });

    it("when a learner's card is moved to the mentor themself, then the mentor is dropped instead of refusing the move", async () => {
      const d = '2026-05-19';
      const id = await learnerCard(d);
      const res = await patch(id, d, { operatorId: tomas });
      expect(res.status).toBe(200);
      expect(cardOf(res.body, id)).toMatchObject({ operator: { membershipId: tomas }, mentor: null });
      expect(res.body.conflicts).toEqual([]);
      const [last] = await t.db('board_changes').where({ farm_id: farm.id, day: d }).orderBy('version', 'desc').limit(1);
      expect(last.summary).toMatch(/\(operator, mentor\)$/);
    });

    it("when a learner's card moves to another learner, then the mentor stays", async () => {
      const d = '2026-05-20';
      const id = await learnerCard(d);
      const res = await patch(id, d, { operatorId: kai });
      expect(cardOf(res.body, id)).toMatchObject({ operator: { membershipId: kai }, mentor: { membershipId: tomas } });
      expect(codes(res.body, 'learner_without_mentor')).toEqual([]);
    });

    it('when the owner names a mentor for a qualified operator, then 422 on the mentor field', async () => {
      const res = await add('2026-05-21', { fieldId: await field(80), operatorId: ada, mentorId: tomas });
      expect(res.status).toBe(422);
      expect(res.body.error).toMatchObject({
        code: 'invalid_input',
        message: 'The operator is qualified for this operation and works without a mentor',
        fields: { mentorId: 'No mentor needed' },
      });
    });

    it('when the learner has since qualified, then editing the card drops the mentor no longer needed instead of refusing the edit', async () => {
      const d = '2026-05-22';
      const id = await learnerCard(d);
      await t.db('crew_skills').where({ farm_id: farm.id, membership_id: milo, operation: 'harrowing' }).update({ level: 'qualified' });
      try {
        const res = await patch(id, d, { note: 'Watch the wet corner' });
        expect(res.status).toBe(200);
        expect(cardOf(res.body, id)).toMatchObject({ mentor: null, note: 'Watch the wet corner' });
      } finally {
        await t.db('crew_skills').where({ farm_id: farm.id, membership_id: milo, operation: 'harrowing' }).update({ level: 'learning' });
      }
    });
  });
});
