import type { Geometry, MultiPolygon, Polygon } from 'geojson';
import { checkBoundary } from '../../shared/geo/boundary-check';
import type { ComputePool } from '../compute/pool';
import { AppError } from '../http/errors';

export interface MeasuredBoundary {
  boundary: Polygon | MultiPolygon;
  areaM2: number;
  acres: number;
}

/**
 * Checks a boundary and measures it on the ellipsoid, in a compute worker (a boundary may hold
 * tens of thousands of points); a bad one is a 422 naming the problem.
 */
export async function measureBoundary(compute: ComputePool, geometry: unknown, label?: string): Promise<MeasuredBoundary> {
  const m = await compute.run('measureBoundary', { geometry, label });
  if (m.areaM2 === null) {
    const { problems } = m;
    throw new AppError(422, 'bad_boundary', problems[0].message, { boundary: problems[0].message }, { problems });
  }
  return { boundary: geometry as Polygon | MultiPolygon, areaM2: m.areaM2, acres: m.acres };
}

const HAZARD_TYPES = new Set(['Point', 'LineString', 'Polygon', 'MultiPoint', 'MultiLineString', 'MultiPolygon']);

/** A hazard may be a point, a line or an area; coordinates must be real lon/lat pairs. */
export function checkHazardGeometry(geometry: unknown): Geometry {
  const g = geometry as { type?: unknown; coordinates?: unknown };
  if (!g || typeof g.type !== 'string' || !HAZARD_TYPES.has(g.type)) {
    throw new AppError(422, 'bad_hazard', `A hazard must be a point, a line or an area, not ${String(g?.type ?? 'nothing')}`, {
      geometry: 'Draw a point, a line or an area',
    });
  }
  if (g.type === 'Polygon' || g.type === 'MultiPolygon') {
    const problems = checkBoundary(g, 'the hazard area');
    if (problems.length) throw new AppError(422, 'bad_hazard', problems[0].message, { geometry: problems[0].message });
    return g as Geometry;
  }
  const flat: unknown[] = [];
  const walk = (c: unknown, depth: number) => {
    if (depth === 0) flat.push(c);
    else if (Array.isArray(c)) c.forEach((x) => walk(x, depth - 1));
    else throw new AppError(422, 'bad_hazard', 'The hazard has malformed coordinates');
  };
  const depth = { Point: 0, LineString: 1, MultiPoint: 1, MultiLineString: 2 }[g.type] as number;
  walk(g.coordinates, depth);
  if (flat.length === 0 || (g.type === 'LineString' && flat.length < 2))
    throw new AppError(422, 'bad_hazard', 'The hazard has too few positions');
  flat.forEach((p, i) => {
    const ok = Array.isArray(p) && p.length >= 2 && p.every((n) => typeof n === 'number' && Number.isFinite(n));
    if (!ok || Math.abs((p as number[])[0]) > 180 || Math.abs((p as number[])[1]) > 90) {
      throw new AppError(422, 'bad_hazard', `Position ${i + 1} of the hazard is not a valid [longitude, latitude] pair`);
    }
  });
  return g as Geometry;
}
