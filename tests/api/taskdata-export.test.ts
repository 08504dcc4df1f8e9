// Task data out: a board day's and one job's TASKDATA.zip are checked against the published
// ISO 11783-10 schemas (version 4.3) with Debian's xmllint, parsed back with the npm `isoxml`
// package, and their geometry measured with GeographicLib (npm geographiclib-geodesic).
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { MultiPolygon, Polygon, Position } from 'geojson';
import {
  ExtendedPolygon,
  ISOXMLManager,
  type ExtendedPartfield,
  type Customer,
  type Farm,
  type LineString,
  type Point,
  type Task,
  type Worker,
} from 'isoxml';
import JSZip from 'jszip';
import { insertImplement, insertMachine } from './matrix/board';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { ACRE, rect, rectWithHole, referenceAreaM2, twoParts } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';
// eslint-disable-next-line @typescript-eslint/no-require-imports
const { Geodesic } = require('geographiclib-geodesic') as {
  Geodesic: { WGS84: { Inverse(lat1: number, lon1: number, lat2: number, lon2: number): { azi1: number; s12: number } } };
};

const XSD = path.join(__dirname, '../fixtures/iso11783-10/ISO11783_TaskFile_V4-3.xsd');
const WIDTH_M = 18.288; // 60 ft

/** xmllint's verdict on one TASKDATA.XML against the version 4.3 task-file schema. */
function validate(xml: string): { ok: boolean; output: string } {
  const dir = mkdtempSync(path.join(tmpdir(), 'taskdata-'));
  const file = path.join(dir, 'TASKDATA.XML');
  writeFileSync(file, xml);
  try {
    execFileSync('xmllint', ['--noout', '--schema', XSD, file], { encoding: 'utf8', stdio: 'pipe' });
    return { ok: true, output: '' };
  } catch (err) {
    return { ok: false, output: String((err as { stderr?: string }).stderr ?? err) };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** The polygons of a partfield of one ISO 11783-10 type (PLN@A), as GeoJSON. */
function polygonsOfType(pfd: ExtendedPartfield, type: string): { name: string; geometry: MultiPolygon }[] {
  return (pfd.attributes.PolygonnonTreatmentZoneonly ?? [])
    .filter((p) => p.attributes.PolygonType === type)
    .map((p) => ({ name: p.attributes.PolygonDesignator ?? '', geometry: ExtendedPolygon.toGeoJSON([p as ExtendedPolygon]) }));
}

/** Every part's rings, as the field stores them. */
const partsOf = (g: Polygon | MultiPolygon): Position[][][] => (g.type === 'Polygon' ? [g.coordinates] : g.coordinates);

const distanceM = (a: Position, b: Position) => Geodesic.WGS84.Inverse(a[1], a[0], b[1], b[0]).s12;

describe('task data for the terminal', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let operator: Client;
  let viewer: Client;
  const day = `2035-0${1 + Math.floor(Math.random() * 9)}-1${Math.floor(Math.random() * 9)}`;
  const fields: Record<string, { id: number; boundary: Polygon | MultiPolygon; acres: number }> = {};
  const jobs: Record<string, number> = {};
  let slough: { headingDeg: number; firstPass: Position; headlandAcres: number };
  let split: { headingDeg: number; firstPass: Position };

  async function addField(name: string, boundary: Polygon | MultiPolygon) {
    const res = await owner.post('/api/fields', { name, boundary });
    expect(res.status).toBe(201);
    fields[name] = { id: res.body.id, boundary: res.body.boundary, acres: res.body.acres };
  }

  async function addJob(name: string, fieldName: string, operation: string, operatorId: number, state = 'planned') {
    const [a] = await t
      .db('assignments')
      .insert({
        farm_id: farm.id,
        day,
        field_id: fields[fieldName].id,
        operation,
        operator_id: operatorId,
        machine_id: await insertMachine(t.db, farm.id),
        implement_id: await insertImplement(t.db, farm.id, { operations: [operation] }),
        run_order: Object.keys(jobs).length + 1,
        acres_planned: 10,
        state,
        ...(state === 'underway' ? { started_at: t.db.fn.now() } : {}),
      })
      .returning('id');
    jobs[name] = a.id;
  }

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Task data');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    operator = new Client(t.app);
    await operator.signIn(farm.operator.email, farm.operator.password);
    viewer = new Client(t.app);
    await viewer.signIn(farm.viewer.email, farm.viewer.password);

    await addField('Slough Quarter', rectWithHole(-99.93, 47.61, 0.0107, 0.0072));
    await addField('Split Eighty', twoParts(-99.96, 47.63));
    await addField('Home Forty', rect(-99.9, 47.64, 0.006, 0.004));
    const sloughId = fields['Slough Quarter'].id;
    const hazards = [
      { kind: 'bin', geometry: { type: 'Point', coordinates: [-99.925, 47.6125] }, clearanceM: 15 },
      {
        kind: 'power',
        geometry: {
          type: 'LineString',
          coordinates: [
            [-99.927, 47.6155],
            [-99.922, 47.6158],
          ],
        },
        clearanceM: 5,
      },
      { kind: 'rock', geometry: rect(-99.9215, 47.6125, 0.0004, 0.0003), clearanceM: 0 },
    ];
    for (const h of hazards) expect((await owner.post(`/api/fields/${sloughId}/hazards`, h)).status).toBe(201);

    const sloughPlan = await owner.put(`/api/plans/${sloughId}/seeding`, { widthM: WIDTH_M, headlandPasses: 2, headingDeg: 37.5 });
    expect(sloughPlan.status).toBe(200);
    slough = {
      headingDeg: 37.5,
      firstPass: sloughPlan.body.result.passes.features[0].geometry.coordinates[0],
      headlandAcres: sloughPlan.body.result.headlandAcres,
    };
    // An automatic heading: the export takes the heading the planner chose.
    const splitPlan = await owner.put(`/api/plans/${fields['Split Eighty'].id}/harrowing`, {
      widthM: 12,
      headlandPasses: 1,
      headingDeg: 'auto',
    });
    expect(splitPlan.status).toBe(200);
    split = { headingDeg: splitPlan.body.result.headingDeg, firstPass: splitPlan.body.result.passes.features[0].geometry.coordinates[0] };

    await addJob('seeding', 'Slough Quarter', 'seeding', farm.operator.membershipId);
    await addJob('harrowing', 'Split Eighty', 'harrowing', farm.operator.membershipId, 'underway');
    await addJob('spraying', 'Home Forty', 'spraying', farm.owner.membershipId, 'finished');
  });
  afterAll(() => t.close());

  async function download(client: Client, url: string) {
    const res = await client
      .get(url)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    return res;
  }

  async function read(zipBytes: Buffer) {
    const zip = await JSZip.loadAsync(zipBytes);
    expect(Object.keys(zip.files)).toContain('TASKDATA/TASKDATA.XML');
    const xml = await zip.file('TASKDATA/TASKDATA.XML')!.async('string');
    const m = new ISOXMLManager();
    await m.parseISOXMLFile(new Uint8Array(zipBytes), 'application/zip');
    return { xml, m, root: m.rootElement.attributes };
  }

  it("when the owner downloads a board day's task data, then it is a zip of TASKDATA/TASKDATA.XML that the version 4.3 schemas accept", async () => {
    const res = await download(owner, `/api/board/${day}/taskdata.zip`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/zip/);
    const { xml, m } = await read(res.body as Buffer);
    // ISO 11783-10 version 4 (TASKDATA@VersionMajor = 4), checked by the published XSD, version 4.3.
    expect(xml).toMatch(/<ISO11783_TaskData [^>]*VersionMajor="4"/);
    const verdict = validate(xml);
    expect(verdict.output).toBe('');
    expect(verdict.ok).toBe(true);
    expect(m.getWarnings()).toEqual([]);
  });

  it('when it is parsed back with the library, then the farm, its owner, every field, worker and task are there with their status', async () => {
    const { root } = await read((await download(owner, `/api/board/${day}/taskdata.zip`)).body as Buffer);
    const customer = root.Customer as Customer[];
    expect(customer).toHaveLength(1);
    expect(`${customer[0].attributes.CustomerFirstName} ${customer[0].attributes.CustomerLastName}`).toBe(farm.owner.name);
    expect((root.Farm as Farm[]).map((f) => f.attributes.FarmDesignator)).toEqual([farm.name.slice(0, 32)]);
    const pfds = root.Partfield as ExtendedPartfield[];
    expect(pfds.map((p) => p.attributes.PartfieldDesignator).sort()).toEqual(Object.keys(fields).sort());
    const workers = (root.Worker as Worker[]).map((w) => `${w.attributes.WorkerFirstName} ${w.attributes.WorkerLastName}`);
    expect(workers.sort()).toEqual([farm.owner.name, farm.operator.name].sort());
    const tasks = root.Task as Task[];
    expect(tasks).toHaveLength(3);
    // TSK@G: 1 planned, 2 running, 4 completed (ISO 11783-10 TaskStatus, as the XSD documents it).
    const byName = Object.fromEntries(tasks.map((k) => [k.attributes.TaskDesignator, k]));
    expect(byName['Seeding, Slough Quarter'].attributes.TaskStatus).toBe('1');
    expect(byName['Harrowing, Split Eighty'].attributes.TaskStatus).toBe('2');
    expect(byName['Spraying, Home Forty'].attributes.TaskStatus).toBe('4');
    for (const task of tasks) {
      const pfd = task.attributes.PartfieldIdRef!.entity as ExtendedPartfield;
      expect(task.attributes.TaskDesignator).toContain(pfd.attributes.PartfieldDesignator);
      expect(task.attributes.ResponsibleWorkerIdRef!.entity).toBeDefined();
      expect(task.attributes.CustomerIdRef!.entity).toBe(customer[0]);
    }
    const rolling = byName['Spraying, Home Forty'].attributes.ResponsibleWorkerIdRef!.entity as Worker;
    expect(`${rolling.attributes.WorkerFirstName} ${rolling.attributes.WorkerLastName}`).toBe(farm.owner.name);
  });

  it("when the boundaries are read back, then every part and ring is there and each field's geodesic area equals its acres within 0.01 %", async () => {
    const { root } = await read((await download(owner, `/api/board/${day}/taskdata.zip`)).body as Buffer);
    for (const pfd of root.Partfield as ExtendedPartfield[]) {
      const field = fields[pfd.attributes.PartfieldDesignator];
      // PLN@A = 1: partfield boundary; LSG@A = 1 / 2: exterior / interior ring (ISO 11783-10 XSD).
      const boundary = polygonsOfType(pfd, '1');
      const parts = boundary.flatMap((b) => b.geometry.coordinates);
      const want = partsOf(field.boundary);
      expect(parts.map((rings) => rings.length)).toEqual(want.map((rings) => rings.length));
      parts.forEach((rings, i) =>
        rings.forEach((ring, j) => ring.forEach((p, k) => expect(distanceM(p, want[i][j][k])).toBeLessThan(0.001))),
      );
      // GeographicLib's planimeter (Karney), outer rings added and holes subtracted.
      const acres = referenceAreaM2({ type: 'MultiPolygon', coordinates: parts }) / ACRE;
      expect(Math.abs(acres - field.acres) / field.acres).toBeLessThan(1e-4);
      expect(Math.abs(pfd.attributes.PartfieldArea / ACRE - field.acres) / field.acres).toBeLessThan(1e-4);
    }
  });

  it('when the hazards are read back, then each is obstacle geometry and each clearance is a buffer zone of that width', async () => {
    const { root } = await read((await download(owner, `/api/board/${day}/taskdata.zip`)).body as Buffer);
    const pfd = (root.Partfield as ExtendedPartfield[]).find((p) => p.attributes.PartfieldDesignator === 'Slough Quarter')!;
    // PNT@A = 5, LSG@A = 9, PLN@A = 6: obstacle point, line and area (ISO 11783-10 XSD).
    const points = (pfd.attributes.Point ?? []) as Point[];
    const lines = (pfd.attributes.LineString ?? []) as LineString[];
    expect(points.filter((p) => p.attributes.PointType === '5').map((p) => [p.attributes.PointEast, p.attributes.PointNorth])).toEqual([
      [-99.925, 47.6125],
    ]);
    expect(lines.filter((l) => l.attributes.LineStringType === '9')).toHaveLength(1);
    const rocks = polygonsOfType(pfd, '6');
    expect(rocks).toHaveLength(1);
    expect(rocks[0].geometry.coordinates[0][0]).toHaveLength(5);
    // Designators hold at most 32 characters (ISO 11783-10 XSD): the distance comes first.
    expect(points[0].attributes.PointDesignator).toBe('Keep 15 m clear: Bin or yard si…');
    // PLN@A = 11: buffer zone. Only hazards with a clearance get one (the rock is kept as it is).
    const zones = polygonsOfType(pfd, '11');
    expect(zones.map((z) => z.name).sort()).toEqual(['Clearance 15 m: Bin or yard site', 'Clearance 5 m: Power pole or li…']);
    // A point's clearance zone is a circle of that radius: area π r² (plane geometry), drawn as a
    // polygon of 64 sides, whose area is (64 / 2π) sin(2π / 64) = 0.9984 of the circle's.
    const bin = zones.find((z) => z.name.startsWith('Clearance 15 m'))!;
    const circle = Math.PI * 15 ** 2;
    expect(Math.abs(referenceAreaM2(bin.geometry) - circle) / circle).toBeLessThan(0.003);
    // Every vertex of the circle is 15 m from the bin (GeographicLib geodesic distance).
    for (const p of bin.geometry.coordinates[0][0]) expect(Math.abs(distanceM(p, [-99.925, 47.6125]) - 15)).toBeLessThan(0.01);
  });

  it("when the guidance is read back, then each saved plan is an AB line at the plan's heading through its first pass, spaced by the working width", async () => {
    const { root } = await read((await download(owner, `/api/board/${day}/taskdata.zip`)).body as Buffer);
    const check = (fieldName: string, plan: { headingDeg: number; firstPass: Position }, label: string, widthM: number) => {
      const pfd = (root.Partfield as ExtendedPartfield[]).find((p) => p.attributes.PartfieldDesignator === fieldName)!;
      const groups = pfd.attributes.GuidanceGroup ?? [];
      expect(groups.map((g) => g.attributes.GuidanceGroupDesignator)).toEqual([`${label} plan`]);
      const patterns = groups[0].attributes.GuidancePattern ?? [];
      expect(patterns).toHaveLength(1);
      // GPN@C = 1: AB line; LSG@A = 5 guidance pattern; PNT@A = 6 / 7: reference points A / B.
      expect(patterns[0].attributes.GuidancePatternType).toBe('1');
      expect(patterns[0].attributes.GuidancePatternHeading).toBeCloseTo(plan.headingDeg, 6);
      const line = patterns[0].attributes.LineString![0];
      expect(line.attributes.LineStringType).toBe('5');
      expect(line.attributes.LineStringWidth).toBe(Math.round(widthM * 1000));
      const [a, b] = line.attributes.Point!;
      expect([a.attributes.PointType, b.attributes.PointType]).toEqual(['6', '7']);
      const A = [a.attributes.PointEast, a.attributes.PointNorth];
      const B = [b.attributes.PointEast, b.attributes.PointNorth];
      // A is where the plan's first pass starts (within 1 cm, GeographicLib geodesic distance) …
      expect(distanceM(A, plan.firstPass)).toBeLessThan(0.01);
      // … and the geodesic azimuth from A to B (GeographicLib Inverse) is the plan's heading within 0.01°.
      expect(Math.abs(Geodesic.WGS84.Inverse(A[1], A[0], B[1], B[0]).azi1 - plan.headingDeg)).toBeLessThan(0.01);
    };
    check('Slough Quarter', slough, 'Seeding', WIDTH_M);
    check('Split Eighty', split, 'Harrowing', 12);
    // A field without a saved plan for its job has no guidance.
    const home = (root.Partfield as ExtendedPartfield[]).find((p) => p.attributes.PartfieldDesignator === 'Home Forty')!;
    expect(home.attributes.GuidanceGroup ?? []).toEqual([]);
  });

  it("when the headland is read back, then it is its own boundary with the plan's headland acres", async () => {
    const { root } = await read((await download(owner, `/api/board/${day}/taskdata.zip`)).body as Buffer);
    const pfd = (root.Partfield as ExtendedPartfield[]).find((p) => p.attributes.PartfieldDesignator === 'Slough Quarter')!;
    // PLN@A = 10: headland.
    const headland = polygonsOfType(pfd, '10');
    expect(new Set(headland.map((h) => h.name))).toEqual(new Set(['Headland: Seeding']));
    const parts = headland.flatMap((h) => h.geometry.coordinates);
    // The field has a hole: the headland goes round the outside edge and round the slough.
    expect(parts.length).toBe(2);
    const acres = referenceAreaM2({ type: 'MultiPolygon', coordinates: parts }) / ACRE;
    expect(Math.abs(acres - slough.headlandAcres) / slough.headlandAcres).toBeLessThan(1e-3);
  });

  it("when the job's operator downloads one job, then it holds that job alone and validates", async () => {
    const res = await download(operator, `/api/assignments/${jobs.seeding}/taskdata.zip`);
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toMatch(/attachment; filename="TASKDATA-.*\.zip"/);
    const { xml, root } = await read(res.body as Buffer);
    expect(validate(xml).ok).toBe(true);
    expect((root.Task as Task[]).map((k) => k.attributes.TaskDesignator)).toEqual(['Seeding, Slough Quarter']);
    expect((root.Partfield as ExtendedPartfield[]).map((p) => p.attributes.PartfieldDesignator)).toEqual(['Slough Quarter']);
    expect((root.Partfield as ExtendedPartfield[])[0].attributes.GuidanceGroup).toHaveLength(1);
  });

  it("when an operator asks for someone else's job, a viewer for any, or anyone for a day without jobs, then they are refused with a reason", async () => {
    const other = await operator.get(`/api/assignments/${jobs.spraying}/taskdata.zip`);
    expect(other.status).toBe(403);
    expect(other.body.error.message).toMatch(/someone else's run sheet/);
    expect((await viewer.get(`/api/assignments/${jobs.seeding}/taskdata.zip`)).status).toBe(403);
    expect((await operator.get(`/api/board/${day}/taskdata.zip`)).status).toBe(403);
    const empty = await owner.get('/api/board/2035-12-31/taskdata.zip');
    expect(empty.status).toBe(404);
    expect(empty.body.error.message).toMatch(/no jobs on the board for 2035-12-31/);
  });

  it('when a field or hazard name holds XML specials, then the file still validates and the name reads back plainly', async () => {
    await addField('Rock & "Roll" <West>', rect(-99.88, 47.64, 0.004, 0.003));
    await addJob('specials', 'Rock & "Roll" <West>', 'tillage', farm.operator.membershipId);
    const res = await download(owner, `/api/assignments/${jobs.specials}/taskdata.zip`);
    const { xml, root } = await read(res.body as Buffer);
    expect(validate(xml).ok).toBe(true);
    expect((root.Partfield as ExtendedPartfield[])[0].attributes.PartfieldDesignator).toBe('Rock and Roll West');
    expect(xml).not.toContain('&amp;amp;');
  });
});
