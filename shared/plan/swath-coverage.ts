import type { ClippedPasses } from './pass-clipper';
import type { PlanarRegion } from './planar-region';
import { areasLeftOf } from './strip-areas';

/** Bands across the heading, [from, to] offsets in metres (u = p·r). */
export type Band = [number, number];

/** How the swaths of a set of passes cover a region. */
export interface SwathCoverage {
  /** Area of each driven line's swath inside the region, m², in line order. */
  swathM2: number[];
  /** Area of the union of the swaths inside the region, m². */
  workedM2: number;
  /** Σ swath areas − union, m² (≥ 0). */
  overlapM2: number;
  /** Region area − union, m² (≥ 0). */
  unworkedM2: number;
  /** Bands with region area not covered by any swath. */
  gapBands: Band[];
  /** Bands covered by two swaths. */
  overlapBands: Band[];
}

/** Areas below this (m²) are rounding noise, not a strip of ground. */
const NOISE_M2 = 1e-6;

/**
 * Worked, unworked and overlapping area of the swaths of clipped passes, exactly. A swath is its
 * pass line ± width/2 across the heading, taken inside the region (each pass is driven until the
 * implement reaches the headland). Swaths of parallel passes are bands across the heading, so the
 * union is a union of intervals, and each band's area inside the region is F(b) − F(a) with F the
 * half-plane area of {@link areasLeftOf}: no polygon overlay.
 *
 * @param region packed work region (metres)
 * @param passes clipped passes; lines without a segment are not driven and get no swath
 * @param widthM working width, metres
 * @example swathCoverage(region, clipper.clip(90), 18.288).unworkedM2
 */
export function swathCoverage(region: PlanarRegion, passes: ClippedPasses, widthM: number): SwathCoverage {
  const driven = [...new Set(passes.segLine)].map((k) => passes.us[k]);
  const bands: Band[] = driven.map((u) => [u - widthM / 2, u + widthM / 2]);
  const merged: Band[] = [];
  const overlapBands: Band[] = [];
  for (const [a, b] of bands) {
    const last = merged[merged.length - 1];
    if (last && a <= last[1]) {
      if (a < last[1]) overlapBands.push([a, Math.min(b, last[1])]);
      last[1] = Math.max(last[1], b);
    } else merged.push([a, b]);
  }
  const lo = passes.uMin - 1,
    hi = passes.uMax + 1;
  const gaps: Band[] = [];
  let from = lo;
  for (const [a, b] of merged) {
    if (a > from) gaps.push([from, a]);
    from = Math.max(from, b);
  }
  if (from < hi) gaps.push([from, hi]);

  const all = [...bands, ...merged, ...overlapBands, ...gaps].flat();
  const cuts = Float64Array.from(new Set(all));
  const F = areasLeftOf(region, passes.cos, passes.sin, cuts);
  const at = new Map<number, number>();
  cuts.forEach((c, i) => at.set(c, F[i]));
  let q = 0;
  const next = (): number => {
    const a = at.get(all[q++])!,
      b = at.get(all[q++])!;
    return Math.max(0, b - a);
  };
  const swathM2 = bands.map(next);
  const workedM2 = merged.reduce((s) => s + next(), 0);
  const overlapAreas = overlapBands.map(next);
  const gapAreas = gaps.map(next);
  const swathSum = swathM2.reduce((s, a) => s + a, 0);
  const unworkedM2 = gapAreas.reduce((s, a) => s + a, 0);
  return {
    swathM2,
    workedM2,
    overlapM2: swathSum - workedM2 > NOISE_M2 ? swathSum - workedM2 : 0,
    unworkedM2: unworkedM2 > NOISE_M2 ? unworkedM2 : 0,
    gapBands: gaps.filter((_, i) => gapAreas[i] > NOISE_M2),
    overlapBands: overlapBands.filter((_, i) => overlapAreas[i] > NOISE_M2),
  };
}
