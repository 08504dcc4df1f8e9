import SplayTree from 'splaytree';

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
  /**
   * 'touch-loop' when rings of one part only touch, but their touches close a loop that cuts the
   * part's area into pieces; absent for a crossing, an overlap or a ring touching itself.
   */
  kind?: 'touch-loop';
}

/** Work done by one `firstCrossing` call, for specs that check how it grows with the input. */
export interface SweepStats {
  /** Segment–segment tests: sweep neighbours, and edge pairs compared around a shared point. */
  pairTests: number;
  /** Comparisons of two edges (or an edge and a point) that order the sweep's active edges. */
  orderComparisons: number;
}

export interface CrossingOptions {
  /**
   * When true, rings may touch at single points as OGC Simple Features 1.2.1 §6.1.11 allows:
   * rings of different parts at any number of points; rings of one part (outer ring and holes) as
   * long as the touches form no loop, so the part's area stays in one piece. When false (the
   * default), any meeting of two rings is a problem. A ring touching itself is a problem either way.
   */
  ringsMayTouch?: boolean;
  /** Counters to add this call's work to. */
  stats?: SweepStats;
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

/** True when two adjacent edges of one ring share a vertex and lie along each other (a spike). */
export function adjacentOverlap(e: RingEdge, f: RingEdge): boolean {
  if (orient(e.ax, e.ay, e.bx, e.by, f.ax, f.ay) !== 0 || orient(e.ax, e.ay, e.bx, e.by, f.bx, f.by) !== 0) return false;
  // Collinear and sharing an end: they overlap when the far ends lie on the same side of the shared one.
  const [sx, sy, ex, ey, fx, fy] = e.next === f.index ? [e.bx, e.by, e.ax, e.ay, f.bx, f.by] : [e.ax, e.ay, e.bx, e.by, f.ax, f.ay];
  return (ex - sx) * (fx - sx) + (ey - sy) * (fy - sy) > 0;
}

/** An edge as the sweep sees it: left end (smaller x, then smaller y) first. */
interface SweepEdge {
  id: number;
  edge: RingEdge;
  /** Ring number across all parts, for grouping. */
  ringId: number;
  lx: number;
  ly: number;
  rx: number;
  ry: number;
}

/** A ray from an event point along an edge, for ordering the edges that meet there by angle. */
interface HalfEdge {
  s: SweepEdge;
  dx: number;
  dy: number;
}

const lexLess = (ax: number, ay: number, bx: number, by: number): boolean => ax < bx || (ax === bx && ay < by);

/** 0 for directions in the upper half-plane (angle in [0, π)), 1 for the lower one. */
const halfPlane = (h: HalfEdge): number => (h.dy > 0 || (h.dy === 0 && h.dx > 0) ? 0 : 1);

/** The two edges in the order messages name them: lower part/ring first, then lower vertex index. */
function named(e: RingEdge, f: RingEdge, point: [number, number], kind?: 'touch-loop'): EdgeCrossing {
  const eFirst = e.part !== f.part ? e.part < f.part : e.ring !== f.ring ? e.ring < f.ring : e.index <= f.index;
  const [a, b] = eFirst ? [e, f] : [f, e];
  return kind ? { a, b, point, kind } : { a, b, point };
}

/**
 * First improper meeting among a set of ring edges: two edges of different rings that touch or
 * cross (touching only when `ringsMayTouch` does not allow it), two non-adjacent edges of one ring
 * that touch or cross, or two adjacent edges that fold back along each other (a spike).
 *
 * Shamos–Hoey sweep (Shamos & Hoey 1976; de Berg et al., Computational Geometry, 3rd ed., §2.1):
 * events are the edges' end points in (x, y) order; the active edges are kept in a splay tree
 * ordered bottom to top along the sweep line. Each edge is tested against its neighbours when it
 * goes in, and the two edges that become neighbours when one leaves are tested, which finds the
 * leftmost proper crossing. Every meeting at a vertex is handled at that vertex's event instead:
 * all edges ending or starting there, plus the one active edge passing through it (found by a
 * search in the tree), are sorted by angle, which shows a ring touching itself, collinear overlaps,
 * rings crossing at the point, and rings merely touching. O(n log n) in all cases (amortised, as
 * the tree is a splay tree). Orientation tests are the plain determinant, exact on integer grids.
 *
 * When there are several problems, the one reported is the first met by the sweep, which is
 * usually (not always) the leftmost one; which of several is reported is not part of the contract.
 *
 * @param edges every non-degenerate edge (zero-length edges are skipped), plain planar coordinates
 * @param options whether rings may touch at points, and counters of the work done
 * @returns the first problem the sweep meets, or null
 * @example firstCrossing(edgesOf(bowtie)) // { a, b, point: [0.5, 0.5] }
 */
export function firstCrossing(edges: RingEdge[], options: CrossingOptions = {}): EdgeCrossing | null {
  const stats = options.stats ?? { pairTests: 0, orderComparisons: 0 };
  const mayTouch = options.ringsMayTouch === true;

  const ringIds = new Map<string, number>();
  const ringPart: number[] = [];
  const segs: SweepEdge[] = [];
  for (const edge of edges) {
    if (edge.ax === edge.bx && edge.ay === edge.by) continue;
    const key = `${edge.part}:${edge.ring}`;
    let ringId = ringIds.get(key);
    if (ringId === undefined) {
      ringId = ringPart.length;
      ringIds.set(key, ringId);
      ringPart.push(edge.part);
    }
    const aFirst = lexLess(edge.ax, edge.ay, edge.bx, edge.by);
    segs.push({
      id: segs.length,
      edge,
      ringId,
      lx: aFirst ? edge.ax : edge.bx,
      ly: aFirst ? edge.ay : edge.by,
      rx: aFirst ? edge.bx : edge.ax,
      ry: aFirst ? edge.by : edge.ay,
    });
  }

  // Bottom-to-top order of two edges active at once, judged where the later-starting one starts
  // (then by its other end when it starts on the first; then by id for collinear edges). Edges
  // that do not cross keep this order for as long as both are active.
  const below = (a: SweepEdge, b: SweepEdge): number => {
    stats.orderComparisons++;
    if (a === b) return 0;
    const aLater = !lexLess(a.lx, a.ly, b.lx, b.ly);
    const [p, q] = aLater ? [a, b] : [b, a];
    let s = orient(q.lx, q.ly, q.rx, q.ry, p.lx, p.ly);
    if (s === 0) s = orient(q.lx, q.ly, q.rx, q.ry, p.rx, p.ry);
    if (s === 0) s = p.id - q.id;
    const sign = s > 0 ? 1 : -1;
    return aLater ? sign : -sign;
  };
  const tree = new SplayTree<SweepEdge, undefined>(below as (a: unknown, b: unknown) => number);
  const nodes: ReturnType<typeof tree.insert>[] = new Array(segs.length);

  /** Neighbour of the node just splayed to the root, itself splayed to pay for the walk to it. */
  const rootNeighbour = (node: ReturnType<typeof tree.insert>, side: 'prev' | 'next'): SweepEdge | null => {
    const n = side === 'prev' ? tree.prev(node) : tree.next(node);
    if (!n) return null;
    tree.find(n.key);
    tree.find(node.key);
    return n.key;
  };

  /**
   * Two edges whose interiors cross, or that lie along each other for a stretch. Any other meeting
   * has an end point of one edge on the other, and is judged at that point's event.
   */
  const crossing = (s: SweepEdge | null, t: SweepEdge | null): EdgeCrossing | null => {
    if (!s || !t) return null;
    stats.pairTests++;
    const d1 = orient(t.lx, t.ly, t.rx, t.ry, s.lx, s.ly);
    const d2 = orient(t.lx, t.ly, t.rx, t.ry, s.rx, s.ry);
    const d3 = orient(s.lx, s.ly, s.rx, s.ry, t.lx, t.ly);
    const d4 = orient(s.lx, s.ly, s.rx, s.ry, t.rx, t.ry);
    const proper = ((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0));
    const [later, earlier] = lexLess(s.lx, s.ly, t.lx, t.ly) ? [t, s] : [s, t];
    const overlap = d1 === 0 && d2 === 0 && d3 === 0 && d4 === 0 && lexLess(later.lx, later.ly, earlier.rx, earlier.ry);
    if (proper) return named(s.edge, t.edge, segmentMeet(s.edge, t.edge)!);
    return overlap ? named(s.edge, t.edge, [later.lx, later.ly]) : null;
  };

  // Events: every end point, in (x, y) order; edges leaving at a point go before edges entering.
  const order: number[] = new Array(segs.length * 2);
  for (let i = 0; i < order.length; i++) order[i] = i;
  const ex = (k: number) => (k & 1 ? segs[k >> 1].rx : segs[k >> 1].lx);
  const ey = (k: number) => (k & 1 ? segs[k >> 1].ry : segs[k >> 1].ly);
  order.sort((i, j) => ex(i) - ex(j) || ey(i) - ey(j) || (j & 1) - (i & 1));

  const parent = ringPart.map((_, i) => i);
  const root = (i: number): number => {
    while (parent[i] !== i) i = parent[i] = parent[parent[i]];
    return i;
  };

  const probe: SweepEdge = { id: -1, edge: edges[0], ringId: -1, lx: 0, ly: 0, rx: 0, ry: 0 };
  for (let k = 0; k < order.length;) {
    const vx = ex(order[k]);
    const vy = ey(order[k]);
    const leaving: SweepEdge[] = [];
    const entering: SweepEdge[] = [];
    for (; k < order.length && ex(order[k]) === vx && ey(order[k]) === vy; k++)
      (order[k] & 1 ? leaving : entering).push(segs[order[k] >> 1]);

    for (const s of leaving) {
      tree.find(s);
      const node = nodes[s.id];
      const lo = rootNeighbour(node, 'prev');
      const hi = rootNeighbour(node, 'next');
      tree.remove(s);
      const hit = crossing(lo, hi);
      if (hit) return hit;
    }

    // The active edge (if any) passing through this point: the lowest one not below it.
    let through: SweepEdge | null = null;
    if (tree.size) {
      probe.lx = probe.rx = vx;
      probe.ly = probe.ry = vy;
      const pn = tree.insert(probe);
      const up = tree.next(pn);
      tree.remove(probe);
      if (up) {
        tree.find(up.key);
        if (orient(up.key.lx, up.key.ly, up.key.rx, up.key.ry, vx, vy) === 0) {
          through = up.key;
          // Two edges through one point cross there.
          const hit = crossing(through, rootNeighbour(up, 'next'));
          if (hit) return hit;
        }
      }
    }

    const hit = vertexProblem(vx, vy, leaving, entering, through);
    if (hit) return hit;

    for (const s of entering) {
      const node = (nodes[s.id] = tree.insert(s));
      const lo = rootNeighbour(node, 'prev');
      const hi = rootNeighbour(node, 'next');
      const found = crossing(s, lo) ?? crossing(s, hi);
      if (found) return found;
    }
  }
  return null;

  /** What is wrong where edges meet at one point (an end point of at least one of them). */
  function vertexProblem(
    vx: number,
    vy: number,
    leaving: SweepEdge[],
    entering: SweepEdge[],
    through: SweepEdge | null,
  ): EdgeCrossing | null {
    const point: [number, number] = [vx, vy];
    const halves: HalfEdge[] = [];
    for (const s of leaving) halves.push({ s, dx: s.lx - vx, dy: s.ly - vy });
    for (const s of entering) halves.push({ s, dx: s.rx - vx, dy: s.ry - vy });
    if (through)
      halves.push({ s: through, dx: through.lx - vx, dy: through.ly - vy }, { s: through, dx: through.rx - vx, dy: through.ry - vy });

    // A ring that comes here more than once touches itself (its vertex repeats, or lies on its own edge).
    const count = new Map<number, number>();
    for (const h of halves) count.set(h.s.ringId, (count.get(h.s.ringId) ?? 0) + 1);
    for (const [ringId, n] of count) {
      if (n <= 2) continue;
      const own = halves.filter((h) => h.s.ringId === ringId).map((h) => h.s.edge);
      const e = own[0];
      const f = own.find((g) => g !== e && g.next !== e.index && e.next !== g.index) ?? own[1];
      return named(e, f, point);
    }

    halves.sort((h, g) => {
      stats.pairTests++;
      return halfPlane(h) - halfPlane(g) || -Math.sign(h.dx * g.dy - h.dy * g.dx);
    });
    // Two edges leaving the point in one direction overlap: a spike, or rings sharing a stretch.
    for (let i = 1; i < halves.length; i++) {
      const [h, g] = [halves[i - 1], halves[i]];
      if (halfPlane(h) === halfPlane(g) && h.dx * g.dy - h.dy * g.dx === 0) return named(h.s.edge, g.s.edge, point);
    }
    if (count.size < 2) return null;

    // Each ring here has two rays; two rings cross when their rays alternate around the point
    // (a ring whose second ray comes while another ring's pair is still open).
    const open: HalfEdge[] = [];
    const isOpen = new Set<number>();
    for (const h of halves) {
      const top = open[open.length - 1];
      if (top && top.s.ringId === h.s.ringId) {
        open.pop();
        isOpen.delete(h.s.ringId);
      } else if (isOpen.has(h.s.ringId)) return named(top.s.edge, h.s.edge, point);
      else {
        open.push(h);
        isOpen.add(h.s.ringId);
      }
    }

    // The rings only touch here.
    const rings = [...count.keys()];
    if (!mayTouch) {
      const first = halves.find((h) => h.s.ringId === rings[0])!;
      const other = halves.find((h) => h.s.ringId !== rings[0])!;
      return named(first.s.edge, other.s.edge, point);
    }
    // Rings of one part that touch in a loop cut its area apart (OGC SF 1.2.1 §6.1.11: the
    // interior of a polygon is connected).
    const byPart = new Map<number, number>();
    for (const ringId of rings) {
      const part = ringPart[ringId];
      const first = byPart.get(part);
      if (first === undefined) {
        byPart.set(part, ringId);
        continue;
      }
      const [x, y] = [root(first), root(ringId)];
      if (x === y) {
        const e = halves.find((h) => h.s.ringId === first)!.s.edge;
        const f = halves.find((h) => h.s.ringId === ringId)!.s.edge;
        return named(e, f, point, 'touch-loop');
      }
      parent[y] = x;
    }
    return null;
  }
}
