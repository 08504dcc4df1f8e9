// Reports from the field reach the owner: an open list with confirm / dismiss, an e-mail to each
// owner through the outbox in the report's own transaction, and a breakdown puts the machine down.
import type { FieldReports } from '../../shared/schemas/run-sheet';
import type { Board } from '../../shared/schemas/board';
import { dayIn } from '../../shared/calendar';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';

describe('reports from the field', () => {
  let t: TestApp;
  let farm: TestFarm;
  let other: TestFarm;
  let owner: Client;
  let operator: Client;
  let otherOwner: Client;
  let tractor: number;
  let harrow: number;
  let n = 0;

  const field = async (): Promise<number> => {
    const [f] = await t
      .db('fields')
      .insert({
        farm_id: farm.id,
        name: `Reported ${++n}`,
        boundary: JSON.stringify(rect(-97.5 + n * 0.01, 47.1, 0.005, 0.005)),
        area_m2: 100 * 4046.86,
        acres: 100,
      })
      .returning('id');
    return f.id;
  };
  const board = async (date: string): Promise<Board> => (await owner.get(`/api/board?date=${date}`)).body;
  const add = async (date: string, fieldId: number): Promise<number> => {
    const res = await owner.post('/api/assignments', {
      version: (await board(date)).version,
      date,
      operation: 'harrowing',
      fieldId,
      machineId: tractor,
      implementId: harrow,
      operatorId: farm.operator.membershipId,
    });
    expect(res.status).toBe(201);
    return res.body.savedAssignmentId;
  };
  const reports = async (): Promise<FieldReports> => {
    const res = await owner.get('/api/reports');
    expect(res.status).toBe(200);
    return res.body;
  };
  const outbox = (ref: string) => t.db('mail_outbox').where({ farm_id: farm.id, kind: 'field-report' }).andWhere('ref', 'like', `${ref}%`);

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Reports');
    other = await makeFarm(t.db, 'Elsewhere');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    operator = new Client(t.app);
    await operator.signIn(farm.operator.email, farm.operator.password);
    otherOwner = new Client(t.app);
    await otherOwner.signIn(other.owner.email, other.owner.password);
    tractor = await insertMachine(t.db, farm.id, { name: '4WD No. 3' });
    harrow = await insertImplement(t.db, farm.id);
  });
  afterAll(() => t.close());

  it('when an operator reports a breakdown, then the owner sees it open at once with job, field and machine, the machine is down, and each owner gets an e-mail', async () => {
    const f = await field();
    // A job of the farm's today (America/Chicago, the test farm's zone): it can be started now.
    const today = dayIn('America/Chicago');
    const id = await add(today, f);
    expect((await operator.post(`/api/assignments/${id}/events`, { type: 'start' })).status).toBe(201);
    const res = await operator.post(`/api/assignments/${id}/problems`, { kind: 'breakdown', note: 'Hydraulic hose burst' });
    expect(res.status).toBe(201);
    const list = await reports();
    expect(list.reports).toHaveLength(1);
    const report = list.reports[0];
    expect(report).toMatchObject({
      kind: 'breakdown',
      note: 'Hydraulic hose burst',
      by: farm.operator.name,
      review: 'open',
      job: { id, date: today, operation: 'harrowing', state: 'paused' },
      field: { id: f, name: expect.stringMatching(/^Reported \d+$/) },
      machine: { id: tractor, name: '4WD No. 3' },
    });
    expect(list.machinesDown).toEqual([{ machineId: tractor, name: '4WD No. 3', reportId: report.id, since: report.at }]);
    const mails = await outbox(`report:${report.id}:`);
    expect(mails.map((m) => m.to_address)).toEqual([farm.owner.email]);
    expect(mails[0].subject).toBe(`${farm.operator.name} reported a breakdown: ${report.field.name}`);
    expect(mails[0].text_body).toContain('"Hydraulic hose burst"');
    expect(mails[0].text_body).toContain('The job was paused.');
    expect(mails[0].text_body).toMatch(/Confirm or dismiss it: http\S+\/reports/);
    // Another farm sees none of it.
    expect((await otherOwner.get('/api/reports')).body).toEqual({ reports: [], machinesDown: [], keptActions: [] });
  });

  it('when a report is refused for bad input, then there is no report and no e-mail', async () => {
    const id = await add('2031-06-02', await field());
    const before = Number((await t.db('mail_outbox').where({ farm_id: farm.id }).count({ n: '*' }))[0].n);
    const bad = await operator.post(`/api/assignments/${id}/problems`, {
      kind: 'hazard',
      note: 'Rock',
      geometry: { type: 'Point', coordinates: [-97.5, 147.1] },
    });
    expect(bad.status).toBe(422);
    expect(Number((await t.db('mail_outbox').where({ farm_id: farm.id }).count({ n: '*' }))[0].n)).toBe(before);
    expect((await reports()).reports.filter((r) => r.job.id === id)).toEqual([]);
  });

  it('when the owner confirms a new-hazard report, then it leaves the open list and the hazard is confirmed on the field; a second review is refused', async () => {
    const f = await field();
    const id = await add('2031-06-03', f);
    const res = await operator.post(`/api/assignments/${id}/problems`, {
      kind: 'hazard',
      note: 'Washout by the culvert',
      geometry: { type: 'Point', coordinates: [-97.5 + n * 0.01 + 0.002, 47.102] },
      hazardKind: 'rock',
      clearanceM: 5,
    });
    expect(res.status).toBe(201);
    const report = (await reports()).reports.find((r) => r.job.id === id)!;
    expect(report).toMatchObject({ kind: 'hazard', hazardId: expect.any(Number) });
    expect((await operator.post(`/api/reports/${report.id}/confirm`)).status).toBe(403);
    expect((await otherOwner.post(`/api/reports/${report.id}/confirm`)).status).toBe(404);
    const confirmed = await owner.post(`/api/reports/${report.id}/confirm`);
    expect(confirmed.status).toBe(200);
    expect(confirmed.body).toMatchObject({ id: report.id, review: 'confirmed' });
    expect((await t.db('hazards').where({ id: report.hazardId }).first()).status).toBe('confirmed');
    expect((await reports()).reports.map((r) => r.id)).not.toContain(report.id);
    const again = await owner.post(`/api/reports/${report.id}/dismiss`);
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already confirmed/);
  });

  it('when a machine is reported broken down, then its open cards on any day carry a soft conflict with the report; a card of another machine none', async () => {
    const spare = await insertMachine(t.db, farm.id, { name: 'Spare 4WD' });
    const later = await add('2031-06-05', await field());
    const res = await owner.post('/api/assignments', {
      version: (await board('2031-06-05')).version,
      date: '2031-06-05',
      operation: 'harrowing',
      fieldId: await field(),
      machineId: spare,
      implementId: await insertImplement(t.db, farm.id),
      operatorId: farm.owner.membershipId,
    });
    expect(res.status).toBe(201);
    const day = await board('2031-06-05');
    const down = day.conflicts.filter((c) => c.code === 'machine_reported_down');
    expect(down).toEqual([
      {
        code: 'machine_reported_down',
        severity: 'soft',
        message: expect.stringMatching(
          /^4WD No\. 3 was reported broken down on [A-Z][a-z]{2} \d{1,2}, \d\d:\d\d \("Hydraulic hose burst"\): give the job another machine/,
        ),
        assignmentIds: [later],
      },
    ]);
    // Soft (publishing is held back by hard conflicts only): the report may be stale, the owner decides.
  });

  it('when the owner dismisses a breakdown, then the machine is no longer down', async () => {
    const down = (await reports()).machinesDown.find((m) => m.machineId === tractor)!;
    const res = await owner.post(`/api/reports/${down.reportId}/dismiss`);
    expect(res.body.review).toBe('dismissed');
    expect((await reports()).machinesDown).toEqual([]);
    expect((await board('2031-06-05')).conflicts.filter((c) => c.code === 'machine_reported_down')).toEqual([]);
    expect((await owner.post('/api/reports/abc/dismiss')).status).toBe(400);
  });
});
