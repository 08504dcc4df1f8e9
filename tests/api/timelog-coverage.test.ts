// A track from an ISO 11783-10 TimeLog: a terminal-style TASKDATA.zip written here with the npm
// `isoxml` package (a task with a TimeLog whose header logs position and the actual work state,
// DDI 141), sent to a job's coverage. The covered area is checked by hand and against an overlay
// drawn with JTS (jsts); bad files are refused with the reason and nothing is saved.
import {
  ExtendedTimeLog,
  ISOXMLManager,
  TAGS,
  TimelogDataLogValue,
  TimelogPosition,
  TimelogTime,
  DeviceElementDeviceElementTypeEnum,
  TaskTaskStatusEnum,
  type Device,
  type DeviceElement,
  type Task,
  type TimeLogTimeLogTypeEnum,
  type TimelogPositionPositionStatusEnum,
  type TimelogTimeTypeEnum,
} from 'isoxml';
import GeometryFactory from 'jsts/org/locationtech/jts/geom/GeometryFactory.js';
import GeoJSONReader from 'jsts/org/locationtech/jts/io/GeoJSONReader.js';
import BufferOp from 'jsts/org/locationtech/jts/operation/buffer/BufferOp.js';
import BufferParameters from 'jsts/org/locationtech/jts/operation/buffer/BufferParameters.js';
import OverlayOp from 'jsts/org/locationtech/jts/operation/overlay/OverlayOp.js';
import JSZip from 'jszip';
import { localProjection, projectionForField } from '../../shared/geo/local-projection';
import { geodesicAreaM2 } from '../../shared/geo/geodesic-area';
import type { JobCoverage } from '../../shared/schemas/track-coverage';
import { m2ToAcres } from '../../shared/units';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';

// A 200 m × 300 m field at 47.6° N, 99.9° W, seeded with a 20 m drill in four passes one width
// apart (x = −70, −50, −30, −10 m), each run 10 m past the field's ends, with the turns between
// them logged as not working, and the drill lifted on the third pass from y = −20 to y = 20 m.
// Hand: covered 4 × 20 × 300 − 20 × 40 = 23,200 m²; skipped the strips x < −80 (20 × 300 m) and
// x > 0 (100 × 300 m) and the lifted 20 × 40 m: 36,800 m² in 3 skips.
const WIDTH = 20;
const PASSES = [-70, -50, -30, -10];
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

interface Fix {
  x: number;
  y: number;
  working: boolean;
}

/** The drive: fixes every 10 m along each pass, a 3-fix turn (not working) between passes. */
function drive(): Fix[] {
  const out: Fix[] = [];
  PASSES.forEach((x, k) => {
    const up = k % 2 === 0;
    for (let i = 0; i <= 32; i++) {
      const y = up ? -160 + 10 * i : 160 - 10 * i;
      // The state holds from a fix to the next (the third pass runs up): lifted from the fix at −20 to the one at +20.
      const lifted = k === 2 && y >= -20 && y < 20;
      out.push({ x, y, working: i < 32 && !lifted });
    }
    if (k < PASSES.length - 1) {
      const end = up ? 160 : -160;
      const dir = up ? 1 : -1;
      for (const a of [45, 90, 135]) {
        const r = (a * Math.PI) / 180;
        out.push({ x: x + 10 - 10 * Math.cos(r), y: end + dir * 10 * Math.sin(r), working: false });
      }
    }
  });
  return out;
}

/**
 * One binary record of the header below (ISO 11783-10 binary TimeLog, type 1, as the isoxml
 * reader reads it; layout recalled from the standard): time of day in ms and days since
 * 1980-01-01, north and east in 1e-7 degrees (the header logs them: PTN A="" B=""), the position
 * status (D=""), then the number of values and each value's index in the header and its value.
 */
function record(f: Fix, i: number, values: Array<[number, number]>): Buffer {
  const [lon, lat] = proj.inverse([f.x, f.y]);
  const b = Buffer.alloc(4 + 2 + 4 + 4 + 1 + 1 + 5 * values.length);
  let o = b.writeUInt32LE(7 * 3_600_000 + i * 1000, 0);
  o = b.writeUInt16LE(16_930, o); // days since 1980-01-01: 2026-05-08
  o = b.writeInt32LE(Math.round(lat * 1e7), o);
  o = b.writeInt32LE(Math.round(lon * 1e7), o);
  o = b.writeUInt8(4, o); // RTK fixed
  o = b.writeUInt8(values.length, o);
  for (const [index, v] of values) {
    o = b.writeUInt8(index, o);
    o = b.writeInt32LE(v, o);
  }
  return b;
}

interface ZipOptions {
  /** Log DDI 141 (the actual work state). */
  workState?: boolean;
  /** Leave the position out of the header. */
  noPosition?: boolean;
  /** Cut this many bytes off the binary file's end. */
  cut?: number;
  /** Leave files out of the zip (by name ending). */
  drop?: string[];
  /** Replace the TimeLog header's text. */
  header?: string;
}

/** A terminal's TASKDATA.zip, written with the isoxml package: a seeding task with one TimeLog. */
async function terminalZip(o: ZipOptions = {}): Promise<Buffer> {
  const { workState = true } = o;
  const m = new ISOXMLManager({ version: 4, fmisTitle: 'Terminal' });
  const det = m.createEntityFromAttributes<DeviceElement>(TAGS.DeviceElement, {
    DeviceElementObjectId: 1,
    DeviceElementType: DeviceElementDeviceElementTypeEnum.Device,
    DeviceElementDesignator: 'Drill',
    DeviceElementNumber: 0,
    ParentObjectId: 0,
  });
  const detRef = m.registerEntity(det);
  const dvc = m.createEntityFromAttributes<Device>(TAGS.Device, {
    DeviceDesignator: 'Drill',
    ClientNAME: 'A000860020800001',
    DeviceStructureLabel: '31303030',
    DeviceLocalizationLabel: 'FF000000006564',
    DeviceElement: [det],
  });
  m.registerEntity(dvc);
  m.rootElement.attributes.Device = [dvc];
  // The header: an empty attribute means "logged in each binary record" (ISO 11783-10).
  const tm = new ISOXMLManager({ realm: 'timelog' } as ConstructorParameters<typeof ISOXMLManager>[0]);
  const tlg = new ExtendedTimeLog({ Filename: 'TLG00001', TimeLogType: '1' as TimeLogTimeLogTypeEnum }, m);
  tlg.timeLogHeader = new TimelogTime(
    {
      Start: '',
      Type: '4' as TimelogTimeTypeEnum,
      Position: o.noPosition
        ? []
        : [
            new TimelogPosition(
              {
                PositionNorth: null,
                PositionEast: null,
                PositionStatus: '' as TimelogPositionPositionStatusEnum,
              } as unknown as TimelogPosition['attributes'],
              tm,
            ),
          ],
      DataLogValue: workState
        ? [
            new TimelogDataLogValue(
              { ProcessDataDDI: '008D', ProcessDataValue: '', DeviceElementIdRef: detRef } as TimelogDataLogValue['attributes'],
              tm,
            ),
          ]
        : [],
    },
    tm,
  );
  // A terminal logs a value when it changes: the work state only where it differs from the fix before.
  let last: number | null = null;
  const bin = Buffer.concat(
    drive().map((f, i) => {
      const state = f.working ? 1 : 0;
      const values: Array<[number, number]> = workState && state !== last ? [[0, state]] : [];
      last = state;
      return record(f, i, values);
    }),
  );
  tlg.binaryData = new Uint8Array(o.cut ? bin.subarray(0, bin.length - o.cut) : bin);
  const task = m.createEntityFromAttributes<Task>(TAGS.Task, {
    TaskDesignator: 'Seeding Butte Strip',
    TaskStatus: TaskTaskStatusEnum.Completed,
    TimeLog: [tlg],
  });
  m.registerEntity(task);
  m.rootElement.attributes.Task = [task];
  const written = await JSZip.loadAsync(await m.saveISOXML());
  if (!o.drop && !o.header) return Buffer.from(await written.generateAsync({ type: 'uint8array', compression: 'DEFLATE' }));
  for (const name of Object.keys(written.files))
    if (o.drop?.some((d) => name.toUpperCase().endsWith(d.toUpperCase()))) written.remove(name);
  if (o.header) written.file('TASKDATA/TLG00001.xml', o.header);
  return written.generateAsync({ type: 'nodebuffer', compression: 'DEFLATE' });
}

/** The same drive covered by JTS: each working run buffered (flat ends, round joins), unioned, clipped to the field. */
function jtsCoveredM2(): number {
  const reader = new GeoJSONReader(new GeometryFactory());
  const runs: number[][][] = [];
  let run: number[][] = [];
  for (const f of drive()) {
    if (run.length) run.push([f.x, f.y]);
    if (f.working) {
      if (!run.length) run.push([f.x, f.y]);
    } else {
      if (run.length >= 2) runs.push(run);
      run = [];
    }
  }
  const params = new BufferParameters();
  params.setQuadrantSegments(16);
  params.setJoinStyle(BufferParameters.JOIN_ROUND);
  params.setEndCapStyle(BufferParameters.CAP_FLAT);
  const swath = BufferOp.bufferOp(reader.read({ type: 'MultiLineString', coordinates: runs }), WIDTH / 2, params);
  const field = reader.read(proj.forwardGeometry(boundary));
  return OverlayOp.intersection(field, swath).getArea() * (geodesicAreaM2(boundary) / field.getArea());
}

describe('coverage from an ISO 11783-10 TimeLog', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let jobId: number;

  const send = (data: Buffer, name = 'TASKDATA.zip') =>
    owner.agent.post(`/api/assignments/${jobId}/coverage`).set('X-XSRF-TOKEN', owner.xsrf).attach('file', data, name);
  const saved = async () => (await t.db('assignment_coverage').where({ assignment_id: jobId })).length;

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'TimeLog');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
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
    const [a] = await t
      .db('assignments')
      .insert({
        farm_id: farm.id,
        day: '2026-05-08',
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

  it.each<[string, () => Promise<Buffer>, RegExp]>([
    ['not a zip', async () => Buffer.from('PK but not really a zip'), /not a readable zip/],
    ['no TASKDATA.XML', async () => terminalZip({ drop: ['TASKDATA.XML'] }), /no TASKDATA\.XML/],
    [
      'no TimeLog',
      async () => {
        const m = new ISOXMLManager({ version: 4, fmisTitle: 'Terminal' });
        return Buffer.from(await m.saveISOXML());
      },
      /holds no TimeLog/,
    ],
    ['the binary file missing', async () => terminalZip({ drop: ['TLG00001.bin'] }), /no binary file TLG00001\.BIN/],
    ['the header file missing', async () => terminalZip({ drop: ['TLG00001.xml'] }), /no header file TLG00001\.XML/],
    ['the binary cut short', async () => terminalZip({ cut: 3 }), /ends in the middle of record 141/],
    ['no positions logged', async () => terminalZip({ noPosition: true }), /does not log positions/],
    [
      'a header with entities',
      async () => terminalZip({ header: '<?xml version="1.0"?><!DOCTYPE TIM [<!ENTITY a "aaaa">]><TIM A="" D="4">&a;</TIM>' }),
      /document type or entities/,
    ],
  ])('when the TASKDATA.zip has %s, then it answers 400 with the reason and saves nothing', async (_, make, reason) => {
    const res = await send(await make());
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(reason);
    expect(await saved()).toBe(0);
  });

  it('when the TimeLog logs the work state, then the lifted stretch is a skip and the covered acres match the hand figure and JTS', async () => {
    const res = await send(await terminalZip());
    expect(res.status).toBe(201);
    const c = res.body as JobCoverage;
    expect(c.sourceFormat).toBe('timelog');
    // Hand: 23,200 m² covered, 36,800 m² skipped in 3 skips (see the top of this file).
    expect(c.coveredAcres).toBeCloseTo(m2ToAcres(23_200), 2);
    expect(c.skippedAcres).toBeCloseTo(m2ToAcres(36_800), 2);
    expect(c.skipCount).toBe(3);
    expect(c.workedTwiceAcres).toBeCloseTo(0, 3);
    // JTS: the same working runs buffered and clipped, within 0.1 %.
    expect(Math.abs(c.coveredAcres - m2ToAcres(jtsCoveredM2())) / c.coveredAcres).toBeLessThan(0.001);
    const lifted = c.skips.find((s) => s.acres < m2ToAcres(1000))!;
    const [x, y] = proj.forward(lifted.centroid);
    // Hand: the lifted stretch is centred on the third pass (x = −30 m) at y = 0.
    expect(x).toBeCloseTo(-30, 0);
    expect(Math.abs(y)).toBeLessThan(0.5);
  });

  it('when the TimeLog has no work state, then every logged stretch counts as working', async () => {
    const res = await send(await terminalZip({ workState: false }));
    expect(res.status).toBe(201);
    // Hand: the four whole passes, 4 × 20 × 300 m; the turns lie outside the field.
    expect(res.body.coveredAcres).toBeCloseTo(m2ToAcres(24_000), 2);
    expect(res.body.skipCount).toBe(2);
  });
});
