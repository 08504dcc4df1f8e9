import { MAX_SEGMENTS } from '../limits';
import type { HeadingSummary, PassClipper } from './pass-clipper';
import type { PlanarRegion } from './planar-region';

/** Extra candidate headings: the directions of this many longest edges of the region. */
const EDGE_CANDIDATES = 12;

/** Turns for a heading: one end turn between consecutive segments, back and forth. */
export const turnsOf = (s: HeadingSummary): number => Math.max(0, s.segmentCount - 1);

/**
 * Clips the passes at each heading and returns the counts (lines only, no area work).
 *
 * @param clipper pass clipper of the work region
 * @param headings degrees clockwise from grid north
 * @example scanHeadings(clipper, [0, 45, 90]).map(turnsOf)
 */
export function scanHeadings(clipper: PassClipper, headings: Iterable<number>): HeadingSummary[] {
  const out: HeadingSummary[] = [];
  for (const h of headings) out.push(clipper.summary(h));
  return out;
}

/** Every whole degree 0…179, plus the directions of the region's longest edges (mod 180°). */
export function candidateHeadings(region: PlanarRegion): number[] {
  const { xs, ys, ringStart } = region;
  const edges: { len: number; h: number }[] = [];
  for (let r = 0; r + 1 < ringStart.length; r++) {
    for (let i = ringStart[r], j = ringStart[r + 1] - 1; i < ringStart[r + 1]; j = i++) {
      const dx = xs[i] - xs[j],
        dy = ys[i] - ys[j];
      let h = (Math.atan2(dx, dy) * 180) / Math.PI;
      h = ((h % 180) + 180) % 180;
      edges.push({ len: Math.hypot(dx, dy), h: h >= 180 ? 0 : h });
    }
  }
  edges.sort((a, b) => b.len - a.len);
  const whole = Array.from({ length: 180 }, (_, i) => i);
  const extra = edges
    .slice(0, EDGE_CANDIDATES)
    .map((e) => e.h)
    .filter((h) => !Number.isInteger(h));
  return [...whole, ...extra];
}

/**
 * The heading with the fewest turns; ties go to the least time (pass length ÷ speed + turns ×
 * turn time), then to the smaller heading. Scans every whole degree 0…179 and the directions of
 * the region's longest edges, so the result is never worse than any whole degree.
 *
 * @param clipper pass clipper of the work region
 * @param region the work region (for edge directions)
 * @param speedMps working speed, m/s
 * @param turnSeconds seconds per end turn
 * @returns the best heading's summary
 * @example bestHeading(clipper, region, 2.2352, 20).headingDeg // e.g. 90 for a field long east–west
 */
export function bestHeading(clipper: PassClipper, region: PlanarRegion, speedMps: number, turnSeconds: number): HeadingSummary {
  let best: HeadingSummary | null = null;
  let bestTurns = Infinity,
    bestSeconds = Infinity;
  for (const s of scanHeadings(clipper, candidateHeadings(region))) {
    if (s.passCount === 0 || s.overBudget) continue;
    const turns = turnsOf(s);
    const seconds = s.passLengthM / speedMps + turns * turnSeconds;
    const better =
      turns < bestTurns ||
      (turns === bestTurns &&
        (seconds < bestSeconds - 1e-9 || (Math.abs(seconds - bestSeconds) <= 1e-9 && s.headingDeg < (best?.headingDeg ?? Infinity))));
    if (better) {
      best = s;
      bestTurns = turns;
      bestSeconds = seconds;
    }
  }
  if (best) return best;
  const fallback = clipper.summary(0);
  if (fallback.overBudget)
    throw new Error(
      `At every heading the passes would break into more segments than Furlong plans for one field (${MAX_SEGMENTS.toLocaleString('en-US')}); use a wider working width or a simpler boundary`,
    );
  return fallback;
}
