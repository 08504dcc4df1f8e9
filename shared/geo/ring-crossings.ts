/** One edge of a ring: from vertex `index` to the next vertex, in ring `ring` of part `part`. */
export interface RingEdge {
  part: number;
  ring: number;
  /** 0-based index of the edge's first vertex in the ring as given. */
  index: number;
  /** 0-based index of the edge's second vertex in the ring as given. */
  next: number;
  ax: number;
  ay: number;
  bx: number;
  by: number;
}

/** Where two edges meet that should not. */
export interface EdgeCrossing {
  a: RingEdge;
  b: RingEdge;
  point: [number, number];
}

const orient = (ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number =>
  (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);

const onSegment = (e: RingEdge, x: number, y: number): boolean =>
  Math.min(e.ax, e.bx) <= x && x <= Math.max(e.ax, e.bx) && Math.min(e.ay, e.by) <= y && y <= Math.max(e.ay, e.by);

/** The point where two closed segments meet, or null. Collinear overlaps give one shared point. */
export function segmentMeet(e: RingEdge, f: RingEdge): [number, number] | null {
  const d1 = orient(f.ax, f.ay, f.bx, f.by, e.ax, e.ay);
  const d2 = orient(f.ax, f.ay, f.bx, f.by, e.bx, e.by);
  const d3 = orient(e.ax, e.ay, e.bx, e.by, f.ax, f.ay);
  const d4 = orient(e.ax, e.ay, e.bx, e.by, f.bx, f.by);
  if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) {
    const t = d1 / (d1 - d2);
    return [e.ax + t * (e.bx - e.ax), e.ay + t * (e.by - e.ay)];
  }
  if (d1 === 0 && onSegment(f, e.ax, e.ay)) return [e.ax, e.ay];
  if (d2 === 0 && onSegment(f, e.bx, e.by)) return [e.bx, e.by];
  if (d3 === 0 && onSegment(e, f.ax, f.ay)) return [f.ax, f.ay];
  if (d4 === 0 && onSegment(e, f.bx, f.by)) return [f.bx, f.by];
  return null;
}

/** True when two edges of one ring share a vertex and lie along each other (a spike). */
function adjacentOverlap(e: RingEdge, f: RingEdge): boolean {
  if (orient(e.ax, e.ay, e.bx, e.by, f.ax, f.ay) !== 0 || orient(e.ax, e.ay, e.bx, e.by, f.bx, f.by) !== 0) return false;
  // Collinear and sharing an end: they overlap when the far ends lie on the same side of the shared one.
  const [sx, sy, ex, ey, fx, fy] = e.next === f.index ? [e.bx, e.by, e.ax, e.ay, f.bx, f.by] : [e.ax, e.ay, e.bx, e.by, f.ax, f.ay];
  return (ex - sx) * (fx - sx) + (ey - sy) * (fy - sy) > 0;
}

/**
 * First improper meeting among a set of ring edges: two edges of different rings that touch or
 * cross, or two non-adjacent edges of one ring that touch or cross, or two adjacent edges that
 * fold back along each other. Sort-and-sweep on x, so near O(n log n) for field-like rings.
 *
 * @param edges every non-degenerate edge (zero-length edges removed), plain planar coordinates
 * @returns the first problem found in sweep order, or null
 * @example firstCrossing(edgesOf(bowtie)) // { a, b, point: [0.5, 0.5] }
 */
export function firstCrossing(edges: RingEdge[]): EdgeCrossing | null {
  const sorted = edges.map((e) => ({ e, lo: Math.min(e.ax, e.bx), hi: Math.max(e.ax, e.bx) })).sort((p, q) => p.lo - q.lo);
  for (let i = 0; i < sorted.length; i++) {
    const { e, hi } = sorted[i];
    for (let j = i + 1; j < sorted.length && sorted[j].lo <= hi; j++) {
      const f = sorted[j].e;
      if (Math.max(e.ay, e.by) < Math.min(f.ay, f.by) || Math.max(f.ay, f.by) < Math.min(e.ay, e.by)) continue;
      const sameRing = e.part === f.part && e.ring === f.ring;
      const adjacent = sameRing && (e.next === f.index || f.next === e.index);
      if (adjacent) {
        if (adjacentOverlap(e, f)) return { a: e, b: f, point: e.next === f.index ? [e.bx, e.by] : [e.ax, e.ay] };
        continue;
      }
      const p = segmentMeet(e, f);
      if (!p) continue;
      const eFirst = sameRing ? e.index <= f.index : e.part < f.part || (e.part === f.part && e.ring < f.ring);
      return eFirst ? { a: e, b: f, point: p } : { a: f, b: e, point: p };
    }
  }
  return null;
}
