import type { FeatureCollection, Geometry, MultiPolygon, Polygon } from 'geojson';
import GeometryFactory from 'jsts/org/locationtech/jts/geom/GeometryFactory.js';
import GeoJSONReader from 'jsts/org/locationtech/jts/io/GeoJSONReader.js';
import GeoJSONWriter from 'jsts/org/locationtech/jts/io/GeoJSONWriter.js';
import BufferOp from 'jsts/org/locationtech/jts/operation/buffer/BufferOp.js';
import BufferParameters from 'jsts/org/locationtech/jts/operation/buffer/BufferParameters.js';
import OverlayOp from 'jsts/org/locationtech/jts/operation/overlay/OverlayOp.js';

// Thin wrappers over JTS's polygon offset and overlay (the JTS Topology Suite, ported as jsts).
// These run once per plan, never per heading. Coordinates are local-plane metres.

/* eslint-disable @typescript-eslint/no-explicit-any */
type JstsGeometry = any;

const reader = new GeoJSONReader(new GeometryFactory());
const writer = new GeoJSONWriter();

/**
 * Segments per quarter circle in buffers: a round join of radius r is approximated by chords whose
 * sagitta is at most r (1 − cos(π/32)) ≈ 0.0048 r, e.g. 9 cm at 18 m (a 60 ft headland pass).
 */
const QUADRANT_SEGMENTS = 16;

/** Round joins and caps: an offset keeps a constant distance from every point of the edge. */
function bufferParams(): unknown {
  const p = new BufferParameters();
  p.setQuadrantSegments(QUADRANT_SEGMENTS);
  p.setJoinStyle(BufferParameters.JOIN_ROUND);
  p.setEndCapStyle(BufferParameters.CAP_ROUND);
  return p;
}

export const readJsts = (g: Geometry): JstsGeometry => reader.read(g);

/** Polygonal part of a jsts result as GeoJSON (empty → null). */
export function writePolygonal(g: JstsGeometry): Polygon | MultiPolygon | null {
  if (!g || g.isEmpty()) return null;
  const out = writer.write(g) as Geometry;
  if (out.type === 'Polygon' || out.type === 'MultiPolygon') return out;
  if (out.type === 'GeometryCollection') {
    const polys = out.geometries.flatMap((c) => (c.type === 'Polygon' ? [c.coordinates] : c.type === 'MultiPolygon' ? c.coordinates : []));
    if (!polys.length) return null;
    return polys.length === 1 ? { type: 'Polygon', coordinates: polys[0] } : { type: 'MultiPolygon', coordinates: polys };
  }
  return null;
}

/**
 * Offsets a geometry by `distanceM` (negative = inward for polygons) with round joins.
 *
 * @param g jsts geometry in metres
 * @param distanceM offset distance, metres
 * @example offset(fieldJsts, -36.576) // interior inside a 2 × 60 ft headland
 */
export const offset = (g: JstsGeometry, distanceM: number): JstsGeometry => BufferOp.bufferOp(g, distanceM, bufferParams());

export const difference = (a: JstsGeometry, b: JstsGeometry): JstsGeometry => OverlayOp.difference(a, b);
export const intersection = (a: JstsGeometry, b: JstsGeometry): JstsGeometry => OverlayOp.intersection(a, b);
/** Union of a few polygonal geometries (pairwise; hazards are few). */
export const unionAll = (gs: JstsGeometry[]): JstsGeometry => gs.reduce((a, b) => OverlayOp.union(a, b));

/**
 * Hazards buffered by their clearance (properties.clearanceM, metres, default 0), unioned. Points and
 * lines need a clearance > 0 to cover any ground; polygons count as they are at clearance 0.
 *
 * @param hazards features in local-plane metres
 * @returns jsts polygonal geometry, or null when no hazard covers ground
 * @example hazardZones(projectedHazards) // bins at 15 m, a power pole at 10 m, …
 */
export function hazardZones(hazards: FeatureCollection | undefined): JstsGeometry | null {
  if (!hazards?.features?.length) return null;
  const zones: JstsGeometry[] = [];
  for (const f of hazards.features) {
    if (!f.geometry) continue;
    const clearance = Number((f.properties as { clearanceM?: unknown } | null)?.clearanceM ?? 0);
    const g = readJsts(f.geometry);
    const polygonal = f.geometry.type === 'Polygon' || f.geometry.type === 'MultiPolygon';
    if (clearance > 0) zones.push(offset(g, clearance));
    else if (polygonal) zones.push(offset(g, 0));
  }
  const nonEmpty = zones.filter((z) => !z.isEmpty());
  return nonEmpty.length ? unionAll(nonEmpty) : null;
}
