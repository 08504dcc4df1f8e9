import type { FeatureCollection, MultiPolygon, Polygon } from 'geojson';
import { assertBoundary } from '../geo/boundary-check';
import { MAX_HAZARD_VERTICES } from '../limits';
import { DEFAULT_EDGE_MARGIN_PCT, MAX_EDGE_MARGIN_PCT } from './auto-heading';
import { mphToMps } from '../units';
import { DEFAULT_TURN_SECONDS, implementDefaults, IMPLEMENT_DEFAULTS } from './implement-defaults';
import { fieldName } from './format';
import type { PlanInput } from './types';

/** A plan input with every default filled in and every value checked. */
export interface ResolvedPlanInput {
  boundary: Polygon | MultiPolygon;
  label?: string;
  hazards?: FeatureCollection;
  widthM: number;
  headlandPasses: number;
  heading: number | 'auto';
  edgeMarginPct: number;
  /** m/s */
  speedMps: number;
  efficiency: number;
  turnSeconds: number;
  coverage: 'gaps-ok' | 'full';
}

/** The fastest working speed a plan takes: 60 mph, in m/s (above any field work; a guard against typing km/h for mph twice over). */
export const MAX_SPEED_MPS = mphToMps(60);
/** {@link MAX_SPEED_MPS} in words, in both unit systems. */
export const MAX_SPEED_TEXT = '60 mph (97 km/h)';

const HAZARD_TYPES = new Set(['Point', 'MultiPoint', 'LineString', 'MultiLineString', 'Polygon', 'MultiPolygon']);
const finite = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

/** Checks every position of a geometry's coordinates (nesting at most 4 deep); returns how many. */
function checkPositions(coords: unknown, where: string, depth = 0): number {
  if (Array.isArray(coords) && typeof coords[0] === 'number') {
    const [lon, lat] = coords as number[];
    if (!finite(lon) || !finite(lat) || Math.abs(lon) > 180 || Math.abs(lat) > 90)
      throw new Error(`${where} has a position that is not a valid [longitude, latitude]: ${JSON.stringify(coords).slice(0, 80)}`);
    return 1;
  }
  if (!Array.isArray(coords) || coords.length === 0 || depth > 3) throw new Error(`${where} has no coordinates`);
  let n = 0;
  for (const c of coords) n += checkPositions(c, where, depth + 1);
  return n;
}

function checkHazards(hazards: unknown, field: string): FeatureCollection | undefined {
  if (hazards === undefined || hazards === null) return undefined;
  const fc = hazards as FeatureCollection;
  if (fc.type !== 'FeatureCollection' || !Array.isArray(fc.features))
    throw new Error(`The hazards of ${field} must be a GeoJSON FeatureCollection`);
  let positions = 0;
  fc.features.forEach((f, i) => {
    const where = `Hazard ${i + 1} of ${field}`;
    const type = f?.geometry?.type;
    if (!type || !HAZARD_TYPES.has(type)) throw new Error(`${where} must be a point, line or area (got ${String(type ?? 'no geometry')})`);
    positions += checkPositions((f.geometry as { coordinates: unknown }).coordinates, where);
    if (positions > MAX_HAZARD_VERTICES)
      throw new Error(
        `The hazards of ${field} have more than ${MAX_HAZARD_VERTICES.toLocaleString('en-US')} points together, more than Furlong plans around; simplify them`,
      );
    const c = (f.properties as { clearanceM?: unknown } | null)?.clearanceM;
    if (c !== undefined && c !== null && (!finite(c) || c < 0))
      throw new Error(`${where} has a clearance of ${String(c)} m; it must be a distance of 0 m or more`);
  });
  return fc;
}

/**
 * Checks a plan input and fills in its defaults; throws an Error a farmer can act on when a value is
 * wrong. Defaults: 2 headland passes, heading 'auto' with a 3 % edge margin, speed and efficiency from the implement kind
 * (else 5 mph, stored as 2.2352 m/s, and 0.75), 20 s per turn (common practice, no published source), 'gaps-ok'.
 *
 * @param input the plan input as received
 * @example resolvePlanInput({ boundary, widthM: 18.288 }).headlandPasses // 2
 */
export function resolvePlanInput(input: PlanInput): ResolvedPlanInput {
  if (!input || typeof input !== 'object') throw new Error('A pass plan needs a field boundary and a working width');
  const field = fieldName(input.fieldName);
  assertBoundary(input.boundary, input.fieldName);
  const { widthM } = input;
  if (!finite(widthM) || widthM <= 0) throw new Error(`The working width must be a distance greater than zero (got ${String(widthM)})`);
  const headlandPasses = input.headlandPasses ?? 2;
  if (!Number.isInteger(headlandPasses) || headlandPasses < 0 || headlandPasses > 50)
    throw new Error(`The number of headland passes must be a whole number from 0 to 50 (got ${String(headlandPasses)})`);
  const heading = input.headingDeg ?? 'auto';
  if (heading !== 'auto' && (!finite(heading) || heading < 0 || heading >= 180)) {
    const hint = finite(heading) && heading >= 180 && heading < 360 ? `; ${heading}° drives the same lines as ${heading - 180}°` : '';
    throw new Error(`The heading must be 'auto' or from 0° up to (not including) 180° (got ${String(heading)})${hint}`);
  }
  const edgeMarginPct = input.edgeMarginPct ?? DEFAULT_EDGE_MARGIN_PCT;
  if (!finite(edgeMarginPct) || edgeMarginPct < 0 || edgeMarginPct > MAX_EDGE_MARGIN_PCT)
    throw new Error(`The margin for keeping the passes along an edge must be 0 to ${MAX_EDGE_MARGIN_PCT} % (got ${String(edgeMarginPct)})`);
  if (input.implementKind !== undefined && !(input.implementKind in IMPLEMENT_DEFAULTS))
    throw new Error(`Unknown implement kind '${String(input.implementKind)}'; use one of ${Object.keys(IMPLEMENT_DEFAULTS).join(', ')}`);
  const defaults = implementDefaults(input.implementKind);
  const speedMps = input.speedMps ?? defaults.speedMps;
  if (!finite(speedMps) || speedMps <= 0 || speedMps > MAX_SPEED_MPS)
    throw new Error(`The working speed must be above 0 and at most ${MAX_SPEED_TEXT} (got ${String(speedMps)} m/s)`);
  const efficiency = input.efficiency ?? defaults.efficiency;
  if (!finite(efficiency) || efficiency <= 0 || efficiency > 1)
    throw new Error(`The field efficiency must be above 0 and at most 1 (e.g. 0.75 for 75 %) (got ${String(efficiency)})`);
  const turnSeconds = input.turnSeconds ?? DEFAULT_TURN_SECONDS;
  if (!finite(turnSeconds) || turnSeconds < 0 || turnSeconds > 3600)
    throw new Error(`The time per turn must be 0 to 3600 seconds (got ${String(turnSeconds)})`);
  const coverage = input.coverage ?? 'gaps-ok';
  if (coverage !== 'gaps-ok' && coverage !== 'full') throw new Error(`Coverage must be 'gaps-ok' or 'full' (got ${String(coverage)})`);
  const hazards = checkHazards(input.hazards, field);
  return {
    boundary: input.boundary,
    label: input.fieldName,
    hazards,
    widthM,
    headlandPasses,
    heading,
    edgeMarginPct,
    speedMps,
    efficiency,
    turnSeconds,
    coverage,
  };
}
