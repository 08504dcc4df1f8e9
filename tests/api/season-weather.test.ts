// Weather days lost in the season report: jobs planned on the board and called off from the run
// sheet through the API, as an operator does it. The expected counts are worked out by hand from
// the jobs below (a day counts when at least one job that day was called off for weather).
import type { Operation } from '../../shared/operations';
import type { SeasonSummary } from '../../shared/schemas/season';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';

const YEAR = 2026;

let t: TestApp;
let farm: TestFarm;
let owner: Client;
let operator: Client;
let viewer: Client;
let fieldId: number;
let machine: number;
const implementFor: Partial<Record<Operation, number>> = {};

beforeAll(async () => {
  t = await startTestApp();
  farm = await makeFarm(t.db, 'Season weather');
  owner = new Client(t.app);
  await owner.signIn(farm.owner.email, farm.owner.password);
  operator = new Client(t.app);
  await operator.signIn(farm.operator.email, farm.operator.password);
  viewer = new Client(t.app);
  await viewer.signIn(farm.viewer.email, farm.viewer.password);
  const [f] = await t
    .db('fields')
    .insert({
      farm_id: farm.id,
      name: 'Coulee quarter',
      boundary: JSON.stringify(rect(-99.5, 47.6, 0.004, 0.003)),
      area_m2: 80_000,
      acres: 19.77,
    })
    .returning('id');
  fieldId = f.id;
  machine = await insertMachine(t.db, farm.id);
  implementFor.harrowing = await insertImplement(t.db, farm.id);
  implementFor.spraying = await insertImplement(t.db, farm.id, { kind: 'sprayer', operations: ['spraying'], width_m: 36.576 });
  for (const operation of ['harrowing', 'spraying'])
    await t.db('crew_skills').insert({ farm_id: farm.id, membership_id: farm.operator.membershipId, operation, level: 'qualified' });
});
afterAll(() => t.close());

/** A job on the board for the farm's operator, planned by the owner. */
async function plan(day: string, operation: Operation): Promise<number> {
  const { version } = (await owner.get(`/api/board?date=${day}`)).body;
  const res = await owner.post('/api/assignments', {
    version,
    date: day,
    fieldId,
    operatorId: farm.operator.membershipId,
    machineId: machine,
    implementId: implementFor[operation],
    operation,
    acresPlanned: 5,
  });
  expect(res.status).toBe(201);
  return res.body.savedAssignmentId as number;
}

/** The operator calls the job off from the run sheet, at 07:30 UTC on its day ('other' must say why). */
async function callOff(id: number, day: string, reason: 'weather' | 'breakdown' | 'other'): Promise<void> {
  const note = reason === 'other' ? 'Gate to the field is locked' : undefined;
  const res = await operator.post(`/api/assignments/${id}/events`, { type: 'call-off', reason, note, at: `${day}T07:30:00Z` });
  expect(res.status).toBe(201);
  expect(res.body.state).toBe('called-off');
}

async function summary(year = YEAR): Promise<SeasonSummary> {
  const res = await viewer.get(`/api/season/${year}/summary`);
  expect(res.status).toBe(200);
  return res.body as SeasonSummary;
}

const opOf = (s: SeasonSummary, op: Operation) => s.operations.find((o) => o.operation === op)!;

describe('weather days lost', () => {
  beforeAll(async () => {
    // Spraying: two jobs rained off on 10 June, one on 11 June, one broken down on 12 June, one left planned.
    await callOff(await plan('2026-06-10', 'spraying'), '2026-06-10', 'weather');
    await callOff(await plan('2026-06-10', 'spraying'), '2026-06-10', 'weather');
    await callOff(await plan('2026-06-11', 'spraying'), '2026-06-11', 'weather');
    await callOff(await plan('2026-06-12', 'spraying'), '2026-06-12', 'breakdown');
    await plan('2026-06-13', 'spraying');
    // Harrowing: rained off on 10 June too (the same day as spraying), and called off for another reason on 14 June.
    await callOff(await plan('2026-06-10', 'harrowing'), '2026-06-10', 'weather');
    await callOff(await plan('2026-06-14', 'harrowing'), '2026-06-14', 'other');
    // Last season's weather call-off stays in last season. Its day is the last of that season,
    // so its tap time stays within the year a phone may send late (older taps are refused).
    await callOff(await plan('2025-12-31', 'harrowing'), '2025-12-31', 'weather');
  });

  it('when jobs are called off for weather on two days and one for another reason, then the operation counts 2 weather days and ignores the other reason', async () => {
    const spraying = opOf(await summary(), 'spraying');
    // 10 and 11 June; 12 June was a breakdown.
    expect(spraying.weatherDaysLost).toBe(2);
    expect(spraying.jobsCalledOffForWeather).toBe(3);
    // The breakdown still counts as a call-off, just not a weather one.
    expect(spraying.jobsCalledOff).toBe(4);
  });

  it('when two operations lose the same day, then each counts it and the farm counts it once', async () => {
    const s = await summary();
    expect(opOf(s, 'harrowing')).toMatchObject({ weatherDaysLost: 1, jobsCalledOffForWeather: 1, jobsCalledOff: 2 });
    // Days: 10 and 11 June (spraying) ∪ 10 June (harrowing) = 2, not 1 + 2.
    expect(s.totals).toMatchObject({ weatherDaysLost: 2, jobsCalledOffForWeather: 4, jobsCalledOff: 6 });
    for (const op of ['tillage', 'seeding', 'swathing', 'combining', 'baling'] as const)
      expect(opOf(s, op)).toMatchObject({ weatherDaysLost: 0, jobsCalledOffForWeather: 0 });
  });

  it('when another season is read, then only its own weather call-offs count', async () => {
    const last = await summary(YEAR - 1);
    expect(opOf(last, 'harrowing')).toMatchObject({ weatherDaysLost: 1, jobsCalledOffForWeather: 1 });
    expect(last.totals.weatherDaysLost).toBe(1);
    expect((await summary(YEAR + 1)).totals).toMatchObject({ weatherDaysLost: 0, jobsCalledOffForWeather: 0 });
  });

  it("when another farm calls a job off for weather, then this farm's count does not move", async () => {
    const before = await summary();
    const other = await makeFarm(t.db, 'Season weather other');
    const [f] = await t
      .db('fields')
      .insert({ farm_id: other.id, name: 'Elsewhere', boundary: JSON.stringify(rect(-98, 47, 0.01, 0.01)), area_m2: 1e6, acres: 247.1 })
      .returning('id');
    const [a] = await t
      .db('assignments')
      .insert({
        farm_id: other.id,
        day: '2026-06-15',
        field_id: f.id,
        operation: 'spraying',
        operator_id: other.operator.membershipId,
        machine_id: await insertMachine(t.db, other.id),
        implement_id: await insertImplement(t.db, other.id, { kind: 'sprayer', operations: ['spraying'] }),
        run_order: 1,
        acres_planned: 10,
        state: 'called-off',
        call_off_reason: 'weather',
      })
      .returning('id');
    await t.db('assignment_events').insert({ farm_id: other.id, assignment_id: a.id, type: 'call-off', reason: 'weather' });
    expect(await summary()).toEqual(before);
  });

  it('when the operations CSV is downloaded, then it carries the weather days and jobs per operation', async () => {
    const res = await viewer.get(`/api/season/${YEAR}/export/operations.csv`);
    expect(res.status).toBe(200);
    const [head, ...rows] = res.text
      .replace(/^\uFEFF/, '')
      .trimEnd()
      .split('\r\n')
      .map((l) => l.split(','));
    const col = (name: string) => head.indexOf(name);
    const row = (label: string) => rows.find((r) => r[0] === label)!;
    expect(col('weather_days_lost')).toBeGreaterThan(0);
    expect([row('Spraying')[col('weather_days_lost')], row('Spraying')[col('jobs_called_off_for_weather')]]).toEqual(['2', '3']);
    expect([row('Harrowing')[col('weather_days_lost')], row('Harrowing')[col('jobs_called_off_for_weather')]]).toEqual(['1', '1']);
  });
});
