// Which forecast point a field reads. Fields within a few km share one point and one request:
// a field's point is its centre (the middle of its bounding box) rounded to the nearest 0.05° of
// latitude and of longitude. Cells are about 5.6 km north–south and 3.6 km east–west at 50° N,
// finer than the forecast models' own grids (a few km and more), so nothing is lost by sharing.

/** Degrees per grid step: 0.05°. */
export const GRID_STEP_DEG = 0.05;
const PER_DEGREE = 20; // 1 / GRID_STEP_DEG, kept whole so cell numbers are exact integers

export interface GridCell {
  /** round(latitude / 0.05): a whole number that names the row. */
  latIndex: number;
  lonIndex: number;
  /** The cell's centre, to 2 decimals: what the forecast is asked for. */
  latitude: number;
  longitude: number;
}

export function gridCellOf(latitude: number, longitude: number): GridCell {
  const latIndex = Math.round(latitude * PER_DEGREE);
  // Longitude 180 and −180 are one meridian.
  let lonIndex = Math.round(longitude * PER_DEGREE);
  if (lonIndex === 180 * PER_DEGREE) lonIndex = -180 * PER_DEGREE;
  return { latIndex, lonIndex, latitude: latIndex / PER_DEGREE, longitude: lonIndex / PER_DEGREE };
}

type Position = readonly number[];
interface Geometry {
  type: string;
  coordinates: unknown;
}

/** The middle of a Polygon's or MultiPolygon's bounding box, [lon, lat]; null for anything else. */
export function boundaryCentre(boundary: Geometry): [number, number] | null {
  const rings: Position[][] =
    boundary.type === 'Polygon'
      ? (boundary.coordinates as Position[][])
      : boundary.type === 'MultiPolygon'
        ? (boundary.coordinates as Position[][][]).flat()
        : [];
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const ring of rings)
    for (const [x, y] of ring) {
      minX = Math.min(minX, x);
      maxX = Math.max(maxX, x);
      minY = Math.min(minY, y);
      maxY = Math.max(maxY, y);
    }
  if (!Number.isFinite(minX) || !Number.isFinite(minY)) return null;
  return [(minX + maxX) / 2, (minY + maxY) / 2];
}
