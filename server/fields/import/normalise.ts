import type { Feature, FeatureCollection, Geometry, Position } from 'geojson';

const strip = (p: Position): Position => [p[0], p[1]];

function to2d(g: Geometry): Geometry {
  switch (g.type) {
    case 'Point':
      return { type: 'Point', coordinates: strip(g.coordinates) };
    case 'LineString':
    case 'MultiPoint':
      return { ...g, coordinates: g.coordinates.map(strip) } as Geometry;
    case 'Polygon':
    case 'MultiLineString':
      return { ...g, coordinates: g.coordinates.map((r) => r.map(strip)) } as Geometry;
    case 'MultiPolygon':
      return { type: 'MultiPolygon', coordinates: g.coordinates.map((p) => p.map((r) => r.map(strip))) };
    case 'GeometryCollection':
      return { type: 'GeometryCollection', geometries: g.geometries.map(to2d) };
  }
}

/**
 * Boundaries as Furlong stores them: 2-D positions, and a collection of polygons (as KML's
 * MultiGeometry becomes) merged into one MultiPolygon. Anything else is left for the checks.
 */
export function normaliseGeometry(g: Geometry | null): Geometry | null {
  if (!g) return null;
  const flat = to2d(g);
  if (flat.type !== 'GeometryCollection') return flat;
  const parts = flat.geometries;
  if (parts.length > 0 && parts.every((p) => p.type === 'Polygon' || p.type === 'MultiPolygon')) {
    const polys = parts.flatMap((p) => (p.type === 'Polygon' ? [p.coordinates] : p.type === 'MultiPolygon' ? p.coordinates : []));
    return polys.length === 1 ? { type: 'Polygon', coordinates: polys[0] } : { type: 'MultiPolygon', coordinates: polys };
  }
  return flat;
}

export function featuresOf(fc: FeatureCollection): Feature[] {
  return fc.features.map((f) => ({ ...f, geometry: normaliseGeometry(f.geometry) as Geometry }));
}
