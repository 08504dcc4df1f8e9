// A job's map reads its coverage: the covered ground, the ground worked twice and the skips as
// GeoJSON, with the field they were measured on.
import type { MultiPolygon } from 'geojson';
import { geodesicAreaM2 } from '../../shared/geo/geodesic-area';
import type { JobCoverageView } from '../../shared/schemas/track-coverage';
import { m2ToAcres } from '../../shared/units';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { referenceAreaM2 } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';
import { trackField, trackFieldProjection } from '../support/track-field';

// A 200 m × 300 m field at 47.6° N, 99.9° W, a 20 m implement, and a track of two passes up the
// field at x = −10 and x = +5 m: they overlap by 5 m, so (by hand) 35 m × 300 m is covered,
// 5 m × 300 m of it twice, and the rest, 165 m × 300 m, is skipped in two strips.
const WIDTH = 20;
const boundary = trackField;
const proj = trackFieldProjection;

function twoPassGeoJson(): string {
  const line = (x: number, from: number, to: number) => ({
    type: 'Feature',
    properties: {},
    geometry: { type: 'LineString', coordinates: Array.from({ length: 41 }, (_, i) => proj.inverse([x, from + ((to - from) * i) / 40])) },
  });
  return JSON.stringify({ type: 'FeatureCollection', features: [line(-10, -200, 200), line(5, 200, -200)] });
}

/** Area of a lon/lat MultiPolygon on the ellipsoid, by GeographicLib (tests/support/geo-fixtures). */
const areaOf = (g: MultiPolygon | null) => (g ? referenceAreaM2(g) : 0);

describe("a job's coverage on its map", () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let operator: Client;
  let jobId: number;
  let fieldId: number;

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Coverage map');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    operator = new Client(t.app);
    await operator.signIn(farm.operator.email, farm.operator.password);
    const [f] = await t
      .db('fields')
      .insert({
        farm_id: farm.id,
        name: 'Butte Strip',
        boundary: JSON.stringify(boundary),
        area_m2: geodesicAreaM2(boundary),
        acres: m2ToAcres(geodesicAreaM2(boundary)),
      })
      .returning('id');
    fieldId = f.id;
    const [a] = await t
      .db('assignments')
      .insert({
        farm_id: farm.id,
        day: '2026-05-14',
        field_id: f.id,
        operation: 'seeding',
        operator_id: farm.operator.membershipId,
        machine_id: await insertMachine(t.db, farm.id),
        implement_id: await insertImplement(t.db, farm.id, { width_m: WIDTH, operations: ['seeding'] }),
        run_order: 1,
        acres_planned: 14,
      })
      .returning('id');
    jobId = a.id;
  });
  afterAll(() => t.close());

  it('when no track was sent, then the map has the field and no coverage', async () => {
    const res = await operator.get(`/api/assignments/${jobId}/coverage`);
    expect(res.status).toBe(200);
    const v = res.body as JobCoverageView;
    expect(v.coverage).toBeNull();
    expect(v.field).toMatchObject({ name: 'Butte Strip', boundary });
    // Seeding is an operation whose coverage rule is full (shared/operations.ts): every skip is flagged.
    expect(v.job).toMatchObject({ id: jobId, operation: 'seeding', coverageRule: 'full', acresMeasured: false });
  });

  it("when the field has a saved plan for the job's operation, then the map gets its passes to draw under the coverage", async () => {
    // No plan yet: nothing to draw.
    expect(((await operator.get(`/api/assignments/${jobId}/coverage`)).body as JobCoverageView).passes).toBeNull();
    // A 20 m drill north–south with no headland over a field 200 m wide (tests/support/track-field.ts):
    // passes every 20 m, 200 / 20 = 10 by hand; 11 where the planner lays its passes off the edge and
    // needs one more to reach the far side. Either way the map gets exactly the plan's own passes.
    const saved = await owner.put(`/api/plans/${fieldId}/seeding`, { widthM: WIDTH, headingDeg: 0, headlandPasses: 0 });
    expect(saved.status).toBe(200);
    const v = (await operator.get(`/api/assignments/${jobId}/coverage`)).body as JobCoverageView;
    expect(v.passes!.features).toHaveLength(saved.body.result.passCount);
    expect([10, 11]).toContain(saved.body.result.passCount);
    expect(v.passes!.features.every((f) => f.geometry.type === 'LineString')).toBe(true);
    expect(await owner.delete(`/api/plans/${fieldId}/seeding`)).toMatchObject({ status: 204 });
  });

  it('when a track of two overlapping passes is measured, then the map gets the covered, twice-worked and skipped ground', async () => {
    const sent = await operator.agent
      .post(`/api/assignments/${jobId}/coverage`)
      .set('X-XSRF-TOKEN', operator.xsrf)
      .attach('file', Buffer.from(twoPassGeoJson()), 'two-passes.geojson');
    expect(sent.status).toBe(201);
    const v = (await owner.get(`/api/assignments/${jobId}/coverage`)).body as JobCoverageView;
    const c = v.coverage!;
    // Hand: 35 × 300 m covered, 5 × 300 m twice, 165 × 300 m skipped in two strips.
    expect(c.coveredAcres).toBeCloseTo(m2ToAcres(35 * 300), 2);
    expect(c.workedTwiceAcres).toBeCloseTo(m2ToAcres(5 * 300), 2);
    expect(c.skippedAcres).toBeCloseTo(m2ToAcres(165 * 300), 2);
    expect(c.skipCount).toBe(2);
    // The outlines hold those areas (GeographicLib), within the strips' drawing at the scanline spacing.
    expect(Math.abs(areaOf(c.coveredGeometry) - 35 * 300) / (35 * 300)).toBeLessThan(0.005);
    expect(Math.abs(areaOf(c.twiceGeometry) - 5 * 300) / (5 * 300)).toBeLessThan(0.01);
    expect(Math.abs(areaOf(c.skipGeometry) - 165 * 300) / (165 * 300)).toBeLessThan(0.005);
  });
});
