import type { FeatureCollection, MultiPolygon, Polygon } from 'geojson';
import { assertBoundary } from '../geo/boundary-check';
import { fieldArea } from '../geo/geodesic-area';
import { projectionForField, type LocalProjection } from '../geo/local-projection';
import { MAX_TRACK_POINTS } from '../limits';
import { difference, hazardZones, readJsts, writePolygonal } from '../plan/jsts-ops';
import { m2ToAcres } from '../units';
import { piecesOf, sweepCoverage, type LineIntervals, type Piece, type SweepPass, type XY } from './sweep';

/** One logged position of the implement. */
export interface TrackPoint {
  lon: number;
  lat: number;
  /** Time of the fix, ms since 1970 (optional). */
  t?: number;
  /** Whether the implement was working from this fix to the next (optional: unknown = working). */
  working?: boolean;
}

/** What to measure: a field, its hazards, a logged track and the implement's width. */
export interface CoverageInput {
  /** Field boundary, GeoJSON lon/lat (RFC 7946), holes and several parts allowed. */
  boundary: Polygon | MultiPolygon;
  /** Hazards (Point / LineString / Polygon); properties.clearanceM in metres, as the pass plan takes them. */
  hazards?: FeatureCollection;
  /** The track: one or more lines of fixes in the order driven (GPX track segments, GeoJSON lines). */
  track: TrackPoint[][];
  /** Implement working width, metres. */
  widthM: number;
}

/** One skipped piece of the work region. */
export interface Skip {
  acres: number;
  /** Centre of the piece (its centroid; may fall outside an L-shaped piece), [lon, lat]. */
  centroid: [number, number];
}

export interface CoverageResult {
  /** The field's acres on the WGS84 ellipsoid (as everywhere in Furlong). */
  fieldAcres: number;
  /** The field minus its hazards' clearance zones. */
  workRegionAcres: number;
  /** Work region under the swath. */
  coveredAcres: number;
  /** Work region not under the swath, slivers left out (see SLIVER_*). */
  skippedAcres: number;
  /** Uncovered slivers too small to count as skips: workRegion = covered + skipped + slivers. */
  sliverAcres: number;
  /** Work region under the swaths of two or more passes (see sweepCoverage for the rule at turns). */
  workedTwiceAcres: number;
  skipCount: number;
  /** Skips, largest first. */
  skips: Skip[];
  /** Length of the whole track as logged (every fix), metres. */
  trackLengthM: number;
  /** Length of the track while the implement was working, metres. */
  workingLengthM: number;
  /** Passes found in the working track (see splitPasses). */
  passCount: number;
  trackPoints: number;
  widthM: number;
  /** Spacing of the scanlines the areas were summed on, m. */
  scanSpacingM: number;
  /**
   * Lon/lat geometries for the map (outlines along the scanlines, each piece as strips that tile
   * it); null when empty. Skipped: the skips only (no slivers); covered: the work region under the
   * swath; twice: the part of it under two or more passes, pieces below the sliver size left out.
   */
  geometry: {
    skipped: MultiPolygon | null;
    covered: MultiPolygon | null;
    twice: MultiPolygon | null;
  };
}

/**
 * A skip narrower than this on average (2 × area ÷ perimeter, which is the width of a long strip)
 * is a sliver, not a skip: half a metre is about one nozzle or two seed rows, less than the
 * pass-to-pass accuracy of a sub-metre GPS receiver (common practice, no published source).
 */
export const SLIVER_WIDTH_M = 0.5;
/** A skip smaller than this is a sliver too: 10 m² is about 100 sq ft (common practice, no published source). */
export const SLIVER_AREA_M2 = 10;
/**
 * Fixes closer than this to the last one kept are dropped before anything else: a standing
 * tractor's GPS jitter would otherwise give headings in every direction.
 */
const MIN_STEP_M = 0.2;
/**
 * Douglas–Peucker tolerance of the working track: 2 cm, well below a receiver's pass-to-pass
 * accuracy (RTK: about 2.5 cm). Each swath edge moves by at most this much, so the covered area
 * changes by at most tolerance × its exposed edge. Straight runs of a 1 Hz log fold into a few
 * vertices, which makes the buffer fast.
 */
const SIMPLIFY_M = 0.05;
/** A pass ends where the heading has turned more than this from the pass's first heading. */
const PASS_TURN_DEG = 90;
/** Fixes further apart in time than this are not joined: the log stopped (seconds). */
const TIME_GAP_S = 30;
/**
 * Scanlines per region at most (their spacing is the region's height ÷ this, at least 2 cm): 0.2 m
 * on a mile-high section. The covered area's error is of order spacing² per vertex of the swath.
 */
const SCANLINES = 8_000;
const MIN_SCAN_M = 0.02;
/**
 * Scanlines per region at most for the map's covered and twice-worked outlines: a second, coarser
 * sweep (about 3.2 m on a mile-high section, where the figures' own sweep keeps 0.2 m; a few
 * pixels at a close zoom). Outlining the fine sweep's pieces took four times as long as the
 * figures; this adds about a tenth (`npm run bench -- coverage`, CPU time).
 */
const MAP_SCANLINES = 500;

/**
 * Gaps narrower than this between covered pieces of a scanline are closed for the map: passes
 * driven exactly a width apart leave micro gaps that would split the covered ground into thousands
 * of strips (slow to outline, and drawn as hairline seams). Far below a map's pixel.
 */
const MAP_GAP_M = 0.05;

/** Each line's intervals with gaps narrower than `gap` closed. */
export function closeGaps(lines: LineIntervals[], gap: number): LineIntervals[] {
  return lines.map((l) => {
    const out: number[] = [];
    for (let i = 0; i < l.length; i += 2) {
      if (out.length && l[i] - out[out.length - 1] < gap) out[out.length - 1] = l[i + 1];
      else out.push(l[i], l[i + 1]);
    }
    return out;
  });
}

/** Douglas–Peucker on a planar polyline, iterative (a 36,000-fix run must not recurse deeply). */
export function simplifyLine(pts: XY[], tolerance: number): XY[] {
  const n = pts.length;
  if (n <= 2) return pts.slice();
  const keep = new Uint8Array(n);
  keep[0] = keep[n - 1] = 1;
  const stack: number[] = [0, n - 1];
  const tol2 = tolerance * tolerance;
  while (stack.length) {
    const b = stack.pop()!;
    const a = stack.pop()!;
    const [ax, ay] = pts[a];
    const dx = pts[b][0] - ax,
      dy = pts[b][1] - ay;
    const len2 = dx * dx + dy * dy;
    let worst = -1,
      worstD = tol2;
    for (let i = a + 1; i < b; i++) {
      const px = pts[i][0] - ax,
        py = pts[i][1] - ay;
      let d2: number;
      if (len2 === 0) d2 = px * px + py * py;
      else {
        const t = Math.max(0, Math.min(1, (px * dx + py * dy) / len2));
        const ex = px - t * dx,
          ey = py - t * dy;
        d2 = ex * ex + ey * ey;
      }
      if (d2 > worstD) {
        worstD = d2;
        worst = i;
      }
    }
    if (worst >= 0) {
      keep[worst] = 1;
      stack.push(a, worst, worst, b);
    }
  }
  const out: XY[] = [];
  for (let i = 0; i < n; i++) if (keep[i]) out.push(pts[i]);
  return out;
}

const headingOf = (a: XY, b: XY) => Math.atan2(b[0] - a[0], b[1] - a[1]);
const turn = (h0: number, h1: number) => Math.abs(((h1 - h0 + 3 * Math.PI) % (2 * Math.PI)) - Math.PI);

/**
 * Splits a working run (simplified, planar) into passes: a pass ends where the heading has
 * turned more than PASS_TURN_DEG from its first segment's, so the two legs of an end turn are
 * different passes, and consecutive passes share their joining vertex.
 */
export function splitPasses(run: XY[]): XY[][] {
  const passes: XY[][] = [];
  let cur: XY[] = [run[0], run[1]];
  let h0 = headingOf(run[0], run[1]);
  const limit = (PASS_TURN_DEG * Math.PI) / 180;
  for (let i = 2; i < run.length; i++) {
    const h = headingOf(run[i - 1], run[i]);
    if (turn(h0, h) > limit) {
      passes.push(cur);
      cur = [run[i - 1], run[i]];
      h0 = h;
    } else cur.push(run[i]);
  }
  passes.push(cur);
  return passes;
}

export interface WorkingRuns {
  /** Runs of the working track, planar, thinned (not yet simplified). */
  runs: XY[][];
  trackLengthM: number;
  workingLengthM: number;
  trackPoints: number;
}

/**
 * The working runs of a track in the local plane. A segment from one fix to the next is worked
 * when the first fix says working (or says nothing); fixes more than TIME_GAP_S apart, both with
 * times, are not joined; fixes closer than MIN_STEP_M to the last kept one are dropped.
 */
export function workingRuns(track: TrackPoint[][], proj: LocalProjection): WorkingRuns {
  const runs: XY[][] = [];
  let trackLengthM = 0,
    workingLengthM = 0,
    trackPoints = 0;
  for (const line of track) {
    let run: XY[] = [];
    const close = () => {
      if (run.length >= 2) runs.push(run);
      run = [];
    };
    let prev: XY | null = null;
    let prevPt: TrackPoint | null = null;
    for (const p of line) {
      trackPoints++;
      const xy = proj.forward([p.lon, p.lat]);
      if (prev && prevPt) {
        const d = Math.hypot(xy[0] - prev[0], xy[1] - prev[1]);
        const gap = prevPt.t !== undefined && p.t !== undefined && Math.abs(p.t - prevPt.t) > TIME_GAP_S * 1000;
        if (!gap) trackLengthM += d;
        const working = prevPt.working !== false && !gap;
        if (working) {
          workingLengthM += d;
          if (run.length === 0) run.push(prev);
          const last = run[run.length - 1];
          if (Math.hypot(xy[0] - last[0], xy[1] - last[1]) >= MIN_STEP_M) run.push(xy);
        } else close();
      }
      prev = xy;
      prevPt = p;
    }
    close();
  }
  return { runs, trackLengthM, workingLengthM, trackPoints };
}

/** The passes of the working runs, simplified, in track order. */
export function trackPasses(runs: XY[][]): SweepPass[] {
  const out: SweepPass[] = [];
  for (const r of runs) splitPasses(simplifyLine(r, SIMPLIFY_M)).forEach((pts, i) => out.push({ pts, followsPrevious: i > 0 }));
  return out;
}

/**
 * What a logged track really covered of a field: the swath (the working track widened by half
 * the working width to each side, round joins, flat ends) taken inside the work region (the field
 * minus its hazards' clearance zones), in the field's local projection (the pass plan's).
 * Skipped ground is the rest of the work region, less slivers narrower than SLIVER_WIDTH_M on
 * average or smaller than SLIVER_AREA_M2. Areas are scaled to the field's geodesic acres.
 *
 * @throws Error with a plain message on a bad boundary, width or track
 * @example computeCoverage({ boundary, track: [[{ lon, lat }, …]], widthM: ftToM(60) }).coveredAcres
 */
export function computeCoverage(input: CoverageInput): CoverageResult {
  assertBoundary(input.boundary);
  const w = input.widthM;
  if (!Number.isFinite(w) || w <= 0 || w > 100) throw new Error(`The working width must be more than 0 and at most 100 m (got ${w})`);
  const points = input.track.reduce((n, l) => n + l.length, 0);
  if (points > MAX_TRACK_POINTS)
    throw new Error(
      `The track has ${points.toLocaleString('en-US')} points; Furlong reads at most ${MAX_TRACK_POINTS.toLocaleString('en-US')} (a day at one point per second)`,
    );
  for (const line of input.track)
    for (const p of line)
      if (!Number.isFinite(p.lon) || !Number.isFinite(p.lat) || Math.abs(p.lon) > 180 || Math.abs(p.lat) > 90)
        throw new Error(`The track has a position that is not a longitude/latitude in degrees (${p.lon}, ${p.lat})`);

  const proj = projectionForField(input.boundary);
  const fieldJ = readJsts(proj.forwardGeometry(input.boundary));
  const { areaM2: fieldM2, acres: fieldAcresValue } = fieldArea(input.boundary);
  // Planar areas in the local plane, scaled to the ellipsoid (the factor is within 1e-5 of 1).
  const scale = fieldM2 / fieldJ.getArea();
  const acres = (m2: number) => m2ToAcres(m2 * scale);

  const hazardsXY = input.hazards && {
    ...input.hazards,
    features: input.hazards.features.filter((f) => f.geometry).map((f) => ({ ...f, geometry: proj.forwardGeometry(f.geometry) })),
  };
  const zones = hazardZones(hazardsXY);
  const region = zones ? difference(fieldJ, zones) : fieldJ;

  const regionXY = writePolygonal(region);
  const rings: XY[][] = !regionXY
    ? []
    : (regionXY.type === 'Polygon' ? [regionXY.coordinates] : regionXY.coordinates).flat().map((r) => r.map((p) => [p[0], p[1]] as XY));
  const env = region.getEnvelopeInternal();
  const dy = Math.max(MIN_SCAN_M, env.getHeight() / SCANLINES);

  const runs = workingRuns(input.track, proj);
  if (runs.trackPoints < 2) throw new Error('The track has fewer than two points; there is nothing to measure');
  const passes = trackPasses(runs.runs);
  const sweep = sweepCoverage(rings, passes, w / 2, dy);
  const mapDy = Math.max(dy, env.getHeight() / MAP_SCANLINES);
  const mapSweep = mapDy > dy ? sweepCoverage(rings, passes, w / 2, mapDy) : sweep;

  let sliverM2 = 0;
  const isSkip = (p: { areaM2: number; widthM: number }) => p.areaM2 >= SLIVER_AREA_M2 && p.widthM >= SLIVER_WIDTH_M;
  const skipPieces = piecesOf(sweep.uncovered, sweep.y0, sweep.dy, (p) => {
    if (!isSkip(p)) sliverM2 += p.areaM2;
    return isSkip(p);
  });
  const skippedM2 = skipPieces.reduce((a, p) => a + p.areaM2, 0);
  skipPieces.sort((a, b) => b.areaM2 - a.areaM2);
  const skips = skipPieces.map((p) => ({ acres: acres(p.areaM2), centroid: proj.inverse([p.cx, p.cy]) }));
  const lonLat = (pieces: Piece[], dy = sweep.dy): MultiPolygon | null => {
    const polys = pieces.flatMap((p) => p.rings.map((r) => [simplifyLine(r, dy / 2).map((xy) => proj.inverse(xy))]));
    return polys.length ? { type: 'MultiPolygon', coordinates: polys } : null;
  };
  const workRegionM2 = region.getArea();
  return {
    fieldAcres: fieldAcresValue,
    workRegionAcres: acres(workRegionM2),
    coveredAcres: acres(sweep.coveredM2),
    skippedAcres: acres(skippedM2),
    sliverAcres: acres(sliverM2),
    workedTwiceAcres: acres(sweep.twiceM2),
    skipCount: skips.length,
    skips,
    trackLengthM: runs.trackLengthM,
    workingLengthM: runs.workingLengthM,
    passCount: passes.length,
    trackPoints: runs.trackPoints,
    widthM: w,
    scanSpacingM: sweep.dy,
    geometry: {
      skipped: lonLat(skipPieces),
      covered: lonLat(
        piecesOf(closeGaps(mapSweep.covered, MAP_GAP_M), mapSweep.y0, mapSweep.dy, () => true),
        mapSweep.dy,
      ),
      // Drawn only where it is more than a sliver: neighbouring passes driven exactly one width
      // apart touch along hairline strips that a map would show as lines.
      twice: lonLat(piecesOf(mapSweep.twice, mapSweep.y0, mapSweep.dy, isSkip), mapSweep.dy),
    },
  };
}
