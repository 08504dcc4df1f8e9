import * as turf from '@turf/turf';
import type { Feature, FeatureCollection, LineString, Polygon, Position } from 'geojson';
import { Geodesic } from 'geographiclib-geodesic';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { localProjection } from '../geo/local-projection';
import { planPasses } from './plan-passes';
import type { PassProperties } from './types';
import { hazardsAt, headingBetween, inBoundary, passAt, savedPlanInput, whereAmI } from './where';

const read = (name: string) => JSON.parse(readFileSync(join(__dirname, '../../tests/fixtures/geo', name), 'utf8')) as FeatureCollection;

/**
 * Tolerance against @turf/turf: turf measures on a sphere of radius 6,371,008.8 m, we on the WGS84
 * ellipsoid; at 47.6° N the ellipsoid's radii of curvature are about 0.01 % (north–south) and 0.3 %
 * (east–west) off that sphere, so distances may differ by up to 0.3 % of their length.
 */
const turfTolerance = (m: number) => 0.004 * m + 0.01;

describe('whereAmI: a hand-worked example', () => {
  // Passes 10 m wide running due north, 200 m long; pass k's centre line is 10k − 5 m east of O.
  // A point hazard (a power pole) 60 m east and 50 m north of O, with 15 m clearance.
  // Everything is laid out in the plane of O and carried to lon/lat with its inverse.
  const O: [number, number] = [-99.9, 47.6];
  const p = localProjection(O);
  const ll = (x: number, y: number) => p.inverse([x, y]);
  const passes: FeatureCollection<LineString, PassProperties> = {
    type: 'FeatureCollection',
    features: [1, 2, 3, 4, 5, 6].map((k) => ({
      type: 'Feature',
      properties: { pass: k, segment: 1, headingDeg: 0, lengthM: 200 },
      geometry: { type: 'LineString', coordinates: [ll(10 * k - 5, 0), ll(10 * k - 5, 200)] },
    })),
  };
  const boundary: Polygon = { type: 'Polygon', coordinates: [[ll(0, 0), ll(60, 0), ll(60, 200), ll(0, 200), ll(0, 0)]] };
  const hazards: FeatureCollection = {
    type: 'FeatureCollection',
    features: [
      { type: 'Feature', properties: { id: 9, kind: 'power-pole', clearanceM: 15 }, geometry: { type: 'Point', coordinates: ll(60, 50) } },
    ],
  };

  it('when the phone is 23 m east and 100 m north of O, then it is on pass 3 (floor(23 / 10) + 1), 2 m off its centre line (|23 − 25|)', () => {
    const at = p.inverse([23, 100]);
    const w = whereAmI(at, { passes, widthM: 10 }, boundary, hazards);
    expect(w.pass).toMatchObject({ pass: 3, segment: 1, under: true });
    expect(w.pass!.offsetM).toBeCloseTo(2, 6);
    expect(w.inField).toBe(true);
    // To the pole: √(37² + 50²) = 62.201 m; to its zone's edge 62.201 − 15 = 47.201 m.
    expect(w.insideZones).toEqual([]);
    expect(w.nextZone).toMatchObject({ id: 9, kind: 'power-pole', inside: false });
    expect(w.nextZone!.distanceM).toBeCloseTo(Math.hypot(37, 50), 6);
    expect(w.nextZone!.toZoneM).toBeCloseTo(Math.hypot(37, 50) - 15, 6);
  });

  it('when the phone is 3 m past the north end of pass 3, then no pass is under it (the swath ends flat) and pass 3 is the nearest, √(2² + 3²) = 3.606 m away', () => {
    const w = whereAmI(p.inverse([23, 203]), { passes, widthM: 10 }, boundary, hazards);
    expect(w.pass).toMatchObject({ pass: 3, under: false });
    expect(w.pass!.offsetM).toBeCloseTo(Math.hypot(2, 3), 6);
    expect(w.inField).toBe(false);
  });

  it('when the phone is 10 m west and 10 m north of the pole, then it is inside its 15 m zone (√200 = 14.142 m) and the zone is no longer "next"', () => {
    const w = whereAmI(p.inverse([50, 60]), { passes, widthM: 10 }, boundary, hazards);
    expect(w.insideZones).toHaveLength(1);
    expect(w.insideZones[0]).toMatchObject({ id: 9, inside: true, toZoneM: 0 });
    expect(w.insideZones[0].distanceM).toBeCloseTo(Math.sqrt(200), 6);
    expect(w.nextZone).toBeNull();
    // On the line between passes 5 (45 m) and 6 (55 m) at x = 50: both are 5 m off; either is right.
    expect([5, 6]).toContain(w.pass!.pass);
    expect(w.pass!.offsetM).toBeCloseTo(5, 6);
  });

  it('when there is no saved plan, then only the field and the hazards are told', () => {
    const w = whereAmI(p.inverse([30, 30]), null, boundary, hazards);
    expect(w.pass).toBeNull();
    expect(w.inField).toBe(true);
  });
});

describe('whereAmI against @turf/turf on the fixture section (passes from the planner)', () => {
  const boundary = read('draw-section.geojson').features[0].geometry as Polygon;
  const hazards = read('draw-section-hazards.geojson');
  const widthM = 18.288;
  const plan = planPasses({ boundary, hazards, widthM, headlandPasses: 2, headingDeg: 37.3 });
  const bbox = turf.bbox(boundary);
  // A 15 × 15 grid over the field's box, and a ring of positions around each hazard, so that every
  // case (on a pass, in the headland, outside the field, inside and outside each zone) is met.
  const positions: Position[] = [];
  for (let i = 0; i < 15; i++)
    for (let j = 0; j < 15; j++)
      positions.push([bbox[0] + ((bbox[2] - bbox[0]) * (i + 0.5)) / 15, bbox[1] + ((bbox[3] - bbox[1]) * (j + 0.5)) / 15]);
  for (const h of hazards.features) {
    const c = turf.centroid(h).geometry.coordinates;
    for (const r of [3, 9, 14, 20, 30])
      for (let a = 0; a < 360; a += 45) positions.push(turf.destination(c, r, a, { units: 'meters' }).geometry.coordinates);
  }

  it('when the pass is read at 345 positions, then it is the pass whose centre line turf finds nearest, at the same distance', () => {
    let compared = 0;
    for (const at of positions) {
      const ours = passAt(at as [number, number], plan.passes, widthM)!;
      const d = plan.passes.features.map((f) => ({ f, d: turf.pointToLineDistance(at, f, { units: 'meters' }) })).sort((a, b) => a.d - b.d);
      // Where two centre lines are nearly as near (a pass ends beside another's segment), either answer is right.
      if (!ours.under && d[1].d - d[0].d < turfTolerance(d[0].d) * 2) continue;
      if (ours.under) {
        // Under a pass: turf agrees the position is within half a width of that pass's line.
        const line = plan.passes.features.find((f) => f.properties.pass === ours.pass && f.properties.segment === ours.segment)!;
        expect(turf.pointToLineDistance(at, line, { units: 'meters' })).toBeLessThanOrEqual(widthM / 2 + turfTolerance(widthM / 2));
      } else {
        expect(ours.pass).toBe(d[0].f.properties.pass);
        expect(Math.abs(ours.offsetM - d[0].d)).toBeLessThanOrEqual(turfTolerance(d[0].d));
      }
      compared++;
    }
    expect(compared).toBeGreaterThan(300);
  });

  it('when a position is in the middle of a pass segment and a third of a width aside, then that pass is under it (turf.along and turf.destination place it)', () => {
    for (const f of plan.passes.features.filter((_, i) => i % 7 === 0)) {
      const middle = turf.along(f, f.properties.lengthM / 2000, { units: 'kilometers' });
      const aside = turf.destination(middle, widthM / 3, f.properties.headingDeg + 90, { units: 'meters' }).geometry.coordinates;
      const ours = passAt(aside as [number, number], plan.passes, widthM)!;
      expect(ours).toMatchObject({ pass: f.properties.pass, under: true });
      expect(Math.abs(ours.offsetM - widthM / 3)).toBeLessThanOrEqual(turfTolerance(widthM / 3));
    }
  });

  it('when each hazard is measured from 345 positions, then distances and "inside the zone" agree with turf', () => {
    let insideSeen = 0;
    let outsideSeen = 0;
    for (const at of positions) {
      const ours = hazardsAt(at as [number, number], hazards);
      expect(ours).toHaveLength(hazards.features.length);
      for (const h of ours) {
        const f = hazards.features[h.index] as Feature;
        const ref = turfDistance(at, f);
        expect(Math.abs(h.distanceM - ref)).toBeLessThanOrEqual(turfTolerance(ref));
        const clearance = Number(f.properties!.clearanceM);
        if (Math.abs(ref - clearance) > turfTolerance(ref)) {
          expect(h.inside).toBe(ref <= clearance);
          if (h.inside) insideSeen++;
          else outsideSeen++;
        }
      }
      // turf.booleanPointInPolygon: inside the field.
      expect(inBoundary(at as [number, number], boundary)).toBe(turf.booleanPointInPolygon(at, boundary));
    }
    expect(insideSeen).toBeGreaterThan(20);
    expect(outsideSeen).toBeGreaterThan(300);
  });
});

/** Distance from a position to a hazard by @turf/turf: 0 inside an area, else to its point, line or rings. */
function turfDistance(at: Position, f: Feature): number {
  const g = f.geometry;
  if (g.type === 'Point') return turf.distance(at, g.coordinates, { units: 'meters' });
  if (g.type === 'LineString') return turf.pointToLineDistance(at, g, { units: 'meters' });
  if (g.type === 'Polygon') {
    if (turf.booleanPointInPolygon(at, g)) return 0;
    return Math.min(...g.coordinates.map((ring) => turf.pointToLineDistance(at, turf.lineString(ring), { units: 'meters' })));
  }
  throw new Error(`no reference for ${g.type}`);
}

describe('headingBetween', () => {
  it('when the phone moves, then its heading is the geodesic azimuth GeographicLib gives (within 0.01°)', () => {
    const from: [number, number] = [-99.9, 47.6];
    for (const azi of [0, 30, 90, 135, 181, 270, 359]) {
      const r = Geodesic.WGS84.Direct(from[1], from[0], azi, 25);
      const ours = headingBetween(from, [r.lon2!, r.lat2!])!;
      const diff = Math.abs(((ours - azi + 540) % 360) - 180);
      expect(diff).toBeLessThan(0.01);
      // And turf's spherical bearing, within the sphere's 0.2°.
      const tb = (turf.bearing(from, [r.lon2!, r.lat2!]) + 360) % 360;
      expect(Math.abs(((ours - tb + 540) % 360) - 180)).toBeLessThan(0.2);
    }
  });

  it('when the phone moved less than 3 m (a standing phone wanders), then there is no heading', () => {
    const r = Geodesic.WGS84.Direct(47.6, -99.9, 45, 2);
    expect(headingBetween([-99.9, 47.6], [r.lon2!, r.lat2!])).toBeNull();
  });
});

describe('savedPlanInput', () => {
  it('when a plan saved with auto heading is read back, then the planner gives the saved passes again (the heading auto chose, from the summary)', () => {
    const boundary = read('draw-section.geojson').features[0].geometry as Polygon;
    const hazards = read('draw-section-hazards.geojson');
    const saved = planPasses({ boundary, hazards, widthM: 18.288, headlandPasses: 2, headingDeg: 'auto' });
    const again = planPasses(
      savedPlanInput(
        { boundary, hazards },
        {
          widthM: 18.288,
          headlandPasses: 2,
          headingDeg: null,
          coverage: saved.coverage,
          speedMps: saved.speedMps,
          efficiency: saved.efficiency,
          turnSeconds: saved.turnSeconds,
          summary: { headingDeg: saved.headingDeg, edgeMarginPct: saved.edgeMarginPct },
        },
      ),
    );
    expect(again.headingDeg).toBe(saved.headingDeg);
    expect(again.passes).toEqual(saved.passes);
  });
});
