// "Where am I" on a job's map: which pass of the saved plan a position is on (or nearest to), how
// far the next hazard clearance zone is, and whether the position is inside one. Pure geometry in a
// transverse Mercator plane centred on the position (shared/geo/local-projection.ts), where lengths
// over a field are within 0.001 % of geodesic ones.
import type { Feature, FeatureCollection, Geometry, LineString, MultiPolygon, Polygon, Position } from 'geojson';
import { localProjection, type LocalProjection } from '../geo/local-projection';
import type { PassProperties, PlanInput } from './types';

/** The pass under a position, or the nearest one. */
export interface PassAt {
  /** Pass number as the plan numbers it (1-based from the left-hand edge looking along the heading). */
  pass: number;
  /** Segment of that pass (1-based along the heading). */
  segment: number;
  /** Distance from the pass's centre line, m. */
  offsetM: number;
  /** The position is on the pass's swath: within half the working width of its centre line, between its ends. */
  under: boolean;
}

/** One hazard seen from a position. */
export interface HazardAt {
  /** The hazard's index in the collection given. */
  index: number;
  /** properties.id and properties.kind, when the hazard has them. */
  id: number | null;
  kind: string | null;
  clearanceM: number;
  /** Distance to the hazard itself, m (0 inside an area hazard). */
  distanceM: number;
  /** Distance to the edge of its clearance zone, m; 0 inside it. */
  toZoneM: number;
  /** The position is inside the hazard's clearance zone (or inside the hazard's own area). */
  inside: boolean;
}

export interface Where {
  /** The pass under the position, else the nearest pass; null for a plan with no passes. */
  pass: PassAt | null;
  /** Inside the field's boundary (holes are outside). */
  inField: boolean;
  /** Clearance zones the position is inside, nearest hazard first. */
  insideZones: HazardAt[];
  /** The nearest clearance zone the position is outside of; null when there is none. */
  nextZone: HazardAt | null;
}

/** A small tolerance for "on the edge": positions a phone gives are metres off, far above it. */
const EDGE_M = 1e-6;

type XY = [number, number];

/** Distance from the origin to segment a–b, and where its foot falls along it (0 at a, 1 at b, clamped). */
function toSegment(a: XY, b: XY): { d: number; t: number; tRaw: number } {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len2 = dx * dx + dy * dy;
  const tRaw = len2 === 0 ? 0 : -(a[0] * dx + a[1] * dy) / len2;
  const t = Math.min(1, Math.max(0, tRaw));
  return { d: Math.hypot(a[0] + t * dx, a[1] + t * dy), t, tRaw };
}

/** Even-odd test of the origin against one ring (closed or not). */
function originInRing(ring: XY[]): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = ring[i];
    const [xj, yj] = ring[j];
    if (yi > 0 !== yj > 0 && 0 < ((xj - xi) * (0 - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

function minToPath(path: XY[]): number {
  if (path.length === 1) return Math.hypot(path[0][0], path[0][1]);
  let d = Infinity;
  for (let i = 1; i < path.length; i++) d = Math.min(d, toSegment(path[i - 1], path[i]).d);
  return d;
}

/** Distance from the origin to a projected polygon (0 inside it; holes are outside). */
function toPolygon(rings: XY[][]): number {
  if (!rings.length) return Infinity;
  const edge = Math.min(...rings.map(minToPath));
  const inside = originInRing(rings[0]) && !rings.slice(1).some(originInRing);
  return inside ? 0 : edge;
}

/** Distance from the origin (the position) to a geometry projected with `p`, and whether it has an area. */
function distanceTo(g: Geometry, p: LocalProjection): { d: number; area: boolean } {
  const pr = (c: Position): XY => p.forward(c);
  switch (g.type) {
    case 'Point':
      return { d: minToPath([pr(g.coordinates)]), area: false };
    case 'MultiPoint':
      return { d: Math.min(...g.coordinates.map((c) => minToPath([pr(c)]))), area: false };
    case 'LineString':
      return { d: minToPath(g.coordinates.map(pr)), area: false };
    case 'MultiLineString':
      return { d: Math.min(...g.coordinates.map((l) => minToPath(l.map(pr)))), area: false };
    case 'Polygon':
      return { d: toPolygon(g.coordinates.map((r) => r.map(pr))), area: true };
    case 'MultiPolygon':
      return { d: Math.min(...g.coordinates.map((poly) => toPolygon(poly.map((r) => r.map(pr))))), area: true };
    case 'GeometryCollection': {
      const parts = g.geometries.map((c) => distanceTo(c, p));
      return { d: Math.min(...parts.map((x) => x.d)), area: parts.some((x) => x.area && x.d === 0) };
    }
  }
}

/**
 * The pass under a position (on its swath: within half the working width of the centre line,
 * between the segment's flat ends), else the pass whose centre line is nearest.
 */
export function passAt(
  at: readonly [number, number],
  passes: FeatureCollection<LineString, PassProperties>,
  widthM: number,
): PassAt | null {
  const p = localProjection([at[0], at[1]]);
  let best: PassAt | null = null;
  for (const f of passes.features) {
    const line = f.geometry.coordinates.map((c) => p.forward(c));
    let offset = Infinity;
    let within = false;
    for (let i = 1; i < line.length; i++) {
      const s = toSegment(line[i - 1], line[i]);
      offset = Math.min(offset, s.d);
      // Flat ends: the swath stops where the centre line does (the foot falls on the segment).
      if (s.tRaw >= -EDGE_M && s.tRaw <= 1 + EDGE_M && s.d <= widthM / 2 + EDGE_M) within = true;
    }
    if (line.length === 1) offset = minToPath(line);
    const candidate: PassAt = { pass: f.properties.pass, segment: f.properties.segment, offsetM: offset, under: within };
    if (!best || (candidate.under && !best.under) || (candidate.under === best.under && candidate.offsetM < best.offsetM)) best = candidate;
  }
  return best;
}

/** Each hazard seen from a position: its distance, its clearance zone's edge, inside or not. */
export function hazardsAt(at: readonly [number, number], hazards: FeatureCollection): HazardAt[] {
  const p = localProjection([at[0], at[1]]);
  return hazards.features.flatMap((f: Feature, index) => {
    if (!f.geometry) return [];
    const props = (f.properties ?? {}) as { id?: unknown; kind?: unknown; clearanceM?: unknown };
    const clearanceM = Math.max(0, Number(props.clearanceM ?? 0) || 0);
    const { d, area } = distanceTo(f.geometry, p);
    if (!Number.isFinite(d)) return [];
    // As the planner's zones (jsts-ops.ts): a point or a line covers ground only with a clearance;
    // an area counts as it is.
    const inside = (clearanceM > 0 && d <= clearanceM + EDGE_M) || (area && d === 0);
    return [
      {
        index,
        id: typeof props.id === 'number' ? props.id : null,
        kind: typeof props.kind === 'string' ? props.kind : null,
        clearanceM,
        distanceM: d,
        toZoneM: inside ? 0 : d - clearanceM,
        inside,
      },
    ];
  });
}

/** Whether a position lies inside a field boundary (holes are outside). */
export function inBoundary(at: readonly [number, number], boundary: Polygon | MultiPolygon): boolean {
  return distanceTo(boundary, localProjection([at[0], at[1]])).d === 0;
}

/** Where a position is on a job's field: the pass, the field, the clearance zones. */
export function whereAmI(
  at: readonly [number, number],
  plan: { passes: FeatureCollection<LineString, PassProperties>; widthM: number } | null,
  boundary: Polygon | MultiPolygon,
  hazards: FeatureCollection,
): Where {
  const seen = hazardsAt(at, hazards);
  const insideZones = seen.filter((h) => h.inside).sort((a, b) => a.distanceM - b.distanceM);
  const outside = seen.filter((h) => !h.inside).sort((a, b) => a.toZoneM - b.toZoneM);
  return {
    pass: plan ? passAt(at, plan.passes, plan.widthM) : null,
    inField: inBoundary(at, boundary),
    insideZones,
    nextZone: outside[0] ?? null,
  };
}

/**
 * The direction of travel from one fix to the next, degrees clockwise from true north (0–360), or
 * null when the phone moved less than `minMoveM` (a standing phone's fixes wander a few metres).
 * For phones whose position carries no heading of its own.
 */
export function headingBetween(from: readonly [number, number], to: readonly [number, number], minMoveM = 3): number | null {
  const [x, y] = localProjection([from[0], from[1]]).forward(to);
  if (Math.hypot(x, y) < minMoveM) return null;
  const deg = (Math.atan2(x, y) * 180) / Math.PI;
  return deg < 0 ? deg + 360 : deg;
}

/** The saved settings of a pass plan, as the run sheet carries them. */
export interface SavedPlanSettings {
  widthM: number;
  headlandPasses: number;
  headingDeg: number | null;
  coverage: 'full' | 'gaps-ok';
  speedMps: number;
  efficiency: number;
  turnSeconds: number;
  summary: Record<string, unknown>;
}

/**
 * The planner's input that gives a saved plan's passes again: its own settings, with the heading
 * auto chose when it was saved (kept in its summary), so the geometry is the saved plan's.
 */
export function savedPlanInput(
  field: { boundary: Polygon | MultiPolygon; hazards: FeatureCollection; name?: string },
  saved: SavedPlanSettings,
): PlanInput {
  const num = (k: string) => (typeof saved.summary[k] === 'number' ? (saved.summary[k] as number) : undefined);
  return {
    boundary: field.boundary,
    hazards: field.hazards,
    fieldName: field.name,
    widthM: saved.widthM,
    headlandPasses: saved.headlandPasses,
    headingDeg: saved.headingDeg ?? num('headingDeg') ?? 'auto',
    edgeMarginPct: num('edgeMarginPct'),
    speedMps: saved.speedMps,
    efficiency: saved.efficiency,
    turnSeconds: saved.turnSeconds,
    coverage: saved.coverage,
  };
}
