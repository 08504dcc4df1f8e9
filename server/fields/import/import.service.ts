// Boundary files in: GeoJSON, KML/KMZ and zipped shapefiles. A preview lists every feature
// found with its acres and problems; saving writes the chosen ones in one transaction, or none.
import type { FeatureCollection } from 'geojson';
import type { ImportPreview, ImportedFeature } from '../../../shared/schemas/fields';
import { checkBoundary } from '../../../shared/geo/boundary-check';
import { geodesicAreaM2 } from '../../../shared/geo/geodesic-area';
import { ACRE_M2 } from '../../../shared/units';
import type { AppDeps } from '../../app-deps';
import { AppError } from '../../http/errors';
import { createField } from '../fields.service';
import { fieldNameTaken } from '../fields.repository';
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
  throw new AppError(415, 'unknown_format', `Furlong reads GeoJSON (.geojson), KML (.kml, .kmz) and zipped shapefiles (.zip); "${fileName}" is none of these`);
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
    if (!attributes.includes(wanted)) throw new AppError(400, 'invalid_input', `The file has no attribute "${wanted}"; it has: ${attributes.join(', ') || 'none'}`);
    return wanted;
  }
  for (const key of NAME_KEYS) {
    const hit = attributes.find((a) => a.toLowerCase() === key);
    if (hit) return hit;
  }
  return null;
}

const GEOMETRY_NAMES: Record<string, string> = { Point: 'a point', MultiPoint: 'points', LineString: 'a line', MultiLineString: 'lines', GeometryCollection: 'a mix of shapes' };

/** Reads a boundary file and checks every feature in it against the farm's fields. */
export async function previewImport(deps: AppDeps, farmId: number, file: { name: string; data: Buffer }, nameAttribute?: string): Promise<ImportPreview> {
  if (file.data.length === 0) throw new AppError(400, 'empty_file', `The file "${file.name}" is empty`);
  const format = detectFormat(file.name, file.data);
  const features = featuresOf(await parse(format, file.data));
  if (features.length === 0) throw new AppError(422, 'no_features', `No shapes were found in "${file.name}"`);
  const attributes = [...new Set(features.flatMap((f) => Object.keys(f.properties ?? {})))];
  const nameAttr = pickNameAttribute(attributes, nameAttribute);
  const seen = new Map<string, number>();
  const out: ImportedFeature[] = [];
  for (const [index, f] of features.entries()) {
    const raw = nameAttr ? f.properties?.[nameAttr] : undefined;
    const name = (raw === undefined || raw === null || String(raw).trim() === '' ? `Field ${index + 1}` : String(raw).trim()).slice(0, 120);
    const label = `feature ${index + 1} ("${name}")`;
    const errors: string[] = [];
    let acres: number | null = null;
    const g = f.geometry;
    if (!g) errors.push(`${label} has no geometry`);
    else if (g.type !== 'Polygon' && g.type !== 'MultiPolygon') errors.push(`${label} is ${GEOMETRY_NAMES[g.type] ?? g.type}, but a field boundary must be an area (polygon)`);
    else {
      const problems = checkBoundary(g, label);
      if (problems.length) errors.push(problems[0].message);
      else acres = geodesicAreaM2(g) / ACRE_M2;
    }
    out.push({ index, name, acres, geometry: g, properties: f.properties ?? {}, errors });
    const key = name.toLowerCase();
    if (seen.has(key)) errors.push(`${label}: the name "${name}" is used twice in this file`);
    seen.set(key, index);
  }
  for (const f of out) {
    if (await fieldNameTaken(deps.db, farmId, f.name)) f.errors.push(`A field called "${f.name}" already exists on this farm; rename it or untick it`);
  }
  return { format, attributes, nameAttribute: nameAttr, features: out };
}

/** Saves the chosen features (all of them when no choice is given) in one transaction. */
export async function saveImport(
  deps: AppDeps,
  farmId: number,
  file: { name: string; data: Buffer },
  nameAttribute: string | undefined,
  selection: Array<{ index: number; name: string }> | undefined,
): Promise<{ saved: Array<{ id: number; name: string; acres: number }> }> {
  const preview = await previewImport(deps, farmId, file, nameAttribute);
  const chosen = selection ?? preview.features.map((f) => ({ index: f.index, name: f.name }));
  const problems: string[] = [];
  const names = new Set<string>();
  for (const c of chosen) {
    const f = preview.features[c.index];
    if (!f) {
      problems.push(`There is no feature ${c.index + 1} in the file`);
      continue;
    }
    const errors = f.errors.filter((e) => !e.includes('already exists on this farm') && !e.includes('is used twice'));
    problems.push(...errors);
    if (names.has(c.name.toLowerCase())) problems.push(`Two fields would be called "${c.name}"; rename one`);
    names.add(c.name.toLowerCase());
    if (await fieldNameTaken(deps.db, farmId, c.name)) problems.push(`A field called "${c.name}" already exists on this farm; rename it or untick it`);
  }
  if (problems.length) {
    throw new AppError(422, 'import_refused', `Nothing was saved. ${problems[0]}${problems.length > 1 ? ` (and ${problems.length - 1} more problem${problems.length > 2 ? 's' : ''})` : ''}`, undefined, { problems });
  }
  const saved = await deps.db.transaction(async (tx) => {
    const rows: Array<{ id: number; name: string; acres: number }> = [];
    for (const c of chosen) {
      const f = preview.features[c.index];
      const id = await createField(deps, farmId, { name: c.name, boundary: f.geometry }, tx);
      rows.push({ id, name: c.name, acres: f.acres! });
    }
    return rows;
  });
  return { saved };
}
