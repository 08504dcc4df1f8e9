import fc from 'fast-check';
import type { MultiPolygon, Polygon, Position } from 'geojson';
import GeometryFactory from 'jsts/org/locationtech/jts/geom/GeometryFactory.js';
import GeoJSONReader from 'jsts/org/locationtech/jts/io/GeoJSONReader.js';
import OverlayOp from 'jsts/org/locationtech/jts/operation/overlay/OverlayOp.js';
import { localProjection } from './local-projection';
import { findOverlaps, OVERLAP_MIN_ACRES, sharedAreaM2 } from './overlap';
import { m2ToAcres } from '../units';

// The outside reference: JTS's overlay (jsts OverlayOp.intersection) in a transverse Mercator
// plane centred on the fields (proj4 tmerc on WGS84, scale error below 1e-7 over a few km, so a
// planar area there is within 0.001 % of the geodesic one), measured with JTS's planar getArea.
//
// Both sides must mean the same lines. GeoJSON's edges are straight in longitude and latitude
// (RFC 7946, 3.1.1), and the overlap is clipped that way; projected to the plane, such an edge
// bows away from the straight line between its projected ends (an east–west edge follows its
// parallel: about 2 cm off the chord in the middle of a 1 km edge at 47.6° N, L² tan φ ÷ 8R).
// So each edge is cut into pieces of at most DENSIFY_DEG before it is projected for JTS: the
// bow of a 1 m piece is far below a millimetre.

const reader = new GeoJSONReader(new GeometryFactory());
const plane = localProjection([-99.9, 47.6]);

/** A boundary given in local metres (x east, y north of 47.6° N, 99.9° W), as lon/lat. */
const fromMetres = (rings: number[][][]): Polygon => plane.inverseGeometry({ type: 'Polygon', coordinates: rings });
const rect = (x0: number, y0: number, x1: number, y1: number): Polygon =>
  fromMetres([
    [
      [x0, y0],
      [x1, y0],
      [x1, y1],
      [x0, y1],
      [x0, y0],
    ],
  ]);

/** About 11 m of latitude: edges are cut into pieces no longer than this, in degrees. */
const DENSIFY_DEG = 1e-4;

/** The same boundary with extra points along each edge, straight in lon/lat between them (see above). */
function densified(g: Polygon | MultiPolygon): Polygon | MultiPolygon {
  const ring = (r: Position[]): Position[] => {
    const out: Position[] = [r[0]];
    for (let i = 1; i < r.length; i++) {
      const [x0, y0] = r[i - 1];
      const [x1, y1] = r[i];
      const n = Math.max(1, Math.ceil(Math.max(Math.abs(x1 - x0), Math.abs(y1 - y0)) / DENSIFY_DEG));
      for (let k = 1; k <= n; k++) out.push([x0 + ((x1 - x0) * k) / n, y0 + ((y1 - y0) * k) / n]);
    }
    return out;
  };
  return g.type === 'Polygon'
    ? { type: 'Polygon', coordinates: g.coordinates.map(ring) }
    : { type: 'MultiPolygon', coordinates: g.coordinates.map((p) => p.map(ring)) };
}

/** JTS's intersection area of two lon/lat boundaries, m², in the local plane. */
function jtsSharedM2(a: Polygon | MultiPolygon, b: Polygon | MultiPolygon): number {
  return jtsShared(a, b).areaM2;
}

/** JTS's intersection of two lon/lat boundaries in the local plane: its area (m²) and perimeter (m). */
function jtsShared(a: Polygon | MultiPolygon, b: Polygon | MultiPolygon): { areaM2: number; perimeterM: number } {
  const ga = reader.read(plane.forwardGeometry(densified(a)));
  const gb = reader.read(plane.forwardGeometry(densified(b)));
  const shared = OverlayOp.intersection(ga, gb);
  return { areaM2: shared.getArea() as number, perimeterM: shared.getLength() as number };
}

const field = (id: number, name: string, boundary: Polygon | MultiPolygon) => ({ id, name, boundary });

describe('overlapping boundaries', () => {
  it('when a quarter section is redrawn 100 m into its neighbour, then the overlap matches JTS overlay within 0.01 %', () => {
    const north = rect(0, 804.672, 804.672, 1609.344);
    const drawn = rect(0, -100, 804.672, 904.672);
    const [found] = findOverlaps(drawn, [field(7, 'North quarter', north)]);
    const reference = jtsSharedM2(drawn, north); // JTS OverlayOp, planar m² in tmerc
    expect(reference).toBeCloseTo(80_467.2, 0); // 100 m × 804.672 m, worked by hand
    expect(found.name).toBe('North quarter');
    expect(found.fieldId).toBe(7);
    expect(Math.abs(found.areaM2 - reference) / reference).toBeLessThan(1e-4);
    expect(found.acres).toBeCloseTo(m2ToAcres(reference), 1);
  });

  it('when two fields only share an edge, then no overlap is reported', () => {
    const west = rect(0, 0, 400, 800);
    const east = rect(400, 0, 800, 800);
    expect(jtsSharedM2(west, east)).toBeLessThan(1); // JTS: the shared edge has no area
    expect(findOverlaps(east, [field(1, 'West', west)])).toEqual([]);
  });

  it('when two tracings of one fence disagree by 1.5 m, then the sliver is left out', () => {
    const west = rect(0, 0, 400, 800);
    const east = rect(398.5, 0, 800, 800); // 1.5 m × 800 m = 1,200 m² ≈ 0.3 ac, but thinner than 2 m
    expect(jtsSharedM2(west, east)).toBeCloseTo(1200, 0); // JTS OverlayOp
    expect(sharedAreaM2(west, east)).toBe(0);
    expect(findOverlaps(east, [field(1, 'West', west)])).toEqual([]);
  });

  it('when the overlap is wide but under 0.1 ac, then it is left out; just over, it is reported', () => {
    const home = rect(0, 0, 400, 400);
    const small = rect(385, 385, 600, 600); // 15 m × 15 m = 225 m² ≈ 0.056 ac
    const larger = rect(375, 375, 600, 600); // 25 m × 25 m = 625 m² ≈ 0.154 ac
    expect(m2ToAcres(jtsSharedM2(small, home))).toBeLessThan(OVERLAP_MIN_ACRES);
    expect(findOverlaps(small, [field(1, 'Home', home)])).toEqual([]);
    const [found] = findOverlaps(larger, [field(1, 'Home', home)]);
    expect(found.areaM2).toBeCloseTo(jtsSharedM2(larger, home), -1); // JTS OverlayOp
  });

  it('when the new boundary overlaps two fields and misses a third, then both are named, largest first', () => {
    const drawn = rect(0, 0, 800, 800);
    const fields = [
      field(1, 'Slough quarter', rect(700, 0, 1500, 800)),
      field(2, 'Home half', rect(-800, 0, 300, 800)),
      field(3, 'River flat', rect(5000, 5000, 5800, 5800)),
    ];
    const found = findOverlaps(drawn, fields);
    expect(found.map((f) => f.name)).toEqual(['Home half', 'Slough quarter']);
    for (const f of found) {
      const reference = jtsSharedM2(drawn, fields.find((x) => x.id === f.fieldId)!.boundary);
      expect(Math.abs(f.areaM2 - reference) / reference).toBeLessThan(1e-4); // JTS OverlayOp
    }
  });

  it('when a field has a hole or several parts, then the overlap counts only land in both (JTS agrees)', () => {
    const holed = fromMetres([
      [
        [0, 0],
        [800, 0],
        [800, 800],
        [0, 800],
        [0, 0],
      ],
      [
        [200, 200],
        [200, 600],
        [600, 600],
        [600, 200],
        [200, 200],
      ],
    ]);
    const twoParts: MultiPolygon = {
      type: 'MultiPolygon',
      coordinates: [rect(100, 100, 700, 300).coordinates, rect(-300, 700, 300, 1000).coordinates],
    };
    const [found] = findOverlaps(twoParts, [field(4, 'Slough quarter', holed)]);
    const reference = jtsSharedM2(twoParts, holed); // JTS OverlayOp
    expect(Math.abs(found.areaM2 - reference) / reference).toBeLessThan(1e-4);
  });

  it('when random quadrilaterals overlap, then the area agrees with JTS overlay within 0.05 % or nothing is reported', () => {
    // A square of random size and place with each corner moved up to 40 % of its half-side: always a simple ring.
    const quad = fc
      .record({
        cx: fc.integer({ min: -500, max: 500 }),
        cy: fc.integer({ min: -500, max: 500 }),
        half: fc.integer({ min: 50, max: 500 }),
        jitter: fc.array(fc.double({ min: -0.4, max: 0.4, noNaN: true }), { minLength: 8, maxLength: 8 }),
      })
      .map(({ cx, cy, half, jitter }): Polygon => {
        const corners = [
          [-1, -1],
          [1, -1],
          [1, 1],
          [-1, 1],
        ].map(([sx, sy], i) => [cx + half * (sx + jitter[2 * i]), cy + half * (sy + jitter[2 * i + 1])]);
        return fromMetres([[...corners, corners[0]]]);
      });
    fc.assert(
      fc.property(quad, quad, (a, b) => {
        const { areaM2: reference, perimeterM } = jtsShared(a, b);
        const ours = sharedAreaM2(a, b);
        // Thin pieces are left out on purpose; where ours counts, it must agree with JTS within
        // 0.05 %, or a strip 1 mm wide along the overlap's edge (the densified edges' own bow).
        if (ours > 0) expect(Math.abs(ours - reference)).toBeLessThan(Math.max(0.001 * perimeterM, 5e-4 * reference));
        else expect(findOverlaps(a, [field(1, 'x', b)])).toEqual([]);
      }),
      { numRuns: 150 },
    );
  });
});
