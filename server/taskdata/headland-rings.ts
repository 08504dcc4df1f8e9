// The headland of a plan (the field minus its interior) put together from the rings the two already
// have, without a polygon overlay. The interior is the field offset inward by a positive distance,
// so no interior ring meets a field ring: the ground inside an odd number of the rings (field's
// and interior's together) is exactly the field minus the interior. Each ring is a shell or a hole
// by how many other rings hold it (even: shell; odd: hole of the ring just outside it).
import type { MultiPolygon, Polygon, Position } from 'geojson';

type Ring = Position[];

const ringsOf = (g: Polygon | MultiPolygon): Ring[] => (g.type === 'Polygon' ? g.coordinates : g.coordinates.flat());

/** Twice the signed area of a closed ring (shoelace; counter-clockwise positive). */
function signedArea2(ring: Ring): number {
  let s = 0;
  for (let i = 0; i + 1 < ring.length; i++) s += ring[i][0] * ring[i + 1][1] - ring[i + 1][0] * ring[i][1];
  return s;
}

/** Plane area of a polygonal geometry (shells minus holes, whatever their winding). */
export function planeArea(g: Polygon | MultiPolygon): number {
  const polys = g.type === 'Polygon' ? [g.coordinates] : g.coordinates;
  let a = 0;
  for (const rings of polys) rings.forEach((r, i) => (a += ((i === 0 ? 1 : -1) * Math.abs(signedArea2(r))) / 2));
  return a;
}

/** Whether p is inside the closed ring (crossing number). */
function inside(p: Position, ring: Ring): boolean {
  let odd = false;
  for (let i = 0, j = ring.length - 2; i < ring.length - 1; j = i++) {
    const [xi, yi] = ring[i];
    const [xj, yj] = ring[j];
    if (yi > p[1] !== yj > p[1] && p[0] < ((xj - xi) * (p[1] - yi)) / (yj - yi) + xi) odd = !odd;
  }
  return odd;
}

const wound = (ring: Ring, ccw: boolean): Ring => (signedArea2(ring) > 0 === ccw ? ring : [...ring].reverse());

/**
 * Field minus interior, plane coordinates, as polygons with holes (shells counter-clockwise, holes
 * clockwise, as GeoJSON has them); null when the rings do not nest cleanly (a ring touching
 * another, so its area does not come out as the field's less the interior's): the caller then
 * takes the overlay.
 *
 * @param field the field, plane metres
 * @param interior the field offset inward by a distance > 0 (null when nothing is left inside)
 * @example headlandFromRings(fieldXY, interiorXY) // the ring round the outside and the ring round a slough
 */
export function headlandFromRings(field: Polygon | MultiPolygon, interior: Polygon | MultiPolygon | null): Polygon | MultiPolygon | null {
  const rings = [...ringsOf(field), ...(interior ? ringsOf(interior) : [])].filter((r) => r.length >= 4);
  const holders = rings.map((r, i) => rings.map((_, j) => j).filter((j) => j !== i && inside(r[0], rings[j])));
  const depth = holders.map((h) => h.length);
  const polygons: Ring[][] = [];
  const shellAt = new Map<number, number>();
  rings.forEach((r, i) => {
    if (depth[i] % 2 === 0) {
      shellAt.set(i, polygons.length);
      polygons.push([wound(r, true)]);
    }
  });
  for (let i = 0; i < rings.length; i++) {
    if (depth[i] % 2 === 0) continue;
    const parent = holders[i].find((j) => depth[j] === depth[i] - 1);
    if (parent === undefined) return null;
    polygons[shellAt.get(parent)!].push(wound(rings[i], false));
  }
  if (!polygons.length) return null;
  const out: Polygon | MultiPolygon =
    polygons.length === 1 ? { type: 'Polygon', coordinates: polygons[0] } : { type: 'MultiPolygon', coordinates: polygons };
  const expected = planeArea(field) - (interior ? planeArea(interior) : 0);
  return Math.abs(planeArea(out) - expected) <= 1e-9 * planeArea(field) ? out : null;
}
