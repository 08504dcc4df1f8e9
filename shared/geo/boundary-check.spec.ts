import type { MultiPolygon, Polygon } from 'geojson';
import GeometryFactory from 'jsts/org/locationtech/jts/geom/GeometryFactory.js';
import GeoJSONReader from 'jsts/org/locationtech/jts/io/GeoJSONReader.js';
import IsValidOp from 'jsts/org/locationtech/jts/operation/valid/IsValidOp.js';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { MAX_BOUNDARY_RINGS, MAX_BOUNDARY_VERTICES } from '../limits';
import { assertBoundary, checkAndMeasureBoundary, checkBoundary } from './boundary-check';
import { fieldAcres, geodesicAreaM2 } from './geodesic-area';

// Rules checked: RFC 7946 §3.1.6 (a linear ring is closed, has ≥ 4 positions; positions are
// [longitude, latitude], §3.1.1) and the OGC Simple Features polygon rules (rings do not cross
// themselves or each other, holes lie inside the shell; OGC 06-103r4 §6.1.11, from memory).
// Where a rule is geometric, JTS's IsValidOp (jsts) is the independent reference.

const reader = new GeoJSONReader(new GeometryFactory());
const jtsValid = (g: Polygon | MultiPolygon): boolean => new IsValidOp(reader.read(g)).isValid();
const poly = (...rings: number[][][]): Polygon => ({ type: 'Polygon', coordinates: rings });
const multi = (...parts: number[][][][]): MultiPolygon => ({ type: 'MultiPolygon', coordinates: parts });
const square = [
  [-99.92, 47.6],
  [-99.9, 47.6],
  [-99.9, 47.61],
  [-99.92, 47.61],
  [-99.92, 47.6],
];

describe('checkBoundary', () => {
  it('when the boundary is a plain square, then there is no problem (and JTS agrees it is valid)', () => {
    expect(checkBoundary(poly(square))).toEqual([]);
    expect(jtsValid(poly(square))).toBe(true);
  });

  it('when the geometry is a Point or a LineString, then the message says what it is', () => {
    expect(checkBoundary({ type: 'Point', coordinates: [-99.9, 47.6] }, 'North Quarter')[0].message).toBe(
      "The boundary of field 'North Quarter' is a Point, not a Polygon or MultiPolygon",
    );
    expect(checkBoundary({ type: 'LineString', coordinates: square })[0]).toMatchObject({
      code: 'not-polygon',
      message: expect.stringContaining('LineString'),
    });
    expect(checkBoundary(null)[0].code).toBe('not-polygon');
  });

  it('when a ring has 3 positions, then it is too short (RFC 7946 §3.1.6: ≥ 4)', () => {
    expect(checkBoundary(poly(square.slice(0, 2).concat([square[0]])))[0].code).toBe('too-few-positions');
  });

  it('when the last position does not repeat the first, then the ring is not closed (RFC 7946 §3.1.6)', () => {
    const p = checkBoundary(poly(square.slice(0, 4).concat([[-99.921, 47.6]])), 'X')[0];
    expect(p.code).toBe('not-closed');
    expect(p.message).toBe("Ring 1 of field 'X' is not closed: its last position must repeat the first");
  });

  it('when a coordinate is NaN, a string or out of range, then the vertex is named (1-based)', () => {
    const bad = square.map((p) => [...p]);
    bad[2] = [Number.NaN, 47.61];
    expect(checkBoundary(poly(bad))[0]).toMatchObject({ code: 'not-finite', vertex: 3 });
    bad[2] = [-190, 47.61];
    expect(checkBoundary(poly(bad))[0]).toMatchObject({ code: 'out-of-range', vertex: 3 });
  });

  it('when latitude comes first, then the message says they look swapped (RFC 7946 §3.1.1: longitude first)', () => {
    const swapped = square.map(([lon, lat]) => [lat, lon]);
    const p = checkBoundary(poly(swapped), 'North Quarter')[0];
    expect(p.code).toBe('swapped');
    expect(p.message).toContain('looks like latitude and longitude are swapped');
  });

  it('when the ring is a bow tie, then it crosses itself at the point JTS also finds invalid', () => {
    const bowtie = JSON.parse(readFileSync(join(__dirname, '../../tests/fixtures/geo/bowtie.geojson'), 'utf8')).geometry as Polygon;
    expect(jtsValid(bowtie)).toBe(false);
    const [p] = checkBoundary(bowtie, 'North Quarter');
    expect(p.code).toBe('self-intersection');
    // The two diagonals of the box -99.9…-99.89 × 47.6…47.61 cross at its centre (geometry).
    expect(p.point![0]).toBeCloseTo(-99.895, 9);
    expect(p.point![1]).toBeCloseTo(47.605, 9);
    expect(p.message).toBe("Ring 1 of field 'North Quarter' crosses itself near 47.60500° N, 99.89500° W (between vertex 1 and vertex 3)");
  });

  it('when a ring folds back on itself (a spike), then it is reported, as JTS also rejects it', () => {
    const spike = poly([
      [-99.92, 47.6],
      [-99.9, 47.6],
      [-99.9, 47.61],
      [-99.9, 47.605],
      [-99.92, 47.61],
      [-99.92, 47.6],
    ]);
    expect(jtsValid(spike)).toBe(false);
    expect(checkBoundary(spike)[0].code).toBe('self-intersection');
  });

  it('when a hole crosses the outer ring or lies outside it, then it is reported, as JTS also rejects it', () => {
    const crossing = [
      [-99.905, 47.605],
      [-99.895, 47.605],
      [-99.895, 47.606],
      [-99.905, 47.606],
      [-99.905, 47.605],
    ];
    expect(jtsValid(poly(square, crossing))).toBe(false);
    expect(checkBoundary(poly(square, crossing))[0]).toMatchObject({ code: 'rings-cross', ring: 1 });
    const outside = [
      [-99.89, 47.605],
      [-99.88, 47.605],
      [-99.88, 47.606],
      [-99.89, 47.606],
      [-99.89, 47.605],
    ];
    expect(jtsValid(poly(square, outside))).toBe(false);
    expect(checkBoundary(poly(square, outside))[0]).toMatchObject({ code: 'hole-outside', ring: 2 });
    const inside = [
      [-99.915, 47.603],
      [-99.915, 47.606],
      [-99.91, 47.606],
      [-99.91, 47.603],
      [-99.915, 47.603],
    ];
    expect(jtsValid(poly(square, inside))).toBe(true);
    expect(checkBoundary(poly(square, inside))).toEqual([]);
  });

  it('when all points lie on a line, then the ring encloses no area', () => {
    const line = [
      [-99.92, 47.6],
      [-99.91, 47.605],
      [-99.9, 47.61],
      [-99.92, 47.6],
    ];
    expect(checkBoundary(poly(line))[0].code).toBe('zero-area');
  });

  it('when a MultiPolygon has one part inside another, then the parts overlap', () => {
    const small = [
      [-99.915, 47.603],
      [-99.91, 47.603],
      [-99.91, 47.606],
      [-99.915, 47.606],
      [-99.915, 47.603],
    ];
    const p = checkBoundary({ type: 'MultiPolygon', coordinates: [[square], [small]] })[0];
    expect(p.code).toBe('parts-overlap');
  });

  it('when assertBoundary meets a bad boundary, then it throws the first message; a good one passes', () => {
    expect(() => assertBoundary({ type: 'Point', coordinates: [0, 0] }, 'X')).toThrow("The boundary of field 'X' is a Point");
    expect(() => assertBoundary(poly(square))).not.toThrow();
  });

  describe('rings that touch at single points', () => {
    // A grid of 0.001° steps from a corner, so shared points are exactly equal numbers.
    const at = (i: number, j: number): number[] => [-99.92 + i * 0.001, 47.6 + j * 0.001];
    const box = (i0: number, j0: number, i1: number, j1: number): number[][] => [
      at(i0, j0),
      at(i1, j0),
      at(i1, j1),
      at(i0, j1),
      at(i0, j0),
    ];
    // Reference: JTS IsValidOp (jsts), the OGC Simple Features 1.2.1 §6.1.11 rules: parts of a
    // MultiPolygon may touch at finitely many points; a polygon's rings may touch at points as long
    // as its interior stays connected; no ring may touch itself; no crossings or shared stretches.
    const cases: [string, Polygon | MultiPolygon, boolean][] = [
      ['two squares touching at a corner', multi([box(0, 0, 4, 4)], [box(4, 4, 8, 8)]), true],
      ['two squares sharing an edge', multi([box(0, 0, 4, 4)], [box(4, 0, 8, 4)]), false],
      ['two squares sharing half an edge', multi([box(0, 0, 4, 4)], [box(4, 2, 8, 6)]), false],
      [
        'a square and a diamond whose corner pokes through its edge',
        multi([box(0, 0, 4, 4)], [[at(3, 2), at(6, 0), at(9, 2), at(6, 4), at(3, 2)]]),
        false,
      ],
      [
        'a diamond touching the middle of a square edge with its corner',
        multi([box(0, 0, 4, 4)], [[at(4, 2), at(6, 0), at(8, 2), at(6, 4), at(4, 2)]]),
        true,
      ],
      ['a hole touching its outer ring at one corner', poly(box(0, 0, 8, 8), [at(0, 0), at(3, 1), at(1, 3), at(0, 0)]), true],
      ['a hole touching the middle of an outer edge at one point', poly(box(0, 0, 8, 8), [at(4, 0), at(6, 3), at(2, 3), at(4, 0)]), true],
      ['a hole touching its outer ring at two points', poly(box(0, 0, 8, 8), [at(0, 4), at(4, 2), at(8, 4), at(4, 6), at(0, 4)]), false],
      ['two holes touching each other at one point', poly(box(0, 0, 8, 8), box(1, 1, 3, 3), box(3, 3, 5, 5)), true],
      ['a ring touching itself at one point', poly([at(0, 0), at(8, 0), at(4, 4), at(6, 6), at(2, 6), at(4, 4), at(0, 0)]), false],
    ];
    it.each(cases)('when %s, then checkBoundary agrees with JTS IsValidOp (valid: %s)', (_name, g, valid) => {
      expect(jtsValid(g)).toBe(valid);
      expect(checkBoundary(g)).toEqual(valid ? [] : [expect.objectContaining({ message: expect.any(String) })]);
    });

    it('when a hole touches its outer ring twice, then the message says it cuts the field into pieces', () => {
      const [p] = checkBoundary(poly(box(0, 0, 8, 8), [at(0, 4), at(4, 2), at(8, 4), at(4, 6), at(0, 4)]), 'X');
      expect(p.code).toBe('rings-touch');
      expect(p.message).toMatch(/^Ring 2 of field 'X' touches ring 1 near .*cuts the field into separate pieces/);
    });

    it('when a part lies inside another part touching it at a corner, then the parts overlap (JTS agrees)', () => {
      const g = multi([box(0, 0, 8, 8)], [[at(0, 0), at(3, 1), at(1, 3), at(0, 0)]]);
      expect(jtsValid(g)).toBe(false);
      expect(checkBoundary(g)[0].code).toBe('parts-overlap');
    });

    it('when a hole touches its outer ring from outside, then it lies outside (JTS agrees)', () => {
      const g = poly(box(0, 0, 4, 4), [at(4, 4), at(6, 5), at(5, 6), at(4, 4)]);
      expect(jtsValid(g)).toBe(false);
      expect(checkBoundary(g)[0].code).toBe('hole-outside');
    });
  });

  describe('budgets (shared/limits.ts)', () => {
    it('when a boundary has more positions than the budget, then it is refused in plain words before any other check', () => {
      // A long thin ring of MAX_BOUNDARY_VERTICES + 1 positions whose second vertex is not a
      // number: had the ring been read, that would be the problem reported.
      const ring = Array.from({ length: MAX_BOUNDARY_VERTICES }, (_, i) => [-99.92 + i * 1e-7, 47.6 + (i % 2) * 1e-5]);
      ring[1] = [Number.NaN, 47.6];
      ring.push(ring[0]);
      const problems = checkBoundary(poly(ring), 'North Quarter');
      expect(problems).toEqual([
        {
          code: 'too-many-positions',
          message:
            "The boundary of field 'North Quarter' has 50,001 points; Furlong takes at most 50,000 points per field boundary. Simplify it (e.g. to one point every metre) and upload it again.",
        },
      ]);
    });

    it('when a boundary has more rings than the budget, then it is refused in plain words', () => {
      const tiny = (k: number) => [
        [-99 + k * 0.01, 47],
        [-99 + k * 0.01 + 0.001, 47],
        [-99 + k * 0.01, 47.001],
        [-99 + k * 0.01, 47],
      ];
      const g = multi(...Array.from({ length: MAX_BOUNDARY_RINGS + 1 }, (_, k) => [tiny(k)]));
      const [p] = checkBoundary(g);
      expect(p.code).toBe('too-many-rings');
      expect(p.message).toBe(
        'The boundary has 1,001 rings (outer boundaries and holes); Furlong takes at most 1,000 rings per field boundary. Leave out small holes and pieces, or upload the pieces as separate fields.',
      );
      // One ring fewer is within the budget, and these small triangles are a valid boundary.
      expect(checkBoundary(multi(...Array.from({ length: MAX_BOUNDARY_RINGS }, (_, k) => [tiny(k)])))).toEqual([]);
    });
  });
});

describe('checkAndMeasureBoundary', () => {
  it('when the boundary is the diamond of GeographicLib test Planimeter0, then it has no problem and its published area', () => {
    // Source: GeographicLib test suite (test_geodesic.py) "Planimeter0": (0,-1), (-1,0), (0,1), (1,0)
    // → area 24,619,419,146 m² (±1); acres by 1 acre = 4,046.856 422 4 m² (NIST Handbook 44, Appendix C).
    const m = checkAndMeasureBoundary(
      poly([
        [-1, 0],
        [0, -1],
        [1, 0],
        [0, 1],
        [-1, 0],
      ]),
    );
    expect(m.problems).toEqual([]);
    expect(Math.abs(m.areaM2! - 24_619_419_146)).toBeLessThanOrEqual(1);
    expect(Math.abs(m.acres! - 24_619_419_146 / 4046.8564224)).toBeLessThanOrEqual(1 / 4046.8564224);
  });

  it('when a square has a hole, then the area is the one the check measured: the same as measuring it alone', () => {
    const hole = [
      [-99.915, 47.603],
      [-99.905, 47.603],
      [-99.905, 47.607],
      [-99.915, 47.607],
      [-99.915, 47.603],
    ];
    const g = poly(square, hole);
    const m = checkAndMeasureBoundary(g, 'Slough quarter');
    expect(m.problems).toEqual([]);
    expect(m.areaM2).toBe(geodesicAreaM2(g));
    expect(m.acres).toBe(fieldAcres(g));
  });

  it('when the boundary has a problem, then it is not measured', () => {
    const m = checkAndMeasureBoundary({ type: 'Point', coordinates: [-99.9, 47.6] }, 'North Quarter');
    expect(m).toMatchObject({ areaM2: null, acres: null, problems: [{ code: 'not-polygon' }] });
  });
});
