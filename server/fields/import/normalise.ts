import type { Feature, FeatureCollection, Geometry, Position } from 'geojson';
import { MAX_FILE_FEATURES, MAX_FILE_VERTICES } from '../../../shared/limits';
import { AppError } from '../../http/errors';

const int = (n: number) => n.toLocaleString('en-US');

/**
 * Positions in one geometry's coordinates, counted without copying. Works on whatever a file
 * holds (malformed nesting included): an array whose first item is a number is one position.
 * The depth stop keeps the recursion short whatever the caller passes (files are checked earlier).
 */
function positionsIn(coords: unknown, depth = 0): number {
  if (!Array.isArray(coords) || coords.length === 0 || depth > 64) return 0;
  if (typeof coords[0] === 'number') return 1;
  let n = 0;
  for (const c of coords) n += positionsIn(c, depth + 1);
  return n;
}

function geometryPositions(g: unknown, depth = 0): number {
  if (!g || typeof g !== 'object' || depth > 64) return 0;
  const { coordinates, geometries } = g as { coordinates?: unknown; geometries?: unknown };
  let n = positionsIn(coordinates);
  if (Array.isArray(geometries)) for (const part of geometries) n += geometryPositions(part, depth + 1);
  return n;
}

/**
 * Refuses a file with more shapes or positions than Furlong reads (MAX_FILE_FEATURES,
 * MAX_FILE_VERTICES), before anything is copied.
 */
export function checkFileBudget(fc: FeatureCollection, fileKind: string): void {
  const features = fc.features;
  if (features.length > MAX_FILE_FEATURES) {
    throw new AppError(
      422,
      'file_too_complex',
      `The ${fileKind} holds ${int(features.length)} shapes; Furlong reads at most ${int(MAX_FILE_FEATURES)} shapes from one file`,
    );
  }
  let positions = 0;
  for (const f of features) positions += geometryPositions(f?.geometry);
  if (positions > MAX_FILE_VERTICES) {
    throw new AppError(
      422,
      'file_too_complex',
      `The ${fileKind} holds ${int(positions)} points in its shapes; Furlong reads at most ${int(MAX_FILE_VERTICES)} points from one file`,
    );
  }
}

const strip = (p: Position): Position => [p[0], p[1]];

function to2d(g: Geometry): Geometry {
  switch (g.type) {
    case 'Point':
      return { type: 'Point', coordinates: strip(g.coordinates) };
    case 'LineString':
    case 'MultiPoint':
      return { ...g, coordinates: g.coordinates.map(strip) } as Geometry;
    case 'Polygon':
    case 'MultiLineString':
      return { ...g, coordinates: g.coordinates.map((r) => r.map(strip)) } as Geometry;
    case 'MultiPolygon':
      return { type: 'MultiPolygon', coordinates: g.coordinates.map((p) => p.map((r) => r.map(strip))) };
    case 'GeometryCollection':
      return { type: 'GeometryCollection', geometries: g.geometries.map(to2d) };
  }
}

/**
 * Boundaries as Furlong stores them: 2-D positions, and a collection of polygons (as KML's
 * MultiGeometry becomes) merged into one MultiPolygon; a collection of lines only (or points
 * only) becomes one MultiLineString (MultiPoint). Anything else is left for the checks.
 */
export function normaliseGeometry(g: Geometry | null): Geometry | null {
  if (!g) return null;
  const flat = to2d(g);
  if (flat.type !== 'GeometryCollection') return flat;
  const parts = flat.geometries;
  if (parts.length > 0 && parts.every((p) => p.type === 'Polygon' || p.type === 'MultiPolygon')) {
    const polys = parts.flatMap((p) => (p.type === 'Polygon' ? [p.coordinates] : p.type === 'MultiPolygon' ? p.coordinates : []));
    return polys.length === 1 ? { type: 'Polygon', coordinates: polys[0] } : { type: 'MultiPolygon', coordinates: polys };
  }
  // Lines only, or points only: named as what they are, not as a mix of shapes.
  if (parts.length > 0 && parts.every((p) => p.type === 'LineString' || p.type === 'MultiLineString'))
    return {
      type: 'MultiLineString',
      coordinates: parts.flatMap((p) => (p.type === 'LineString' ? [p.coordinates] : p.type === 'MultiLineString' ? p.coordinates : [])),
    };
  if (parts.length > 0 && parts.every((p) => p.type === 'Point' || p.type === 'MultiPoint'))
    return {
      type: 'MultiPoint',
      coordinates: parts.flatMap((p) => (p.type === 'Point' ? [p.coordinates] : p.type === 'MultiPoint' ? p.coordinates : [])),
    };
  return flat;
}

/** The features of a parsed file, 2-D and merged, once the file is known to be within budget. */
export function featuresOf(fc: FeatureCollection): Feature[] {
  checkFileBudget(fc, 'file');
  return fc.features.map((f) => ({ ...f, geometry: normaliseGeometry(f.geometry) as Geometry }));
}
