import fc from 'fast-check';
import type { Polygon } from 'geojson';
import GeometryFactory from 'jsts/org/locationtech/jts/geom/GeometryFactory.js';
import GeoJSONReader from 'jsts/org/locationtech/jts/io/GeoJSONReader.js';
import BufferOp from 'jsts/org/locationtech/jts/operation/buffer/BufferOp.js';
import RelateOp from 'jsts/org/locationtech/jts/operation/relate/RelateOp.js';
import { geodesicAreaM2 } from '../geo/geodesic-area';
import { localProjection, projectionForField } from '../geo/local-projection';
import { m2ToAcres } from '../units';
import { planPasses } from './plan-passes';

// Properties on random star-shaped (hence simple) fields around 47.6° N, 99.9° W. The containment
// check uses JTS (jsts) `covers` as the outside reference; the area identities use GeographicLib.

const reader = new GeoJSONReader(new GeometryFactory());
const centre = localProjection([-99.9, 47.6]);

/** A star-shaped polygon: vertices at increasing angles (gaps from weights) and random radii, metres → lon/lat. */
const starField = fc
  .tuple(
    fc.array(fc.record({ gap: fc.double({ min: 0.2, max: 1, noNaN: true }), radius: fc.double({ min: 250, max: 700, noNaN: true }) }), {
      minLength: 5,
      maxLength: 14,
    }),
    fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }),
  )
  .map(([vs, turn]) => {
    const total = vs.reduce((s, v) => s + v.gap, 0);
    let a = turn;
    const ring = vs.map(({ gap, radius }) => {
      a += (2 * Math.PI * gap) / total;
      return [radius * Math.cos(a), radius * Math.sin(a)];
    });
    ring.push(ring[0]);
    return centre.inverseGeometry<Polygon>({ type: 'Polygon', coordinates: [ring] });
  });

const settings = fc.record({
  widthM: fc.double({ min: 6, max: 36, noNaN: true }),
  headlandPasses: fc.integer({ min: 0, max: 3 }),
  headingDeg: fc.oneof(fc.constant<'auto'>('auto'), fc.double({ min: 0, max: 179.99, noNaN: true })),
  coverage: fc.constantFrom<'gaps-ok' | 'full'>('gaps-ok', 'full'),
});

describe('planPasses properties on random star-shaped fields', () => {
  it('when planned, then every pass segment lies inside the work region (JTS covers)', () => {
    fc.assert(
      fc.property(starField, settings, (boundary, s) => {
        const r = planPasses({ boundary, ...s });
        const proj = projectionForField(boundary);
        const region = BufferOp.bufferOp(reader.read(proj.forwardGeometry(r.workRegion)), 1e-3);
        for (const f of r.passes.features) {
          const line = reader.read(proj.forwardGeometry(f.geometry));
          expect(RelateOp.relate(region, line).isCovers()).toBe(true);
          expect(Math.abs(line.getLength() - f.properties.lengthM)).toBeLessThan(1e-6);
        }
      }),
      { numRuns: 25 },
    );
  });

  it('when planned, then worked + unworked = work region, and headland + interior = field (geodesic areas)', () => {
    fc.assert(
      fc.property(starField, settings, (boundary, s) => {
        const r = planPasses({ boundary, ...s });
        expect(Math.abs(r.workedAcres + r.unworkedAcres - r.workRegionAcres)).toBeLessThan(1e-9 * r.workRegionAcres + 1e-9);
        expect(Math.abs(r.headlandAcres + r.interiorAcres - r.fieldAcres)).toBeLessThan(1e-9 * r.fieldAcres);
        // The map geometries carry the same acres on the WGS84 ellipsoid (GeographicLib PolygonArea).
        const headland = r.headland ? m2ToAcres(geodesicAreaM2(r.headland)) : 0;
        const interior = m2ToAcres(geodesicAreaM2(r.workRegion)); // no hazards: work region = interior
        expect(Math.abs(headland + interior - r.fieldAcres) / r.fieldAcres).toBeLessThan(1e-6);
        expect(Math.abs(interior - r.interiorAcres) / r.interiorAcres).toBeLessThan(1e-6);
        if (s.coverage === 'gaps-ok') expect(r.overlapAcres).toBe(0);
        else expect(r.unworkedAcres).toBeLessThan(1e-6 * r.workRegionAcres + 1e-9);
        for (const v of Object.values(r)) if (typeof v === 'number') expect(Number.isFinite(v)).toBe(true);
      }),
      { numRuns: 40 },
    );
  });

  it('when the heading is auto, then its field time is within the edge margin of every whole degree, and with no margin no more', () => {
    // The objective is the plan's own hours (driving + turns × turn time); the margin rule is common
    // practice (passes along the fence line), no published source.
    fc.assert(
      fc.property(
        starField,
        fc.double({ min: 12, max: 36, noNaN: true }),
        fc.constantFrom<'gaps-ok' | 'full'>('gaps-ok', 'full'),
        fc.constantFrom(0, 3),
        (boundary, widthM, coverage, edgeMarginPct) => {
          const auto = planPasses({ boundary, widthM, coverage, edgeMarginPct, headingDeg: 'auto' });
          expect(auto.headingCandidates[0].headingDeg).toBe(auto.headingDeg);
          for (let h = 0; h < 180; h++) {
            const fixed = planPasses({ boundary, widthM, coverage, headingDeg: h });
            expect(auto.hours).toBeLessThanOrEqual(fixed.hours * (1 + edgeMarginPct / 100) * (1 + 1e-12));
          }
        },
      ),
      { numRuns: 6 },
    );
  });
});
