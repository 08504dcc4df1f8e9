// ISO 11783-10 task data (version 4) for a tractor terminal, written with the npm `isoxml` package:
// the farm and its owner (customer), each field as a partfield with its boundary, its hazards as
// obstacles with their clearance zones, each saved plan's guidance (an AB line) and headland, the
// operators (workers) and one task per job. Pure (no database), so it runs in a compute worker.
import type { Geometry, MultiPolygon, Polygon, Position } from 'geojson';
import { Geodesic } from 'geographiclib-geodesic';
import RelateOp from 'jsts/org/locationtech/jts/operation/relate/RelateOp.js';
import {
  ExtendedLineString,
  type ExtendedPartfield,
  ExtendedPolygon,
  GuidancePatternGuidancePatternPropagationDirectionEnum,
  GuidancePatternGuidancePatternTypeEnum,
  ISOXMLManager,
  LineStringLineStringTypeEnum,
  Point,
  PointPointTypeEnum,
  PolygonPolygonTypeEnum,
  TAGS,
  TaskTaskStatusEnum,
  type Customer,
  type Entity,
  type ISOXMLReference,
  type Farm,
  type GuidanceGroup,
  type GuidancePattern,
  type Polygon as IsoPolygon,
  type Task,
  type Worker,
} from 'isoxml';
import { formatLength } from '../../shared/figures';
import { projectionForField, type LocalProjection } from '../../shared/geo/local-projection';
import type { AssignmentState } from '../../shared/schemas/jobs';
import { createPassClipper } from '../../shared/plan/pass-clipper';
import { difference, hazardZones, offset, readJsts, unionAll, writePolygonal } from '../../shared/plan/jsts-ops';

/** A JTS geometry (the jsts package has no types). */
type JstsGeometry = ReturnType<typeof readJsts>;
import { packRegion } from '../../shared/plan/planar-region';
import { headlandFromRings } from './headland-rings';
import { pointZone } from './point-zone';

type Passes = ReturnType<ReturnType<typeof createPassClipper>['clip']>;

/**
 * Whether a clearance zone reaches the first pass of a clip over `region`, or the region's vertex
 * furthest to the left across the heading (the edge the passes are laid from).
 */
function zonesTouchFirstPass(zones: JstsGeometry[], region: Polygon | MultiPolygon, p: Passes): boolean {
  const u = p.us[p.segLine[0]];
  const at = (t: number) => [u * p.cos + t * p.sin, -u * p.sin + t * p.cos];
  let left: Position = [0, 0];
  let leftU = Infinity;
  for (const ring of region.type === 'Polygon' ? region.coordinates : region.coordinates.flat())
    for (const q of ring) {
      const qu = q[0] * p.cos - q[1] * p.sin;
      if (qu < leftU) [leftU, left] = [qu, q];
    }
  const pass = readJsts({ type: 'LineString', coordinates: [at(p.segT[0]), at(p.segT[1])] });
  const edge = readJsts({ type: 'Point', coordinates: left });
  const meets = (z: JstsGeometry, g: JstsGeometry): boolean =>
    z.getEnvelopeInternal().intersects(g.getEnvelopeInternal()) && RelateOp.relate(z, g).isIntersects();
  return zones.some((z) => meets(z, pass) || meets(z, edge));
}

/** The version-4 designators (PFD@C, TSK@B, CTR@B …) hold at most 32 characters (ISO 11783-10 XSD). */
const DESIGNATOR_MAX = 32;
/**
 * A name as a designator: at most 32 characters, and without the XML specials & < > " (the library
 * escapes attribute text twice, so "&" would reach a terminal as "&amp;").
 */
const designator = (text: string) => {
  const plain = text.replaceAll('&', 'and').replaceAll("'", '’').replace(/[<>"]/g, '').trim();
  return plain.length > DESIGNATOR_MAX ? `${plain.slice(0, DESIGNATOR_MAX - 1)}…` : plain;
};

export interface TaskDataHazard {
  id: number;
  /** What it is, in words ("Grain bins", "Power pole"). */
  label: string;
  geometry: Geometry;
  clearanceM: number;
}

export interface TaskDataPlan {
  /** The operation's name ("Seeding"). */
  label: string;
  widthM: number;
  headlandPasses: number;
  /** Degrees clockwise from true north, 0 ≤ h < 180: the saved heading, or the one auto chose. */
  headingDeg: number;
}

export interface TaskDataField {
  id: number;
  name: string;
  boundary: Polygon | MultiPolygon;
  /** The field's area on the WGS84 ellipsoid, m² (the stored measure). */
  areaM2: number;
  hazards: TaskDataHazard[];
  /** The saved plans of the operations exported for this field, by operation. */
  plans: Record<string, TaskDataPlan>;
}

export interface TaskDataJob {
  id: number;
  fieldId: number;
  operation: string;
  /** "Seeding, North Quarter". */
  label: string;
  workerId: number;
  state: AssignmentState;
}

export interface TaskDataInput {
  farm: { name: string };
  /** The farm's owner: the customer of every task. */
  customer: { name: string };
  fields: TaskDataField[];
  workers: Array<{ id: number; name: string }>;
  jobs: TaskDataJob[];
  /** The writing program's version (TASKDATA@ManagementSoftwareVersion). */
  softwareVersion?: string;
}

/** A job's state as an ISO 11783-10 task status (TSK@G). */
export const TASK_STATUS: Record<AssignmentState, TaskTaskStatusEnum> = {
  planned: TaskTaskStatusEnum.Planned,
  underway: TaskTaskStatusEnum.Running,
  paused: TaskTaskStatusEnum.Paused,
  finished: TaskTaskStatusEnum.Completed,
  'called-off': TaskTaskStatusEnum.Canceled,
};

/** "Clearance 15 m: Grain bins": the designator of a hazard's clearance zone; parsed back on import. */
export const clearanceDesignator = (clearanceM: number, label: string) =>
  designator(`Clearance ${formatLength(clearanceM, 'metric')}: ${label}`);

function splitName(name: string): { last: string; first?: string } {
  const at = name.trim().lastIndexOf(' ');
  return at > 0 ? { first: designator(name.slice(0, at)), last: designator(name.slice(at + 1)) } : { last: designator(name.trim()) };
}

/** The parts of a (multi-)geometry of one kind, e.g. the polygons of a MultiPolygon. */
function partsOf(g: Geometry): Geometry[] {
  switch (g.type) {
    case 'MultiPoint':
      return g.coordinates.map((coordinates) => ({ type: 'Point', coordinates }));
    case 'MultiLineString':
      return g.coordinates.map((coordinates) => ({ type: 'LineString', coordinates }));
    case 'MultiPolygon':
      return g.coordinates.map((coordinates) => ({ type: 'Polygon', coordinates }));
    case 'GeometryCollection':
      return g.geometries.flatMap(partsOf);
    default:
      return [g];
  }
}

const point = (m: ISOXMLManager, p: Position, type: PointPointTypeEnum, name?: string) =>
  new Point({ PointType: type, PointNorth: p[1], PointEast: p[0], ...(name ? { PointDesignator: designator(name) } : {}) }, m);

const polygons = (m: ISOXMLManager, g: Polygon | MultiPolygon, type: PolygonPolygonTypeEnum, name: string): IsoPolygon[] =>
  ExtendedPolygon.fromGeoJSON(g, type, m).map((p) => {
    p.attributes.PolygonDesignator = designator(name);
    return p;
  });

/**
 * The hazard itself as obstacle geometry (a point, line or area of type "obstacle"), and its
 * clearance zone (the hazard widened by its clearance, in the field's own plane) as a buffer zone
 * polygon named with the distance. Answers the ground the hazard keeps clear (its zone; an area
 * hazard at clearance 0 is itself), for the plans' work region.
 */
function addHazard(m: ISOXMLManager, pfd: ExtendedPartfield, proj: LocalProjection, h: TaskDataHazard): JstsGeometry | null {
  const name = designator(`Keep ${formatLength(h.clearanceM, 'metric')} clear: ${h.label}`);
  for (const part of partsOf(h.geometry)) {
    if (part.type === 'Point') (pfd.attributes.Point ??= []).push(point(m, part.coordinates, PointPointTypeEnum.Obstacle, name));
    else if (part.type === 'LineString') {
      const line = ExtendedLineString.fromGeoJSONCoordinates(part.coordinates, m, LineStringLineStringTypeEnum.Obstacle);
      line.attributes.LineStringDesignator = name;
      (pfd.attributes.LineString ??= []).push(line);
    } else if (part.type === 'Polygon')
      (pfd.attributes.PolygonnonTreatmentZoneonly ??= []).push(...polygons(m, part, PolygonPolygonTypeEnum.Obstacle, name));
  }
  // A point's zone is its disc, drawn as the buffer draws it; other shapes go through the buffer.
  const disc = h.geometry.type === 'Point' && h.clearanceM > 0 ? pointZone(proj.forward(h.geometry.coordinates), h.clearanceM) : null;
  const zone = disc
    ? readJsts(disc)
    : hazardZones({
        type: 'FeatureCollection',
        features: [{ type: 'Feature', properties: { clearanceM: h.clearanceM }, geometry: proj.forwardGeometry(h.geometry) }],
      });
  const zoneXY = disc ?? (h.clearanceM > 0 && zone ? writePolygonal(zone) : null);
  if (zoneXY)
    (pfd.attributes.PolygonnonTreatmentZoneonly ??= []).push(
      ...polygons(m, proj.inverseGeometry(zoneXY), PolygonPolygonTypeEnum.BufferZone, clearanceDesignator(h.clearanceM, h.label)),
    );
  return zone && !zone.isEmpty() ? zone : null;
}

/**
 * A saved plan's headland (the boundary minus the interior the passes work) and its AB line. The
 * interior and the first pass are found as the planner finds them (shared/plan/plan-passes): the
 * boundary offset inward by headland passes × width, hazard clearances taken out, the first pass
 * half a width in from the left-hand edge looking along the heading. A is where that pass starts;
 * B is reached from A along the geodesic at the plan's heading, over the pass's length, so the
 * line's azimuth at A is the plan's heading exactly (on the plan's own plane, north is true north
 * only on the field's centre meridian).
 */
function addPlan(
  m: ISOXMLManager,
  pfd: ExtendedPartfield,
  field: { proj: LocalProjection; fieldXY: Polygon | MultiPolygon; fieldJ: JstsGeometry; zones: JstsGeometry[] },
  plan: TaskDataPlan,
): void {
  const { proj, fieldXY, fieldJ, zones } = field;
  const headlandM = plan.headlandPasses * plan.widthM;
  const interiorJ = headlandM > 0 ? offset(fieldJ, -headlandM) : fieldJ;
  const interiorXY = headlandM > 0 ? writePolygonal(interiorJ) : fieldXY;
  if (headlandM > 0) {
    // The interior lies inside the field by headlandM, so the headland is the two sets of rings
    // nested; the overlay stays for rings that do not nest cleanly.
    const headland = headlandFromRings(fieldXY, interiorXY) ?? writePolygonal(difference(fieldJ, interiorJ));
    if (headland)
      (pfd.attributes.PolygonnonTreatmentZoneonly ??= []).push(
        ...polygons(m, proj.inverseGeometry(headland), PolygonPolygonTypeEnum.Headland, `Headland: ${plan.label}`),
      );
  }
  if (!interiorXY) return;
  let passes = createPassClipper(packRegion(interiorXY), plan.widthM).clip(plan.headingDeg);
  if (passes.segmentCount === 0 && !zones.length) return;
  // The first pass of the work region (the interior less the clearance zones) is the interior's
  // when no zone touches that pass nor the interior's left-hand extreme: the passes are then laid
  // from the same edge, the work region's lie on the interior's, and none comes before one that is
  // whole. Otherwise the zones are taken out and the passes clipped again, as the planner does.
  if (zones.length && (passes.segmentCount === 0 || zonesTouchFirstPass(zones, interiorXY, passes))) {
    const workXY = writePolygonal(difference(interiorJ, unionAll(zones)));
    if (!workXY) return;
    passes = createPassClipper(packRegion(workXY), plan.widthM).clip(plan.headingDeg);
  }
  if (passes.segmentCount === 0) return;
  const u = passes.us[passes.segLine[0]];
  const [t0, t1] = [passes.segT[0], passes.segT[1]];
  const a = proj.inverse([u * passes.cos + t0 * passes.sin, -u * passes.sin + t0 * passes.cos]);
  const b = Geodesic.WGS84.Direct(a[1], a[0], plan.headingDeg, t1 - t0);
  const line = new ExtendedLineString(
    {
      LineStringType: LineStringLineStringTypeEnum.GuidancePattern,
      // The pass spacing: the working width, in millimetres (LSG@D).
      LineStringWidth: Math.round(plan.widthM * 1000),
      Point: [point(m, a, PointPointTypeEnum.GuidanceReferenceA), point(m, [b.lon2!, b.lat2!], PointPointTypeEnum.GuidanceReferenceB)],
    },
    m,
  );
  const pattern = m.createEntityFromAttributes<GuidancePattern>(TAGS.GuidancePattern, {
    GuidancePatternDesignator: designator(`AB ${plan.label}`),
    GuidancePatternType: GuidancePatternGuidancePatternTypeEnum.AB,
    GuidancePatternPropagationDirection: GuidancePatternGuidancePatternPropagationDirectionEnum.BothDirections,
    GuidancePatternHeading: plan.headingDeg,
    LineString: [line],
  });
  m.registerEntity(pattern);
  const group = m.createEntityFromAttributes<GuidanceGroup>(TAGS.GuidanceGroup, {
    GuidanceGroupDesignator: designator(`${plan.label} plan`),
    GuidancePattern: [pattern],
  });
  m.registerEntity(group);
  (pfd.attributes.GuidanceGroup ??= []).push(group);
}

/**
 * The library's manager, finding an entity's reference through a map: the library looks it up by
 * a scan of every reference for each point it writes (points carry an optional id), which made a
 * day of 40 fields cost seconds (`npm run bench -- taskdata`).
 */
class IndexedManager extends ISOXMLManager {
  private readonly refs = new Map<Entity, ISOXMLReference>();
  override registerEntity(entity?: Entity, xmlId?: string, fmisId?: string): ISOXMLReference {
    const ref = super.registerEntity(entity, xmlId, fmisId);
    if (ref?.entity) this.refs.set(ref.entity, ref);
    return ref;
  }
  override getReferenceByEntity(entity: Entity): ISOXMLReference {
    return this.refs.get(entity)!;
  }
}

/** TASKDATA/TASKDATA.XML (version 4) in a zip, as a terminal loads it. */
export async function buildTaskData(input: TaskDataInput): Promise<Uint8Array> {
  const m = new IndexedManager({ version: 4, fmisTitle: 'Furlong', fmisVersion: input.softwareVersion ?? '1.0', rootFolder: 'TASKDATA' });
  const register = <T extends Entity>(tag: TAGS, attrs: Record<string, unknown>): T => {
    const e = m.createEntityFromAttributes<T>(tag, attrs);
    m.registerEntity(e);
    return e;
  };
  const owner = splitName(input.customer.name);
  const customer = register<Customer>(TAGS.Customer, { CustomerLastName: owner.last, CustomerFirstName: owner.first });
  const customerRef = m.getReferenceByEntity(customer);
  const farm = register<Farm>(TAGS.Farm, { FarmDesignator: designator(input.farm.name), CustomerIdRef: customerRef });
  const farmRef = m.getReferenceByEntity(farm);

  const partfields = new Map<number, ExtendedPartfield>();
  for (const f of input.fields) {
    const pfd = register<ExtendedPartfield>(TAGS.Partfield, {
      PartfieldDesignator: designator(f.name),
      PartfieldArea: Math.round(f.areaM2),
      CustomerIdRef: customerRef,
      FarmIdRef: farmRef,
    });
    pfd.attributes.PolygonnonTreatmentZoneonly = polygons(m, f.boundary, PolygonPolygonTypeEnum.PartfieldBoundary, f.name);
    const proj = projectionForField(f.boundary);
    // Each hazard's zone is buffered once; the plans of the field share their union.
    const zones = f.hazards.map((h) => addHazard(m, pfd, proj, h)).filter((z): z is JstsGeometry => z !== null);
    const plans = Object.values(f.plans);
    if (plans.length) {
      const fieldXY = proj.forwardGeometry(f.boundary) as Polygon | MultiPolygon;
      const shared = { proj, fieldXY, fieldJ: readJsts(fieldXY), zones };
      for (const plan of plans) addPlan(m, pfd, shared, plan);
    }
    partfields.set(f.id, pfd);
  }
  const workers = new Map<number, Worker>();
  for (const w of input.workers) {
    const n = splitName(w.name);
    workers.set(w.id, register<Worker>(TAGS.Worker, { WorkerLastName: n.last, WorkerFirstName: n.first }));
  }
  const tasks = input.jobs.map((j) =>
    register<Task>(TAGS.Task, {
      TaskDesignator: designator(j.label),
      CustomerIdRef: customerRef,
      FarmIdRef: farmRef,
      PartfieldIdRef: m.getReferenceByEntity(partfields.get(j.fieldId)!),
      ResponsibleWorkerIdRef: m.getReferenceByEntity(workers.get(j.workerId)!),
      TaskStatus: TASK_STATUS[j.state],
    }),
  );
  const root = m.rootElement.attributes;
  root.Customer = [customer];
  root.Farm = [farm];
  root.Partfield = [...partfields.values()];
  root.Worker = [...workers.values()];
  root.Task = tasks;
  return m.saveISOXML();
}
