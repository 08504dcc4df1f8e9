import { intersection, readJsts } from './jsts-ops';
import type { PassLayout } from './pass-clipper';

/* eslint-disable @typescript-eslint/no-explicit-any */

/**
 * The parts of a region inside bands across the heading, for drawing gaps and overlaps on the map
 * (display only; the acres come from swathCoverage).
 *
 * @param regionJ jsts polygonal region, metres
 * @param layout heading layout (direction and extent along the heading)
 * @param bands [from, to] offsets across the heading, metres
 * @returns one jsts geometry per band
 * @example bandPolygons(workJ, clipped, coverage.gapBands).map(writePolygonal)
 */
export function bandPolygons(regionJ: any, layout: PassLayout, bands: [number, number][]): any[] {
  const { cos, sin } = layout;
  const t0 = layout.tMin - 1,
    t1 = layout.tMax + 1;
  const xy = (u: number, t: number): number[] => [u * cos + t * sin, -u * sin + t * cos];
  return bands.map(([a, b]) => {
    const ring = [xy(a, t0), xy(b, t0), xy(b, t1), xy(a, t1), xy(a, t0)];
    return intersection(regionJ, readJsts({ type: 'Polygon', coordinates: [ring] }));
  });
}
