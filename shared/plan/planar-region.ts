import type { MultiPolygon, Polygon, Position } from 'geojson';

/**
 * A polygonal region in the local plane (metres) packed for fast scanning: every ring's vertices
 * in one pair of typed arrays, without the closing repeat. Outer rings run counter-clockwise and
 * holes clockwise, so the signed shoelace sum of all rings is the region's area.
 */
export interface PlanarRegion {
  readonly xs: Float64Array;
  readonly ys: Float64Array;
  /** ringStart[r] .. ringStart[r + 1] − 1 are ring r's vertices; length = rings + 1. */
  readonly ringStart: Int32Array;
  /** The same region as GeoJSON coordinates in metres (closed rings, RFC 7946 orientation). */
  readonly geometry: Polygon | MultiPolygon;
}

function signedArea(ring: Position[]): number {
  let a = 0;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) a += ring[j][0] * ring[i][1] - ring[i][0] * ring[j][1];
  return a / 2;
}

/**
 * Packs a planar Polygon or MultiPolygon (metres) into a {@link PlanarRegion}, fixing ring
 * orientation (outer counter-clockwise, holes clockwise) and dropping repeated vertices.
 *
 * @param geometry polygon in local plane coordinates, metres
 * @example const region = packRegion({ type: 'Polygon', coordinates: [[[0, 0], [10, 0], [10, 10], [0, 10], [0, 0]]] });
 */
export function packRegion(geometry: Polygon | MultiPolygon): PlanarRegion {
  const parts = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
  const rings: Position[][] = [];
  const outParts: Position[][][] = [];
  for (const part of parts) {
    const outPart: Position[][] = [];
    part.forEach((ring, r) => {
      const open: Position[] = [];
      for (const p of ring) {
        const q = open[open.length - 1];
        if (!q || q[0] !== p[0] || q[1] !== p[1]) open.push([p[0], p[1]]);
      }
      while (open.length > 1 && open[0][0] === open[open.length - 1][0] && open[0][1] === open[open.length - 1][1]) open.pop();
      if (open.length < 3) return;
      const ccw = signedArea(open) > 0;
      if (ccw !== (r === 0)) open.reverse();
      rings.push(open);
      outPart.push([...open, open[0]]);
    });
    if (outPart.length) outParts.push(outPart);
  }
  const n = rings.reduce((s, r) => s + r.length, 0);
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  const ringStart = new Int32Array(rings.length + 1);
  let k = 0;
  rings.forEach((ring, r) => {
    ringStart[r] = k;
    for (const [x, y] of ring) {
      xs[k] = x;
      ys[k++] = y;
    }
  });
  ringStart[rings.length] = k;
  const packed: Polygon | MultiPolygon =
    outParts.length === 1 ? { type: 'Polygon', coordinates: outParts[0] } : { type: 'MultiPolygon', coordinates: outParts };
  return { xs, ys, ringStart, geometry: packed };
}

/**
 * Area of a packed region by the shoelace formula, m².
 *
 * @param region packed region (metres)
 * @example regionAreaM2(packRegion(square10m)) // 100
 */
export function regionAreaM2(region: PlanarRegion): number {
  const { xs, ys, ringStart } = region;
  let a = 0;
  for (let r = 0; r + 1 < ringStart.length; r++) {
    const s = ringStart[r];
    const e = ringStart[r + 1];
    for (let i = s, j = e - 1; i < e; j = i++) a += xs[j] * ys[i] - xs[i] * ys[j];
  }
  return a / 2;
}
