// A finished job with a measured track counts the acres the track covered; the typed acres stay
// beside them as typed. The board, the run sheet and the season report say which figures were
// measured, and the season adds the tracks' skipped and twice-worked acres.
import { localProjection, projectionForField } from '../../shared/geo/local-projection';
import { geodesicAreaM2 } from '../../shared/geo/geodesic-area';
import type { Board } from '../../shared/schemas/board';
import type { RunSheetItem } from '../../shared/schemas/run-sheet';
import type { SeasonSummary } from '../../shared/schemas/season';
import { m2ToAcres } from '../../shared/units';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';

// A 200 m × 300 m field at 47.6° N, 99.9° W worked with a 20 m implement; each track is one
// straight pass the length of the field, so it covers 20 × 300 m and skips 180 × 300 m of it
// (areas worked by hand; GeographicLib's geodesicAreaM2 for the field itself).
const WIDTH = 20;
const PASS_M2 = WIDTH * 300;
const SKIP_M2 = 180 * 300;
const centre = localProjection([-99.9, 47.6]);
const ring = [
  [-100, -150],
  [100, -150],
  [100, 150],
  [-100, 150],
  [-100, -150],
].map((p) => centre.inverse(p));
const boundary = { type: 'Polygon' as const, coordinates: [ring] };
const proj = projectionForField(boundary);

/** GPX 1.1 of one pass along x (m from the field's centre), from y = −200 to 200 m, a fix every 10 m. */
function passGpx(x: number): string {
  const pts = Array.from({ length: 41 }, (_, i) => {
    const [lon, lat] = proj.inverse([x, -200 + i * 10]);
    const time = new Date(Date.UTC(2026, 4, 10, 7, 0, i * 5)).toISOString();
    return `<trkpt lat="${lat.toFixed(9)}" lon="${lon.toFixed(9)}"><time>${time}</time></trkpt>`;
  });
  return `<?xml version="1.0" encoding="UTF-8"?>
<gpx version="1.1" creator="Tamarack Ridge test" xmlns="http://www.topografix.com/GPX/1/1"><trk><trkseg>
${pts.join('\n')}
</trkseg></trk></gpx>`;
}

describe('measured acres of a finished job', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let operator: Client;
  let fieldId: number;
  let otherFieldId: number;
  let machineId: number;
  let implementId: number;
  let run = 0;

  const job = async (day: string, field = fieldId): Promise<number> => {
    const [a] = await t
      .db('assignments')
      .insert({
        farm_id: farm.id,
        day,
        field_id: field,
        operation: 'harrowing',
        operator_id: farm.operator.membershipId,
        machine_id: machineId,
        implement_id: implementId,
        run_order: ++run,
        acres_planned: 14,
      })
      .returning('id');
    return a.id;
  };
  const track = (c: Client, id: number, x: number) =>
    c.agent
      .post(`/api/assignments/${id}/coverage`)
      .set('X-XSRF-TOKEN', c.xsrf)
      .attach('file', Buffer.from(passGpx(x)), `pass-${x}.gpx`);
  const event = (c: Client, id: number, body: object) => c.post(`/api/assignments/${id}/events`, body);
  const finish = async (id: number, day: string, acres: number): Promise<RunSheetItem> => {
    expect((await event(operator, id, { type: 'start', at: `${day}T08:00:00-05:00` })).status).toBe(201);
    const done = await event(operator, id, { type: 'finish', at: `${day}T11:00:00-05:00`, acres });
    expect(done.status).toBe(201);
    return done.body;
  };
  const stored = async (id: number) => (await t.db('assignment_coverage').where({ assignment_id: id }).first()).covered_acres as number;
  const season = async (): Promise<SeasonSummary> => (await owner.get('/api/season/2026/summary')).body;

  let first: number;
  let second: number;

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Measured');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    operator = new Client(t.app);
    await operator.signIn(farm.operator.email, farm.operator.password);
    const field = async (name: string) =>
      (
        await t
          .db('fields')
          .insert({
            farm_id: farm.id,
            name,
            boundary: JSON.stringify(boundary),
            area_m2: geodesicAreaM2(boundary),
            acres: m2ToAcres(geodesicAreaM2(boundary)),
          })
          .returning('id')
      )[0].id as number;
    fieldId = await field('Coulee Strip');
    otherFieldId = await field('Slough Strip');
    machineId = await insertMachine(t.db, farm.id);
    implementId = await insertImplement(t.db, farm.id, { width_m: WIDTH });
  });
  afterAll(() => t.close());

  it('when a job with a measured track is finished with typed acres, then it counts the measured acres and keeps the typed ones', async () => {
    first = await job('2026-05-10');
    expect((await track(operator, first, 0)).status).toBe(201);
    const done = await finish(first, '2026-05-10', 14);
    // 20 m × 300 m by hand; the stored figure to the 0.0001 ac the column keeps.
    expect(done.log.acresDone).toBeCloseTo(m2ToAcres(PASS_M2), 2);
    expect(done.log.acresDone).toBe(Math.round((await stored(first)) * 1e4) / 1e4);
    expect(done.log).toMatchObject({ acresTyped: 14, acresMeasured: true });
    expect(done.events.at(-1)).toMatchObject({ type: 'finish', acres: done.log.acresDone });
    expect(await t.db('assignments').where({ id: first }).first('acres_source')).toEqual({ acres_source: 'measured' });
  });

  it('when a job without a track is finished, then its typed acres count, as before', async () => {
    const id = await job('2026-05-12', otherFieldId);
    const done = await finish(id, '2026-05-12', 9.5);
    expect(done.log).toMatchObject({ acresDone: 9.5, acresTyped: 9.5, acresMeasured: false });
  });

  it('when a track is measured for a job already finished, then its acres become the measured ones, the log says so and the board shows both', async () => {
    second = await job('2026-05-11');
    expect((await finish(second, '2026-05-11', 10)).log).toMatchObject({ acresDone: 10, acresMeasured: false });
    expect((await track(owner, second, 60)).status).toBe(201);
    const board: Board = (await owner.get('/api/board?date=2026-05-11')).body;
    const card = board.assignments.find((a) => a.id === second)!;
    expect(card.log.acresDone).toBeCloseTo(m2ToAcres(PASS_M2), 2);
    expect(card.log).toMatchObject({ acresTyped: 10, acresMeasured: true });
    // What is left of the field counts the measured acres of both jobs.
    expect(card.acresLeft).toBeCloseTo(m2ToAcres(geodesicAreaM2(boundary)) - 2 * m2ToAcres(PASS_M2), 1);
    const log = await t.db('assignment_events').where({ assignment_id: second, type: 'log-edited' });
    expect(log).toHaveLength(1);
    expect(log[0].note).toMatch(/^acres 10 → [\d.]+ measured from the track pass-60\.gpx \(typed 10\)$/);
  });

  it('when the season is read, then each field and operation gives its measured covered, typed, skipped and twice-worked acres', async () => {
    const s = await season();
    const covered = (await stored(first)) + (await stored(second));
    const coulee = s.byField.find((f) => f.fieldId === fieldId)!.operations.harrowing!;
    expect(coulee.jobs).toBe(2);
    expect(coulee.acres).toBeCloseTo(covered, 3);
    expect(coulee.measured).toMatchObject({ jobs: 2, typedAcres: 24 });
    expect(coulee.measured!.coveredAcres).toBeCloseTo(covered, 3);
    // Each pass skipped 180 m × 300 m of the field (by hand); two passes 20 m wide, 60 m apart, never overlap.
    expect(coulee.measured!.skippedAcres).toBeCloseTo(2 * m2ToAcres(SKIP_M2), 2);
    expect(coulee.measured!.workedTwiceAcres).toBe(0);
    const slough = s.byField.find((f) => f.fieldId === otherFieldId)!.operations.harrowing!;
    expect(slough).toMatchObject({ acres: 9.5, jobs: 1, measured: null });
    const harrowing = s.operations.find((o) => o.operation === 'harrowing')!;
    expect(harrowing).toMatchObject({ jobsFinished: 3, jobsMeasured: 2 });
    expect(harrowing.acresMeasured).toBeCloseTo(covered, 3);
    expect(harrowing.acresFinished).toBeCloseTo(covered + 9.5, 3);
  });

  it('when the fields table is downloaded, then its measured columns carry the same figures', async () => {
    const res = await owner.get('/api/season/2026/export/fields.csv').buffer(true);
    const [head, ...rows] = res.text
      .replace(/^\uFEFF/, '')
      .trim()
      .split('\r\n');
    expect(head.split(',').slice(-6)).toEqual([
      'jobs_finished',
      'jobs_measured',
      'acres_measured',
      'acres_typed_on_measured_jobs',
      'acres_skipped',
      'acres_worked_twice',
    ]);
    const row = (name: string) =>
      rows
        .find((r) => r.startsWith(`${name},`))!
        .split(',')
        .slice(-6);
    const s = await season();
    const m = s.byField.find((f) => f.fieldId === fieldId)!.operations.harrowing!.measured!;
    // Areas to the one decimal the screen shows (shared/figures.ts).
    expect(row('Coulee Strip')).toEqual(['2', '2', m.coveredAcres.toFixed(1), '24.0', m.skippedAcres.toFixed(1), '0.0']);
    expect(row('Slough Strip')).toEqual(['1', '0', '', '', '', '']);
  });

  it("when the owner corrects a measured job's acres, then the correction counts, as typed, and the log says it replaced the measured figure", async () => {
    const edited = await owner.patch(`/api/assignments/${second}/log`, { acresDone: 12 });
    expect(edited.status).toBe(200);
    expect(edited.body.log).toMatchObject({ acresDone: 12, acresTyped: 12, acresMeasured: false });
    expect(edited.body.events.at(-1).note).toMatch(/^acres [\d.]+ \(measured\) → 12$/);
    const coulee = (await season()).byField.find((f) => f.fieldId === fieldId)!.operations.harrowing!;
    expect(coulee.measured).toMatchObject({ jobs: 1, typedAcres: 14 });
    expect(coulee.acres).toBeCloseTo((await stored(first)) + 12, 3);
  });
});
