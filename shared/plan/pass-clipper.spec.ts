import GeometryFactory from 'jsts/org/locationtech/jts/geom/GeometryFactory.js';
import GeoJSONReader from 'jsts/org/locationtech/jts/io/GeoJSONReader.js';
import OverlayOp from 'jsts/org/locationtech/jts/operation/overlay/OverlayOp.js';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { createPassClipper } from './pass-clipper';
import { swathCoverage } from './swath-coverage';
import { fixtureRegion } from './test-fixtures';

// Independent reference: JTS's generic overlay (jsts OverlayOp.intersection) of each full pass line,
// and of each swath rectangle, with the work region polygon. Fixtures are fictional fields with
// holes and hazards around 47.6° N, 99.9° W.

/* eslint-disable @typescript-eslint/no-explicit-any */
const reader = new GeoJSONReader(new GeometryFactory());
const read = (name: string): string => readFileSync(join(__dirname, '../../tests/fixtures/geo', name), 'utf8');

const cases = [
  { field: 'draw-section', widthM: 18.288, headlandM: 2 * 18.288 },
  { field: 'slough-quarter', widthM: 9.144, headlandM: 3 * 9.144 },
];
const headings = [0, 7.5, 19, 33, 37.3, 45, 58, 71, 90, 93.2, 104, 122.77, 135, 147, 160, 171, 179.9];
const swathHeadings = [0, 37.3, 93.2, 147];

/** Pieces of a jsts intersection result that are lines, as [tFrom, tTo] along the heading. */
function linePieces(g: any, sin: number, cos: number): [number, number][] {
  const out: [number, number][] = [];
  for (let i = 0; i < g.getNumGeometries(); i++) {
    const part = g.getGeometryN(i);
    if (part.getGeometryType() !== 'LineString' || part.getLength() <= 1e-6) continue;
    const cs = part.getCoordinates();
    const ts = cs.map((c: any) => c.x * sin + c.y * cos);
    out.push([Math.min(...ts), Math.max(...ts)]);
  }
  return out.sort((a, b) => a[0] - b[0]);
}

describe.each(cases)('pass clipper on $field at $widthM m', ({ field, widthM, headlandM }) => {
  const { region, regionJ } = fixtureRegion(read(`${field}.geojson`), read(`${field}-hazards.geojson`), headlandM);
  const clipper = createPassClipper(region, widthM);

  it.each(headings)('when the heading is %p°, then segment counts and ends match JTS overlay within 1 mm', (h) => {
    const c = clipper.clip(h);
    const xy = (u: number, t: number): number[] => [u * c.cos + t * c.sin, -u * c.sin + t * c.cos];
    let refSegments = 0;
    for (let k = 0; k < c.us.length; k++) {
      const line = reader.read({ type: 'LineString', coordinates: [xy(c.us[k], c.tMin - 10), xy(c.us[k], c.tMax + 10)] });
      const ref = linePieces(OverlayOp.intersection(regionJ, line), c.sin, c.cos);
      const ours: [number, number][] = [];
      for (let s = 0; s < c.segmentCount; s++) if (c.segLine[s] === k) ours.push([c.segT[2 * s], c.segT[2 * s + 1]]);
      expect(ours.length).toBe(ref.length);
      ours.forEach(([a, b], i) => {
        expect(Math.abs(a - ref[i][0])).toBeLessThan(1e-3); // within 1 mm
        expect(Math.abs(b - ref[i][1])).toBeLessThan(1e-3);
      });
      refSegments += ref.length;
    }
    expect(c.segmentCount).toBe(refSegments);
    expect(clipper.summary(h)).toMatchObject({ segmentCount: c.segmentCount, passCount: c.passCount });
  });

  it.each(swathHeadings)('when the heading is %p°, then every swath area matches JTS overlay within 0.01 m²', (h) => {
    const c = clipper.clip(h);
    const xy = (u: number, t: number): number[] => [u * c.cos + t * c.sin, -u * c.sin + t * c.cos];
    const cover = swathCoverage(region, c, widthM);
    const driven = [...new Set(c.segLine)];
    driven.forEach((k, i) => {
      const [a, b] = [c.us[k] - widthM / 2, c.us[k] + widthM / 2];
      const strip = reader.read({
        type: 'Polygon',
        coordinates: [[xy(a, c.tMin - 10), xy(b, c.tMin - 10), xy(b, c.tMax + 10), xy(a, c.tMax + 10), xy(a, c.tMin - 10)]],
      });
      expect(Math.abs(cover.swathM2[i] - OverlayOp.intersection(regionJ, strip).getArea())).toBeLessThan(0.01);
    });
  });
});
