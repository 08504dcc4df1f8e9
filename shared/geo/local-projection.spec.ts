import type { Polygon, Position } from 'geojson';
import { Geodesic } from 'geographiclib-geodesic';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { geodesicAreaM2 } from './geodesic-area';
import { localProjection, projectionForField } from './local-projection';

const WGS84 = Geodesic.WGS84;
const fixture = (name: string): Polygon =>
  JSON.parse(readFileSync(join(__dirname, '../../tests/fixtures/geo', name), 'utf8')).features[0].geometry;

function shoelace(ring: Position[]): number {
  let a = 0;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) a += ring[j][0] * ring[i][1] - ring[i][0] * ring[j][1];
  return Math.abs(a / 2);
}

function section(): Polygon {
  // A section (1 mile square) walked with GeographicLib Direct from 47.6° N, 99.9° W.
  let [lat, lon] = [47.6, -99.9];
  const ring: Position[] = [[lon, lat]];
  for (const azi of [90, 0, -90]) {
    const r = WGS84.Direct(lat, lon, azi, 1609.344);
    [lat, lon] = [r.lat2!, r.lon2!];
    ring.push([lon, lat]);
  }
  ring.push(ring[0]);
  return { type: 'Polygon', coordinates: [ring] };
}

describe('localProjection', () => {
  it('when a 640-acre field is projected, then its plane area agrees with the geodesic area well below 0.01 %', () => {
    // Reference: GeographicLib PolygonArea on the WGS84 ellipsoid (via geodesicAreaM2).
    for (const g of [section(), fixture('draw-section.geojson')]) {
      const xy = projectionForField(g).forwardGeometry(g);
      const plane = shoelace(xy.coordinates[0]) - xy.coordinates.slice(1).reduce((s, r) => s + shoelace(r), 0);
      expect(Math.abs(plane / geodesicAreaM2(g) - 1)).toBeLessThan(1e-6);
    }
  });

  it('when distances across a section are measured in the plane, then they agree with geodesic Inverse below 0.01 %', () => {
    // Reference: GeographicLib Inverse (WGS84).
    const g = section();
    const p = projectionForField(g);
    const ring = g.coordinates[0];
    for (let i = 0; i < 4; i++)
      for (let j = i + 1; j < 4; j++) {
        const [a, b] = [p.forward(ring[i]), p.forward(ring[j])];
        const s = WGS84.Inverse(ring[i][1], ring[i][0], ring[j][1], ring[j][0]).s12!;
        expect(Math.abs(Math.hypot(b[0] - a[0], b[1] - a[1]) / s - 1)).toBeLessThan(1e-6);
      }
  });

  it('when a point lies due north of the centre, then it projects onto grid north (x = 0)', () => {
    // Reference: GeographicLib Direct at azimuth 0°; a transverse Mercator has no convergence on its central meridian.
    const p = localProjection([-99.9, 47.6]);
    const r = WGS84.Direct(47.6, -99.9, 0, 1000);
    const [x, y] = p.forward([r.lon2!, r.lat2!]);
    expect(Math.abs(x)).toBeLessThan(1e-6);
    expect(Math.abs(y - 1000)).toBeLessThan(1e-3);
  });

  it('when a position is projected and back, then it returns within 1e-9°', () => {
    const p = localProjection([-99.9, 47.6]);
    const back = p.inverse(p.forward([-99.887, 47.611]));
    expect(Math.abs(back[0] + 99.887)).toBeLessThan(1e-9);
    expect(Math.abs(back[1] - 47.611)).toBeLessThan(1e-9);
  });
});
