import bcrypt from 'bcryptjs';
import type { Board } from '../../shared/schemas/board';
import { OPERATION_INFO } from '../../shared/operations';
import type { CaughtMail } from '../../server/mail/fake-smtp';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';

describe('work orders by e-mail', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let tomas: number;
  let ada: number;
  const adaEmail = () => `ada-${farm.id}@furlong.test`;
  let n = 0;

  const field = async (name: string, acres: number): Promise<number> => {
    const [f] = await t
      .db('fields')
      .insert({
        farm_id: farm.id,
        name,
        boundary: JSON.stringify(rect(-99.9 + ++n * 0.01, 47.6, 0.005, 0.005)),
        area_m2: acres * 4046.86,
        acres,
      })
      .returning('id');
    return f.id;
  };
  const board = async (date: string): Promise<Board> => (await owner.get(`/api/board?date=${date}`)).body;
  const add = async (date: string, card: Record<string, unknown>) => {
    const res = await owner.post('/api/assignments', { version: (await board(date)).version, date, operation: 'harrowing', ...card });
    expect(res.status).toBe(201);
    return res.body.savedAssignmentId as number;
  };
  const ordersTo = (email: string, date: string): CaughtMail[] => t.mail.to(email).filter((m) => m.subject.includes(date));
  /** Drains the outbox until nothing for the farm is queued (the worker retries with 50–200 ms back-off in tests). */
  const drainAll = async () => {
    for (let i = 0; i < 50; i++) {
      await t.flushMail();
      const [{ n: left }] = await t.db('mail_outbox').where({ farm_id: farm.id, status: 'queued' }).count({ n: '*' });
      if (Number(left) === 0) return;
      await new Promise((r) => setTimeout(r, 100));
    }
    throw new Error('the outbox did not drain');
  };

  let north: number;
  let slough: number;
  let tractor: number;
  let tractor2: number;
  let harrow: number;
  let harrow2: number;

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Orders');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    tomas = farm.operator.membershipId;
    const [u] = await t
      .db('users')
      .insert({ email: adaEmail(), name: 'Ada', password_hash: bcrypt.hashSync('x', 4) })
      .returning('id');
    ada = (await t.db('memberships').insert({ farm_id: farm.id, user_id: u.id, role: 'operator', status: 'active' }).returning('id'))[0].id;
    for (const m of [tomas, ada])
      await t.db('crew_skills').insert({ farm_id: farm.id, membership_id: m, operation: 'harrowing', level: 'qualified' });
    north = await field('North Section', 640);
    slough = await field('Slough Quarter', 150);
    await t.db('hazards').insert([
      {
        farm_id: farm.id,
        field_id: north,
        kind: 'power',
        geometry: JSON.stringify({
          type: 'LineString',
          coordinates: [
            [-99.9, 47.6],
            [-99.89, 47.6],
          ],
        }),
        clearance_m: 10,
        note: 'Transmission line along the north edge',
      },
      {
        farm_id: farm.id,
        field_id: north,
        kind: 'rock',
        geometry: JSON.stringify({ type: 'Point', coordinates: [-99.895, 47.602] }),
        clearance_m: 3,
        note: 'Large rock, marked with a flag',
      },
    ]);
    await t.db('pass_plans').insert({
      farm_id: farm.id,
      field_id: north,
      operation: 'harrowing',
      width_m: 25.6,
      headland_passes: 2,
      heading_deg: 87.4,
      coverage: 'gaps-ok',
      speed_mps: 3.12928, // 7 mph
      efficiency: 0.85,
      turn_seconds: 20,
      summary: JSON.stringify({ hours: 4, headingDeg: 87.4, passCount: 31 }),
    });
    tractor = await insertMachine(t.db, farm.id, { name: '4WD No. 1' });
    tractor2 = await insertMachine(t.db, farm.id, { name: '4WD No. 2' });
    harrow = await insertImplement(t.db, farm.id, { name: '84 ft heavy harrow', width_m: 25.6032 });
    harrow2 = await insertImplement(t.db, farm.id, { name: '70 ft harrow', width_m: 21.336 });
  });
  afterAll(() => t.close());

  it('when the owner publishes, then each operator gets one order with fields in running order, machine, implement, hazards with clearances, pass plan, cautions, note and the run-sheet link', async () => {
    const d = '2026-07-01';
    await add(d, { fieldId: north, operatorId: tomas, machineId: tractor, implementId: harrow, note: 'Start at the east gate' });
    await add(d, { fieldId: slough, operatorId: tomas, machineId: tractor, implementId: harrow });
    await add(d, { fieldId: slough, operatorId: ada, machineId: tractor2, implementId: harrow2, startTime: '13:00' });
    const res = await owner.post(`/api/board/${d}/publish`, {});
    expect(res.status).toBe(200);
    expect(res.body.sent.map((s: { membershipId: number }) => s.membershipId).sort()).toEqual([tomas, ada].sort());
    expect(res.body.board.orders.map((o: { status: string }) => o.status)).toEqual(['queued', 'queued']);
    await drainAll();

    const mine = ordersTo(farm.operator.email, 'July 1, 2026');
    expect(mine).toHaveLength(1);
    const { text, html, subject } = mine[0];
    expect(subject).toBe(`Work order for Wednesday, July 1, 2026 (${farm.name})`);
    // The demo-like test farm is in America/Chicago: daylight time (CDT) in July (tz database).
    expect(text.indexOf('1. North Section: Harrowing, 07:00–11:00 CDT, 640.0 ac')).toBeGreaterThan(0);
    expect(text.indexOf('2. Slough Quarter: Harrowing, 11:00')).toBeGreaterThan(text.indexOf('1. North Section'));
    expect(text).toContain('Machine: 4WD No. 1');
    expect(text).toContain('Implement: 84 ft heavy harrow (84.0 ft)');
    // In the farm's units, whole feet as the run sheet writes them (shared/figures.ts formatLength):
    // 10 m = 32.8 ft → 33 ft; 3 m = 9.8 ft → 10 ft (1 ft = 0.3048 m, NIST).
    expect(text).toContain('Power pole or line: keep 33 ft clear. Transmission line along the north edge');
    expect(text).toContain('Rock: keep 10 ft clear. Large rock, marked with a flag');
    // The heading as the plan's summary and the run sheet write it (shared/figures.ts formatHeading), not rounded to whole degrees.
    expect(text).toContain('Pass plan: heading 87.4° (east–west), 31 passes, 2 headland passes');
    expect(text).toContain('Pass plan: none saved');
    expect(text).toContain('Note: Start at the east gate');
    for (const caution of OPERATION_INFO.harrowing.cautions) expect(text).toContain(caution);
    expect(text).toContain('defer to local law and licensed practice');
    expect(text).toContain('http://127.0.0.1:3999/run-sheet?date=2026-07-01');
    expect(html).toContain('href="http://127.0.0.1:3999/run-sheet?date=2026-07-01"');
    expect(html).toContain('Large rock, marked with a flag');

    const adas = ordersTo(adaEmail(), 'July 1, 2026');
    expect(adas).toHaveLength(1);
    expect(adas[0].text).toContain('1. Slough Quarter: Harrowing, 13:00');
    expect(adas[0].text).not.toContain('North Section');
    const b = await board(d);
    expect(b.orders.map((o) => [o.status, o.changedSincePublish])).toEqual([
      ['sent', false],
      ['sent', false],
    ]);
    expect(b.publishedAt).toEqual(expect.any(String));
  });

  it("when one operator's card changes and the board is published again, then only that operator's order is sent", async () => {
    const d = '2026-07-01';
    const before = await board(d);
    const adaCard = before.assignments.find((a) => a.operator.membershipId === ada)!;
    const changed = await owner.patch(`/api/assignments/${adaCard.id}`, { version: before.version, startTime: '14:00' });
    expect(changed.body.orders.find((o: { membershipId: number }) => o.membershipId === ada)).toMatchObject({
      status: 'sent',
      changedSincePublish: true,
    });
    expect(changed.body.orders.find((o: { membershipId: number }) => o.membershipId === tomas)).toMatchObject({
      changedSincePublish: false,
    });
    const res = await owner.post(`/api/board/${d}/publish`, { version: changed.body.version });
    expect(res.body.sent).toEqual([{ membershipId: ada, name: 'Ada', kind: 'order' }]);
    expect(res.body.unchanged).toEqual([{ membershipId: tomas, name: farm.operator.name }]);
    await drainAll();
    expect(ordersTo(farm.operator.email, 'July 1, 2026')).toHaveLength(1);
    const adas = ordersTo(adaEmail(), 'July 1, 2026');
    expect(adas).toHaveLength(2);
    expect(adas[1].text).toContain('1. Slough Quarter: Harrowing, 14:00');
  });

  it('when an operator loses all their jobs and the board is published again, then they are told their order is withdrawn', async () => {
    const d = '2026-07-01';
    const b = await board(d);
    const adaCard = b.assignments.find((a) => a.operator.membershipId === ada)!;
    await owner.delete(`/api/assignments/${adaCard.id}?version=${b.version}`);
    const res = await owner.post(`/api/board/${d}/publish`, {});
    expect(res.body.sent).toEqual([{ membershipId: ada, name: 'Ada', kind: 'withdrawn' }]);
    await drainAll();
    const adas = ordersTo(adaEmail(), 'July 1, 2026');
    expect(adas.at(-1)!.subject).toBe(`No jobs for you on Wednesday, July 1, 2026 (${farm.name})`);
    expect(adas.at(-1)!.text).toContain('you no longer have jobs that day');
    const again = await owner.post(`/api/board/${d}/publish`, {});
    expect(again.body.sent).toEqual([]);
  });

  it('when the mail server is down, then publishing still succeeds, orders wait as queued, and each is delivered exactly once when it is back', async () => {
    const d = '2026-07-02';
    await add(d, { fieldId: north, operatorId: tomas, machineId: tractor, implementId: harrow });
    await add(d, { fieldId: slough, operatorId: ada, machineId: tractor2, implementId: harrow2 });
    const port = t.mail.port;
    await t.mail.stop();
    try {
      const res = await owner.post(`/api/board/${d}/publish`, {});
      expect(res.status).toBe(200);
      await t.flushMail(); // fails: nobody listens on the port
      await t.flushMail();
      const b = await board(d);
      expect(b.orders.map((o) => o.status)).toEqual(['queued', 'queued']);
      const rows = await t.db('mail_outbox').where({ farm_id: farm.id, kind: 'work-order' }).andWhere('ref', 'like', `board:${d}:%`);
      expect(rows).toHaveLength(2);
      expect(rows.every((r) => r.status === 'queued' && r.attempts >= 1 && r.last_error)).toBe(true);
    } finally {
      await t.mail.start(port);
    }
    await drainAll();
    expect(ordersTo(farm.operator.email, 'July 2, 2026')).toHaveLength(1);
    expect(ordersTo(adaEmail(), 'July 2, 2026')).toHaveLength(1);
    expect((await board(d)).orders.map((o) => o.status)).toEqual(['sent', 'sent']);
    await t.flushMail();
    expect(ordersTo(farm.operator.email, 'July 2, 2026')).toHaveLength(1);
  });

  it("when a job's field is already finished for its operation this season, then that job's order repeats the board's warning and the other jobs' do not", async () => {
    const d = '2026-07-06';
    const doneField = await field('Home Quarter', 160);
    await t.db('assignments').insert({
      farm_id: farm.id,
      field_id: doneField,
      operator_id: ada,
      machine_id: tractor2,
      implement_id: harrow2,
      run_order: 1,
      day: '2026-05-04',
      operation: 'harrowing',
      acres_planned: 160,
      state: 'finished',
      acres_done: 160,
    });
    await add(d, { fieldId: doneField, operatorId: tomas, machineId: tractor, implementId: harrow, acresPlanned: 20 });
    await add(d, { fieldId: slough, operatorId: tomas, machineId: tractor, implementId: harrow });
    await add(d, { fieldId: north, operatorId: ada, machineId: tractor2, implementId: harrow2 });
    const warning = 'Home Quarter is already finished for harrowing this season';
    // The same words the owner confirmed on publishing (the board's soft conflict).
    expect((await board(d)).conflicts).toEqual([expect.objectContaining({ code: 'field_finished', severity: 'soft', message: warning })]);
    expect((await owner.post(`/api/board/${d}/publish`, {})).status).toBe(200);
    await drainAll();

    const [mine] = ordersTo(farm.operator.email, 'July 6, 2026');
    const [first, second] = mine.text.split('\n\n2. ');
    expect(first).toContain('1. Home Quarter: Harrowing');
    expect(first).toContain(`   Warning: ${warning}.\n   Ask the owner before you start; your judgement on the ground comes first.`);
    expect(second).toMatch(/^Slough Quarter: Harrowing/);
    expect(second).not.toContain('Warning');
    expect(mine.html).toContain(`<th style="text-align:left;padding-right:8px;vertical-align:top">Warning</th><td>${warning}.</td>`);
    const [adas] = ordersTo(adaEmail(), 'July 6, 2026');
    expect(adas.text).not.toContain('Warning');
    expect(adas.html).not.toContain('Warning');
  });

  it('when the board has a hard conflict, then publishing is refused with the list and nothing is queued', async () => {
    const d = '2026-07-03';
    await add(d, { fieldId: north, operatorId: tomas, machineId: tractor, implementId: harrow });
    await add(d, { fieldId: slough, operatorId: ada, machineId: tractor, implementId: harrow2 });
    const queued = async () =>
      Number((await t.db('mail_outbox').where({ farm_id: farm.id }).andWhere('ref', 'like', `board:${d}:%`).count({ n: '*' }))[0].n);
    const res = await owner.post(`/api/board/${d}/publish`, {});
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('board_conflicts');
    expect(res.body.error.conflicts).toEqual([expect.objectContaining({ code: 'machine_double_booked', severity: 'hard' })]);
    expect(res.body.error.message).toMatch(/^Fix this conflict before publishing: 4WD No. 1 is on two jobs at once/);
    expect(await queued()).toBe(0);
    expect((await board(d)).publishedAt).toBeNull();
  });
});
