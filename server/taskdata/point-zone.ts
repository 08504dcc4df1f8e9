// A point hazard's clearance zone drawn directly: the disc JTS's buffer draws for a point (a
// regular polygon of 4 × 16 chords, 16 segments a quarter circle as shared/plan/jsts-ops sets, a
// vertex at angle 0), without the buffer's noding and polygon building, which cost a day's task
// data a tenth of its time for two or three bins and rock piles a field.
import type { Polygon, Position } from 'geojson';

/** Chords of the whole circle: 4 quadrants × QUADRANT_SEGMENTS (16) of shared/plan/jsts-ops. */
const CHORDS = 64;

/**
 * The disc of radius r round p, plane metres, counter-clockwise and closed.
 *
 * @example pointZone([120, 80], 15) // a grain bin's 15 m clearance
 */
export function pointZone(p: Position, r: number): Polygon {
  const ring: Position[] = [];
  for (let i = 0; i < CHORDS; i++) {
    const a = (2 * Math.PI * i) / CHORDS;
    ring.push([p[0] + r * Math.cos(a), p[1] + r * Math.sin(a)]);
  }
  ring.push(ring[0]);
  return { type: 'Polygon', coordinates: [ring] };
}
