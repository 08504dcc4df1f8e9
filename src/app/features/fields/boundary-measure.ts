import { checkAndMeasureBoundary, type BoundaryProblemCode } from '@shared/geo/boundary-check';
import type { Feature, FeatureCollection, Geometry, Position } from 'geojson';
import type { Boundary } from './fields-api';

/** The live reading beside a boundary being drawn: its acres, or why it cannot be used yet. */
export interface BoundaryMeasure {
  /** Acres on the WGS84 ellipsoid, holes subtracted and parts added; null while there is a problem. */
  acres: number | null;
  /** What is wrong, in plain words, in the order found. */
  problems: string[];
  /** The same problems' codes, for anything that decides by them. */
  codes: BoundaryProblemCode[];
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
  if (!boundary) return { acres: null, problems: [], codes: [] };
  const m = checkAndMeasureBoundary(boundary, name?.trim() || undefined);
  return { acres: m.acres, problems: m.problems.map((p) => p.message), codes: m.problems.map((p) => p.code) };
}
