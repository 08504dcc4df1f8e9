import type { MultiPolygon, Polygon, Position } from 'geojson';
import { MAX_SEGMENTS } from '../limits';
import { HOUR_S } from '../units';
import type { HeadingSummary, PassClipper } from './pass-clipper';
import type { PlanarRegion } from './planar-region';

/** Extra candidate headings: the directions of this many longest edges of the region. */
const EDGE_CANDIDATES = 12;

/**
 * Default margin for preferring a heading along one of the field's long straight edges: taken when
 * its field time is at most this many per cent above the fastest heading's. Common practice
 * (passes along the fence line), no published source for the number.
 */
export const DEFAULT_EDGE_MARGIN_PCT = 3;

/** Largest margin a plan accepts, per cent: beyond it the "fastest" heading would mean little. */
export const MAX_EDGE_MARGIN_PCT = 25;

/** How many headings are offered to the owner beside the chosen one (in all, at most this many). */
const OFFERED = 3;

/** Offered headings differ by at least this much (degrees, mod 180), so they are real choices. */
const OFFER_SPREAD_DEG = 5;

/** Headings within this many degrees of each other run the same lines for the owner. */
const SAME_HEADING_DEG = 0.05;

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

const mod180 = (h: number): number => {
  const m = ((h % 180) + 180) % 180;
  return m >= 180 - 1e-12 ? 0 : m;
};
/** Angle between two headings as lines (mod 180), degrees, 0…90. */
const apart = (a: number, b: number): number => {
  const d = Math.abs(mod180(a) - mod180(b));
  return Math.min(d, 180 - d);
};
const headingOf = (dx: number, dy: number): number => mod180((Math.atan2(dx, dy) * 180) / Math.PI);

/** Every whole degree 0…179, plus the directions of the region's longest edges (mod 180°). */
export function candidateHeadings(region: PlanarRegion): number[] {
  const { xs, ys, ringStart } = region;
  const edges: { len: number; h: number }[] = [];
  for (let r = 0; r + 1 < ringStart.length; r++) {
    for (let i = ringStart[r], j = ringStart[r + 1] - 1; i < ringStart[r + 1]; j = i++) {
      const dx = xs[i] - xs[j],
        dy = ys[i] - ys[j];
      edges.push({ len: Math.hypot(dx, dy), h: headingOf(dx, dy) });
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

/** A straight stretch of the field's outer edge: its direction (mod 180°) and length. */
export interface StraightEdge {
  headingDeg: number;
  lengthM: number;
}

/** A stretch counts as a long edge when at least this share of the field's longest straight stretch. */
const LONG_EDGE_SHARE = 0.25;
/** At most this many long edges are tried (a square has two directions, a quarter with a road corner three). */
const MAX_LONG_EDGES = 4;

/**
 * The field's long straight edges (fence lines), from the outer rings of its boundary in the local
 * plane (metres). A boundary walked with a GPS receiver has many vertices along one fence, so runs
 * of edges are merged while each new vertex stays within max(1 m, 1 % of the run) of the run's
 * line; the run's direction is its chord. Runs of at least a quarter of the longest are kept, the
 * longest per direction (1° apart), at most four. O(n) in the boundary's vertices.
 *
 * @param boundaryXY the field boundary in the local plane, metres
 * @example longStraightEdges(squareXY) // [{ headingDeg: 0, lengthM: 804.7 }, { headingDeg: 90, lengthM: 804.7 }]
 */
export function longStraightEdges(boundaryXY: Polygon | MultiPolygon): StraightEdge[] {
  const parts = boundaryXY.type === 'Polygon' ? [boundaryXY.coordinates] : boundaryXY.coordinates;
  const runs: StraightEdge[] = [];
  for (const part of parts) {
    const ring = part[0]?.slice(0, -1) ?? [];
    const n = ring.length;
    if (n < 3) continue;
    // Start at the sharpest corner so no straight run is cut by where the ring happens to begin.
    let start = 0,
      sharpest = -1;
    for (let i = 0; i < n; i++) {
      const a = ring[(i + n - 1) % n],
        b = ring[i],
        c = ring[(i + 1) % n];
      const turn = apart(headingOf(b[0] - a[0], b[1] - a[1]), headingOf(c[0] - b[0], c[1] - b[1]));
      if (turn > sharpest) {
        sharpest = turn;
        start = i;
      }
    }
    const at = (k: number): Position => ring[(start + k) % n];
    let s = at(0),
      e = at(1);
    const close = (): void => {
      const len = Math.hypot(e[0] - s[0], e[1] - s[1]);
      if (len > 0) runs.push({ headingDeg: headingOf(e[0] - s[0], e[1] - s[1]), lengthM: len });
    };
    for (let k = 2; k <= n; k++) {
      const p = at(k);
      const cx = e[0] - s[0],
        cy = e[1] - s[1];
      const chord = Math.hypot(cx, cy);
      const off = chord > 0 ? Math.abs(cx * (p[1] - s[1]) - cy * (p[0] - s[0])) / chord : Infinity;
      const ahead = chord > 0 && cx * (p[0] - e[0]) + cy * (p[1] - e[1]) > 0;
      if (ahead && off <= Math.max(1, 0.01 * Math.hypot(p[0] - s[0], p[1] - s[1]))) e = p;
      else {
        close();
        s = e;
        e = p;
      }
    }
    close();
  }
  runs.sort((a, b) => b.lengthM - a.lengthM);
  const longest = runs[0]?.lengthM ?? 0;
  const out: StraightEdge[] = [];
  for (const r of runs) {
    if (r.lengthM < LONG_EDGE_SHARE * longest || out.length >= MAX_LONG_EDGES) break;
    if (!out.some((o) => apart(o.headingDeg, r.headingDeg) < 1)) out.push(r);
  }
  return out;
}

/** One heading the planner weighed: its field time and counts, as the owner sees them. */
export interface HeadingCandidate {
  headingDeg: number;
  passCount: number;
  segmentCount: number;
  turns: number;
  passLengthM: number;
  /** Field time at this heading, h: the same figure as the plan's `hours`. */
  hours: number;
  /** True when the passes run along one of the field's long straight edges. */
  alongEdge: boolean;
}

/** What the field time is made of, besides the passes (see {@link chooseHeading}). */
export interface HeadingObjective {
  speedMps: number;
  turnSeconds: number;
  /** Distance driven whatever the heading (the headland laps), m. */
  fixedDistanceM: number;
  widthM: number;
  coverage: 'gaps-ok' | 'full';
  /** Prefer a long-edge heading whose time is at most this many per cent above the fastest. */
  edgeMarginPct: number;
}

/** The heading auto picks, the fastest one, and the few offered to the owner (chosen first). */
export interface HeadingChoice {
  chosen: HeadingCandidate;
  fastest: HeadingCandidate;
  candidates: HeadingCandidate[];
}

/**
 * Chooses the heading a farmer would run: the least field time, preferring a heading along one of
 * the field's long straight edges when its time is within `edgeMarginPct` of the fastest.
 *
 * Field time = (pass length + headland laps) ÷ speed + turns × turn time: the plan's `hours`. What
 * an angle costs is in it: the short passes across a corner each add a turn, and with full coverage
 * the last pass an angle needs (and its overlap) is driven and turned like any other. Scans every
 * whole degree 0…179, the directions of the region's longest edges and of the field's long
 * straight edges. The scan counts lines only; with full coverage, headings are then clipped in
 * order of their time without the last pass (a lower bound) until no unclipped one can win.
 *
 * @param clipper pass clipper of the work region
 * @param region the work region (for its edge directions)
 * @param edges the field's long straight edges ({@link longStraightEdges})
 * @param o speed, turn time, fixed distance, width, coverage and edge margin
 * @throws Error when every heading is over the segment budget
 * @example chooseHeading(clipper, region, longStraightEdges(fieldXY), objective).chosen.headingDeg
 */
export function chooseHeading(clipper: PassClipper, region: PlanarRegion, edges: StraightEdge[], o: HeadingObjective): HeadingChoice {
  const hoursOf = (passLengthM: number, turns: number): number =>
    (passLengthM + o.fixedDistanceM) / o.speedMps / HOUR_S + (turns * o.turnSeconds) / HOUR_S;
  const alongEdge = (h: number): boolean => edges.some((e) => apart(e.headingDeg, h) < SAME_HEADING_DEG);
  const candidate = (s: HeadingSummary): HeadingCandidate => {
    const turns = turnsOf(s);
    return {
      headingDeg: s.headingDeg,
      passCount: s.passCount,
      segmentCount: s.segmentCount,
      turns,
      passLengthM: s.passLengthM,
      hours: hoursOf(s.passLengthM, turns),
      alongEdge: alongEdge(s.headingDeg),
    };
  };
  /** The time with full coverage's last pass, as planPasses drives it; null when it breaks the budget. */
  const withLastPass = (c: HeadingCandidate): HeadingCandidate | null => {
    if (o.coverage !== 'full') return c;
    const l = clipper.layout(c.headingDeg);
    if (l.uMin + l.us.length * o.widthM >= l.uMax - 1e-9) return c;
    try {
      const clipped = clipper.clip(c.headingDeg, [l.uMax - o.widthM / 2]);
      return { ...candidate(clipped), alongEdge: c.alongEdge };
    } catch {
      return null;
    }
  };

  const headings = [...candidateHeadings(region), ...edges.map((e) => e.headingDeg)];
  const bounds = scanHeadings(clipper, headings)
    .filter((s) => s.passCount > 0 && !s.overBudget)
    .map(candidate)
    .sort((a, b) => a.hours - b.hours || a.headingDeg - b.headingDeg);
  if (!bounds.length) {
    const fallback = clipper.summary(0);
    if (fallback.overBudget)
      throw new Error(
        `At every heading the passes would break into more segments than Furlong plans for one field (${MAX_SEGMENTS.toLocaleString('en-US')}); use a wider working width or a simpler boundary`,
      );
    const c = candidate(fallback);
    return { chosen: c, fastest: c, candidates: [] };
  }

  // Exact times: every lower bound that could still be within the margin of the best, every edge
  // heading, and enough others to offer a choice.
  const factor = 1 + o.edgeMarginPct / 100;
  const exact: HeadingCandidate[] = [];
  let bestHours = Infinity;
  for (const b of bounds) {
    if (b.hours > bestHours * factor && !b.alongEdge && exact.length >= 4 * OFFERED) continue;
    const c = withLastPass(b);
    if (!c) continue;
    exact.push(c);
    bestHours = Math.min(bestHours, c.hours);
  }
  // Ties go to an edge heading, then to the smaller heading, so the choice never flickers.
  exact.sort((a, b) => a.hours - b.hours || Number(b.alongEdge) - Number(a.alongEdge) || a.headingDeg - b.headingDeg);
  const fastest = exact[0];
  const edge = exact.find((c) => c.alongEdge && c.hours <= fastest.hours * factor);
  const chosen = edge ?? fastest;
  const candidates = [chosen];
  for (const c of [fastest, ...exact]) {
    if (candidates.length >= OFFERED) break;
    if (candidates.every((k) => apart(k.headingDeg, c.headingDeg) >= OFFER_SPREAD_DEG)) candidates.push(c);
  }
  return { chosen, fastest, candidates };
}
