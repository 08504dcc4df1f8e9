import type { FeatureCollection, Polygon } from 'geojson';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { localProjection } from '../geo/local-projection';
import { planPasses } from './plan-passes';

// Messages a farmer reads when a plan cannot be made. Each names what was wrong and where.

const proj = localProjection([-99.9, 47.6]);
const side = 44 * 18.288; // ½ mile
const boundary = proj.inverseGeometry<Polygon>({
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
const base = { boundary, fieldName: 'North Quarter', widthM: 18.288 };

describe('planPasses bad input', () => {
  it.each([0, -3, Number.NaN, Number.POSITIVE_INFINITY])('when the width is %p, then it must be greater than zero', (widthM) => {
    expect(() => planPasses({ ...base, widthM })).toThrow(/^The working width must be a distance greater than zero/);
  });

  it('when the width is wider than the field, then the message gives both in feet and metres, as the shared figures write them', () => {
    // 2000 m = 6561.68 ft (1 ft = 0.3048 m, 85 FR 62698); the ½-mile square is at most 2640 ft × √2 =
    // 3733.5 ft = 1138.0 m across (its diagonal). Widths to 0.1 ft / 0.01 m, distances whole.
    expect(() => planPasses({ ...base, widthM: 2000 })).toThrow(
      /^The working width \(6,561\.7 ft \/ 2,000\.00 m\) is wider than field 'North Quarter' \(at most 3,734 ft \/ 1,138 m across\)$/,
    );
  });

  it.each([180, 200, -1, Number.NaN])('when the heading is %p, then it must be from 0° up to 180°', (headingDeg) => {
    expect(() => planPasses({ ...base, headingDeg })).toThrow(/^The heading must be 'auto' or from 0° up to \(not including\) 180°/);
  });

  it('when the heading is 200°, then the message says it drives the same lines as 20°', () => {
    expect(() => planPasses({ ...base, headingDeg: 200 })).toThrow('200° drives the same lines as 20°');
  });

  it('when the headland leaves nothing to work, then the message says how wide it is', () => {
    // 22 passes × 60 ft = 1320 ft = 402.336 m = half the ½-mile side: nothing left inside.
    expect(() => planPasses({ ...base, headlandPasses: 22 })).toThrow(
      "The headland (22 passes × 60.0 ft / 18.29 m = 1,320.0 ft / 402.34 m) leaves nothing of field 'North Quarter' to work",
    );
  });

  it.each([0, -0.2, 1.01, Number.NaN])('when the efficiency is %p, then it must be above 0 and at most 1', (efficiency) => {
    expect(() => planPasses({ ...base, efficiency })).toThrow(/^The field efficiency must be above 0 and at most 1/);
  });

  it('when headland passes, speed, turn time or coverage are out of range, then each says so', () => {
    expect(() => planPasses({ ...base, headlandPasses: 1.5 })).toThrow(/headland passes must be a whole number/);
    expect(() => planPasses({ ...base, speedMps: 0 })).toThrow(/working speed must be above 0/);
    expect(() => planPasses({ ...base, turnSeconds: -1 })).toThrow(/time per turn/);
    expect(() => planPasses({ ...base, coverage: 'most' as never })).toThrow(/Coverage must be 'gaps-ok' or 'full'/);
  });

  it('when the boundary crosses itself, then the boundary check message comes through', () => {
    const bowtie = JSON.parse(readFileSync(join(__dirname, '../../tests/fixtures/geo/bowtie.geojson'), 'utf8')).geometry;
    expect(() => planPasses({ ...base, boundary: bowtie })).toThrow(
      /^Ring 1 of field 'North Quarter' crosses itself near 47\.60500° N, 99\.89500° W/,
    );
  });

  it('when the boundary is a Point, then the message says so', () => {
    expect(() => planPasses({ ...base, boundary: { type: 'Point', coordinates: [-99.9, 47.6] } as never })).toThrow(
      "The boundary of field 'North Quarter' is a Point, not a Polygon or MultiPolygon",
    );
  });

  it('when a hazard has a negative clearance, then the hazard is numbered', () => {
    const hazards: FeatureCollection = {
      type: 'FeatureCollection',
      features: [{ type: 'Feature', properties: { clearanceM: -5 }, geometry: { type: 'Point', coordinates: [-99.9, 47.6] } }],
    };
    expect(() => planPasses({ ...base, hazards })).toThrow("Hazard 1 of field 'North Quarter' has a clearance of -5 m");
  });

  it('when hazard clearances cover the whole interior, then nothing is left to work', () => {
    const hazards: FeatureCollection = {
      type: 'FeatureCollection',
      features: [{ type: 'Feature', properties: { clearanceM: 600 }, geometry: { type: 'Point', coordinates: [-99.9, 47.6] } }],
    };
    expect(() => planPasses({ ...base, hazards })).toThrow(/Hazard clearances cover all of field 'North Quarter'/);
  });
});
