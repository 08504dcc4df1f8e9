import type { Polygon } from 'geojson';
import { localProjection } from '../geo/local-projection';
import { ACRE_M2, mphToMps } from '../units';
import { planPasses } from './plan-passes';

// Closed-form cases (geometry, worked by hand in the comments): a square field drawn in a
// transverse Mercator plane centred on 47.6° N, 99.9° W and sent as lon/lat, so its plane geometry
// is known exactly. W = 60 ft = 18.288 m (1 ft = 0.3048 m, 85 FR 62698).

const W = 18.288;
const proj = localProjection([-99.9, 47.6]);
const squareField = (side: number): Polygon =>
  proj.inverseGeometry<Polygon>({
    type: 'Polygon',
    coordinates: [
      [
        [-side / 2, -side / 2],
        [side / 2, -side / 2],
        [side / 2, side / 2],
        [-side / 2, side / 2],
        [-side / 2, -side / 2],
      ],
    ],
  });
const rel = (a: number, b: number): number => Math.abs(a / b - 1);

describe('planPasses on a square field of 44 widths (a half-mile square, 160 acres)', () => {
  const S = 44 * W; // 804.672 m = ½ mile
  const L = 40 * W; // interior side inside 2 headland passes
  const boundary = squareField(S);

  it.each([0, 90])('when the heading is %i°, then 40 passes of the interior side, 39 turns and no gaps', (heading) => {
    const r = planPasses({ boundary, widthM: W, headingDeg: heading, speedMps: mphToMps(5), turnSeconds: 20 });
    // ½ mile square = 160 acres (1 mile = 1609.344 m; 1 acre = 4046.8564224 m²).
    expect(rel(r.fieldAcres, 160)).toBeLessThan(1e-6);
    expect(rel(r.interiorAcres, (L * L) / ACRE_M2)).toBeLessThan(1e-6);
    expect(rel(r.headlandAcres, (S * S - L * L) / ACRE_M2)).toBeLessThan(1e-6);
    expect(r.passCount).toBe(40); // interior = 40 widths exactly
    expect(r.segmentCount).toBe(40);
    expect(r.turns).toBe(39); // back and forth over a convex field: turns = passes − 1
    expect(rel(r.passLengthM, 40 * L)).toBeLessThan(1e-9);
    expect(rel(r.workedAcres, r.interiorAcres)).toBeLessThan(1e-9);
    expect(r.unworkedAcres).toBe(0);
    expect(r.overlapAcres).toBe(0);
    // Laps at W/2 and 1.5 W inside: squares of side 43 W and 41 W → 4 × (43 + 41) W.
    expect(rel(r.headlandLengthM, 336 * W)).toBeLessThan(1e-9);
    const hours = (40 * L + 336 * W) / mphToMps(5) / 3600 + (39 * 20) / 3600;
    expect(rel(r.hours, hours)).toBeLessThan(1e-9);
  });

  it('when the heading is 0° (north), then pass 1 runs half a width in from the west edge of the interior', () => {
    const r = planPasses({ boundary, widthM: W, headingDeg: 0 });
    const first = r.passes.features.find((f) => f.properties.pass === 1)!;
    const [x0, y0] = proj.forward(first.geometry.coordinates[0]);
    const [x1, y1] = proj.forward(first.geometry.coordinates[1]);
    expect(Math.abs(x0 - (-L / 2 + W / 2))).toBeLessThan(1e-6);
    expect(Math.abs(x1 - x0)).toBeLessThan(1e-6);
    expect(y1).toBeGreaterThan(y0); // drawn along the heading
  });

  it('when the heading is 90° (east), then pass 1 runs half a width in from the north edge (left looking east)', () => {
    const r = planPasses({ boundary, widthM: W, headingDeg: 90 });
    const first = r.passes.features.find((f) => f.properties.pass === 1)!;
    const [, y0] = proj.forward(first.geometry.coordinates[0]);
    expect(Math.abs(y0 - (L / 2 - W / 2))).toBeLessThan(1e-6);
  });

  it('when the heading is 45°, then the passes are the chords of the interior diamond', () => {
    // By hand: across 45° the interior square spans its diagonal D = 40√2 W = 56.57 W. Pass centres sit
    // at s = W/2 + kW from the left corner while s < D: k = 0 … ceil(40√2 − ½) − 1 = 56, so 57 passes.
    // A chord at distance s from a corner of a square turned 45° is 2·min(s, D − s) long.
    const r = planPasses({ boundary, widthM: W, headingDeg: 45 });
    const D = L * Math.SQRT2;
    let total = 0;
    for (let k = 0; k < 57; k++) total += 2 * Math.min(W / 2 + k * W, D - (W / 2 + k * W));
    expect(r.passCount).toBe(57);
    expect(r.segmentCount).toBe(57);
    expect(r.turns).toBe(56);
    expect(rel(r.passLengthM, total)).toBeLessThan(1e-9);
    // 57 W > D: the swaths reach past the far corner, so the interior is fully worked.
    expect(rel(r.workedAcres, (L * L) / ACRE_M2)).toBeLessThan(1e-9);
    expect(r.unworkedAcres).toBe(0);
  });

  it('when the heading is auto, then a heading along an edge (40 passes, 39 turns) is chosen', () => {
    const r = planPasses({ boundary, widthM: W });
    expect(r.turns).toBe(39);
    expect([0, 90]).toContain(r.headingDeg);
  });
});

describe('planPasses when the interior is not a whole number of widths', () => {
  // Side 44.3 W: interior 40.3 W. At heading 0, centres at W/2 + kW < 40.3 W → k ≤ 39, 40 passes covering
  // 40 W; a strip 0.3 W wide stays unworked. Full coverage adds pass 41 against the east edge, whose swath
  // overlaps pass 40's by 40 W − (40.3 W − W) = 0.7 W.
  const L = 40.3 * W;
  const boundary = squareField(44.3 * W);

  it('when gaps are allowed, then a 0.3-width strip the length of the field stays unworked', () => {
    const r = planPasses({ boundary, widthM: W, headingDeg: 0, coverage: 'gaps-ok' });
    expect(r.passCount).toBe(40);
    expect(rel(r.workedAcres, (40 * W * L) / ACRE_M2)).toBeLessThan(1e-6);
    expect(rel(r.unworkedAcres, (0.3 * W * L) / ACRE_M2)).toBeLessThan(1e-6);
    expect(r.overlapAcres).toBe(0);
    expect(r.unworked.features.length).toBe(1);
    // 0.3 × 18.288 m × 40.3 × 18.288 m = 4,043.5 m² = 0.999 ac (1 ac = 4,046.856 422 4 m²), written as
    // every acre figure is (shared/figures.ts, one decimal).
    expect(r.warnings).toContain('1.0 ac of the field stay unworked at even spacing; choose full coverage to add a last pass');
  });

  it('when full coverage is asked, then pass 41 is added and overlaps its neighbour by 0.7 width', () => {
    const r = planPasses({ boundary, widthM: W, headingDeg: 0, coverage: 'full' });
    expect(r.passCount).toBe(41);
    expect(r.turns).toBe(40);
    expect(r.unworkedAcres).toBe(0);
    expect(rel(r.workedAcres, (L * L) / ACRE_M2)).toBeLessThan(1e-6);
    expect(rel(r.overlapAcres, (0.7 * W * L) / ACRE_M2)).toBeLessThan(1e-6);
    const last = r.passes.features.find((f) => f.properties.pass === 41)!;
    expect(Math.abs(proj.forward(last.geometry.coordinates[0])[0] - (L / 2 - W / 2))).toBeLessThan(1e-6);
    expect(r.overlap.features.length).toBe(1);
  });
});
