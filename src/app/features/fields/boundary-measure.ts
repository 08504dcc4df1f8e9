import { fieldAcres } from '@shared/geo/geodesic-area';
import { checkBoundary } from '@shared/geo/boundary-check';
import type { Feature, FeatureCollection, Geometry, Position } from 'geojson';
import type { Boundary } from './fields-api';

/** The live reading beside a boundary being drawn: its acres, or why it cannot be used yet. */
export interface BoundaryMeasure {
  /** Acres on the WGS84 ellipsoid, holes subtracted and parts added; null while there is a problem. */
  acres: number | null;
  problems: string[];
}

/**
 * One boundary from the shapes drawn on the map: each polygon (with any holes cut into it) is a
 * part; one part gives a Polygon, several a MultiPolygon, none gives null.
 */
export function combineParts(shapes: readonly (Geometry | Feature | FeatureCollection)[]): Boundary | null {
  const polygons: Position[][][] = [];
  const visit = (g: Geometry | Feature | FeatureCollection | null): void => {
    if (!g) return;
    if (g.type === 'FeatureCollection') g.features.forEach(visit);
    else if (g.type === 'Feature') visit(g.geometry);
    else if (g.type === 'Polygon') polygons.push(g.coordinates);
    else if (g.type === 'MultiPolygon') polygons.push(...g.coordinates);
  };
  shapes.forEach(visit);
  if (polygons.length === 0) return null;
  return polygons.length === 1 ? { type: 'Polygon', coordinates: polygons[0] } : { type: 'MultiPolygon', coordinates: polygons };
}

/** Acres and problems of a drawn boundary, by the same shared code the server measures with. */
export function measureBoundary(boundary: Boundary | null, name?: string): BoundaryMeasure {
  if (!boundary) return { acres: null, problems: [] };
  const problems = checkBoundary(boundary, name?.trim() || undefined).map((p) => p.message);
  return { acres: problems.length ? null : fieldAcres(boundary), problems };
}
