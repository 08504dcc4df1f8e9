import { geodesicAreaM2 } from '../../shared/geo/geodesic-area';
import type { JobCoverage } from '../../shared/schemas/track-coverage';
import { m2ToAcres } from '../../shared/units';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';
import { trackField, trackFieldProjection } from '../support/track-field';

// A 200 m × 300 m field at 47.6° N, 99.9° W, worked with a 20 m implement by one straight pass up
// its middle: covered = 20 × 300 m, two skips of 90 × 300 m (areas worked by hand).
const WIDTH = 20;
const boundary = trackField;
const proj = trackFieldProjection;
const lonLat = (x: number, y: number) => proj.inverse([x, y]);

/** GPX 1.1 of one pass from y = −200 to y = 200 m, a fix every 10 m and 5 s. */
function onePassGpx(): string {
  const pts = Array.from({ length: 41 }, (_, i) => {
    const [lon, lat] = lonLat(0, -200 + i * 10);
    const time = new Date(Date.UTC(2026, 4, 10, 7, 0, i * 5)).toISOString();
    return `<trkpt lat="${lat.toFixed(9)}" lon="${lon.toFixed(9)}"><time>${time}</time></trkpt>`;
  });
  return `<?xml version="1.0" encoding="UTF-8"?>
<gpx version="1.1" creator="Tamarack Ridge test" xmlns="http://www.topografix.com/GPX/1/1"><trk><name>Harrowing</name><trkseg>
${pts.join('\n')}
</trkseg></trk></gpx>`;
}

describe('coverage of a job from a track file', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let operator: Client;
  let jobId: number;

  const send = (c: Client, id: number, name: string | null, data?: string) => {
    const req = c.agent.post(`/api/assignments/${id}/coverage`).set('X-XSRF-TOKEN', c.xsrf);
    return name === null ? req : req.attach('file', Buffer.from(data ?? ''), name);
  };
  const saved = async () => (await t.db('assignment_coverage').where({ assignment_id: jobId })).length;

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Coverage');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    operator = new Client(t.app);
    await operator.signIn(farm.operator.email, farm.operator.password);
    const [f] = await t
      .db('fields')
      .insert({
        farm_id: farm.id,
        name: 'Coulee Strip',
        boundary: JSON.stringify(boundary),
        area_m2: geodesicAreaM2(boundary),
        acres: m2ToAcres(geodesicAreaM2(boundary)),
      })
      .returning('id');
    const [a] = await t
      .db('assignments')
      .insert({
        farm_id: farm.id,
        day: '2026-05-10',
        field_id: f.id,
        operation: 'harrowing',
        operator_id: farm.operator.membershipId,
        machine_id: await insertMachine(t.db, farm.id),
        implement_id: await insertImplement(t.db, farm.id, { width_m: WIDTH }),
        run_order: 1,
        acres_planned: 14,
      })
      .returning('id');
    jobId = a.id;
  });
  afterAll(() => t.close());

  it.each([
    ['not-a-track.txt', 'hello', /GPX .* GeoJSON/],
    ['damaged.gpx', '<gpx version="1.1"><trk><trkseg><trkpt lat="1"', /damaged/],
    ['entities.gpx', '<?xml version="1.0"?><!DOCTYPE gpx [<!ENTITY a "aaaa">]><gpx>&a;</gpx>', /document type or entities/],
    ['boundary.geojson', JSON.stringify({ type: 'Feature', properties: {}, geometry: boundary }), /no track/],
    ['kml.gpx', '<kml xmlns="http://www.opengis.net/kml/2.2"><Document/></kml>', /not GPX/],
    ['deep.geojson', '['.repeat(5000) + ']'.repeat(5000), /nests/],
  ])('when the file is bad (%s), then it answers 400 with the reason and saves nothing', async (name, data, reason) => {
    const res = await send(owner, jobId, name, data);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(reason);
    expect(await saved()).toBe(0);
  });

  it('when no file is sent, then it asks for one', async () => {
    const res = await send(owner, jobId, null);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('no_file');
  });

  it("when the job's operator sends a GPX of one pass, then the job stores the covered acres and the two skips beside it", async () => {
    const res = await send(operator, jobId, 'harrowing.gpx', onePassGpx());
    expect(res.status).toBe(201);
    const c = res.body as JobCoverage;
    // Hand: 20 m × 300 m covered; 2 × 90 m × 300 m skipped; GeographicLib (geodesicAreaM2) for the field.
    expect(c.fieldAcres).toBeCloseTo(m2ToAcres(geodesicAreaM2(boundary)), 6);
    expect(c.coveredAcres).toBeCloseTo(m2ToAcres(WIDTH * 300), 2);
    expect(c.skippedAcres).toBeCloseTo(m2ToAcres(2 * 90 * 300), 2);
    expect(c.skipCount).toBe(2);
    expect(c.trackLengthM).toBeCloseTo(400, 1);
    expect(c.sourceFormat).toBe('gpx');
    expect(c.skipGeometry?.type).toBe('MultiPolygon');
    const row = await t.db('assignment_coverage').where({ assignment_id: jobId }).first();
    expect(row.covered_acres).toBeCloseTo(c.coveredAcres, 9);
    expect(row.source_name).toBe('harrowing.gpx');
    expect(row.skip_count).toBe(2);
  });

  it('when the owner sends the same pass as GeoJSON points, then its measure replaces the first one', async () => {
    const features = Array.from({ length: 41 }, (_, i) => ({
      type: 'Feature',
      properties: { time: new Date(Date.UTC(2026, 4, 10, 7, 0, i * 5)).toISOString(), working: i < 20 },
      geometry: { type: 'Point', coordinates: lonLat(0, -200 + i * 10) },
    }));
    const res = await send(owner, jobId, 'track.geojson', JSON.stringify({ type: 'FeatureCollection', features }));
    expect(res.status).toBe(201);
    // Hand: working only from y = −200 to y = 0 (the state holds from a fix to the next): 20 m × 150 m in the field.
    expect(res.body.coveredAcres).toBeCloseTo(m2ToAcres(WIDTH * 150), 2);
    expect(res.body.sourceFormat).toBe('geojson');
    expect(await saved()).toBe(1);
  });
});
