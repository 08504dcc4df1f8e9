import { MAX_SEGMENTS } from '../limits';
import { formatHeading } from '../figures';
import type { PlanarRegion } from './planar-region';

/** Segments shorter than this (m) are touches at a vertex, not passes. */
const MIN_SEGMENT_M = 1e-6;
const DEG = Math.PI / 180;

/** How the pass lines of one heading sit across the region. */
export interface PassLayout {
  headingDeg: number;
  /** Heading direction d = (sin h, cos h) and right-hand normal r = (cos h, −sin h) as cos/sin. */
  cos: number;
  sin: number;
  /** Extent of the region across the heading (u = p·r, m; u grows to the right of the heading). */
  uMin: number;
  uMax: number;
  /** Extent along the heading (t = p·d, m). */
  tMin: number;
  tMax: number;
  /** Pass-line offsets across the heading, ascending (m). */
  us: Float64Array;
}

/** Counts for one heading, without geometry. */
export interface HeadingSummary {
  headingDeg: number;
  passCount: number;
  segmentCount: number;
  passLengthM: number;
  /**
   * True when the lines at this heading would break into more segments than the plan budget
   * allows; the counts are then not computed (and auto heading passes this heading over).
   */
  overBudget?: boolean;
}

/** Pass lines clipped to the region at one heading, with every segment. */
export interface ClippedPasses extends PassLayout, HeadingSummary {
  /** Segment s spans t from segT[2s] to segT[2s+1] on line segLine[s]; ordered by line, then t. */
  segT: Float64Array;
  segLine: Int32Array;
}

/** Reusable scanline clipper for one region and one working width. */
export interface PassClipper {
  /** Number of lines, segments and total length at one heading; no geometry (buffers are reused). */
  summary(headingDeg: number): HeadingSummary;
  /**
   * Full clip at one heading; `extraU` adds lines at these offsets (e.g. a last pass for full
   * coverage). Throws a plain Error when the segments would exceed the budget.
   */
  clip(headingDeg: number, extraU?: number[]): ClippedPasses;
  /** Layout of the regular lines at one heading (no clipping). */
  layout(headingDeg: number): PassLayout;
}

/**
 * A scanline clipper for straight parallel passes over a planar region (metres). At heading h
 * (degrees clockwise from grid north) the passes run along d = (sin h, cos h); they are laid from
 * the left-hand edge of the region looking along the heading, the first centre half a width in,
 * then every `widthM`, for every centre strictly inside the region's extent across the heading.
 *
 * Each line is intersected with every edge (outer rings and holes) using the half-open rule
 * min(uₐ, u_b) ≤ u < max(uₐ, u_b), so a line through a vertex counts each crossing once; the
 * crossings of each line are sorted and paired (even–odd). Cost per heading is O(n + k log k)
 * for n vertices and k crossings; buffers are allocated once and grown on demand.
 *
 * Budget: crossings are counted per edge before any is computed, so a heading whose lines would
 * break into more than `maxSegments` segments costs O(n) and is reported `overBudget`.
 *
 * @param region packed work region (see packRegion)
 * @param widthM implement working width, metres
 * @param maxSegments most segments one heading may produce (default MAX_SEGMENTS of shared/limits)
 * @example
 * const clipper = createPassClipper(region, 18.288);
 * clipper.summary(90); // { headingDeg: 90, passCount, segmentCount, passLengthM }
 */
export function createPassClipper(region: PlanarRegion, widthM: number, maxSegments = MAX_SEGMENTS): PassClipper {
  const { xs, ys, ringStart } = region;
  const n = xs.length;
  const u = new Float64Array(n);
  const t = new Float64Array(n);
  let counts = new Int32Array(64);
  let crossT = new Float64Array(256);

  function rotate(h: number): PassLayout {
    const cos = Math.cos(h * DEG);
    const sin = Math.sin(h * DEG);
    let uMin = Infinity,
      uMax = -Infinity,
      tMin = Infinity,
      tMax = -Infinity;
    for (let i = 0; i < n; i++) {
      const ui = xs[i] * cos - ys[i] * sin;
      const ti = xs[i] * sin + ys[i] * cos;
      u[i] = ui;
      t[i] = ti;
      if (ui < uMin) uMin = ui;
      if (ui > uMax) uMax = ui;
      if (ti < tMin) tMin = ti;
      if (ti > tMax) tMax = ti;
    }
    const q = (uMax - uMin - widthM / 2) / widthM;
    const lines = q > 0 ? Math.ceil(q) : 0;
    const us = new Float64Array(lines);
    for (let k = 0; k < lines; k++) us[k] = uMin + widthM / 2 + k * widthM;
    return { headingDeg: h, cos, sin, uMin, uMax, tMin, tMax, us };
  }

  /** First index k with us[k] ≥ v. */
  function lowerBound(us: Float64Array, v: number): number {
    let lo = 0,
      hi = us.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (us[mid] < v) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  }

  const edgeCount = n;
  const edgeK0 = new Int32Array(edgeCount);
  const edgeK1 = new Int32Array(edgeCount);
  const edgeFrom = new Int32Array(edgeCount);
  for (let r = 0; r + 1 < ringStart.length; r++)
    for (let i = ringStart[r], j = ringStart[r + 1] - 1; i < ringStart[r + 1]; j = i++) edgeFrom[i] = j;

  /** First index k with us[k] ≥ v: direct on the regular grid, then checked against the stored offsets. */
  function firstAtOrAbove(us: Float64Array, regular: boolean, v: number): number {
    const lines = us.length;
    if (!regular) return lowerBound(us, v);
    let k = Math.ceil((v - us[0]) / widthM);
    if (k <= 0) return 0;
    if (k > lines) k = lines;
    while (k > 0 && us[k - 1] >= v) k--;
    while (k < lines && us[k] < v) k++;
    return k;
  }

  /**
   * Fills crossT with every line's crossings, bucketed by line; returns bucket starts (length
   * lines + 1). Edge j→i crosses line k when min(uⱼ, uᵢ) ≤ us[k] < max(uⱼ, uᵢ).
   */
  function cross(us: Float64Array, regular: boolean): Int32Array | null {
    const lines = us.length;
    if (counts.length < lines + 1) counts = new Int32Array(2 * lines + 1);
    const starts = counts;
    starts.fill(0, 0, lines + 1);
    if (lines === 0) return starts;
    let total = 0;
    for (let i = 0; i < edgeCount; i++) {
      const ua = u[edgeFrom[i]],
        ub = u[i];
      let k0 = 0,
        k1 = 0;
      if (ua !== ub) {
        k0 = firstAtOrAbove(us, regular, ua < ub ? ua : ub);
        k1 = firstAtOrAbove(us, regular, ua < ub ? ub : ua);
        total += k1 - k0;
      }
      edgeK0[i] = k0;
      edgeK1[i] = k1;
    }
    // Two crossings bound one segment: past the budget, stop before doing any per-crossing work.
    if (total > 2 * maxSegments) return null;
    for (let i = 0; i < edgeCount; i++) for (let k = edgeK0[i]; k < edgeK1[i]; k++) starts[k + 1]++;
    for (let k = 0; k < lines; k++) starts[k + 1] += starts[k];
    if (crossT.length < total) crossT = new Float64Array(2 * total);
    const out = crossT;
    for (let i = 0; i < edgeCount; i++) {
      const k0 = edgeK0[i],
        k1 = edgeK1[i];
      if (k0 === k1) continue;
      const j = edgeFrom[i];
      const ua = u[j];
      const slope = (t[i] - t[j]) / (u[i] - ua);
      for (let k = k0; k < k1; k++) out[starts[k]++] = t[j] + (us[k] - ua) * slope;
    }
    // Each start has advanced to its line's end, which is the next line's start: shift back.
    for (let k = lines; k > 0; k--) starts[k] = starts[k - 1];
    starts[0] = 0;
    return starts;
  }

  function sortRange(a: Float64Array, s: number, e: number): void {
    for (let i = s + 1; i < e; i++) {
      const v = a[i];
      let j = i - 1;
      while (j >= s && a[j] > v) {
        a[j + 1] = a[j];
        j--;
      }
      a[j + 1] = v;
    }
  }

  function summary(h: number): HeadingSummary {
    const { us } = rotate(h);
    const starts = cross(us, true);
    if (!starts) return { headingDeg: h, passCount: 0, segmentCount: 0, passLengthM: 0, overBudget: true };
    let passCount = 0,
      segmentCount = 0,
      passLengthM = 0;
    for (let k = 0; k < us.length; k++) {
      const s = starts[k],
        e = starts[k + 1];
      sortRange(crossT, s, e);
      let segs = 0;
      for (let c = s; c + 1 < e; c += 2) {
        const len = crossT[c + 1] - crossT[c];
        if (len > MIN_SEGMENT_M) {
          segs++;
          passLengthM += len;
        }
      }
      if (segs) passCount++;
      segmentCount += segs;
    }
    return { headingDeg: h, passCount, segmentCount, passLengthM };
  }

  function clip(h: number, extraU: number[] = []): ClippedPasses {
    const layout = rotate(h);
    if (extraU.length) {
      const merged = Float64Array.from([...layout.us, ...extraU]).sort();
      layout.us = merged;
    }
    const { us } = layout;
    const starts = cross(us, extraU.length === 0);
    if (!starts)
      throw new Error(
        `At heading ${formatHeading(h, 180)} the passes would break into more than ${maxSegments.toLocaleString('en-US')} segments, more than Furlong plans for one field; choose another heading or a wider working width`,
      );
    const segT: number[] = [];
    const segLine: number[] = [];
    let passCount = 0,
      passLengthM = 0;
    for (let k = 0; k < us.length; k++) {
      const s = starts[k],
        e = starts[k + 1];
      sortRange(crossT, s, e);
      let segs = 0;
      for (let c = s; c + 1 < e; c += 2) {
        const len = crossT[c + 1] - crossT[c];
        if (len > MIN_SEGMENT_M) {
          segs++;
          passLengthM += len;
          segT.push(crossT[c], crossT[c + 1]);
          segLine.push(k);
        }
      }
      if (segs) passCount++;
    }
    return {
      ...layout,
      passCount,
      segmentCount: segLine.length,
      passLengthM,
      segT: Float64Array.from(segT),
      segLine: Int32Array.from(segLine),
    };
  }

  return { summary, clip, layout: rotate };
}
