// Task data in: a terminal-style TASKDATA.zip written here with the npm `isoxml` package itself (not
// with Furlong's exporter) goes through the same import as GeoJSON, KML and shapefiles; acres are
// checked against GeographicLib's planimeter. Every bad file is refused with a reason and saves nothing.
import type { MultiPolygon, Polygon } from 'geojson';
import {
  type ExtendedPartfield,
  GuidancePatternGuidancePatternTypeEnum,
  ISOXMLManager,
  LineStringLineStringTypeEnum,
  Point,
  PointPointTypeEnum,
  TAGS,
  type GuidanceGroup,
  type GuidancePattern,
  type LineString,
} from 'isoxml';
import JSZip from 'jszip';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { ACRE, rect, rectWithHole, referenceAreaM2, twoParts } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';

/** A terminal's TASKDATA.zip: the given fields as partfields, the first with an AB line at 72.5°. */
async function terminalZip(fields: Array<{ name: string; boundary: Polygon | MultiPolygon }>): Promise<Buffer> {
  const m = new ISOXMLManager({ version: 4, fmisTitle: 'Terminal' });
  const pfds = fields.map((f) => {
    const pfd = m.createEntityFromAttributes<ExtendedPartfield>(TAGS.Partfield, { PartfieldDesignator: f.name, PartfieldArea: 1 });
    pfd.boundaryFromGeoJSON(f.boundary, m);
    m.registerEntity(pfd);
    return pfd;
  });
  const line = m.createEntityFromAttributes<LineString>(TAGS.LineString, {
    LineStringType: LineStringLineStringTypeEnum.GuidancePattern,
    LineStringWidth: 12192,
    Point: [
      new Point({ PointType: PointPointTypeEnum.GuidanceReferenceA, PointNorth: 47.612, PointEast: -99.928 }, m),
      new Point({ PointType: PointPointTypeEnum.GuidanceReferenceB, PointNorth: 47.613, PointEast: -99.924 }, m),
    ],
  });
  const gpn = m.createEntityFromAttributes<GuidancePattern>(TAGS.GuidancePattern, {
    GuidancePatternDesignator: 'AB East',
    GuidancePatternType: GuidancePatternGuidancePatternTypeEnum.AB,
    GuidancePatternHeading: 252.5,
    LineString: [line],
  });
  m.registerEntity(gpn);
  const ggp = m.createEntityFromAttributes<GuidanceGroup>(TAGS.GuidanceGroup, { GuidanceGroupDesignator: 'Lines', GuidancePattern: [gpn] });
  m.registerEntity(ggp);
  pfds[0].attributes.GuidanceGroup = [ggp];
  m.rootElement.attributes.Partfield = pfds;
  return Buffer.from(await m.saveISOXML());
}

const ROOT = '<?xml version="1.0" encoding="UTF-8"?>\n<ISO11783_TaskData VersionMajor="4" VersionMinor="3" DataTransferOrigin="2">';
const PFD =
  '<PFD A="PFD1" C="Lone" D="1"><PLN A="1"><LSG A="1"><PNT A="2" C="47.6" D="-99.9"/><PNT A="2" C="47.6" D="-99.89"/><PNT A="2" C="47.61" D="-99.89"/><PNT A="2" C="47.6" D="-99.9"/></LSG></PLN></PFD>';
const zipOf = async (files: Record<string, string>) => {
  const zip = new JSZip();
  for (const [name, text] of Object.entries(files)) zip.file(name, text);
  return zip.generateAsync({ type: 'nodebuffer', compression: 'DEFLATE' });
};

describe('importing ISO 11783-10 task data', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  const count = async () => Number((await t.db('fields').where({ farm_id: farm.id }).count({ n: '*' }))[0].n);
  const upload = (name: string, data: Buffer | string, q = '') =>
    owner.agent
      .post(`/api/fields/import${q}`)
      .set('X-XSRF-TOKEN', owner.xsrf)
      .attach('file', Buffer.isBuffer(data) ? data : Buffer.from(data), name);

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Terminal');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
  });
  afterAll(() => t.close());

  const fields = [
    { name: 'Slough Quarter', boundary: rectWithHole(-99.93, 47.61, 0.0107, 0.0072) },
    { name: 'Split Eighty', boundary: twoParts(-99.96, 47.63) },
    { name: 'Home Forty', boundary: rect(-99.9, 47.64, 0.006, 0.004) },
  ];

  it("when a terminal's TASKDATA.zip is previewed, then its partfields are candidate fields with their holes, parts and acres, and its AB line is offered as a heading", async () => {
    const before = await count();
    const res = await upload('TASKDATA.zip', await terminalZip(fields), '?dryRun=true');
    expect(res.status).toBe(200);
    expect(res.body.format).toBe('taskdata');
    expect(res.body.features.map((f: { name: string }) => f.name)).toEqual(fields.map((f) => f.name));
    res.body.features.forEach((f: { acres: number; problems: unknown[]; geometry: Polygon | MultiPolygon }, i: number) => {
      expect(f.problems).toEqual([]);
      // GeographicLib's planimeter (Karney) on the boundary as written.
      const want = referenceAreaM2(fields[i].boundary) / ACRE;
      expect(Math.abs(f.acres - want) / want).toBeLessThan(1e-6);
    });
    expect(res.body.features[0].geometry.type).toBe('Polygon');
    expect(res.body.features[0].geometry.coordinates).toHaveLength(2); // outer ring + hole
    expect(res.body.features[1].geometry.type).toBe('MultiPolygon');
    expect(res.body.features[1].geometry.coordinates.map((p: unknown[]) => p.length)).toEqual([2, 1]);
    // The line runs 252.5° one way, so 72.5° as a plan heading (passes run both ways); 12192 mm wide.
    expect(res.body.guidance).toEqual([{ index: 0, fieldName: 'Slough Quarter', name: 'AB East', headingDeg: 72.5, widthM: 12.192 }]);
    expect(await count()).toBe(before);
  });

  it('when a bare TASKDATA.XML is saved, then its fields are stored with their holes and parts', async () => {
    const zip = await JSZip.loadAsync(await terminalZip(fields.map((f) => ({ ...f, name: `${f.name} Bare` }))));
    const xml = await zip.file('TASKDATA/TASKDATA.XML')!.async('string');
    const res = await upload('TASKDATA.XML', xml);
    expect(res.status).toBe(201);
    expect(res.body.saved.map((s: { name: string }) => s.name)).toEqual(fields.map((f) => `${f.name} Bare`));
    const split = await t.db('fields').where({ farm_id: farm.id, name: 'Split Eighty Bare' }).first();
    expect(split.boundary.type).toBe('MultiPolygon');
    expect(split.boundary.coordinates[0]).toHaveLength(2);
  });

  const bomb =
    '<?xml version="1.0"?><!DOCTYPE ISO11783_TaskData [<!ENTITY a "aaaaaaaaaa"><!ENTITY b "&a;&a;&a;&a;&a;&a;&a;&a;&a;&a;"><!ENTITY c "&b;&b;&b;&b;&b;&b;&b;&b;&b;&b;">]>' +
    '<ISO11783_TaskData VersionMajor="4" VersionMinor="3" DataTransferOrigin="2"><PFD A="PFD1" C="&c;" D="1"/></ISO11783_TaskData>';
  const external =
    '<?xml version="1.0"?><!DOCTYPE ISO11783_TaskData [<!ENTITY xxe SYSTEM "file:///etc/passwd">]>' +
    '<ISO11783_TaskData VersionMajor="4" VersionMinor="3" DataTransferOrigin="2"><PFD A="PFD1" C="&xxe;" D="1"/></ISO11783_TaskData>';
  const badFiles: Array<[string, () => Promise<[string, Buffer | string]>, number, RegExp]> = [
    [
      'a TASKDATA.zip that is not a zip',
      async () => ['TASKDATA.zip', 'these are not the bytes of a zip'],
      422,
      /not a readable zip archive/,
    ],
    [
      'a zip without TASKDATA.XML',
      async () => ['TASKDATA.zip', await zipOf({ 'TASKDATA/README.TXT': 'hello' })],
      422,
      /holds no TASKDATA\.XML/,
    ],
    [
      'XML that is not task data',
      async () => ['TASKDATA.XML', '<?xml version="1.0"?><notes><note>hi</note></notes>'],
      422,
      /not ISO 11783-10 task data: its root element is <notes>/,
    ],
    [
      'a partfield without a boundary',
      async () => ['TASKDATA.XML', `${ROOT}<PFD A="PFD1" C="Bare" D="1"/></ISO11783_TaskData>`],
      422,
      /Partfield 1 \("Bare"\) has no boundary/,
    ],
    [
      'a reference that does not resolve',
      async () => [
        'TASKDATA.zip',
        await zipOf({ 'TASKDATA/TASKDATA.XML': `${ROOT}${PFD}<TSK A="TSK1" E="PFD9" G="1"/></ISO11783_TaskData>` }),
      ],
      422,
      /refers to PFD9, which it does not hold/,
    ],
    [
      'XML nested deeper than the budget',
      async () => ['TASKDATA.XML', `${ROOT}${PFD}${'<CTR A="CTR1" B="x">'.repeat(70)}${'</CTR>'.repeat(70)}</ISO11783_TaskData>`],
      422,
      /nests its elements more than 64 deep/,
    ],
    [
      'XML with more elements than the budget',
      async () => [
        'TASKDATA.zip',
        await zipOf({ 'TASKDATA/TASKDATA.XML': `${ROOT}${PFD}${'<CTR A="CTR1" B="x"/>'.repeat(600_001)}</ISO11783_TaskData>` }),
      ],
      422,
      /more than 600,000 XML elements/,
    ],
    ['an entity bomb', async () => ['TASKDATA.XML', bomb], 422, /declares a document type or entities/],
    [
      'an external entity',
      async () => ['TASKDATA.zip', await zipOf({ 'TASKDATA/TASKDATA.XML': external })],
      422,
      /declares a document type or entities/,
    ],
  ];

  it.each(badFiles)('when %s is uploaded, then it is refused with a reason and nothing is saved', async (_what, make, status, message) => {
    const [name, data] = await make();
    const before = await count();
    const preview = await upload(name, data, '?dryRun=true');
    expect(preview.status).toBe(status);
    expect(preview.body.error.message).toMatch(message);
    const save = await upload(name, data);
    expect(save.status).toBe(status);
    expect(save.body.error.message).toMatch(message);
    expect(await count()).toBe(before);
  });
});
