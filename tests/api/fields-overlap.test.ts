import type { Geometry, MultiPolygon, Polygon } from 'geojson';
import GeometryFactory from 'jsts/org/locationtech/jts/geom/GeometryFactory.js';
import GeoJSONReader from 'jsts/org/locationtech/jts/io/GeoJSONReader.js';
import GeoJSONWriter from 'jsts/org/locationtech/jts/io/GeoJSONWriter.js';
import OverlayOp from 'jsts/org/locationtech/jts/operation/overlay/OverlayOp.js';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { ACRE, rect, referenceAreaM2 } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';

// The reference for every overlap: JTS's overlay (jsts OverlayOp.intersection) of the two
// boundaries, measured on the WGS84 ellipsoid with GeographicLib's planimeter (a geodesic
// measure; referenceAreaM2 in tests/support/geo-fixtures).
const reader = new GeoJSONReader(new GeometryFactory());
const writer = new GeoJSONWriter();
function jtsOverlapAcres(a: Polygon | MultiPolygon, b: Polygon | MultiPolygon): number {
  const shared = writer.write(OverlayOp.intersection(reader.read(a), reader.read(b))) as Geometry;
  if (shared.type !== 'Polygon' && shared.type !== 'MultiPolygon') return 0;
  return referenceAreaM2(shared) / ACRE;
}

interface Overlap {
  fieldId: number;
  name: string;
  areaM2: number;
  acres: number;
}

describe('overlapping field boundaries', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  // A half-mile square-ish field near 47.6° N (invented place).
  const home = rect(-99.9, 47.6, 0.0107, 0.0072);
  let homeId: number;

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Overlap');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    const res = await owner.post('/api/fields', { name: 'Home Quarter', boundary: home });
    expect(res.status).toBe(201);
    expect(res.body.overlaps).toEqual([]);
    homeId = res.body.id;
  });
  afterAll(() => t.close());

  it('when a drawn field overlaps another, then it is saved with a warning naming that field and the overlap in acres', async () => {
    const drawn = rect(-99.9 + 0.008, 47.6 + 0.002, 0.0107, 0.0072);
    const res = await owner.post('/api/fields', { name: 'East Strip', boundary: drawn });
    expect(res.status).toBe(201);
    const [overlap] = res.body.overlaps as Overlap[];
    expect(overlap).toMatchObject({ fieldId: homeId, name: 'Home Quarter' });
    const want = jtsOverlapAcres(drawn, home); // JTS overlay, GeographicLib area
    expect(want).toBeGreaterThan(20);
    expect(Math.abs(overlap.acres - want)).toBeLessThan(0.01);
    expect(await t.db('fields').where({ farm_id: farm.id, name: 'East Strip' }).first()).toBeTruthy();
  });

  it('when a field only shares an edge, or differs from its neighbour by a sliver under 2 m, then no overlap is reported', async () => {
    const west = rect(-99.9 - 0.0107, 47.6, 0.0107, 0.0072); // shares Home Quarter's west edge exactly
    const edge = await owner.post('/api/fields', { name: 'West Quarter', boundary: west });
    expect(edge.status).toBe(201);
    expect(edge.body.overlaps).toEqual([]);
    // Home Quarter redrawn 0.00002° of longitude (≈ 1.5 m at 47.6° N) west: a strip 1.5 m × 800 m over West Quarter.
    const drifted = rect(-99.9 - 0.00002, 47.6, 0.0107, 0.0072);
    expect(jtsOverlapAcres(drifted, west)).toBeGreaterThan(0.25); // JTS overlay, GeographicLib area: ≈ 0.3 ac, yet a sliver
    const shifted = await owner.patch(`/api/fields/${homeId}`, { boundary: drifted });
    expect(shifted.status).toBe(200);
    expect((shifted.body.overlaps as Overlap[]).map((o) => o.name)).toEqual(['East Strip']);
    await owner.patch(`/api/fields/${homeId}`, { boundary: home });
  });

  it('when a field is redrawn over another, then the answer warns; a rename alone does not compare again', async () => {
    const far = await owner.post('/api/fields', { name: 'River Flat', boundary: rect(-99.7, 47.7, 0.005, 0.005) });
    expect(far.body.overlaps).toEqual([]);
    const redrawn = rect(-99.9 + 0.005, 47.6 + 0.001, 0.003, 0.003); // inside Home Quarter
    const res = await owner.patch(`/api/fields/${far.body.id}`, { boundary: redrawn });
    expect(res.status).toBe(200);
    const names = (res.body.overlaps as Overlap[]).map((o) => o.name);
    expect(names[0]).toBe('Home Quarter');
    const want = jtsOverlapAcres(redrawn, home); // JTS overlay, GeographicLib area: the whole redrawn field
    expect(Math.abs((res.body.overlaps as Overlap[])[0].acres - want)).toBeLessThan(0.01);
    // The field is never compared with itself.
    expect(names).not.toContain('River Flat');
    const renamed = await owner.patch(`/api/fields/${far.body.id}`, { name: 'River Flat Two' });
    expect(renamed.status).toBe(200);
    expect(renamed.body.overlaps).toBeUndefined();
  });

  it('when an uploaded file has a feature over a field of the farm, then its preview row carries the warning', async () => {
    const over = rect(-99.9 - 0.002, 47.6 - 0.002, 0.004, 0.004); // over Home Quarter's south-west corner
    const clear = rect(-99.5, 47.5, 0.004, 0.004);
    const fc = {
      type: 'FeatureCollection',
      features: [
        { type: 'Feature', properties: { name: 'Corner Patch' }, geometry: over },
        { type: 'Feature', properties: { name: 'Clear Patch' }, geometry: clear },
      ],
    };
    const res = await owner.agent
      .post('/api/fields/import?dryRun=true')
      .set('X-XSRF-TOKEN', owner.xsrf)
      .attach('file', Buffer.from(JSON.stringify(fc)), 'patches.geojson');
    expect(res.status).toBe(200);
    const [first, second] = res.body.features as Array<{ overlaps: Overlap[] }>;
    const home1 = first.overlaps.find((o) => o.name === 'Home Quarter')!;
    const want = jtsOverlapAcres(over, home); // JTS overlay, GeographicLib area
    expect(Math.abs(home1.acres - want)).toBeLessThan(0.01);
    expect(first.overlaps.map((o) => o.name)).toContain('West Quarter');
    expect(second.overlaps).toEqual([]);
  });
});
