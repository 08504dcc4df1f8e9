// Boundary files as old county and consultant data have them: a .prj that leaves out a parameter,
// datums other than WGS84, parts that touch at a point, padded .shp files and KML as various
// programs write it. Every fixture is written here (shp-write for the shapefile records, strings
// for WKT and KML); acres are checked against GeographicLib's planimeter, validity against JTS
// (jsts IsValidOp, a port of JTS/GEOS validity).
import shpwrite from '@mapbox/shp-write';
import type { Feature, MultiPolygon, Polygon, Position } from 'geojson';
import GeometryFactory from 'jsts/org/locationtech/jts/geom/GeometryFactory.js';
import GeoJSONReader from 'jsts/org/locationtech/jts/io/GeoJSONReader.js';
import IsValidOp from 'jsts/org/locationtech/jts/operation/valid/IsValidOp.js';
import JSZip from 'jszip';
import proj4 from 'proj4';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { ACRE, rect, referenceAreaM2 } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';
// eslint-disable-next-line @typescript-eslint/no-require-imports
const { Geodesic } = require('geographiclib-geodesic') as {
  Geodesic: { WGS84: { Inverse: (lat1: number, lon1: number, lat2: number, lon2: number) => { s12: number } } };
};

const jts = new GeoJSONReader(new GeometryFactory());
const jtsValid = (g: Polygon | MultiPolygon): boolean => (new IsValidOp(jts.read(g)) as unknown as { isValid(): boolean }).isValid();

const GEOG_NAD83 =
  'GEOGCS["GCS_North_American_1983",DATUM["D_North_American_1983",SPHEROID["GRS_1980",6378137.0,298.257222101]],PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]]';
const GEOG_NAD27 =
  'GEOGCS["GCS_North_American_1927",DATUM["D_North_American_1927",SPHEROID["Clarke_1866",6378206.4,294.978698213898]],PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]]';

/** An invented Lambert conic zone in ESRI WKT with its latitude of origin left out, as some writers do. */
const LCC_NO_ORIGIN =
  `PROJCS["NAD_1983_Lambert_Invented",${GEOG_NAD83},PROJECTION["Lambert_Conformal_Conic"],` +
  'PARAMETER["False_Easting",600000.0],PARAMETER["False_Northing",0.0],PARAMETER["Central_Meridian",-100.5],' +
  'PARAMETER["Standard_Parallel_1",47.4333333333333],PARAMETER["Standard_Parallel_2",48.7333333333333],UNIT["Meter",1.0]]';
/** The same zone as PROJ reads it: a missing latitude of origin is 0 (PROJ/GDAL default; recalled from memory). */
const LCC_PROJ =
  '+proj=lcc +lat_1=47.4333333333333 +lat_2=48.7333333333333 +lat_0=0 +lon_0=-100.5 +x_0=600000 +y_0=0 +ellps=GRS80 +units=m';

const utmWkt = (geog: string, name: string) =>
  `PROJCS["${name}",${geog},PROJECTION["Transverse_Mercator"],PARAMETER["False_Easting",500000.0],PARAMETER["False_Northing",0.0],` +
  'PARAMETER["Central_Meridian",-99.0],PARAMETER["Scale_Factor",0.9996],PARAMETER["Latitude_Of_Origin",0.0],UNIT["Meter",1.0]]';
const UTM14_NAD83 = utmWkt(GEOG_NAD83, 'NAD_1983_UTM_Zone_14N');
const UTM14 = '+proj=utm +zone=14 +ellps=GRS80 +units=m +no_defs';

type Boundary = Polygon | MultiPolygon;
const feature = (name: string, geometry: Boundary): Feature => ({ type: 'Feature', properties: { name }, geometry });
const mapCoords = (g: Boundary, f: (p: Position) => Position): Boundary =>
  g.type === 'Polygon'
    ? { type: 'Polygon', coordinates: g.coordinates.map((r) => r.map(f)) }
    : { type: 'MultiPolygon', coordinates: g.coordinates.map((p) => p.map((r) => r.map(f))) };

/** A zipped shapefile of the features (every one written as a MultiPolygon) with the given .prj text. */
async function shapefileZip(features: Feature[], prj: string, editShp?: (shp: Buffer) => Buffer): Promise<Buffer> {
  const multi = features.map((f) =>
    f.geometry.type === 'Polygon' ? { ...f, geometry: { type: 'MultiPolygon', coordinates: [f.geometry.coordinates] } } : f,
  );
  const written = (await shpwrite.zip({ type: 'FeatureCollection', features: multi }, { outputType: 'nodebuffer' } as never)) as Buffer;
  const zip = await JSZip.loadAsync(written);
  const shpName = Object.keys(zip.files).find((n) => n.endsWith('.shp'))!;
  const prjName = shpName.replace(/\.shp$/, '.prj');
  zip.file(prjName, prj);
  if (editShp) zip.file(shpName, editShp(await zip.file(shpName)!.async('nodebuffer')));
  return zip.generateAsync({ type: 'nodebuffer' });
}

interface PreviewFeature {
  name: string;
  acres: number | null;
  geometry: Boundary | null;
  errors: string[];
}

describe('boundary files as real-world programs write them', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  const preview = (name: string, data: Buffer | string) =>
    owner.agent
      .post('/api/fields/import?dryRun=true')
      .set('X-XSRF-TOKEN', owner.xsrf)
      .attach('file', Buffer.isBuffer(data) ? data : Buffer.from(data), name);

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Import real world');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
  });
  afterAll(() => t.close());

  describe('a .prj that leaves out a parameter', () => {
    it('when a Lambert conic .prj has no latitude of origin, then it is read with the PROJ/GDAL default (0) and the field lands where it was', async () => {
      const wgs = rect(-100.31, 47.88, 0.0107, 0.0072);
      const projected = mapCoords(wgs, (p) => proj4('WGS84', LCC_PROJ, p));
      const res = await preview('lcc.zip', await shapefileZip([feature('Coulee', projected)], LCC_NO_ORIGIN));
      expect(res.status).toBe(200);
      const [f] = res.body.features as PreviewFeature[];
      expect(f.errors).toEqual([]);
      // Acres against GeographicLib's planimeter of the original lon/lat rectangle, to 1e-5.
      const want = referenceAreaM2(wgs) / ACRE;
      expect(Math.abs(f.acres! - want) / want).toBeLessThan(1e-5);
      // Where it lands: the corner within about a centimetre (1e-7°) of the lon/lat it was made from.
      const corner = (f.geometry as Polygon).coordinates[0][0];
      expect(corner[0]).toBeCloseTo(-100.31, 7);
      expect(corner[1]).toBeCloseTo(47.88, 7);
    });

    it('when a Lambert conic .prj has no standard parallel, then 422 says it cannot be read for sure', async () => {
      const noParallels = LCC_NO_ORIGIN.replace(/PARAMETER\["Standard_Parallel_\d",[\d.]+\],/g, '');
      const projected = mapCoords(rect(-100.31, 47.88, 0.01, 0.007), (p) => proj4('WGS84', LCC_PROJ, p));
      const res = await preview('lcc.zip', await shapefileZip([feature('Coulee', projected)], noParallels));
      expect(res.status).toBe(422);
      expect(res.body.error.message).toMatch(/leaves out its standard parallel/);
    });

    it('when the projection is one Furlong does not read, then 422 names it instead of guessing', async () => {
      const odd = LCC_NO_ORIGIN.replace('"Lambert_Conformal_Conic"', '"Hotine_Oblique_Mercator_Azimuth_Center"');
      const res = await preview('odd.zip', await shapefileZip([feature('Coulee', rect(600000, 5300000, 400, 300))], odd));
      expect(res.status).toBe(422);
      expect(res.body.error.message).toMatch(/uses the Hotine Oblique Mercator Azimuth Center projection, which Furlong does not read/);
    });
  });

  describe('datums', () => {
    // Meades Ranch, Kansas, the NAD27 origin: NAD27 39°13′26.686″ N, 98°32′30.506″ W; NAD83
    // 39°13′26.71220″ N, 98°32′31.74540″ W (NGS datasheet; recalled from memory).
    const dms = (d: number, m: number, s: number) => d + m / 60 + s / 3600;
    const NAD27_POINT = [-dms(98, 32, 30.506), dms(39, 13, 26.686)];
    const NAD83_POINT = [-dms(98, 32, 31.7454), dms(39, 13, 26.7122)];

    it('when a shapefile is in NAD27, then 422 asks for WGS84 or NAD83 rather than moving the field by tens of metres', async () => {
      // Read without the NADCON shift, the point would sit this far from where it is (GeographicLib inverse).
      const unshiftedM = Geodesic.WGS84.Inverse(NAD27_POINT[1], NAD27_POINT[0], NAD83_POINT[1], NAD83_POINT[0]).s12;
      expect(unshiftedM).toBeGreaterThan(25);
      const field = rect(NAD27_POINT[0], NAD27_POINT[1], 0.008, 0.006);
      const res = await preview('nad27.zip', await shapefileZip([feature('Ranch', field)], GEOG_NAD27));
      expect(res.status).toBe(422);
      expect(res.body.error.message).toMatch(/^This file uses the NAD27 datum; convert it to WGS84 or NAD83 first/);
      const utm27 = utmWkt(GEOG_NAD27, 'NAD_1927_UTM_Zone_14N');
      const res2 = await preview('nad27utm.zip', await shapefileZip([feature('Ranch', rect(560000, 4340000, 400, 300))], utm27));
      expect(res2.status).toBe(422);
      expect(res2.body.error.message).toMatch(/NAD27 datum/);
    });

    it('when a shapefile is in NAD83 (UTM 14N), then it is read unshifted (NAD83 to WGS 84 is a null shift, EPSG:1188; recalled from memory)', async () => {
      const wgs = rect(-99.41, 47.33, 0.0107, 0.0072);
      const res = await preview(
        'nad83.zip',
        await shapefileZip(
          [
            feature(
              'Flat',
              mapCoords(wgs, (p) => proj4('WGS84', UTM14, p)),
            ),
          ],
          UTM14_NAD83,
        ),
      );
      expect(res.status).toBe(200);
      const corner = (res.body.features[0].geometry as Polygon).coordinates[0][0];
      expect(corner[0]).toBeCloseTo(-99.41, 7);
      expect(corner[1]).toBeCloseTo(47.33, 7);
    });

    it('when a datum has no shift good to a few metres (European 1950, no TOWGS84), then 422 names it', async () => {
      const ed50 =
        'GEOGCS["GCS_European_1950",DATUM["D_European_1950",SPHEROID["International_1924",6378388.0,297.0]],PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]]';
      const res = await preview('ed50.zip', await shapefileZip([feature('Far', rect(2.1, 48.1, 0.01, 0.007))], ed50));
      expect(res.status).toBe(422);
      expect(res.body.error.message).toMatch(/^This file uses the European 1950 datum; convert it to WGS84 or NAD83 first/);
    });

    it('when a datum carries a seven-parameter TOWGS84, then the shift is applied (checked against the EPSG Guidance Note 7-2 worked example)', async () => {
      // IOGP Guidance Note 7-2, Position Vector transformation example (recalled from memory):
      // WGS 72 → WGS 84, tZ = +4.5 m, rZ = +0.554″, dS = +0.219 ppm; X 3657660.66, Y 255768.55,
      // Z 5201382.11 → X 3657660.78, Y 255778.43, Z 5201387.75.
      const wgs72 =
        'GEOGCS["WGS 72",DATUM["WGS_1972",SPHEROID["WGS 72",6378135,298.26],TOWGS84[0,0,4.5,0,0,0.554,0.219]],PRIMEM["Greenwich",0],UNIT["degree",0.0174532925199433]]';
      const from = proj4(
        '+proj=geocent +a=6378135 +rf=298.26 +units=m',
        '+proj=longlat +a=6378135 +rf=298.26',
        [3657660.66, 255768.55, 5201382.11],
      );
      const to = proj4('+proj=geocent +datum=WGS84 +units=m', 'WGS84', [3657660.78, 255778.43, 5201387.75]);
      const field = rect(from[0], from[1], 0.01, 0.007);
      const res = await preview('wgs72.zip', await shapefileZip([feature('Shifted', field)], wgs72));
      expect(res.status).toBe(200);
      const corner = (res.body.features[0].geometry as Polygon).coordinates[0][0];
      // The worked example gives centimetres; the heights differ a little, so a decimetre is allowed.
      expect(Geodesic.WGS84.Inverse(corner[1], corner[0], to[1], to[0]).s12).toBeLessThan(0.1);
      expect(Geodesic.WGS84.Inverse(corner[1], corner[0], from[1], from[0]).s12).toBeGreaterThan(5);
    });
  });

  describe('parts that touch at a point', () => {
    it('when two parts of a projected field touch where a vertex of one lies on an edge of the other, then the field is valid, as JTS says', async () => {
      // In UTM metres: a square, and a triangle above it whose lowest vertex lies on the square's top edge.
      const [x0, y0] = [452_000, 5_273_000];
      const square: Position[] = [
        [x0, y0],
        [x0 + 400, y0],
        [x0 + 400, y0 + 400],
        [x0, y0 + 400],
        [x0, y0],
      ];
      const triangle: Position[] = [
        [x0 + 200.3, y0 + 400],
        [x0 + 500, y0 + 700],
        [x0 - 100, y0 + 700],
        [x0 + 200.3, y0 + 400],
      ];
      const source: MultiPolygon = { type: 'MultiPolygon', coordinates: [[square], [triangle]] };
      expect(jtsValid(source)).toBe(true); // JTS: parts touching at one point are valid (OGC SF 1.2.1 §6.1.11)
      const res = await preview('touch.zip', await shapefileZip([feature('Bowtie', source)], UTM14_NAD83));
      expect(res.status).toBe(200);
      const [f] = res.body.features as PreviewFeature[];
      expect(f.errors).toEqual([]);
      expect(jtsValid(f.geometry!)).toBe(true);
      const want = referenceAreaM2(mapCoords(source, (p) => proj4(UTM14, 'WGS84', p))) / ACRE;
      expect(Math.abs(f.acres! - want) / want).toBeLessThan(1e-5);
    });
  });

  describe('phantom rows, missing shapes, wrong offers', () => {
    it('when a .shp has zero padding after its last record, then only the real shapes are listed', async () => {
      const features = [feature('One', rect(-99.91, 47.61, 0.01, 0.007)), feature('Two', rect(-99.89, 47.61, 0.01, 0.007))];
      const padded = (shp: Buffer) => Buffer.concat([shp, Buffer.alloc(8 * 40)]);
      const res = await preview('padded.zip', await shapefileZip(features, GEOG_NAD83, padded));
      expect(res.status).toBe(200);
      expect((res.body.features as PreviewFeature[]).map((f) => [f.name, f.errors])).toEqual([
        ['One', []],
        ['Two', []],
      ]);
    });

    const ring = (lon: number, lat: number) =>
      `${lon},${lat},0 ${lon + 0.01},${lat},0 ${lon + 0.01},${lat + 0.007},0 ${lon},${lat + 0.007},0 ${lon},${lat},0`;

    it('when KML is written with the kml: namespace prefix, then its placemarks are read', async () => {
      const text = `<?xml version="1.0" encoding="UTF-8"?>
<kml:kml xmlns:kml="http://www.opengis.net/kml/2.2"><kml:Document><kml:Placemark><kml:name>Prefixed</kml:name>
<kml:Polygon><kml:outerBoundaryIs><kml:LinearRing><kml:coordinates>${ring(-99.91, 47.61)}</kml:coordinates></kml:LinearRing></kml:outerBoundaryIs></kml:Polygon>
</kml:Placemark></kml:Document></kml:kml>`;
      const res = await preview('prefixed.kml', text);
      expect(res.status).toBe(200);
      const [f] = res.body.features as PreviewFeature[];
      expect(f.name).toBe('Prefixed');
      expect(f.acres).toBeCloseTo(referenceAreaM2(rect(-99.91, 47.61, 0.01, 0.007)) / ACRE, 3);
    });

    it('when KML holds a <MultiPolygon> container, then it is read as a MultiGeometry of its polygons', async () => {
      const poly = (lon: number) =>
        `<Polygon><outerBoundaryIs><LinearRing><coordinates>${ring(lon, 47.61)}</coordinates></LinearRing></outerBoundaryIs></Polygon>`;
      const text = `<kml xmlns="http://www.opengis.net/kml/2.2"><Document><Placemark><name>Two pieces</name>
<MultiPolygon>${poly(-99.91)}${poly(-99.89)}</MultiPolygon></Placemark></Document></kml>`;
      const res = await preview('multi.kml', text);
      expect(res.status).toBe(200);
      const [f] = res.body.features as PreviewFeature[];
      expect(f.errors).toEqual([]);
      expect(f.geometry!.type).toBe('MultiPolygon');
      const want = (2 * referenceAreaM2(rect(-99.91, 47.61, 0.01, 0.007))) / ACRE;
      expect(Math.abs(f.acres! - want) / want).toBeLessThan(1e-3);
    });

    it('when a MultiGeometry holds only lines, then it is called lines, not a field boundary (not a mix of shapes)', async () => {
      const text = `<kml xmlns="http://www.opengis.net/kml/2.2"><Document><Placemark><name>Fence</name><MultiGeometry>
<LineString><coordinates>-99.9,47.6 -99.89,47.6</coordinates></LineString><LineString><coordinates>-99.89,47.6 -99.89,47.61</coordinates></LineString>
</MultiGeometry></Placemark></Document></kml>`;
      const res = await preview('fence.kml', text);
      expect(res.status).toBe(200);
      const [f] = res.body.features as PreviewFeature[];
      expect(f.errors.join()).toMatch(/is lines, not a field boundary/);
      expect(f.errors.join()).not.toMatch(/mix of shapes/);
    });

    it('when KML holds an image overlay and a region box beside a placemark, then only the placemark is offered', async () => {
      const box = '<LatLonBox><north>48</north><south>47</south><east>-99</east><west>-100</west></LatLonBox>';
      const region = '<Region><LatLonAltBox><north>48</north><south>47</south><east>-99</east><west>-100</west></LatLonAltBox></Region>';
      const overlays = `<GroundOverlay><name>Photo</name><Icon><href>photo.png</href></Icon>${box}</GroundOverlay>
<NetworkLink><name>Tiles</name>${region}<Link><href>tiles.kml</href></Link></NetworkLink>`;
      const placemark = `<Placemark><name>Home quarter</name><Polygon><outerBoundaryIs><LinearRing><coordinates>${ring(-99.91, 47.61)}</coordinates></LinearRing></outerBoundaryIs></Polygon></Placemark>`;
      const res = await preview(
        'overlay.kml',
        `<kml xmlns="http://www.opengis.net/kml/2.2"><Document>${overlays}${placemark}</Document></kml>`,
      );
      expect(res.status).toBe(200);
      expect((res.body.features as PreviewFeature[]).map((f) => f.name)).toEqual(['Home quarter']);
      const only = await preview('overlay-only.kml', `<kml xmlns="http://www.opengis.net/kml/2.2"><Document>${overlays}</Document></kml>`);
      expect(only.status).toBe(422);
      expect(only.body.error.message).toMatch(/only image overlays or region boxes/);
    });
  });
});
