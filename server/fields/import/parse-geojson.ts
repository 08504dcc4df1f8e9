import type { Feature, FeatureCollection } from 'geojson';
import { AppError } from '../../http/errors';

const bad = (message: string) => new AppError(422, 'bad_file', message);

/** A GeoJSON file (RFC 7946): a FeatureCollection, a Feature or a bare geometry. */
export function parseGeoJson(text: string): FeatureCollection {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (err) {
    throw bad(`The GeoJSON file is not valid JSON (${(err as Error).message})`);
  }
  const obj = data as { type?: string; crs?: { properties?: { name?: string } }; features?: unknown };
  if (!obj || typeof obj !== 'object' || typeof obj.type !== 'string') throw bad('The GeoJSON file has no "type"; it does not look like GeoJSON');
  const crs = obj.crs?.properties?.name;
  if (crs && !/CRS84|4326/i.test(crs)) {
    throw bad(`The GeoJSON file uses the coordinate system ${crs}; GeoJSON (RFC 7946) must be WGS84 longitude/latitude — export it again in WGS84`);
  }
  if (obj.type === 'FeatureCollection') {
    if (!Array.isArray(obj.features)) throw bad('The FeatureCollection has no "features" list');
    return obj as FeatureCollection;
  }
  if (obj.type === 'Feature') return { type: 'FeatureCollection', features: [obj as Feature] };
  return { type: 'FeatureCollection', features: [{ type: 'Feature', properties: {}, geometry: obj as Feature['geometry'] }] };
}
