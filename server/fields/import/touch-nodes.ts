// Rings that touch at a point are valid (OGC Simple Features 1.2.1 §6.1.11), and often the point
// is a vertex of one ring lying on an edge of another. A straight edge in a projected file is not
// straight in longitude/latitude, so after reprojection the vertex falls a millimetre or so to
// one side of that edge: a touch becomes a tiny crossing. Before reprojecting, such a vertex is
// added to the edge it lies on, so both rings share it exactly and still only touch afterwards.
import type { Position } from 'geojson';

interface Edge {
  ring: Position[];
  r: number;
  i: number;
}

/**
 * Adds to each ring's edges the vertices of the other rings (of any part) that lie on them,
 * within `tolerance` (file units), away from the edge's ends. Rings are changed in place.
 * Linear in the rings' size when vertices are spread out: edges are kept in a grid of cells about
 * the mean edge's size (common practice, no published source).
 *
 * @param rings every ring of one shape, in the file's own coordinates
 * @param tolerance how far off an edge a vertex may lie and still be on it (about 1 mm)
 * @returns how many vertices were added
 */
export function nodeTouches(rings: Position[][], tolerance: number): number {
  if (rings.length < 2) return 0;
  const edges: Edge[] = [];
  let length = 0;
  rings.forEach((ring, r) => {
    for (let i = 0; i + 1 < ring.length; i++) {
      edges.push({ ring, r, i });
      length += Math.hypot(ring[i + 1][0] - ring[i][0], ring[i + 1][1] - ring[i][1]);
    }
  });
  if (!edges.length || !(length > 0)) return 0;
  const cell = Math.max(length / edges.length, tolerance * 10);
  const grid = new Map<string, Edge[]>();
  const cellKey = (cx: number, cy: number) => `${cx}:${cy}`;
  for (const e of edges) {
    const [a, b] = [e.ring[e.i], e.ring[e.i + 1]];
    const x0 = Math.floor((Math.min(a[0], b[0]) - tolerance) / cell);
    const x1 = Math.floor((Math.max(a[0], b[0]) + tolerance) / cell);
    const y0 = Math.floor((Math.min(a[1], b[1]) - tolerance) / cell);
    const y1 = Math.floor((Math.max(a[1], b[1]) + tolerance) / cell);
    // A very long edge spans many cells; the cells it crosses are bounded by its length / cell.
    for (let cx = x0; cx <= x1; cx++)
      for (let cy = y0; cy <= y1; cy++) {
        if (!nearCell(a, b, cx, cy, cell, tolerance)) continue;
        const k = cellKey(cx, cy);
        const list = grid.get(k);
        if (list) list.push(e);
        else grid.set(k, [e]);
      }
  }
  const inserts = new Map<Edge, Array<{ t: number; p: Position }>>();
  rings.forEach((ring, r) => {
    for (let v = 0; v + 1 < ring.length; v++) {
      const p = ring[v];
      for (const e of grid.get(cellKey(Math.floor(p[0] / cell), Math.floor(p[1] / cell))) ?? []) {
        if (e.r === r) continue;
        const [a, b] = [e.ring[e.i], e.ring[e.i + 1]];
        const dx = b[0] - a[0];
        const dy = b[1] - a[1];
        const len2 = dx * dx + dy * dy;
        if (len2 === 0) continue;
        const t = ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2;
        const along = Math.sqrt(len2);
        // Off the ends by more than the tolerance: a point near a vertex is that vertex's business.
        if (t * along <= tolerance || (1 - t) * along <= tolerance) continue;
        const off = Math.abs((p[0] - a[0]) * dy - (p[1] - a[1]) * dx) / along;
        if (off > tolerance) continue;
        const list = inserts.get(e) ?? [];
        if (!list.some((q) => q.p[0] === p[0] && q.p[1] === p[1])) list.push({ t, p: [p[0], p[1]] });
        inserts.set(e, list);
      }
    }
  });
  let added = 0;
  const byRing = new Map<Position[], Array<{ i: number; pts: Position[] }>>();
  for (const [e, list] of inserts) {
    list.sort((x, y) => x.t - y.t);
    const l = byRing.get(e.ring) ?? [];
    l.push({ i: e.i, pts: list.map((q) => q.p) });
    byRing.set(e.ring, l);
    added += list.length;
  }
  for (const [ring, list] of byRing) {
    // From the last edge back, so earlier indexes stay right.
    list.sort((x, y) => y.i - x.i);
    for (const { i, pts } of list) ring.splice(i + 1, 0, ...pts);
  }
  return added;
}

/** Whether segment a–b passes within `tol` of cell (cx, cy): a cheap test on the segment's line. */
function nearCell(a: Position, b: Position, cx: number, cy: number, cell: number, tol: number): boolean {
  const [x0, y0, x1, y1] = [cx * cell - tol, cy * cell - tol, (cx + 1) * cell + tol, (cy + 1) * cell + tol];
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  // The cell's corners on one side of the line, all of them: the segment misses it.
  const s = [
    [x0, y0],
    [x1, y0],
    [x0, y1],
    [x1, y1],
  ].map(([x, y]) => Math.sign(dx * (y - a[1]) - dy * (x - a[0])));
  return !(s.every((v) => v > 0) || s.every((v) => v < 0));
}
