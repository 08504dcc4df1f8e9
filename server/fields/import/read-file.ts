// Reading one boundary file into candidate fields: format, shapes, names, checks and acres.
// Pure (no database), so it runs in a compute worker; the farm's own checks follow in the service.
import type { FeatureCollection } from 'geojson';
import type { ImportPreview, ImportedFeature } from '../../../shared/schemas/fields';
import { checkBoundary } from '../../../shared/geo/boundary-check';
import { geodesicAreaM2 } from '../../../shared/geo/geodesic-area';
import { m2ToAcres } from '../../../shared/units';
import { AppError } from '../../http/errors';
import { featuresOf } from './normalise';
import { parseGeoJson } from './parse-geojson';
import { parseKml, parseKmz } from './parse-kml';
import { parseShapefileZip } from './parse-shapefile';

type Format = ImportPreview['format'];

const NAME_KEYS = ['name', 'field', 'field_name', 'fieldname', 'label', 'title', 'id'];

function detectFormat(fileName: string, buf: Buffer): Format {
  const ext = fileName.toLowerCase().split('.').pop() ?? '';
  const zip = buf.length > 3 && buf[0] === 0x50 && buf[1] === 0x4b;
  if (ext === 'kmz') return 'kmz';
  if (ext === 'zip' || (zip && ext !== 'kml')) return 'shapefile';
  if (ext === 'kml') return 'kml';
  if (['geojson', 'json'].includes(ext)) return 'geojson';
  const head = buf.subarray(0, 200).toString('utf8').trimStart();
  if (head.startsWith('{')) return 'geojson';
  if (head.startsWith('<')) return 'kml';
  throw new AppError(
    415,
    'unknown_format',
    `Furlong reads GeoJSON (.geojson), KML (.kml, .kmz) and zipped shapefiles (.zip); "${fileName}" is none of these`,
  );
}

async function parse(format: Format, buf: Buffer): Promise<FeatureCollection> {
  switch (format) {
    case 'geojson':
      return parseGeoJson(buf.toString('utf8'));
    case 'kml':
      return parseKml(buf.toString('utf8'));
    case 'kmz':
      return parseKmz(buf);
    case 'shapefile':
      return parseShapefileZip(buf);
  }
}

function pickNameAttribute(attributes: string[], wanted?: string): string | null {
  if (wanted) {
    if (!attributes.includes(wanted))
      throw new AppError(400, 'invalid_input', `The file has no attribute "${wanted}"; it has: ${attributes.join(', ') || 'none'}`);
    return wanted;
  }
  for (const key of NAME_KEYS) {
    const hit = attributes.find((a) => a.toLowerCase() === key);
    if (hit) return hit;
  }
  return null;
}

const GEOMETRY_NAMES: Record<string, string> = {
  Point: 'a point',
  MultiPoint: 'points',
  LineString: 'a line',
  MultiLineString: 'lines',
  GeometryCollection: 'a mix of shapes',
};

/**
 * Reads a boundary file (GeoJSON, KML, KMZ or zipped shapefile) and checks every shape in it as a
 * field boundary. Problems with the farm (a name already used) are for the caller to add.
 *
 * @param file the uploaded file's name and bytes
 * @param nameAttribute the attribute that holds field names (default: the first of NAME_KEYS found)
 */
export async function readBoundaryFile(file: { name: string; data: Buffer }, nameAttribute?: string): Promise<ImportPreview> {
  if (file.data.length === 0) throw new AppError(400, 'empty_file', `The file "${file.name}" is empty`);
  const format = detectFormat(file.name, file.data);
  const features = featuresOf(await parse(format, file.data));
  if (features.length === 0) throw new AppError(422, 'no_features', `No shapes were found in "${file.name}"`);
  const attributes = [...new Set(features.flatMap((f) => Object.keys(f.properties ?? {})))];
  const nameAttr = pickNameAttribute(attributes, nameAttribute);
  const seen = new Set<string>();
  const out: ImportedFeature[] = [];
  for (const [index, f] of features.entries()) {
    const raw: unknown = nameAttr ? f.properties?.[nameAttr] : undefined;
    // A NUL character cannot be stored in a name (PostgreSQL text): it is dropped.
    const text = raw === undefined || raw === null ? '' : String(raw).replaceAll('\u0000', '').trim();
    const name = (text === '' ? `Field ${index + 1}` : text).slice(0, 120);
    const label = `feature ${index + 1} ("${name}")`;
    const errors: string[] = [];
    let acres: number | null = null;
    const g = f.geometry;
    if (!g) errors.push(`${label} has no geometry`);
    else if (g.type !== 'Polygon' && g.type !== 'MultiPolygon')
      errors.push(`${label} is ${GEOMETRY_NAMES[g.type] ?? g.type}, but a field boundary must be an area (polygon)`);
    else {
      const problems = checkBoundary(g, label);
      if (problems.length) errors.push(problems[0].message);
      else acres = m2ToAcres(geodesicAreaM2(g));
    }
    const key = name.toLowerCase();
    if (seen.has(key)) errors.push(`${label}: the name "${name}" is used twice in this file`);
    seen.add(key);
    out.push({ index, name, acres, geometry: g, properties: f.properties ?? {}, errors });
  }
  return { format, attributes, nameAttribute: nameAttr, features: out };
}
