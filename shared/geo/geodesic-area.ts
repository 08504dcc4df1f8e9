import type { MultiPolygon, Polygon, Position } from 'geojson';
import { Geodesic } from 'geographiclib-geodesic';
import { m2ToAcres } from '../units';

/** WGS84 ellipsoid geodesic calculator (GeographicLib, Karney 2013). */
const WGS84 = Geodesic.WGS84;

/**
 * Area and perimeter of one ring on the WGS84 ellipsoid. The closing position may be repeated or
 * not. Returns the absolute area, so orientation does not matter.
 */
function ringAreaPerimeter(ring: readonly Position[]): { areaM2: number; perimeterM: number } {
  const poly = WGS84.Polygon(false);
  let n = ring.length;
  if (n > 1 && ring[0][0] === ring[n - 1][0] && ring[0][1] === ring[n - 1][1]) n--;
  for (let i = 0; i < n; i++) poly.AddPoint(ring[i][1], ring[i][0]);
  const r = poly.Compute(false, true);
  return { areaM2: Math.abs(r.area ?? 0), perimeterM: r.perimeter };
}

function polygonsOf(geometry: Polygon | MultiPolygon): Position[][][] {
  return geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
}

/**
 * Area of every ring of a Polygon or MultiPolygon on the WGS84 ellipsoid, in square metres, part
 * by part (outer ring first, then its holes), each as an unsigned area. The boundary check reads
 * these to find rings that enclose nothing, then `areaOfRingsM2` adds them up: each ring is
 * measured once.
 *
 * @param geometry GeoJSON geometry in lon/lat degrees (RFC 7946)
 * @returns per part, per ring, square metres (≥ 0)
 */
export function ringAreasM2(geometry: Polygon | MultiPolygon): number[][] {
  return polygonsOf(geometry).map((rings) => rings.map((ring) => ringAreaPerimeter(ring).areaM2));
}

/**
 * Area enclosed by rings already measured with `ringAreasM2`: each part's outer ring minus its
 * holes, parts added, never below zero.
 *
 * @param ringAreas per part, per ring, square metres
 * @returns area in square metres (≥ 0)
 */
export function areaOfRingsM2(ringAreas: readonly (readonly number[])[]): number {
  let total = 0;
  for (const rings of ringAreas) rings.forEach((a, i) => (total += i === 0 ? a : -a));
  return Math.max(0, total);
}

/**
 * Area of a Polygon or MultiPolygon on the WGS84 ellipsoid, in square metres: each part's outer
 * ring minus its holes, parts added. Edges are geodesics; ring orientation does not matter.
 * Uses GeographicLib's PolygonArea (C. F. F. Karney, "Algorithms for geodesics", J. Geodesy 87, 2013).
 *
 * @param geometry GeoJSON geometry in lon/lat degrees (RFC 7946)
 * @returns area in square metres (≥ 0)
 * @example
 * geodesicAreaM2({ type: 'Polygon', coordinates: [[[0, -1], [-1, 0], [0, 1], [1, 0], [0, -1]]] });
 * // ≈ 24_619_419_146 (GeographicLib test Planimeter0)
 */
export function geodesicAreaM2(geometry: Polygon | MultiPolygon): number {
  return areaOfRingsM2(ringAreasM2(geometry));
}

/**
 * Length of every ring (outer rings and holes) of a Polygon or MultiPolygon along geodesics on
 * the WGS84 ellipsoid, in metres.
 *
 * @param geometry GeoJSON geometry in lon/lat degrees
 * @returns total ring length in metres
 * @example geodesicPerimeterM({ type: 'Polygon', coordinates: [[[0, -1], [-1, 0], [0, 1], [1, 0], [0, -1]]] }); // ≈ 627_598.2731
 */
export function geodesicPerimeterM(geometry: Polygon | MultiPolygon): number {
  let total = 0;
  for (const rings of polygonsOf(geometry)) for (const ring of rings) total += ringAreaPerimeter(ring).perimeterM;
  return total;
}

/** A field's area on the WGS84 ellipsoid, holes subtracted, in both units Furlong stores. */
export interface FieldArea {
  areaM2: number;
  /** 1 acre = 4,046.856 422 4 m² (shared/units). */
  acres: number;
}

/**
 * A field's area from its rings' areas (`ringAreasM2`): the one place a boundary's acres come
 * from, so a boundary already measured by its check is not measured again.
 *
 * @param ringAreas per part, per ring, square metres
 * @example fieldAreaOfRings([[2_589_988.110336]]) // { areaM2: 2589988.110336, acres: 640 }
 */
export function fieldAreaOfRings(ringAreas: readonly (readonly number[])[]): FieldArea {
  const areaM2 = areaOfRingsM2(ringAreas);
  return { areaM2, acres: m2ToAcres(areaM2) };
}

/**
 * A field's area on the WGS84 ellipsoid (holes subtracted), in m² and acres.
 *
 * @param geometry GeoJSON Polygon or MultiPolygon in lon/lat degrees
 * @example fieldArea(section) // { areaM2: ≈ 2_589_988, acres: ≈ 640 } for a surveyed section
 */
export function fieldArea(geometry: Polygon | MultiPolygon): FieldArea {
  return fieldAreaOfRings(ringAreasM2(geometry));
}

/**
 * Field area in acres on the WGS84 ellipsoid (holes subtracted).
 *
 * @param geometry GeoJSON Polygon or MultiPolygon in lon/lat degrees
 * @returns area in acres (1 acre = 4,046.856 422 4 m²)
 * @example fieldAcres(section) // ≈ 640 for a surveyed section
 */
export function fieldAcres(geometry: Polygon | MultiPolygon): number {
  return fieldArea(geometry).acres;
}
