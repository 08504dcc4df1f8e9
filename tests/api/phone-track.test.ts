// The phone track a job's operator records on the run sheet: stored in chunks exactly once per
// chunk id, read by the owner and the operator only, and measured as a coverage source with the
// same code as an uploaded track file.
import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import { dayIn } from '../../shared/calendar';
import { geodesicAreaM2 } from '../../shared/geo/geodesic-area';
import type { PhoneTrack, TrackPointInput } from '../../shared/schemas/phone-track';
import type { JobCoverage } from '../../shared/schemas/track-coverage';
import { m2ToAcres } from '../../shared/units';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { type Client, signedIn, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';
import { trackField, trackFieldProjection } from '../support/track-field';

// A 200 m × 300 m field at 47.6° N, 99.9° W and a 20 m implement; the tractor drives three
// passes up and down at x = −60, 0 and 60 m, from 50 m beyond one end to 50 m beyond the other
// (the turns are outside the field), a point every 10 m and 2 s.
const WIDTH = 20;
const boundary = trackField;
const proj = trackFieldProjection;
const T0 = Date.now() - 60 * 60_000;
const STARTED = new Date(T0).toISOString();
const FINISHED = new Date(T0 + 30 * 60_000).toISOString();

/** Pass k (0, 1, 2): 41 points from y = −200 to 200 m (or back), taken from T0 + 60 s on. */
function pass(k: number): TrackPointInput[] {
  const x = -60 + 60 * k;
  return Array.from({ length: 41 }, (_, i) => {
    const y = k % 2 === 0 ? -200 + i * 10 : 200 - i * 10;
    const [lon, lat] = proj.inverse([x, y]);
    return {
      at: new Date(T0 + 60_000 + (k * 41 + i) * 2000).toISOString(),
      lat,
      lon,
      accuracyM: 4,
      headingDeg: k % 2 ? 180 : 0,
      speedMps: 5,
    };
  });
}

describe('the phone track of a job', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let operator: Client;
  let viewer: Client;
  let otherOperator: Client;
  let stranger: Client;
  let jobId: number;
  let otherJobId: number;
  let outboxJobId: number;
  let raceJobId: number;
  const chunks = [pass(0), pass(1), pass(2)].map((points) => ({ chunkId: randomUUID(), points }));

  const send = (c: Client, id: number, body: object) => c.post(`/api/assignments/${id}/track-points`, body);
  const stored = async (id = jobId) => Number((await t.db('assignment_track_points').where({ assignment_id: id }).count('* as n'))[0].n);
  const coverage = async () => t.db('assignment_coverage').where({ assignment_id: jobId }).first();

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Phone Track');
    owner = await signedIn(t.app, farm.owner.email, farm.owner.password);
    operator = await signedIn(t.app, farm.operator.email, farm.operator.password);
    viewer = await signedIn(t.app, farm.viewer.email, farm.viewer.password);
    const elsewhere = await makeFarm(t.db, 'Elsewhere');
    stranger = await signedIn(t.app, elsewhere.operator.email, elsewhere.operator.password);
    // A second operator of the same farm, with a job of their own.
    const email = `second-${randomUUID().slice(0, 8)}@furlong.test`;
    const [u] = await t
      .db('users')
      .insert({ email, name: 'Second Operator', password_hash: bcrypt.hashSync('second-operator-pw', 4) })
      .returning('id');
    const [m] = await t
      .db('memberships')
      .insert({ farm_id: farm.id, user_id: u.id, role: 'operator', status: 'active', joined_at: t.db.fn.now() })
      .returning('id');
    otherOperator = await signedIn(t.app, email, 'second-operator-pw');

    const [f] = await t
      .db('fields')
      .insert({
        farm_id: farm.id,
        name: 'Slough Quarter',
        boundary: JSON.stringify(boundary),
        area_m2: geodesicAreaM2(boundary),
        acres: m2ToAcres(geodesicAreaM2(boundary)),
      })
      .returning('id');
    // The farm's day (the test farm keeps America/Chicago) of the start: a start is taken from the job's day on.
    const day = dayIn('America/Chicago', new Date(T0));
    const machine = await insertMachine(t.db, farm.id);
    const implement = await insertImplement(t.db, farm.id, { width_m: WIDTH });
    const job = async (operatorId: number, order: number) =>
      (
        await t
          .db('assignments')
          .insert({
            farm_id: farm.id,
            day,
            field_id: f.id,
            operation: 'harrowing',
            operator_id: operatorId,
            machine_id: machine,
            implement_id: implement,
            run_order: order,
            acres_planned: 14,
          })
          .returning('id')
      )[0].id as number;
    jobId = await job(farm.operator.membershipId, 1);
    otherJobId = await job(m.id, 2);
    outboxJobId = await job(farm.operator.membershipId, 3);
    raceJobId = await job(farm.operator.membershipId, 4);
    const started = await operator.post(`/api/assignments/${jobId}/events`, { type: 'start', at: STARTED });
    expect(started.status).toBe(201);
  });
  afterAll(() => t.close());

  it.each([
    ['a chunk id that is not a UUID', { chunkId: 'chunk-1', points: pass(0).slice(0, 2) }, /UUID/],
    ['no points', { chunkId: randomUUID(), points: [] }, /at least one point/],
    ['a latitude of 91°', { chunkId: randomUUID(), points: [{ ...pass(0)[0], lat: 91 }] }, /Latitude/],
    [
      'a point taken tomorrow',
      { chunkId: randomUUID(), points: [{ ...pass(0)[0], at: new Date(Date.now() + 86_400_000).toISOString() }] },
      /ahead of the farm's clock/,
    ],
  ])('when a chunk has %s, then it answers 400 with the reason and stores nothing', async (_, body, reason) => {
    const res = await send(operator, jobId, body);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(reason);
    expect(await stored()).toBe(0);
  });

  it('when the same chunk is sent twice, then the second answer is the first one and no point is stored twice', async () => {
    const first = await send(operator, jobId, chunks[0]);
    expect(first.status).toBe(201);
    expect(first.body).toEqual({ chunkId: chunks[0].chunkId, points: 41 });
    const again = await send(operator, jobId, chunks[0]);
    expect(again.status).toBe(first.status);
    expect(again.body).toEqual(first.body);
    expect(await stored()).toBe(41);
    // Both at once (a resend while the first is still on its way): still once.
    const both = await Promise.all([send(operator, jobId, chunks[1]), send(operator, jobId, chunks[1])]);
    expect(both.map((r) => r.status)).toEqual([201, 201]);
    expect(await stored()).toBe(82);
  });

  it('when a chunk id comes again with other points, then it is refused and nothing is added', async () => {
    const res = await send(operator, jobId, { chunkId: chunks[0].chunkId, points: pass(2).slice(0, 5) });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('chunk_reused');
    expect(await stored()).toBe(82);
  });

  it("when anyone but the job's operator sends points, then they are refused and nothing is stored", async () => {
    const body = { chunkId: randomUUID(), points: pass(2) };
    // The operator of another job of the same farm, the owner (not this job's operator), a viewer, another farm's member.
    expect((await send(otherOperator, jobId, body)).status).toBe(403);
    expect((await send(owner, jobId, body)).status).toBe(403);
    expect((await send(viewer, jobId, body)).status).toBe(403);
    expect((await send(stranger, jobId, body)).status).toBe(404);
    // This job's operator cannot write to the other operator's job either.
    expect((await send(operator, otherJobId, body)).status).toBe(403);
    expect(await stored()).toBe(82);
    expect(await stored(otherJobId)).toBe(0);
  });

  it('when the owner or the operator reads the track, then it comes in the order taken; others are refused', async () => {
    const res = await owner.get(`/api/assignments/${jobId}/track-points`);
    expect(res.status).toBe(200);
    const track = res.body as PhoneTrack;
    expect(track.points).toHaveLength(82);
    expect(track.points[0]).toEqual({ ...pass(0)[0] });
    expect(track.points.map((p) => p.at)).toEqual([...pass(0), ...pass(1)].map((p) => p.at));
    expect((await operator.get(`/api/assignments/${jobId}/track-points`)).status).toBe(200);
    expect((await otherOperator.get(`/api/assignments/${jobId}/track-points`)).status).toBe(403);
    expect((await viewer.get(`/api/assignments/${jobId}/track-points`)).status).toBe(403);
  });

  it('when the job finishes, then its phone track becomes its coverage; a chunk sent after the finish is measured too', async () => {
    const done = await operator.post(`/api/assignments/${jobId}/events`, { type: 'finish', at: FINISHED, acres: 14 });
    expect(done.status).toBe(201);
    const first = await coverage();
    expect(first.source_format).toBe('phone');
    expect(first.source_name).toBe('phone track');
    // Hand: two passes of 20 m over the field's 300 m, 40 m apart (no overlap).
    expect(first.covered_acres).toBeCloseTo(m2ToAcres(2 * WIDTH * 300), 2);
    // The phone sends its last chunk (taken before the finish) after it.
    expect((await send(operator, jobId, chunks[2])).status).toBe(201);
    const late = await coverage();
    expect(late.covered_acres).toBeCloseTo(m2ToAcres(3 * WIDTH * 300), 2);
    expect(new Date(late.computed_at).getTime()).toBeGreaterThan(new Date(first.computed_at).getTime());
  });

  it('when the same points are sent as a GeoJSON file through the track upload, then the coverage is the same as from the phone track', async () => {
    const phone = await owner.post(`/api/assignments/${jobId}/coverage/from-phone-track`);
    expect(phone.status).toBe(201);
    const fromPhone = phone.body as JobCoverage;
    expect(fromPhone.sourceFormat).toBe('phone');
    // The same points as GeoJSON Point features with their times (RFC 7946), in the order taken.
    const features = chunks
      .flatMap((c) => c.points)
      .map((p) => ({ type: 'Feature', properties: { time: p.at }, geometry: { type: 'Point', coordinates: [p.lon, p.lat] } }));
    const file = await owner.agent
      .post(`/api/assignments/${jobId}/coverage`)
      .set('X-XSRF-TOKEN', owner.xsrf)
      .attach('file', Buffer.from(JSON.stringify({ type: 'FeatureCollection', features })), 'phone-points.geojson');
    expect(file.status).toBe(201);
    const fromFile = file.body as JobCoverage;
    expect(fromFile.sourceFormat).toBe('geojson');
    for (const k of [
      'fieldAcres',
      'workRegionAcres',
      'coveredAcres',
      'skippedAcres',
      'sliverAcres',
      'workedTwiceAcres',
      'trackLengthM',
    ] as const)
      expect(fromPhone[k]).toBeCloseTo(fromFile[k], 9);
    expect(fromPhone.skipCount).toBe(fromFile.skipCount);
    expect(fromPhone.skips).toEqual(fromFile.skips);
    // Hand: three 20 m passes over 300 m; two 40 m strips between them and 30 m strips at the sides are skipped.
    expect(fromPhone.coveredAcres).toBeCloseTo(m2ToAcres(3 * WIDTH * 300), 2);
    expect(fromPhone.skippedAcres).toBeCloseTo(m2ToAcres((2 * 40 + 2 * 30) * 300), 2);
    // A track file sent on purpose is not replaced by the phone's when more points come late.
    expect(
      (await send(operator, jobId, { chunkId: randomUUID(), points: [{ ...pass(2)[40], at: new Date(T0 + 1000).toISOString() }] })).status,
    ).toBe(201);
    expect((await coverage()).source_format).toBe('geojson');
  });

  it("when the job is finished from the phone's outbox (the signal came back), then its phone track becomes its coverage as with a single finish", async () => {
    // (5 ac: the field's harrowing this season is mostly done by the first job.)
    expect((await operator.post(`/api/assignments/${outboxJobId}/events`, { type: 'start', at: STARTED })).status).toBe(201);
    for (const k of [0, 1]) expect((await send(operator, outboxJobId, { chunkId: randomUUID(), points: pass(k) })).status).toBe(201);
    const sent = await operator.post('/api/run-sheet/outbox', {
      events: [{ assignmentId: outboxJobId, type: 'finish', at: FINISHED, acres: 5, clientEventId: randomUUID() }],
    });
    expect(sent.status).toBe(200);
    expect(sent.body.results[0].status).toBe(201);
    const row = await t.db('assignment_coverage').where({ assignment_id: outboxJobId }).first();
    expect(row?.source_format).toBe('phone');
    // Hand: two passes of 20 m over the field's 300 m, 40 m apart (no overlap).
    expect(row.covered_acres).toBeCloseTo(m2ToAcres(2 * WIDTH * 300), 2);
  });

  it('when a chunk is being stored as the finish lands, then the coverage is measured again with its points once it is in', async () => {
    // (5 ac: the field's harrowing this season is mostly done by the first job.)
    expect((await operator.post(`/api/assignments/${raceJobId}/events`, { type: 'start', at: STARTED })).status).toBe(201);
    expect((await send(operator, raceJobId, { chunkId: randomUUID(), points: pass(0) })).status).toBe(201);
    // Hold every chunk's insert (a SHARE lock lets reads through): the second pass's chunk has
    // checked its job, still underway, and waits to be stored when the finish comes in.
    const hold = await t.db.transaction();
    await hold.raw('LOCK TABLE assignment_track_chunks IN SHARE MODE');
    const pending = send(operator, raceJobId, { chunkId: randomUUID(), points: pass(1) }).then((r) => r);
    const waiting = async () =>
      Number(
        (
          await t.db.raw(
            "SELECT count(*) AS n FROM pg_stat_activity WHERE wait_event_type = 'Lock' AND query ILIKE 'insert into \"assignment_track_chunks\"%'",
          )
        ).rows[0].n,
      );
    for (let i = 0; i < 200 && (await waiting()) === 0; i++) await new Promise((r) => setTimeout(r, 25));
    expect(await waiting()).toBe(1);
    const done = await operator.post(`/api/assignments/${raceJobId}/events`, { type: 'finish', at: FINISHED, acres: 5 });
    expect(done.status).toBe(201);
    const atFinish = await t.db('assignment_coverage').where({ assignment_id: raceJobId }).first();
    // Hand: one pass of 20 m over the field's 300 m.
    expect(atFinish.covered_acres).toBeCloseTo(m2ToAcres(WIDTH * 300), 2);
    await hold.commit();
    expect((await pending).status).toBe(201);
    const row = await t.db('assignment_coverage').where({ assignment_id: raceJobId }).first();
    // Hand: two passes of 20 m over the field's 300 m, 40 m apart (no overlap).
    expect(row.covered_acres).toBeCloseTo(m2ToAcres(2 * WIDTH * 300), 2);
  });

  it('when a job has no phone track, then measuring it answers 409 with what to do', async () => {
    const res = await otherOperator.post(`/api/assignments/${otherJobId}/coverage/from-phone-track`);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/Record track/);
  });
});
