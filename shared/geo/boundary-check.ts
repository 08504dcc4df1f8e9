import type { MultiPolygon, Polygon, Position } from 'geojson';
import { fieldAreaOfRings, ringAreasM2, type FieldArea } from './geodesic-area';
import { formatLatLon } from './format-position';
import { MAX_BOUNDARY_RINGS, MAX_BOUNDARY_VERTICES } from '../limits';
import { firstCrossing, type RingEdge } from './ring-crossings';
import { BOUNDARY_PROBLEM_CODES, type BoundaryProblemCode } from './boundary-problem-codes';

export { BOUNDARY_PROBLEM_CODES, type BoundaryProblemCode };

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

/** 1 inside the ring, 0 on its boundary, -1 outside; one pass over the ring (ray casting). */
function locate(x: number, y: number, ring: Position[]): -1 | 0 | 1 {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = ring[i];
    const [xj, yj] = ring[j];
    if (
      (xj - xi) * (y - yi) === (yj - yi) * (x - xi) &&
      Math.min(xi, xj) <= x &&
      x <= Math.max(xi, xj) &&
      Math.min(yi, yj) <= y &&
      y <= Math.max(yi, yj)
    )
      return 0;
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside ? 1 : -1;
}

interface Box {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

function boxOf(ring: Position[]): Box {
  const box = { minX: Infinity, minY: Infinity, maxX: -Infinity, maxY: -Infinity };
  for (const [x, y] of ring) {
    box.minX = Math.min(box.minX, x);
    box.minY = Math.min(box.minY, y);
    box.maxX = Math.max(box.maxX, x);
    box.maxY = Math.max(box.maxY, y);
  }
  return box;
}

const within = (a: Box, b: Box): boolean => a.minX >= b.minX && a.maxX <= b.maxX && a.minY >= b.minY && a.maxY <= b.maxY;

/** Points of a ring tried when deciding which side of other rings it lies on. */
const SIDE_TRIES = 8;

/**
 * Where a ring lies against other rings that it neither crosses nor overlaps, judged at one of its
 * points that is on none of them (rings may touch at single points, so its first vertex may be on
 * one): `locate` of that point against each other ring, or null when none of the ring's first
 * vertices and edge midpoints is off them all. Linear in the other rings' size.
 */
function sideOf(ring: Position[], others: Position[][]): (-1 | 1)[] | null {
  const tries = Math.min(SIDE_TRIES, ring.length - 1);
  for (let k = 0; k < 2 * tries; k++) {
    const [a, b] = k < tries ? [ring[k], ring[k]] : [ring[k - tries], ring[k - tries + 1]];
    const [x, y] = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];
    const sides = others.map((o) => locate(x, y, o));
    if (!sides.includes(0)) return sides as (-1 | 1)[];
  }
  return null;
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

/** Positions and rings in all parts, counted without copying (parts are arrays, checked before). */
function countPositions(parts: unknown[][]): { positions: number; rings: number } {
  let positions = 0;
  let rings = 0;
  for (const part of parts) {
    rings += part.length;
    for (const ring of part) if (Array.isArray(ring)) positions += ring.length;
  }
  return { positions, rings };
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

/** A boundary checked and, when it has no problem, measured (both at once, each ring measured once). */
export type BoundaryMeasurement =
  { problems: []; areaM2: number; acres: number } | { problems: BoundaryProblem[]; areaM2: null; acres: null };

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
  return inspect(geometry, label, {});
}

/**
 * Checks a field boundary (as `checkBoundary`) and measures it on the WGS84 ellipsoid from the
 * ring areas the check already computed: the one check and measurement every boundary gets, in
 * the browser while it is drawn and on the server when it is saved or imported.
 *
 * @param geometry anything claimed to be a GeoJSON Polygon or MultiPolygon in lon/lat degrees
 * @param label the field's name, used in messages
 * @returns the problems, and the area in m² and acres when there are none (null otherwise)
 * @example checkAndMeasureBoundary(section, 'Home quarter') // { problems: [], areaM2: ≈ 2_589_988, acres: ≈ 640 }
 */
export function checkAndMeasureBoundary(geometry: unknown, label?: string): BoundaryMeasurement {
  const measured: { area?: FieldArea } = {};
  const problems = inspect(geometry, label, measured);
  if (problems.length || !measured.area) return { problems, areaM2: null, acres: null };
  return { problems: [], areaM2: measured.area.areaM2, acres: measured.area.acres };
}

/** The checks; `measured.area` is set once every ring has been measured (the last checks need it). */
function inspect(geometry: unknown, label: string | undefined, measured: { area?: FieldArea }): BoundaryProblem[] {
  const subject = label ? `field '${label}'` : 'the boundary';
  const g = geometry as { type?: unknown; coordinates?: unknown } | null;
  if (!g || typeof g !== 'object' || typeof g.type !== 'string')
    return [{ code: 'not-polygon', message: `The boundary of ${subject} is missing or is not a GeoJSON geometry` }];
  if (g.type !== 'Polygon' && g.type !== 'MultiPolygon')
    return [{ code: 'not-polygon', message: `The boundary of ${subject} is a ${g.type}, not a Polygon or MultiPolygon` }];
  const parts = (g.type === 'Polygon' ? [g.coordinates] : g.coordinates) as unknown;
  if (!Array.isArray(parts) || parts.length === 0 || parts.some((p) => !Array.isArray(p) || p.length === 0))
    return [{ code: 'bad-coordinates', message: `The boundary of ${subject} has no rings of coordinates` }];
  const counted = countPositions(parts as unknown[][]);
  const whole = label ? `The boundary of field '${label}'` : 'The boundary';
  const int = (n: number) => n.toLocaleString('en-US');
  if (counted.positions > MAX_BOUNDARY_VERTICES)
    return [
      {
        code: 'too-many-positions',
        message: `${whole} has ${int(counted.positions)} points; Furlong takes at most ${int(MAX_BOUNDARY_VERTICES)} points per field boundary. Simplify it (e.g. to one point every metre) and upload it again.`,
      },
    ];
  if (counted.rings > MAX_BOUNDARY_RINGS)
    return [
      {
        code: 'too-many-rings',
        message: `${whole} has ${int(counted.rings)} rings (outer boundaries and holes); Furlong takes at most ${int(MAX_BOUNDARY_RINGS)} rings per field boundary. Leave out small holes and pieces, or upload the pieces as separate fields.`,
      },
    ];
  const multi = parts.length > 1;
  const ringName = (p: number, r: number, cap = true): string => `${cap ? 'R' : 'r'}ing ${r + 1}${multi ? ` of part ${p + 1}` : ''}`;
  const problems: BoundaryProblem[] = [];
  (parts as unknown[][]).forEach((rings, p) =>
    rings.forEach((ring, r) => problems.push(...checkRing(ring, `${ringName(p, r)} of ${subject}`, { part: p + 1, ring: r + 1 }))),
  );
  if (problems.length) return problems;

  const polys = parts as Position[][][];
  const edges = polys.flatMap((rings, p) => rings.flatMap((ring, r) => edgesOf(ring, p, r)));
  // Rings may touch at single points as OGC Simple Features 1.2.1 §6.1.11 allows.
  const hit = firstCrossing(edges, { ringsMayTouch: true });
  if (hit) {
    const { a, b, point } = hit;
    const near = formatLatLon(point[0], point[1]);
    const same = a.part === b.part && a.ring === b.ring;
    if (hit.kind === 'touch-loop') {
      const message = `${ringName(b.part, b.ring)} of ${subject} touches ${ringName(a.part, a.ring, false)} near ${near}; with the other places where its rings touch, this cuts the field into separate pieces. Draw each piece as a part of its own.`;
      return [{ code: 'rings-touch', message, part: b.part + 1, ring: b.ring + 1, vertex: b.index + 1, point }];
    }
    const message = same
      ? `${ringName(a.part, a.ring)} of ${subject} crosses itself near ${near} (between vertex ${a.index + 1} and vertex ${b.index + 1})`
      : `${ringName(a.part, a.ring)} of ${subject} crosses ${ringName(b.part, b.ring, false)} near ${near} (at vertex ${a.index + 1} and vertex ${b.index + 1})`;
    return [{ code: same ? 'self-intersection' : 'rings-cross', message, part: a.part + 1, ring: a.ring + 1, vertex: a.index + 1, point }];
  }
  const ringAreas = ringAreasM2(g as Polygon | MultiPolygon);
  ringAreas.forEach((rings, p) =>
    rings.forEach((areaM2, r) => {
      if (areaM2 < MIN_RING_AREA_M2) problems.push(zeroArea(`${ringName(p, r)} of ${subject}`, { part: p + 1, ring: r + 1 }));
    }),
  );
  if (problems.length) return problems;
  // Rings neither cross nor overlap now, so one point of a ring off the others tells its side.
  // A box that does not fit inside another rules out lying inside it without a pass over the ring.
  const boxes = polys.map((rings) => rings.map(boxOf));
  polys.forEach((rings, p) =>
    rings.slice(1).forEach((hole, h) => {
      const inside = within(boxes[p][h + 1], boxes[p][0]) && sideOf(hole, [rings[0]])?.[0] !== -1;
      if (!inside)
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
      if (q === p || !within(boxes[p][0], boxes[q][0])) return;
      const sides = sideOf(rings[0], other);
      // Undecided only when every point tried lies on the other part's rings: taken as inside.
      if (!sides || (sides[0] === 1 && !sides.slice(1).includes(1)))
        problems.push({ code: 'parts-overlap', message: `Part ${p + 1} of ${subject} lies inside part ${q + 1}`, part: p + 1, ring: 1 });
    }),
  );
  measured.area = fieldAreaOfRings(ringAreas);
  if (!problems.length && measured.area.areaM2 < MIN_RING_AREA_M2)
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
