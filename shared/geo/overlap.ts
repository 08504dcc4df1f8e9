import intersect from '@turf/intersect';
import type { Feature, MultiPolygon, Polygon, Position } from 'geojson';
import { roundTo } from '../round';
import { m2ToAcres } from '../units';
import { fieldArea, geodesicPerimeterM } from './geodesic-area';

/**
 * Overlaps smaller than this are not reported: 0.1 ac (about 405 m²) is the smallest step the
 * screens show, and less than a 1 m drift along a quarter-mile (402 m) shared fence. Common
 * practice, no published source.
 */
export const OVERLAP_MIN_ACRES = 0.1;

/**
 * A piece of overlap narrower than this on average is a sliver along a shared edge, not land
 * claimed twice: two tracings of the same fence (from imagery, or driven with a GNSS receiver
 * without correction) commonly disagree by a metre or so each way. Common practice, no published
 * source. The mean width of a piece is 2 × area ÷ perimeter (exact for a long thin strip).
 */
export const OVERLAP_MIN_WIDTH_M = 2;

/** A field of the farm that a boundary overlaps, and by how much (on the WGS84 ellipsoid). */
export interface BoundaryOverlap {
  fieldId: number;
  name: string;
  /** Overlap area, m², slivers left out. */
  areaM2: number;
  /** The same in acres, to 2 decimals. */
  acres: number;
}

/** A field to compare a boundary with. */
export interface OverlapCandidate {
  id: number;
  name: string;
  boundary: Polygon | MultiPolygon;
}

type Box = [minLon: number, minLat: number, maxLon: number, maxLat: number];

function boxOf(g: Polygon | MultiPolygon): Box {
  const box: Box = [Infinity, Infinity, -Infinity, -Infinity];
  const parts = g.type === 'Polygon' ? [g.coordinates] : g.coordinates;
  // Outer rings bound their holes: only those are read.
  for (const rings of parts) {
    for (const p of rings[0] ?? []) {
      if (p[0] < box[0]) box[0] = p[0];
      if (p[1] < box[1]) box[1] = p[1];
      if (p[0] > box[2]) box[2] = p[0];
      if (p[1] > box[3]) box[3] = p[1];
    }
  }
  return box;
}

const boxesMeet = (a: Box, b: Box): boolean => a[0] <= b[2] && b[0] <= a[2] && a[1] <= b[3] && b[1] <= a[3];

const feature = (geometry: Polygon | MultiPolygon): Feature<Polygon | MultiPolygon> => ({ type: 'Feature', geometry, properties: {} });

/**
 * The area two boundaries share, m², counting only pieces at least `OVERLAP_MIN_WIDTH_M` wide on
 * average: a shared edge gives nothing, a sliver along it is left out. The intersection is found
 * by turf's polygon clipping in lon/lat (edges straight in degrees, as GeoJSON means them, RFC 7946
 * 3.1.1; an east–west edge a mile long bows about 5 cm from the geodesic at 48° N) and measured
 * with `fieldArea` on the ellipsoid.
 *
 * @example sharedAreaM2(northHalf, southHalfShiftedNorth100m) // ≈ 100 m × the shared width
 */
export function sharedAreaM2(a: Polygon | MultiPolygon, b: Polygon | MultiPolygon): number {
  if (!boxesMeet(boxOf(a), boxOf(b))) return 0;
  const shared = intersect({ type: 'FeatureCollection', features: [feature(a), feature(b)] });
  if (!shared) return 0;
  const g = shared.geometry;
  const pieces: Position[][][] = g.type === 'Polygon' ? [g.coordinates] : g.coordinates;
  let total = 0;
  for (const rings of pieces) {
    const piece: Polygon = { type: 'Polygon', coordinates: rings };
    const { areaM2 } = fieldArea(piece);
    // Mean width of the piece: its outer ring's length only (holes in an overlap are rare and make it wider, not thinner).
    const outer = geodesicPerimeterM({ type: 'Polygon', coordinates: [rings[0]] });
    if (outer > 0 && (2 * areaM2) / outer >= OVERLAP_MIN_WIDTH_M) total += areaM2;
  }
  return total;
}

/**
 * The farm's fields a boundary overlaps by at least `OVERLAP_MIN_ACRES` (slivers and shared edges
 * left out), largest overlap first. A warning, never a refusal: fields that truly share land (a
 * field split for a season, a redrawn field kept beside its old outline) are the owner's call.
 *
 * @param boundary a checked boundary in lon/lat degrees
 * @param fields the farm's other fields (leave out the field being redrawn)
 */
export function findOverlaps(boundary: Polygon | MultiPolygon, fields: readonly OverlapCandidate[]): BoundaryOverlap[] {
  const box = boxOf(boundary);
  const found: BoundaryOverlap[] = [];
  for (const f of fields) {
    if (!boxesMeet(box, boxOf(f.boundary))) continue;
    const areaM2 = sharedAreaM2(boundary, f.boundary);
    const acres = m2ToAcres(areaM2);
    if (acres >= OVERLAP_MIN_ACRES) found.push({ fieldId: f.id, name: f.name, areaM2: roundTo(areaM2, 1), acres: roundTo(acres, 2) });
  }
  return found.sort((x, y) => y.areaM2 - x.areaM2);
}
