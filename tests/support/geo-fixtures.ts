import type { MultiPolygon, Polygon, Position } from 'geojson';
// eslint-disable-next-line @typescript-eslint/no-require-imports
const { Geodesic } = require('geographiclib-geodesic');

/** A closed counter-clockwise rectangle ring, lon/lat degrees (invented places near 47.6° N, 99.9° W). */
export function rectRing(lon: number, lat: number, dLon: number, dLat: number): Position[] {
  return [
    [lon, lat],
    [lon + dLon, lat],
    [lon + dLon, lat + dLat],
    [lon, lat + dLat],
    [lon, lat],
  ];
}

export const rect = (lon: number, lat: number, dLon: number, dLat: number): Polygon => ({
  type: 'Polygon',
  coordinates: [rectRing(lon, lat, dLon, dLat)],
});

/** A rectangle with a smaller rectangular hole (a slough) in its middle. */
export function rectWithHole(lon: number, lat: number, dLon: number, dLat: number): Polygon {
  const hole = rectRing(lon + dLon * 0.4, lat + dLat * 0.4, dLon * 0.2, dLat * 0.2).reverse();
  return { type: 'Polygon', coordinates: [rectRing(lon, lat, dLon, dLat), hole] };
}

/** Two parts, the first with a hole. */
export function twoParts(lon: number, lat: number): MultiPolygon {
  return {
    type: 'MultiPolygon',
    coordinates: [rectWithHole(lon, lat, 0.01, 0.007).coordinates, rect(lon + 0.015, lat, 0.005, 0.004).coordinates],
  };
}

/**
 * The reference: GeographicLib's own planimeter (the npm package geographiclib-geodesic,
 * Karney's algorithms), run here ring by ring, outer rings added and holes subtracted.
 */
export function referenceAreaM2(g: Polygon | MultiPolygon): number {
  const polys = g.type === 'Polygon' ? [g.coordinates] : g.coordinates;
  let total = 0;
  for (const rings of polys) {
    rings.forEach((ring, i) => {
      const p = Geodesic.WGS84.Polygon(false);
      for (const [lon, lat] of ring.slice(0, -1)) p.AddPoint(lat, lon);
      const a = Math.abs(p.Compute(false, true).area);
      total += i === 0 ? a : -a;
    });
  }
  return total;
}

/** International acre, m² (NIST 85 FR 62698: 1 ft = 0.3048 m; 1 acre = 43,560 ft²). */
export const ACRE = 43560 * 0.3048 * 0.3048;
