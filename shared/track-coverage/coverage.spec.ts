import fc from 'fast-check';
import type { FeatureCollection, MultiPolygon, Polygon } from 'geojson';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import GeometryFactory from 'jsts/org/locationtech/jts/geom/GeometryFactory.js';
import GeoJSONReader from 'jsts/org/locationtech/jts/io/GeoJSONReader.js';
import BufferOp from 'jsts/org/locationtech/jts/operation/buffer/BufferOp.js';
import BufferParameters from 'jsts/org/locationtech/jts/operation/buffer/BufferParameters.js';
import OverlayOp from 'jsts/org/locationtech/jts/operation/overlay/OverlayOp.js';
import { projectionForField, localProjection, type LocalProjection } from '../geo/local-projection';
import { geodesicAreaM2 } from '../geo/geodesic-area';
import { ftToM, m2ToAcres } from '../units';
import { computeCoverage, SLIVER_AREA_M2, SLIVER_WIDTH_M, type TrackPoint } from './coverage';

const W = ftToM(60); // 18.288 m
const reader = new GeoJSONReader(new GeometryFactory());

/** A W × H rectangle (metres) centred at 47.6° N, 99.9° W, and the field's own projection. */
function rectangle(widthM: number, heightM: number): { boundary: Polygon; proj: LocalProjection } {
  const c = localProjection([-99.9, 47.6]);
  const x = widthM / 2,
    y = heightM / 2;
  const ring = [
    [-x, -y],
    [x, -y],
    [x, y],
    [-x, y],
    [-x, -y],
  ].map((p) => c.inverse(p));
  const boundary: Polygon = { type: 'Polygon', coordinates: [ring] };
  return { boundary, proj: projectionForField(boundary) };
}

const fixOf = (proj: LocalProjection, xy: number[], working = true): TrackPoint => {
  const [lon, lat] = proj.inverse(xy);
  return { lon, lat, working };
};

/** Back and forth along y at the given x's, from y = from to y = to, lifted across the ends. */
function backAndForth(proj: LocalProjection, xs: number[], from: number, to: number): TrackPoint[] {
  const out: TrackPoint[] = [];
  xs.forEach((x, i) => {
    const [a, b] = i % 2 === 0 ? [from, to] : [to, from];
    out.push(fixOf(proj, [x, a]), fixOf(proj, [x, (a + b) / 2]), fixOf(proj, [x, b], false));
  });
  return out;
}

const acresOf = (m2: number) => m2ToAcres(m2);

describe('coverage of a logged track: closed-form cases (areas worked by hand; rectangle areas against GeographicLib)', () => {
  const n = 10;
  const H = 400;

  it('when passes are spaced exactly one width and run past both ends, then the rectangle is covered once with no skip', () => {
    const L = n * W;
    const { boundary, proj } = rectangle(L, H);
    const xs = Array.from({ length: n }, (_, i) => -L / 2 + W / 2 + i * W);
    const r = computeCoverage({ boundary, track: [backAndForth(proj, xs, -H / 2 - 30, H / 2 + 30)], widthM: W });
    // Source: the field's area on the ellipsoid (GeographicLib, through fieldAcres) = L × H here.
    expect(r.fieldAcres).toBeCloseTo(acresOf(geodesicAreaM2(boundary)), 6);
    expect(r.coveredAcres).toBeCloseTo(acresOf(L * H), 3); // hand: L × H
    expect(r.skippedAcres).toBe(0);
    expect(r.skipCount).toBe(0);
    expect(r.workedTwiceAcres).toBeCloseTo(0, 4); // hand: neighbours touch, never overlap
    expect(r.passCount).toBe(n);
  });

  it('when the same passes stop 5 m short of each end, then the skips are exactly the two end strips', () => {
    const L = n * W;
    const { boundary, proj } = rectangle(L, H);
    const xs = Array.from({ length: n }, (_, i) => -L / 2 + W / 2 + i * W);
    const r = computeCoverage({ boundary, track: [backAndForth(proj, xs, -H / 2 + 5, H / 2 - 5)], widthM: W });
    // Hand: two strips of L × 5 m, one at each end (flat ends).
    expect(r.skipCount).toBe(2);
    expect(r.skippedAcres).toBeCloseTo(acresOf(2 * L * 5), 3);
    expect(r.coveredAcres).toBeCloseTo(acresOf(L * (H - 10)), 3);
    for (const s of r.skips) expect(Math.abs(proj.forward(s.centroid)[1])).toBeCloseTo(H / 2 - 2.5, 1);
  });

  it('when passes are spaced 1.1 widths, then the skips are the n − 1 strips 0.1 width wide between them', () => {
    const L = (n - 1) * 1.1 * W + W;
    const { boundary, proj } = rectangle(L, H);
    const xs = Array.from({ length: n }, (_, i) => -L / 2 + W / 2 + i * 1.1 * W);
    const r = computeCoverage({ boundary, track: [backAndForth(proj, xs, -H / 2 - 30, H / 2 + 30)], widthM: W });
    // Hand: 9 strips of 0.1 × 18.288 m × 400 m = 658.37 m² each.
    expect(r.skipCount).toBe(n - 1);
    expect(r.skippedAcres).toBeCloseTo(acresOf((n - 1) * 0.1 * W * H), 3);
    expect(r.coveredAcres).toBeCloseTo(acresOf(n * W * H), 3);
    expect(r.workedTwiceAcres).toBeCloseTo(0, 4);
  });

  it("when passes are spaced 0.9 widths, then the map's covered and twice outlines hold the covered and twice acres", () => {
    const L = (n - 1) * 0.9 * W + W;
    const { boundary, proj } = rectangle(L, H);
    const xs = Array.from({ length: n }, (_, i) => -L / 2 + W / 2 + i * 0.9 * W);
    const r = computeCoverage({ boundary, track: [backAndForth(proj, xs, -H / 2 - 30, H / 2 + 30)], widthM: W });
    const areaOf = (g: MultiPolygon | null) =>
      (g?.coordinates ?? []).reduce((a, rings) => a + geodesicAreaM2({ type: 'Polygon', coordinates: rings }), 0);
    // Hand: the whole L × H rectangle is covered, and 9 strips of 0.1 W × H are worked twice; outline
    // areas on the ellipsoid (GeographicLib, through geodesicAreaM2), within the strips' simplification.
    expect(Math.abs(areaOf(r.geometry.covered) - L * H) / (L * H)).toBeLessThan(0.002);
    expect(Math.abs(areaOf(r.geometry.twice) - (n - 1) * 0.1 * W * H) / ((n - 1) * 0.1 * W * H)).toBeLessThan(0.01);
    expect(r.geometry.skipped).toBeNull();
  });

  it('when passes are spaced 0.9 widths, then the strips where neighbours overlap are worked twice', () => {
    const L = (n - 1) * 0.9 * W + W;
    const { boundary, proj } = rectangle(L, H);
    const xs = Array.from({ length: n }, (_, i) => -L / 2 + W / 2 + i * 0.9 * W);
    const r = computeCoverage({ boundary, track: [backAndForth(proj, xs, -H / 2 - 30, H / 2 + 30)], widthM: W });
    // Hand: 9 overlaps of 0.1 W × H; nothing skipped.
    expect(r.workedTwiceAcres).toBeCloseTo(acresOf((n - 1) * 0.1 * W * H), 3);
    expect(r.skippedAcres).toBe(0);
  });

  it('when one pass is driven back over itself, then all of it is worked twice except the round join at the turn', () => {
    const { boundary, proj } = rectangle(200, H);
    const track = [fixOf(proj, [0, -150]), fixOf(proj, [0, 150]), fixOf(proj, [0, -150])];
    const r = computeCoverage({ boundary, track: [track], widthM: W });
    // Hand: 300 m × W, less the half disc of radius W/2 inside it around the turning point.
    expect(r.passCount).toBe(2);
    expect(r.workedTwiceAcres).toBeCloseTo(acresOf(300 * W - (Math.PI * (W / 2) ** 2) / 2), 2);
    // Covered: the strip plus the half disc of the reversal's round join beyond its end.
    expect(r.coveredAcres).toBeCloseTo(acresOf(300 * W + (Math.PI * (W / 2) ** 2) / 2), 2);
  });

  it('when the log says the implement was lifted, then that part of the track covers nothing', () => {
    const { boundary, proj } = rectangle(200, H);
    const track = [fixOf(proj, [0, -150]), fixOf(proj, [0, 0], false), fixOf(proj, [0, 150])];
    const r = computeCoverage({ boundary, track: [track], widthM: W });
    expect(r.coveredAcres).toBeCloseTo(acresOf(150 * W), 3); // hand: only the first half
    expect(r.trackLengthM).toBeCloseTo(300, 3);
    expect(r.workingLengthM).toBeCloseTo(150, 3);
  });

  it('when two fixes are more than 30 s apart, then they are not joined', () => {
    const { boundary, proj } = rectangle(200, H);
    const t0 = Date.UTC(2026, 4, 10, 7);
    const track = [0, 60, 120].map((y, i) => ({ ...fixOf(proj, [0, y - 100]), t: t0 + (i === 2 ? 100_000 : i * 10_000) }));
    const r = computeCoverage({ boundary, track: [track], widthM: W });
    expect(r.coveredAcres).toBeCloseTo(acresOf(60 * W), 3);
  });
});

// ---------------------------------------------------------------------------------------------
// The same tracks buffered and clipped by JTS (jsts), done here independently of the module.

const dir = join(__dirname, '../../tests/fixtures/geo');
const fixture = (name: string) => ({
  boundary: JSON.parse(readFileSync(join(dir, `${name}.geojson`), 'utf8')).features[0].geometry as Polygon,
  hazards: JSON.parse(readFileSync(join(dir, `${name}-hazards.geojson`), 'utf8')) as FeatureCollection,
});

/** A slanted back-and-forth track over the field's box, lifted at the ends, with some passes off spacing. */
function slantedTrack(proj: LocalProjection, boundary: Polygon, headingDeg: number): TrackPoint[] {
  const xy = proj.forwardGeometry(boundary).coordinates[0];
  const xs = xy.map((p) => p[0]),
    ys = xy.map((p) => p[1]);
  const cx = (Math.min(...xs) + Math.max(...xs)) / 2,
    cy = (Math.min(...ys) + Math.max(...ys)) / 2;
  const half = Math.hypot(Math.max(...xs) - Math.min(...xs), Math.max(...ys) - Math.min(...ys)) / 2 + W;
  const a = (headingDeg * Math.PI) / 180;
  const at = (u: number, v: number) => [cx + u * Math.cos(a) + v * Math.sin(a), cy - u * Math.sin(a) + v * Math.cos(a)];
  const out: TrackPoint[] = [];
  let u = -half;
  for (let k = 0; u < half; k++) {
    const [v0, v1] = k % 2 === 0 ? [-half, half] : [half, -half];
    // A gentle S-bend in every pass, so joins are not all straight.
    for (let s = 0; s <= 40; s++) {
      const v = v0 + ((v1 - v0) * s) / 40;
      out.push(fixOf(proj, at(u + 3 * Math.sin(v / 60), v), s < 40));
    }
    u += W * (k % 5 === 2 ? 1.25 : k % 7 === 3 ? 0.8 : 1);
  }
  return out;
}

function jtsReference(boundary: Polygon, hazards: FeatureCollection, track: TrackPoint[], proj: LocalProjection) {
  const fieldJ = reader.read(proj.forwardGeometry(boundary));
  let region = fieldJ;
  for (const f of hazards.features) {
    const g = reader.read(proj.forwardGeometry(f.geometry!));
    const clearance = Number(f.properties?.clearanceM ?? 0);
    const zone = BufferOp.bufferOp(g, clearance, 16);
    if (!zone.isEmpty()) region = OverlayOp.difference(region, zone);
  }
  const runs: number[][][] = [];
  let run: number[][] = [];
  for (const p of track) {
    const xy = proj.forward([p.lon, p.lat]);
    if (run.length) run.push(xy);
    if (p.working !== false) {
      if (!run.length) run.push(xy);
    } else {
      if (run.length >= 2) runs.push(run);
      run = [];
    }
  }
  if (run.length >= 2) runs.push(run);
  const params = new BufferParameters();
  params.setQuadrantSegments(16);
  params.setJoinStyle(BufferParameters.JOIN_ROUND);
  params.setEndCapStyle(BufferParameters.CAP_FLAT);
  const swath = BufferOp.bufferOp(reader.read({ type: 'MultiLineString', coordinates: runs }), W / 2, params);
  const covered = OverlayOp.intersection(region, swath);
  const uncovered = OverlayOp.difference(region, swath);
  let skippedM2 = 0;
  for (let i = 0; i < uncovered.getNumGeometries(); i++) {
    const p = uncovered.getGeometryN(i);
    const a = p.getArea();
    if (a >= SLIVER_AREA_M2 && (2 * a) / p.getLength() >= SLIVER_WIDTH_M) skippedM2 += a;
  }
  const scale = geodesicAreaM2(boundary) / fieldJ.getArea();
  return {
    region: m2ToAcres(region.getArea() * scale),
    covered: m2ToAcres(covered.getArea() * scale),
    skipped: m2ToAcres(skippedM2 * scale),
  };
}

describe('coverage against an independent overlay (JTS buffer and overlay, jsts)', () => {
  it.each([
    ['draw-section', 20],
    ['slough-quarter', 75],
  ])(
    'when the %s fixture (a hole, hazards) is worked at %i°, then covered and skipped acres agree with JTS within 0.1 %%',
    (name, heading) => {
      const { boundary, hazards } = fixture(name);
      const proj = projectionForField(boundary);
      const track = slantedTrack(proj, boundary, heading);
      const r = computeCoverage({ boundary, hazards, track: [track], widthM: W });
      const ref = jtsReference(boundary, hazards, track, proj);
      // Source: JTS Topology Suite (jsts 2.12) BufferOp + OverlayOp on the same track and region.
      expect(r.workRegionAcres).toBeCloseTo(ref.region, 6);
      expect(Math.abs(r.coveredAcres - ref.covered) / ref.covered).toBeLessThan(0.001);
      expect(ref.skipped).toBeGreaterThan(1);
      expect(Math.abs(r.skippedAcres - ref.skipped) / ref.skipped).toBeLessThan(0.001);
    },
  );
});

describe('coverage properties (fast-check)', () => {
  const { boundary, proj } = rectangle(300, 300);
  const walk = fc.array(
    fc.record({
      x: fc.double({ min: -200, max: 200, noNaN: true }),
      y: fc.double({ min: -200, max: 200, noNaN: true }),
      working: fc.boolean(),
    }),
    { minLength: 2, maxLength: 40 },
  );
  it('when any track is driven at any width, then covered + skipped + slivers = work region, and covered ≤ work region', () => {
    fc.assert(
      fc.property(walk, fc.double({ min: 2, max: 40, noNaN: true }), (pts, widthM) => {
        const track = pts.map((p) => fixOf(proj, [p.x, p.y], p.working));
        const r = computeCoverage({ boundary, track: [track], widthM });
        // The area sums are taken on scanlines: they agree with the exact region within 0.05 %.
        const tol = 0.0005 * r.workRegionAcres;
        expect(Math.abs(r.coveredAcres + r.skippedAcres + r.sliverAcres - r.workRegionAcres)).toBeLessThan(tol);
        expect(r.coveredAcres).toBeLessThanOrEqual(r.workRegionAcres + tol);
        expect(r.workedTwiceAcres).toBeLessThanOrEqual(r.coveredAcres + 1e-9);
        // Every skip reported is at least the stated sliver threshold (common practice, no published source).
        for (const s of r.skips) expect(s.acres).toBeGreaterThanOrEqual(m2ToAcres(SLIVER_AREA_M2) - 1e-12);
      }),
      { numRuns: 60 },
    );
  });
});
