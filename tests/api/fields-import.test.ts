// Boundary files round-trip: each fixture is written here with a well-known writer package
// (tokml for KML, @mapbox/shp-write for shapefiles, JSON for GeoJSON, JSZip for KMZ) and read
// back through the API; acres are checked against GeographicLib's planimeter.
import shpwrite from '@mapbox/shp-write';
import type { Feature, FeatureCollection, MultiPolygon, Polygon, Position } from 'geojson';
import JSZip from 'jszip';
import proj4 from 'proj4';
import tokml from 'tokml';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { ACRE, rect, rectWithHole, referenceAreaM2, twoParts } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';

// WGS 84 / UTM zone 14N in ESRI WKT, as GIS programs write it in a .prj (EPSG:32614).
const UTM14N_WKT =
  'PROJCS["WGS_1984_UTM_Zone_14N",GEOGCS["GCS_WGS_1984",DATUM["D_WGS_1984",SPHEROID["WGS_1984",6378137.0,298.257223563]],' +
  'PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]],PROJECTION["Transverse_Mercator"],PARAMETER["False_Easting",500000.0],' +
  'PARAMETER["False_Northing",0.0],PARAMETER["Central_Meridian",-99.0],PARAMETER["Scale_Factor",0.9996],PARAMETER["Latitude_Of_Origin",0.0],UNIT["Meter",1.0]]';
const UTM14N = '+proj=utm +zone=14 +datum=WGS84 +units=m +no_defs';

const feature = (name: string, geometry: Polygon | MultiPolygon): Feature => ({
  type: 'Feature',
  properties: { name, crop: 'durum' },
  geometry,
});

/** Three invented fields: a plain one, one with a hole, one in two parts (one with a hole). */
function threeFields(tag: string): FeatureCollection {
  return {
    type: 'FeatureCollection',
    features: [
      feature(`${tag} North`, rect(-99.91, 47.61, 0.0107, 0.0072)),
      feature(`${tag} Slough`, rectWithHole(-99.93, 47.61, 0.0107, 0.0072)),
      feature(`${tag} Split`, twoParts(-99.96, 47.63)),
    ],
  };
}

const acresOf = (g: Polygon | MultiPolygon) => referenceAreaM2(g) / ACRE;

function mapCoords(g: Polygon | MultiPolygon, f: (p: Position) => Position): Polygon | MultiPolygon {
  return g.type === 'Polygon'
    ? { type: 'Polygon', coordinates: g.coordinates.map((r) => r.map(f)) }
    : { type: 'MultiPolygon', coordinates: g.coordinates.map((p) => p.map((r) => r.map(f))) };
}

/**
 * shp-write writes polygons and multi-part polygons to one file name (the last wins), so every
 * feature is written as a MultiPolygon: one layer, parts and holes kept.
 */
async function shapefileZip(fc: FeatureCollection, prj?: string): Promise<Buffer> {
  const multi: FeatureCollection = {
    type: 'FeatureCollection',
    features: fc.features.map((f) =>
      f.geometry.type === 'Polygon' ? { ...f, geometry: { type: 'MultiPolygon', coordinates: [f.geometry.coordinates] } } : f,
    ),
  };
  const out = await shpwrite.zip(multi, { outputType: 'nodebuffer', ...(prj ? { prj } : {}) } as never);
  return out as unknown as Buffer;
}

async function rezip(zipBuf: Buffer, edit: (zip: JSZip) => void): Promise<Buffer> {
  const zip = await JSZip.loadAsync(zipBuf);
  edit(zip);
  return zip.generateAsync({ type: 'nodebuffer' });
}

describe('importing boundary files', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  const count = async () => Number((await t.db('fields').where({ farm_id: farm.id }).count({ n: '*' }))[0].n);
  const upload = (name: string, data: Buffer | string, q = '', selection?: unknown) => {
    const req = owner.agent.post(`/api/fields/import${q}`).set('X-XSRF-TOKEN', owner.xsrf);
    if (selection !== undefined) req.field('selection', JSON.stringify(selection));
    return req.attach('file', Buffer.isBuffer(data) ? data : Buffer.from(data), name);
  };

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Import');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
  });
  afterAll(() => t.close());

  function expectSameFields(found: Array<{ name: string; acres: number }>, fc: FeatureCollection) {
    expect(found.map((f) => f.name)).toEqual(fc.features.map((f) => f.properties!.name));
    found.forEach((f, i) => {
      const want = acresOf(fc.features[i].geometry as Polygon | MultiPolygon);
      expect(Math.abs(f.acres - want) / want).toBeLessThan(1e-5);
    });
  }

  it('when a GeoJSON file is previewed (dry run), then every field is found with its acres and nothing is saved', async () => {
    const fc = threeFields('Geo');
    const before = await count();
    const res = await upload('fields.geojson', JSON.stringify(fc), '?dryRun=true');
    expect(res.status).toBe(200);
    expect(res.body.format).toBe('geojson');
    expect(res.body.nameAttribute).toBe('name');
    expect(res.body.attributes).toEqual(['name', 'crop']);
    expect(res.body.features.every((f: { errors: string[] }) => f.errors.length === 0)).toBe(true);
    expect(res.body.features.every((f: { problems: unknown[] }) => f.problems.length === 0)).toBe(true);
    expectSameFields(res.body.features, fc);
    expect(await count()).toBe(before);
  });

  it('when a GeoJSON file is saved, then all its fields are stored with their holes and parts', async () => {
    const fc = threeFields('GeoSave');
    const res = await upload('fields.geojson', JSON.stringify(fc));
    expect(res.status).toBe(201);
    expectSameFields(res.body.saved, fc);
    const split = await t.db('fields').where({ farm_id: farm.id, name: 'GeoSave Split' }).first();
    expect(split.boundary.type).toBe('MultiPolygon');
    expect(split.boundary.coordinates[0]).toHaveLength(2); // outer ring + hole
  });

  it('when a KML file (written by tokml) is read, then the same fields and acres come back', async () => {
    const fc = threeFields('Kml');
    const res = await upload('fields.kml', tokml(fc, { name: 'name' }), '?dryRun=true');
    expect(res.status).toBe(200);
    expect(res.body.format).toBe('kml');
    expectSameFields(res.body.features, fc);
  });

  it('when a KMZ (a zipped KML) is read, then the same fields come back', async () => {
    const fc = threeFields('Kmz');
    const zip = new JSZip();
    zip.file('doc.kml', tokml(fc, { name: 'name' }));
    const res = await upload('fields.kmz', await zip.generateAsync({ type: 'nodebuffer' }), '?dryRun=true');
    expect(res.status).toBe(200);
    expect(res.body.format).toBe('kmz');
    expectSameFields(res.body.features, fc);
  });

  it('when a zipped shapefile in WGS84 (written by shp-write) is read, then the same fields come back', async () => {
    const fc = threeFields('Shp');
    const res = await upload('fields.zip', await shapefileZip(fc), '?dryRun=true');
    expect(res.status).toBe(200);
    expect(res.body.format).toBe('shapefile');
    expectSameFields(res.body.features, fc);
  });

  it('when a shapefile is in a projected system (UTM 14N), then it is reprojected from its .prj to the same acres', async () => {
    const fc = threeFields('Utm');
    const wgs = fc.features;
    const projected: FeatureCollection = {
      type: 'FeatureCollection',
      features: wgs.map((f) => ({ ...f, geometry: mapCoords(f.geometry as Polygon | MultiPolygon, (p) => proj4('WGS84', UTM14N, p)) })),
    };
    const res = await upload('utm.zip', await shapefileZip(projected, UTM14N_WKT), '?dryRun=true');
    expect(res.status).toBe(200);
    // The reprojection is checked against the original lon/lat fields to 1e-5 (0.001 %).
    expectSameFields(res.body.features, { type: 'FeatureCollection', features: wgs });
    const first = res.body.features[0].geometry.coordinates[0][0];
    expect(first[0]).toBeCloseTo(-99.91, 6);
    expect(first[1]).toBeCloseTo(47.61, 6);
  });

  it('when the owner unticks and renames, then only the chosen fields are saved under the new names', async () => {
    const fc = threeFields('Pick');
    const res = await upload('pick.geojson', JSON.stringify(fc), '', [
      { index: 0, name: 'Picked North' },
      { index: 2, name: 'Picked Split' },
    ]);
    expect(res.status).toBe(201);
    expect(res.body.saved.map((s: { name: string }) => s.name)).toEqual(['Picked North', 'Picked Split']);
    expect(await t.db('fields').where({ farm_id: farm.id }).whereIn('name', ['Pick Slough', 'Pick North']).first()).toBeUndefined();
  });

  it('when a name attribute is chosen, then names come from it', async () => {
    const fc = threeFields('Attr');
    const res = await upload('attr.geojson', JSON.stringify(fc), '?dryRun=true&nameAttribute=crop');
    expect(res.body.features.map((f: { name: string }) => f.name)).toEqual(['durum', 'durum', 'durum']);
    expect(res.body.features[1].errors.join()).toMatch(/used twice in this file/);
    expect(res.body.features[1].problems).toEqual([{ code: 'name-repeated', message: res.body.features[1].errors[0], index: 1 }]);
    expect(res.body.features[0].problems).toEqual([]);
  });

  it('when a feature whose name is already on the farm is saved under another name, then it is saved', async () => {
    const taken = { type: 'FeatureCollection', features: [feature('Kept Name', rect(-99.5, 47.7, 0.01, 0.01))] };
    expect((await upload('first.geojson', JSON.stringify(taken))).status).toBe(201);
    const before = await count();
    const again = { type: 'FeatureCollection', features: [feature('Kept Name', rect(-99.4, 47.7, 0.01, 0.01))] };
    const res = await upload('again.geojson', JSON.stringify(again), '', [{ index: 0, name: 'Kept Name East' }]);
    expect(res.status).toBe(201);
    expect(res.body.saved.map((s: { name: string }) => s.name)).toEqual(['Kept Name East']);
    expect(await count()).toBe(before + 1);
  });

  describe('bad files are refused with a clear message and save nothing', () => {
    const refused = async (
      res: { status: number; body: { error: { message: string } } },
      status: number,
      message: RegExp,
      before: number,
    ) => {
      expect(res.status).toBe(status);
      expect(res.body.error.message).toMatch(message);
      expect(await count()).toBe(before);
    };
    /** The codes of an `import_refused` answer's problems, each with the message it stands beside. */
    const codes = (res: { body: { error: { problems?: Array<{ code: string; message: string }> } } }) =>
      (res.body.error.problems ?? []).map((p) => p.code);

    it('when one of three fields crosses itself, then nothing is saved and the crossing is named', async () => {
      const before = await count();
      const fc = threeFields('Bad');
      (fc.features[1].geometry as Polygon).coordinates = [
        [
          [-99.93, 47.61],
          [-99.92, 47.62],
          [-99.92, 47.61],
          [-99.93, 47.62],
          [-99.93, 47.61],
        ],
      ];
      const res = await upload('bad.geojson', JSON.stringify(fc));
      await refused(res, 422, /Nothing was saved.*"Bad Slough".*crosses itself near 47\.615\d*° N, 99\.925\d*° W/, before);
      expect(codes(res)).toEqual(['self-intersection']);
      expect(res.body.error.problems[0]).toMatchObject({ index: 1, message: expect.stringMatching(/crosses itself/) });
    });
    it('when the file is empty, then 400', async () => refused(await upload('empty.geojson', ''), 400, /is empty/, await count()));
    it('when the file is over 10 MB, then 413', async () => {
      const before = await count();
      await refused(await upload('huge.geojson', Buffer.alloc(10 * 1024 * 1024 + 10, 32)), 413, /larger than Furlong accepts/, before);
    });
    it('when a zip holds no .shp, then 422 says so', async () => {
      const zip = new JSZip();
      zip.file('readme.txt', 'no shapes here');
      await refused(await upload('x.zip', await zip.generateAsync({ type: 'nodebuffer' })), 422, /no \.shp file/, await count());
    });
    it('when a zip has .shp but no .dbf, then 422 says so', async () => {
      const buf = await rezip(await shapefileZip(threeFields('NoDbf')), (z) => z.remove('POLYGON.dbf'));
      await refused(await upload('x.zip', buf), 422, /no matching \.dbf/, await count());
    });
    it('when a shapefile has no .prj, then 422: the coordinate system is not guessed', async () => {
      const buf = await rezip(await shapefileZip(threeFields('NoPrj')), (z) => z.remove('POLYGON.prj'));
      await refused(await upload('x.zip', buf), 422, /no \.prj file/, await count());
    });
    it('when the .prj cannot be read, then 422', async () => {
      const buf = await rezip(await shapefileZip(threeFields('OddPrj')), (z) => z.file('POLYGON.prj', 'PROJCS["Mystery",NOT_WKT_AT_ALL'));
      await refused(await upload('x.zip', buf), 422, /coordinate system in POLYGON\.prj cannot be read/, await count());
    });
    it('when the zip is corrupt, then 422', async () => {
      const buf = Buffer.concat([Buffer.from('PK\u0003\u0004'), Buffer.alloc(200, 7)]);
      await refused(await upload('x.zip', buf), 422, /damaged/, await count());
    });
    it('when the KML is corrupt, then 422', async () => {
      await refused(
        await upload('x.kml', '<?xml version="1.0"?><kml><Document><Placemark><name>A</name></Document>'),
        422,
        /KML file is damaged/,
        await count(),
      );
    });
    it('when the GeoJSON holds a point where a boundary is expected, then 422 names the feature', async () => {
      const fc: FeatureCollection = {
        type: 'FeatureCollection',
        features: [{ type: 'Feature', properties: { name: 'Pump' }, geometry: { type: 'Point', coordinates: [-99.9, 47.6] } }],
      };
      const res = await upload('p.geojson', JSON.stringify(fc));
      await refused(res, 422, /feature 1 \("Pump"\) is a point/, await count());
      expect(codes(res)).toEqual(['not-polygon']);
    });
    it('when a field of the file is already on the farm, then 422 and nothing is saved', async () => {
      await upload(
        'first.geojson',
        JSON.stringify({ type: 'FeatureCollection', features: [feature('Twice Field', rect(-99.8, 47.7, 0.01, 0.01))] }),
      );
      const before = await count();
      const fc = {
        type: 'FeatureCollection',
        features: [feature('Fresh Field', rect(-99.7, 47.7, 0.01, 0.01)), feature('Twice Field', rect(-99.6, 47.7, 0.01, 0.01))],
      };
      const res = await upload('again.geojson', JSON.stringify(fc));
      await refused(res, 422, /already exists on this farm/, before);
      expect(codes(res)).toEqual(['name-taken']);
      const preview = await upload('again.geojson', JSON.stringify(fc), '?dryRun=true');
      expect(preview.body.features.map((f: { problems: Array<{ code: string }> }) => f.problems.map((p) => p.code))).toEqual([
        [],
        ['name-taken'],
      ]);
      expect(preview.body.features[1].errors).toEqual(['A field called "Twice Field" already exists on this farm; rename it or untick it']);
    });
    it('when the coordinates are latitude-first, then 422 says they look swapped', async () => {
      const g = rect(-99.9, 47.6, 0.01, 0.01);
      g.coordinates = [g.coordinates[0].map(([x, y]) => [y, x])];
      const res = await upload('swap.geojson', JSON.stringify(feature('Swapped', g)));
      await refused(res, 422, /swapped/, await count());
      expect(codes(res)).toEqual(['swapped']);
    });
    it('when the file is neither GeoJSON, KML nor a zip, then 415', async () => {
      await refused(await upload('notes.txt', 'just some notes'), 415, /reads GeoJSON/, await count());
    });
  });
});
