import { fieldAcres } from '@shared/geo/geodesic-area';
import type { Polygon } from 'geojson';
import { combineParts, measureBoundary } from './boundary-measure';

// A quarter-mile square near 47.6° N (about 40 acres) and a small square hole inside it.
const square = (lon: number, lat: number, dLon: number, dLat: number) => [
  [lon, lat],
  [lon + dLon, lat],
  [lon + dLon, lat + dLat],
  [lon, lat + dLat],
  [lon, lat],
];
const outer = square(-99.9, 47.6, 0.0054, 0.0036);
const hole = square(-99.898, 47.601, 0.001, 0.001);
const east = square(-99.89, 47.6, 0.0054, 0.0036);

describe('drawn boundaries', () => {
  it('when one polygon is drawn, then the boundary is that Polygon', () => {
    expect(combineParts([{ type: 'Polygon', coordinates: [outer] }])).toEqual({ type: 'Polygon', coordinates: [outer] });
  });

  it('when two parts are drawn (one already cut into a feature), then they make one MultiPolygon', () => {
    const cut = { type: 'Feature' as const, properties: {}, geometry: { type: 'Polygon' as const, coordinates: [outer, hole] } };
    expect(combineParts([cut, { type: 'Polygon', coordinates: [east] }])).toEqual({
      type: 'MultiPolygon',
      coordinates: [[outer, hole], [east]],
    });
  });

  it('when nothing (or only lines) is drawn, then there is no boundary', () => {
    expect(combineParts([])).toBeNull();
    expect(combineParts([{ type: 'LineString', coordinates: outer }])).toBeNull();
  });

  it('when a hole is cut, then its area is taken off the acres', () => {
    const whole = measureBoundary({ type: 'Polygon', coordinates: [outer] });
    const holed = measureBoundary({ type: 'Polygon', coordinates: [outer, hole] });
    const holeOnly = fieldAcres({ type: 'Polygon', coordinates: [hole] } as Polygon);
    expect(whole.acres).toBeGreaterThan(38);
    expect(whole.acres).toBeLessThan(42);
    expect(holed.acres).toBeCloseTo((whole.acres ?? 0) - holeOnly, 6);
    expect(holed.problems).toEqual([]);
  });

  it('when the boundary crosses itself, then the problem names the field and no acres show', () => {
    const bowtie = [outer[0], outer[2], outer[1], outer[3], outer[0]];
    const m = measureBoundary({ type: 'Polygon', coordinates: [bowtie] }, 'Home quarter');
    expect(m.acres).toBeNull();
    expect(m.problems[0]).toMatch(/field 'Home quarter' crosses itself/);
    expect(m.codes).toEqual(['self-intersection']);
  });
});
