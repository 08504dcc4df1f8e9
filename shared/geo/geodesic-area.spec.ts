import area from '@turf/area';
import type { Polygon, Position } from 'geojson';
import { Geodesic } from 'geographiclib-geodesic';
import { ACRE_M2 } from '../units';
import { fieldAcres, geodesicAreaM2, geodesicPerimeterM } from './geodesic-area';

const WGS84 = Geodesic.WGS84;

/** Walks edges of given azimuth (deg) and length (m) from a start with GeographicLib Direct; closed ring, [lon, lat]. */
function walk(lat: number, lon: number, edges: [number, number][]): Position[] {
  const ring: Position[] = [[lon, lat]];
  for (const [azi, s] of edges) {
    const r = WGS84.Direct(lat, lon, azi, s);
    lat = r.lat2!;
    lon = r.lon2!;
    ring.push([lon, lat]);
  }
  ring.push(ring[0]);
  return ring;
}

/** Area by GeographicLib's own PolygonArea, fed point by point (the independent reference). */
function libraryArea(ring: Position[]): number {
  const p = WGS84.Polygon(false);
  for (const [lon, lat] of ring.slice(0, -1)) p.AddPoint(lat, lon);
  return Math.abs(p.Compute(false, true).area!);
}

describe('geodesicAreaM2', () => {
  it('when given the diamond of test Planimeter0, then area and perimeter match the published values', () => {
    // Source: GeographicLib test suite, test_geodesic.py / geodesictest.js "Planimeter0":
    // (0,-1), (-1,0), (0,1), (1,0) → perimeter 627598.2731 m (±1e-4), area 24619419146 m² (±1).
    const g: Polygon = {
      type: 'Polygon',
      coordinates: [
        [
          [-1, 0],
          [0, -1],
          [1, 0],
          [0, 1],
          [-1, 0],
        ],
      ],
    };
    expect(Math.abs(geodesicAreaM2(g) - 24_619_419_146)).toBeLessThanOrEqual(1);
    expect(Math.abs(geodesicPerimeterM(g) - 627_598.2731)).toBeLessThanOrEqual(1e-4);
  });

  it('when given the ring around the pole of test Planimeter0, then the area matches the published value', () => {
    // Source: GeographicLib "Planimeter0": (89,0), (89,90), (89,180), (89,270) → 631819.8745 m, 24952305678 m² (±1).
    const g: Polygon = {
      type: 'Polygon',
      coordinates: [
        [
          [0, 89],
          [90, 89],
          [180, 89],
          [-90, 89],
          [0, 89],
        ],
      ],
    };
    expect(Math.abs(geodesicAreaM2(g) - 24_952_305_678)).toBeLessThanOrEqual(1);
    expect(Math.abs(geodesicPerimeterM(g) - 631_819.8745)).toBeLessThanOrEqual(1e-4);
  });

  it('when the ring is the 1000 m square of test Planimeter29 built by geodesic Direct, then the area is 1,000,000 m² ± 0.01', () => {
    // Source: GeographicLib "Planimeter29": start (0,0), edges of 1000 m at azimuths 90°, 0°, -90°, closed → 1e6 m² (±0.01).
    const ring = walk(0, 0, [
      [90, 1000],
      [0, 1000],
      [-90, 1000],
    ]);
    expect(Math.abs(geodesicAreaM2({ type: 'Polygon', coordinates: [ring] }) - 1_000_000)).toBeLessThanOrEqual(0.01);
  });

  it('when the ring is reversed, then the area is the same (orientation-independent)', () => {
    const ring = walk(47.6, -99.9, [
      [90, 1609.344],
      [0, 1609.344],
      [-90, 1609.344],
    ]);
    const a = geodesicAreaM2({ type: 'Polygon', coordinates: [ring] });
    const b = geodesicAreaM2({ type: 'Polygon', coordinates: [[...ring].reverse()] });
    expect(b).toBe(a);
  });

  it('when a section has a slough hole, then the area is the outer ring less the hole, as GeographicLib computes them', () => {
    // Reference: GeographicLib PolygonArea on each ring separately (independent of our ring handling).
    const outer = walk(47.6, -99.9, [
      [90, 1609.344],
      [0, 1609.344],
      [-90, 1609.344],
    ]);
    const hole = walk(47.605, -99.895, [
      [0, 300],
      [60, 200],
      [150, 250],
      [240, 180],
    ]).reverse();
    const expected = libraryArea(outer) - libraryArea(hole);
    const got = geodesicAreaM2({ type: 'Polygon', coordinates: [outer, hole] });
    expect(Math.abs(got - expected) / expected).toBeLessThan(1e-5); // within 0.001 %
    expect(Math.abs(got - expected)).toBeLessThan(1e-6);
  });

  it('when a MultiPolygon has two parts, then their areas add', () => {
    const a = walk(47.6, -99.9, [
      [90, 800],
      [0, 800],
      [-90, 800],
    ]);
    const b = walk(47.62, -99.88, [
      [90, 500],
      [0, 400],
      [-90, 500],
    ]);
    const got = geodesicAreaM2({ type: 'MultiPolygon', coordinates: [[a], [b]] });
    expect(Math.abs(got - (libraryArea(a) + libraryArea(b)))).toBeLessThan(1e-6);
  });

  it('when a section is 1 mile on a side, then it is about 640 acres', () => {
    // Source: a PLSS section is "as near as may be" 640 acres (43 U.S.C. § 751, from memory); 1 mile = 1609.344 m.
    // Geodesic edges of a "square" on the ellipsoid make it differ from 640 by well under 0.1 %.
    const ring = walk(47.6, -99.9, [
      [90, 1609.344],
      [0, 1609.344],
      [-90, 1609.344],
    ]);
    expect(fieldAcres({ type: 'Polygon', coordinates: [ring] })).toBeCloseTo(640, 0);
    expect(ACRE_M2 * 640).toBeCloseTo(1609.344 ** 2, 6);
  });

  it('when a spherical formula (@turf/area) is used at 47.6° N, then it is 0.2–0.35 % low: why we use the ellipsoid', () => {
    // Reference: references.md, "A spherical area formula … differs … by up to a few tenths of a percent".
    const ring = walk(47.6, -99.9, [
      [90, 1609.344],
      [0, 1609.344],
      [-90, 1609.344],
    ]);
    const g: Polygon = { type: 'Polygon', coordinates: [ring] };
    const rel = area(g) / geodesicAreaM2(g) - 1;
    expect(rel).toBeLessThan(-0.002);
    expect(rel).toBeGreaterThan(-0.0035);
  });
});
