// The swath overlay by scanlines: the work region and every swath piece are cut by horizontal
// lines dy apart, and along each line the covered, twice-worked and uncovered lengths are found
// by one sorted sweep of interval ends. Area = Σ length × dy (the midpoint rule, exact where the
// lengths vary linearly between lines; the error is of order dy² at each vertex). This replaces a
// polygon overlay of thousands of swath pieces (tens of seconds in JTS for a day's noisy track)
// with sorting a few million numbers.

export type XY = [number, number];

/** A pass: its vertices in the local plane, and whether it follows the one before it along the track. */
export interface SweepPass {
  pts: XY[];
  followsPrevious: boolean;
}

/** Uncovered (or twice-worked) pieces of one scanline: [x0, x1, x0, x1, …]. */
export type LineIntervals = number[];

export interface SweepResult {
  dy: number;
  /** y of scanline 0; line j is at y0 + j·dy. */
  y0: number;
  regionM2: number;
  coveredM2: number;
  twiceM2: number;
  uncovered: LineIntervals[];
  twice: LineIntervals[];
  /** Covered pieces of each scanline (for the map). */
  covered: LineIntervals[];
}

/** Chords of a round join span at most this angle: JTS's 16 segments per quarter circle. */
const CHORD_RAD = Math.PI / 32;
const CODE = 2 ** 24;
const REGION = CODE - 1;

/**
 * Appends to `out` the convex polygon's span along each scanline it crosses, as sort keys.
 * The polygon's vertices are in order (either turn); `code` says whose span it is.
 */
function addConvex(poly: XY[], code: number, ctx: Ctx): void {
  let minY = Infinity,
    maxY = -Infinity;
  for (const p of poly) {
    if (p[1] < minY) minY = p[1];
    if (p[1] > maxY) maxY = p[1];
  }
  const j0 = Math.max(0, Math.ceil((minY - ctx.y0) / ctx.dy));
  const j1 = Math.min(ctx.lines - 1, Math.floor((maxY - ctx.y0) / ctx.dy));
  const n = poly.length;
  for (let j = j0; j <= j1; j++) {
    const y = ctx.y0 + j * ctx.dy;
    let lo = Infinity,
      hi = -Infinity;
    for (let i = 0; i < n; i++) {
      const a = poly[i],
        b = poly[(i + 1) % n];
      if ((a[1] <= y && b[1] >= y) || (b[1] <= y && a[1] >= y)) {
        let x: number;
        if (a[1] === b[1]) {
          if (a[0] < lo) lo = a[0];
          if (a[0] > hi) hi = a[0];
          x = b[0];
        } else x = a[0] + ((y - a[1]) / (b[1] - a[1])) * (b[0] - a[0]);
        if (x < lo) lo = x;
        if (x > hi) hi = x;
      }
    }
    if (lo < ctx.minX) lo = ctx.minX;
    if (hi > ctx.maxX) hi = ctx.maxX;
    if (hi <= lo) continue;
    const bucket = ctx.events[j];
    bucket.push(Math.round((lo - ctx.minX) * ctx.q) * CODE + 2 * code, Math.round((hi - ctx.minX) * ctx.q) * CODE + 2 * code + 1);
  }
}

interface Ctx {
  y0: number;
  dy: number;
  lines: number;
  minX: number;
  maxX: number;
  q: number;
  events: number[][];
}

/** The swath of a pass as convex pieces: a rectangle per segment, a join wedge per turn. */
function passPieces(pts: XY[], half: number, joinAtStart: XY | null, emit: (poly: XY[]) => void): void {
  const normal = (a: XY, b: XY): XY => {
    const dx = b[0] - a[0],
      dy = b[1] - a[1];
    const len = Math.hypot(dx, dy);
    return [(-dy / len) * half, (dx / len) * half];
  };
  const wedge = (v: XY, n0: XY, n1: XY) => {
    // Turned left (cross > 0): the outer side is the right one (−normal); else the left one.
    const cross = n0[0] * n1[1] - n0[1] * n1[0];
    if (cross === 0 && n0[0] * n1[0] + n0[1] * n1[1] > 0) return;
    const s = cross > 0 ? -1 : 1;
    const a0 = Math.atan2(s * n0[1], s * n0[0]);
    const a1 = Math.atan2(s * n1[1], s * n1[0]);
    // Sweep the short way round from a0 to a1 (the outer arc of the turn).
    let d = a1 - a0;
    while (d > Math.PI) d -= 2 * Math.PI;
    while (d < -Math.PI) d += 2 * Math.PI;
    // The outer arc bulges ahead of the incoming segment (its direction is n0 turned right).
    const mid = a0 + d / 2;
    if (Math.cos(mid) * n0[1] - Math.sin(mid) * n0[0] < 0) d -= Math.sign(d || 1) * 2 * Math.PI;
    const steps = Math.max(1, Math.ceil(Math.abs(d) / CHORD_RAD));
    // A turn of up to 180° is split into wedges of at most 90° so each piece stays convex.
    const per = Math.ceil(steps / 2);
    for (let k0 = 0; k0 < steps; k0 += per) {
      const poly: XY[] = [v];
      for (let k = k0; k <= Math.min(steps, k0 + per); k++) {
        const a = a0 + (d * k) / steps;
        poly.push([v[0] + half * Math.cos(a), v[1] + half * Math.sin(a)]);
      }
      emit(poly);
    }
  };
  let prevN: XY | null = joinAtStart ? normal(joinAtStart, pts[0]) : null;
  for (let i = 0; i + 1 < pts.length; i++) {
    const a = pts[i],
      b = pts[i + 1];
    const n = normal(a, b);
    if (prevN) wedge(a, prevN, n);
    emit([
      [a[0] + n[0], a[1] + n[1]],
      [b[0] + n[0], b[1] + n[1]],
      [b[0] - n[0], b[1] - n[1]],
      [a[0] - n[0], a[1] - n[1]],
    ]);
    prevN = n;
  }
}

/**
 * Covered, twice-worked and uncovered ground of the passes' swaths inside a region.
 *
 * A point is covered when it lies in the swath of any pass; worked twice when it lies in the
 * swaths of two or more passes, except where the only two are consecutive passes of one run and
 * the point is within half a width of the vertex joining them (that is the round join of one
 * turn). Three passes always include two that do not follow one another.
 * Each pass's swath is its line widened by `half` to each side with flat ends and round joins
 * (chords of at most π/32, as JTS's buffer draws them); where a pass follows the one before it,
 * the join between them belongs to the later pass.
 *
 * @param region rings of the work region (outer rings and holes, any orientation; even–odd rule)
 * @param passes the passes in track order
 * @param half half the working width, m
 * @param dy scanline spacing, m
 */
export function sweepCoverage(region: XY[][], passes: SweepPass[], half: number, dy: number): SweepResult {
  let minX = Infinity,
    maxX = -Infinity,
    minY = Infinity,
    maxY = -Infinity;
  for (const ring of region)
    for (const [x, y] of ring) {
      if (x < minX) minX = x;
      if (x > maxX) maxX = x;
      if (y < minY) minY = y;
      if (y > maxY) maxY = y;
    }
  // x is quantized in the sort keys to the finest power of two that keeps a key below 2⁵³
  // (2⁻¹⁶ m, 15 µm, for a region 4 km across).
  const Q = 2 ** Math.floor(Math.log2(2 ** 52 / CODE / (maxX - minX + 1)));
  const y0 = minY + dy / 2;
  const lines = Math.max(1, Math.ceil((maxY - minY) / dy));
  const ctx: Ctx = { y0, dy, lines, minX, maxX, q: Q, events: Array.from({ length: lines }, () => []) };

  // Region edges: one key per crossing (even–odd).
  for (const ring of region) {
    const n = ring.length;
    for (let i = 0; i < n; i++) {
      const a = ring[i],
        b = ring[(i + 1) % n];
      if (a[1] === b[1]) continue;
      const lo = Math.min(a[1], b[1]),
        hi = Math.max(a[1], b[1]);
      // Half-open in y so a vertex shared by two edges counts once.
      const j0 = Math.max(0, Math.ceil((lo - y0) / dy));
      let j1 = Math.min(lines - 1, Math.floor((hi - y0) / dy));
      if (y0 + j1 * dy === hi) j1--;
      for (let j = j0; j <= j1; j++) {
        const y = y0 + j * dy;
        const x = a[0] + ((y - a[1]) / (b[1] - a[1])) * (b[0] - a[0]);
        ctx.events[j].push(Math.round((x - minX) * Q) * CODE + REGION);
      }
    }
  }

  passes.forEach((p, k) => {
    const before = k > 0 && p.followsPrevious ? passes[k - 1].pts : null;
    const join = before && before.length >= 2 ? before[before.length - 2] : null;
    passPieces(p.pts, half, join, (poly) => addConvex(poly, k, ctx));
  });

  const count = new Int32Array(passes.length);
  const follows = passes.map((p) => p.followsPrevious);
  let regionLen = 0,
    coveredLen = 0,
    twiceLen = 0;
  const uncovered: LineIntervals[] = [];
  const twice: LineIntervals[] = [];
  const covered: LineIntervals[] = [];
  for (let j = 0; j < lines; j++) {
    const y = y0 + j * dy;
    const keys = Float64Array.from(ctx.events[j]).sort();
    ctx.events[j] = [];
    const un: number[] = [];
    const tw: number[] = [];
    const cov: number[] = [];
    let inRegion = false,
      distinct = 0,
      sum = 0,
      sumSq = 0;
    let lastX = 0;
    for (let i = 0; i < keys.length; i++) {
      const q = Math.floor(keys[i] / CODE);
      const code = keys[i] - q * CODE;
      const x = minX + q / Q;
      const len = x - lastX;
      if (len > 0 && inRegion) {
        regionLen += len;
        if (distinct > 0) {
          coveredLen += len;
          pushInterval(cov, lastX, x);
          let two = distinct >= 3;
          if (distinct === 2) {
            // Two passes a < b: from Σ and Σ² of their numbers, b − a = √(2Σ² − Σ²).
            const gap = Math.round(Math.sqrt(2 * sumSq - sum * sum));
            const b = (sum + gap) / 2;
            two = true;
            if (gap === 1 && follows[b]) {
              // Consecutive passes: their common ground within half a width of the vertex that
              // joins them is the round join of one turn, not ground worked twice.
              const [jx, jy] = passes[b].pts[0];
              const h = half * half - (y - jy) ** 2;
              const r = h > 0 ? Math.sqrt(h) : -1;
              two = false;
              if (r < 0 || jx + r <= lastX || jx - r >= x) pushInterval(tw, lastX, x);
              else {
                if (jx - r > lastX) pushInterval(tw, lastX, jx - r);
                if (jx + r < x) pushInterval(tw, jx + r, x);
              }
            }
          }
          if (two) pushInterval(tw, lastX, x);
        } else pushInterval(un, lastX, x);
      }
      lastX = x;
      if (code === REGION) inRegion = !inRegion;
      else {
        const k = code >> 1;
        if ((code & 1) === 0) {
          if (count[k]++ === 0) {
            distinct++;
            sum += k;
            sumSq += k * k;
          }
        } else if (--count[k] === 0) {
          distinct--;
          sum -= k;
          sumSq -= k * k;
        }
      }
    }
    for (let i = 1; i < tw.length; i += 2) twiceLen += tw[i] - tw[i - 1];
    uncovered.push(un);
    twice.push(tw);
    covered.push(cov);
  }
  return { dy, y0, regionM2: regionLen * dy, coveredM2: coveredLen * dy, twiceM2: twiceLen * dy, uncovered, twice, covered };
}

/** Appends [a, b] to a line's intervals, merged with the last one when they touch. */
function pushInterval(out: number[], a: number, b: number): void {
  if (out.length && out[out.length - 1] === a) out[out.length - 1] = b;
  else out.push(a, b);
}

/** A connected piece of intervals on consecutive scanlines. */
export interface Piece {
  areaM2: number;
  /** Centroid, local plane. */
  cx: number;
  cy: number;
  /** Mean width: area ÷ length along the piece's long axis (from its second moments). */
  widthM: number;
  /** Its outline(s) for the map: one ring per chain of single intervals on consecutive lines. */
  rings: XY[][];
}

/**
 * Pieces of a set of scanline intervals: intervals on consecutive lines that overlap in x are one
 * piece (union–find). The long axis of a strip of length L has variance L²/12, so L = √(12 λmax)
 * with λmax the larger eigenvalue of the piece's covariance, and the mean width is area ÷ L.
 * Outlines are drawn only for the pieces `outline` accepts (a day's track has thousands of slivers).
 */
export function piecesOf(lines: LineIntervals[], y0: number, dy: number, outline: (p: Omit<Piece, 'rings'>) => boolean): Piece[] {
  const starts: number[] = [];
  let total = 0;
  for (const l of lines) {
    starts.push(total);
    total += l.length / 2;
  }
  const parent = new Int32Array(total).map((_, i) => i);
  const find = (i: number): number => {
    while (parent[i] !== i) i = parent[i] = parent[parent[i]];
    return i;
  };
  // Links between lines: chains continue only through one-to-one links.
  const up = new Int32Array(total).fill(-1); // the single interval linked on the next line, or -2 for several
  const down = new Int32Array(total).fill(-1);
  for (let j = 1; j < lines.length; j++) {
    const a = lines[j - 1],
      b = lines[j];
    let p = 0,
      q = 0;
    while (p < a.length && q < b.length) {
      if (a[p + 1] > b[q] && b[q + 1] > a[p]) {
        const ia = starts[j - 1] + p / 2,
          ib = starts[j] + q / 2;
        parent[find(ia)] = find(ib);
        up[ia] = up[ia] === -1 ? ib : -2;
        down[ib] = down[ib] === -1 ? ia : -2;
      }
      if (a[p + 1] < b[q + 1]) p += 2;
      else q += 2;
    }
  }
  // Moments per interval, summed at its piece's root: area, Σx, Σy, Σx², Σy², Σxy.
  const m = new Float64Array(6 * total);
  for (let j = 0; j < lines.length; j++) {
    const y = y0 + j * dy;
    const l = lines[j];
    for (let p = 0; p < l.length; p += 2) {
      const r = 6 * find(starts[j] + p / 2);
      const x0 = l[p],
        x1 = l[p + 1];
      const a = (x1 - x0) * dy;
      m[r] += a;
      m[r + 1] += (a * (x0 + x1)) / 2;
      m[r + 2] += a * y;
      m[r + 3] += (dy * (x1 * x1 * x1 - x0 * x0 * x0)) / 3;
      m[r + 4] += a * (y * y + (dy * dy) / 12);
      m[r + 5] += (dy * y * (x1 * x1 - x0 * x0)) / 2;
    }
  }
  // Chains: start at an interval whose down link is not one-to-one, follow one-to-one up links.
  const chainOf = (i0: number, j0: number): XY[] => {
    const left: XY[] = [],
      right: XY[] = [];
    let i = i0,
      j = j0;
    for (;;) {
      const l = lines[j];
      const p = 2 * (i - starts[j]);
      const y = y0 + j * dy;
      left.push([l[p], y]);
      right.push([l[p + 1], y]);
      const nxt = up[i];
      if (nxt < 0 || down[nxt] !== i) break;
      i = nxt;
      j++;
    }
    // Half a line above and below so a single line still has an area on the map.
    const top = y0 + j * dy + dy / 2,
      bottom = y0 + j0 * dy - dy / 2;
    const ring: XY[] = [
      [left[0][0], bottom],
      ...left,
      [left[left.length - 1][0], top],
      [right[right.length - 1][0], top],
      ...right.reverse(),
      [right[0][0], bottom],
    ];
    ring.push(ring[0]);
    return ring;
  };
  const pieces = new Map<number, Piece>();
  for (let root = 0; root < total; root++) {
    if (parent[root] !== root) continue;
    const r = 6 * root,
      area = m[r];
    const cx = m[r + 1] / area,
      cy = m[r + 2] / area;
    const vxx = m[r + 3] / area - cx * cx,
      vyy = m[r + 4] / area - cy * cy,
      vxy = m[r + 5] / area - cx * cy;
    const lmax = (vxx + vyy) / 2 + Math.sqrt(((vxx - vyy) / 2) ** 2 + vxy * vxy);
    const length = Math.sqrt(12 * Math.max(lmax, 0));
    const piece = { areaM2: area, cx, cy, widthM: length > 0 ? area / length : 0 };
    if (outline(piece)) pieces.set(root, { ...piece, rings: [] });
  }
  for (let j = 0; j < lines.length; j++)
    for (let p = 0; p < lines[j].length; p += 2) {
      const i = starts[j] + p / 2;
      const d = down[i];
      if (d >= 0 && up[d] === i) continue; // continues a chain from below
      if (!pieces.has(find(i))) continue;
      pieces.get(find(i))?.rings.push(chainOf(i, j));
    }
  return [...pieces.values()];
}
