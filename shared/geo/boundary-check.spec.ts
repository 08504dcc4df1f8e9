import type { Polygon } from 'geojson';
import GeometryFactory from 'jsts/org/locationtech/jts/geom/GeometryFactory.js';
import GeoJSONReader from 'jsts/org/locationtech/jts/io/GeoJSONReader.js';
import IsValidOp from 'jsts/org/locationtech/jts/operation/valid/IsValidOp.js';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { assertBoundary, checkBoundary } from './boundary-check';

// Rules checked: RFC 7946 §3.1.6 (a linear ring is closed, has ≥ 4 positions; positions are
// [longitude, latitude], §3.1.1) and the OGC Simple Features polygon rules (rings do not cross
// themselves or each other, holes lie inside the shell; OGC 06-103r4 §6.1.11, from memory).
// Where a rule is geometric, JTS's IsValidOp (jsts) is the independent reference.

const reader = new GeoJSONReader(new GeometryFactory());
const jtsValid = (g: Polygon): boolean => new IsValidOp(reader.read(g)).isValid();
const poly = (...rings: number[][][]): Polygon => ({ type: 'Polygon', coordinates: rings });
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
});
