import type { MultiPolygon, Polygon, Position } from 'geojson';
import { geodesicAreaM2 } from './geodesic-area';
import { formatLatLon } from './format-position';
import { firstCrossing, type RingEdge } from './ring-crossings';

/** What can be wrong with a field boundary. */
export type BoundaryProblemCode =
  | 'not-polygon'
  | 'bad-coordinates'
  | 'not-finite'
  | 'out-of-range'
  | 'swapped'
  | 'too-few-positions'
  | 'not-closed'
  | 'zero-area'
  | 'self-intersection'
  | 'rings-cross'
  | 'hole-outside'
  | 'parts-overlap';

/** One problem with a boundary. Numbers are 1-based, as in the message. */
export interface BoundaryProblem {
  code: BoundaryProblemCode;
  message: string;
  /** Polygon number within a MultiPolygon (1 for a Polygon). */
  part?: number;
  /** Ring number within the polygon: 1 = outer boundary, 2… = holes. */
  ring?: number;
  /** Vertex number within the ring. */
  vertex?: number;
  /** Where, [lon, lat] degrees. */
  point?: [number, number];
}

/** Smallest area a ring may enclose, m²; below this it is a line or a point drawn by mistake. */
const MIN_RING_AREA_M2 = 0.01;

const isNum = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

function pointInRing(x: number, y: number, ring: Position[]): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = ring[i];
    const [xj, yj] = ring[j];
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

const zeroArea = (name: string, where: { part: number; ring: number }): BoundaryProblem => ({
  code: 'zero-area',
  message: `${name} encloses no area (its points lie on a line or on top of each other)`,
  ...where,
});

/** True when every vertex lies on the line through the first two distinct ones (or there are < 3). */
function isCollinear(ring: Position[]): boolean {
  const [x0, y0] = ring[0];
  const far = ring.find(([x, y]) => x !== x0 || y !== y0);
  if (!far) return true;
  const dx = far[0] - x0,
    dy = far[1] - y0;
  const len2 = dx * dx + dy * dy;
  // Off the line by less than 1e-10 of its length (under a micrometre at field size): rounding noise.
  return ring.every(([x, y]) => Math.abs(dx * (y - y0) - dy * (x - x0)) <= 1e-10 * len2);
}

/** Structural checks of one ring; returns problems (empty when the ring can be used). */
function checkRing(ring: unknown, name: string, where: { part: number; ring: number }): BoundaryProblem[] {
  if (!Array.isArray(ring)) return [{ code: 'bad-coordinates', message: `${name} is not a list of positions`, ...where }];
  for (let v = 0; v < ring.length; v++) {
    const p: unknown = ring[v];
    if (!Array.isArray(p) || p.length < 2 || !isNum(p[0]) || !isNum(p[1])) {
      const message = `${name}: vertex ${v + 1} is not a pair of finite numbers [longitude, latitude]`;
      return [{ code: 'not-finite', message, ...where, vertex: v + 1 }];
    }
    const [lon, lat] = p as number[];
    if (Math.abs(lat) > 90 && Math.abs(lon) <= 90 && Math.abs(lat) <= 180) {
      const message = `${name}: vertex ${v + 1} has latitude ${lat}, beyond ±90°; it looks like latitude and longitude are swapped (GeoJSON lists longitude first)`;
      return [{ code: 'swapped', message, ...where, vertex: v + 1 }];
    }
    if (Math.abs(lon) > 180 || Math.abs(lat) > 90) {
      const message = `${name}: vertex ${v + 1} (${lon}, ${lat}) is outside longitude ±180° / latitude ±90°`;
      return [{ code: 'out-of-range', message, ...where, vertex: v + 1 }];
    }
  }
  if (ring.length < 4)
    return [
      {
        code: 'too-few-positions',
        message: `${name} has ${ring.length} positions; a closed ring needs at least 4 (the first repeated at the end)`,
        ...where,
      },
    ];
  const [first, last] = [ring[0] as number[], ring[ring.length - 1] as number[]];
  if (first[0] !== last[0] || first[1] !== last[1])
    return [
      {
        code: 'not-closed',
        message: `${name} is not closed: its last position must repeat the first`,
        ...where,
        point: [first[0], first[1]],
      },
    ];
  if (isCollinear(ring as Position[])) return [zeroArea(name, where)];
  return [];
}

function edgesOf(ring: Position[], part: number, r: number): RingEdge[] {
  const keep: number[] = [];
  for (let i = 0; i < ring.length - 1; i++) {
    const prev = keep.length ? ring[keep[keep.length - 1]] : null;
    if (!prev || prev[0] !== ring[i][0] || prev[1] !== ring[i][1]) keep.push(i);
  }
  if (keep.length > 1 && ring[keep[0]][0] === ring[keep[keep.length - 1]][0] && ring[keep[0]][1] === ring[keep[keep.length - 1]][1])
    keep.pop();
  return keep.map((index, k) => {
    const next = keep[(k + 1) % keep.length];
    return { part, ring: r, index, next, ax: ring[index][0], ay: ring[index][1], bx: ring[next][0], by: ring[next][1] };
  });
}

/**
 * Everything wrong with a field boundary, in plain words for the farmer who drew or uploaded it.
 * Checks the GeoJSON type, closed rings of ≥ 4 positions, finite lon/lat in range (and spots
 * swapped latitude/longitude), zero area, rings crossing themselves or each other, holes outside
 * their outer ring and overlapping parts. Vertex numbers in messages are 1-based; for a crossing
 * they name the first vertex of each of the two crossing edges.
 *
 * @param geometry anything claimed to be a GeoJSON Polygon or MultiPolygon in lon/lat degrees
 * @param label the field's name, used in messages
 * @returns the problems found; empty when the boundary is fine
 * @example checkBoundary({ type: 'Point', coordinates: [-99.9, 47.6] }, 'North Quarter')
 * // [{ code: 'not-polygon', message: "The boundary of field 'North Quarter' is a Point, …" }]
 */
export function checkBoundary(geometry: unknown, label?: string): BoundaryProblem[] {
  const subject = label ? `field '${label}'` : 'the boundary';
  const g = geometry as { type?: unknown; coordinates?: unknown } | null;
  if (!g || typeof g !== 'object' || typeof g.type !== 'string')
    return [{ code: 'not-polygon', message: `The boundary of ${subject} is missing or is not a GeoJSON geometry` }];
  if (g.type !== 'Polygon' && g.type !== 'MultiPolygon')
    return [{ code: 'not-polygon', message: `The boundary of ${subject} is a ${g.type}, not a Polygon or MultiPolygon` }];
  const parts = (g.type === 'Polygon' ? [g.coordinates] : g.coordinates) as unknown;
  if (!Array.isArray(parts) || parts.length === 0 || parts.some((p) => !Array.isArray(p) || p.length === 0))
    return [{ code: 'bad-coordinates', message: `The boundary of ${subject} has no rings of coordinates` }];
  const multi = parts.length > 1;
  const ringName = (p: number, r: number, cap = true): string => `${cap ? 'R' : 'r'}ing ${r + 1}${multi ? ` of part ${p + 1}` : ''}`;
  const problems: BoundaryProblem[] = [];
  (parts as unknown[][]).forEach((rings, p) =>
    rings.forEach((ring, r) => problems.push(...checkRing(ring, `${ringName(p, r)} of ${subject}`, { part: p + 1, ring: r + 1 }))),
  );
  if (problems.length) return problems;

  const polys = parts as Position[][][];
  const edges = polys.flatMap((rings, p) => rings.flatMap((ring, r) => edgesOf(ring, p, r)));
  const hit = firstCrossing(edges);
  if (hit) {
    const { a, b, point } = hit;
    const near = formatLatLon(point[0], point[1]);
    const same = a.part === b.part && a.ring === b.ring;
    const message = same
      ? `${ringName(a.part, a.ring)} of ${subject} crosses itself near ${near} (between vertex ${a.index + 1} and vertex ${b.index + 1})`
      : `${ringName(a.part, a.ring)} of ${subject} crosses ${ringName(b.part, b.ring, false)} near ${near} (at vertex ${a.index + 1} and vertex ${b.index + 1})`;
    return [{ code: same ? 'self-intersection' : 'rings-cross', message, part: a.part + 1, ring: a.ring + 1, vertex: a.index + 1, point }];
  }
  polys.forEach((rings, p) =>
    rings.forEach((ring, r) => {
      if (geodesicAreaM2({ type: 'Polygon', coordinates: [ring] }) < MIN_RING_AREA_M2)
        problems.push(zeroArea(`${ringName(p, r)} of ${subject}`, { part: p + 1, ring: r + 1 }));
    }),
  );
  if (problems.length) return problems;
  polys.forEach((rings, p) =>
    rings.slice(1).forEach((hole, h) => {
      if (!pointInRing(hole[0][0], hole[0][1], rings[0]))
        problems.push({
          code: 'hole-outside',
          message: `${ringName(p, h + 1)} of ${subject} is a hole that lies outside its outer ring`,
          part: p + 1,
          ring: h + 2,
        });
    }),
  );
  polys.forEach((rings, p) =>
    polys.forEach((other, q) => {
      if (q === p) return;
      const [x, y] = rings[0][0];
      if (pointInRing(x, y, other[0]) && !other.slice(1).some((hole) => pointInRing(x, y, hole)))
        problems.push({ code: 'parts-overlap', message: `Part ${p + 1} of ${subject} lies inside part ${q + 1}`, part: p + 1, ring: 1 });
    }),
  );
  if (!problems.length && geodesicAreaM2(g as never) < MIN_RING_AREA_M2)
    problems.push({ code: 'zero-area', message: `The boundary of ${subject} encloses no area once its holes are taken out` });
  return problems;
}

/**
 * Throws an Error with the first problem's message when the boundary is not usable.
 *
 * @param geometry anything claimed to be a GeoJSON Polygon or MultiPolygon in lon/lat degrees
 * @param label the field's name, used in the message
 * @example assertBoundary(upload.geometry, 'North Quarter'); // throws "Ring 1 of field 'North Quarter' crosses itself near …"
 */
export function assertBoundary(geometry: unknown, label?: string): asserts geometry is Polygon | MultiPolygon {
  const problems = checkBoundary(geometry, label);
  if (problems.length) throw new Error(problems[0].message);
}
