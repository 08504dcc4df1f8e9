import type { Geometry, MultiPolygon, Polygon, Position } from 'geojson';
import proj4 from 'proj4';

/** A transverse Mercator plane centred on one field; x east, y north, metres. */
export interface LocalProjection {
  /** Centre of the projection, [lon, lat] degrees. Grid north = true north here. */
  readonly centre: readonly [number, number];
  /** The proj4 definition used. */
  readonly definition: string;
  /** [lon, lat] degrees → [x, y] metres. */
  forward(position: readonly number[]): [number, number];
  /** [x, y] metres → [lon, lat] degrees. */
  inverse(xy: readonly number[]): [number, number];
  /** Projects every position of a geometry (lon/lat → metres); other members are copied. */
  forwardGeometry<G extends Geometry>(geometry: G): G;
  /** Inverse-projects every position of a geometry (metres → lon/lat). */
  inverseGeometry<G extends Geometry>(geometry: G): G;
}

type Nested = Position | Nested[];

function mapPositions(coords: Nested, fn: (p: Position) => Position): Nested {
  return typeof coords[0] === 'number' ? fn(coords as Position) : (coords as Nested[]).map((c) => mapPositions(c, fn));
}

function mapGeometry<G extends Geometry>(g: G, fn: (p: Position) => Position): G {
  if (g.type === 'GeometryCollection') return { ...g, geometries: g.geometries.map((c) => mapGeometry(c, fn)) };
  return { ...g, coordinates: mapPositions(g.coordinates as Nested, fn) } as G;
}

/**
 * A transverse Mercator projection on the WGS84 ellipsoid with its origin at `[lon, lat]`, scale 1
 * on the central meridian (proj4 `+proj=tmerc`, the exact Poder/Engsager series). Over a field a
 * few km across the scale error is below 1e-7, so planar lengths and areas in this plane are
 * within 0.001 % of their geodesic values.
 *
 * @param centre [lon, lat] degrees of the origin
 * @example
 * const p = localProjection([-99.9, 47.6]);
 * p.forward([-99.9, 47.6]); // [0, 0]
 */
export function localProjection(centre: readonly [number, number]): LocalProjection {
  const [lon0, lat0] = centre;
  const definition = `+proj=tmerc +lat_0=${lat0} +lon_0=${lon0} +k=1 +x_0=0 +y_0=0 +ellps=WGS84 +units=m +no_defs`;
  const converter = proj4('WGS84', definition);
  const forward = (p: readonly number[]): [number, number] => {
    const r = converter.forward([p[0], p[1]]);
    return [r[0], r[1]];
  };
  const inverse = (p: readonly number[]): [number, number] => {
    const r = converter.inverse([p[0], p[1]]);
    return [r[0], r[1]];
  };
  return {
    centre: [lon0, lat0],
    definition,
    forward,
    inverse,
    forwardGeometry: (g) => mapGeometry(g, forward),
    inverseGeometry: (g) => mapGeometry(g, inverse),
  };
}

/**
 * The projection centred on the middle of a field's lon/lat bounding box.
 *
 * @param geometry field boundary in lon/lat degrees
 * @example const p = projectionForField(boundary); const xy = p.forwardGeometry(boundary);
 */
export function projectionForField(geometry: Polygon | MultiPolygon): LocalProjection {
  let minLon = Infinity,
    minLat = Infinity,
    maxLon = -Infinity,
    maxLat = -Infinity;
  const rings = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
  for (const poly of rings)
    for (const ring of poly)
      for (const [lon, lat] of ring) {
        if (lon < minLon) minLon = lon;
        if (lon > maxLon) maxLon = lon;
        if (lat < minLat) minLat = lat;
        if (lat > maxLat) maxLat = lat;
      }
  return localProjection([(minLon + maxLon) / 2, (minLat + maxLat) / 2]);
}
