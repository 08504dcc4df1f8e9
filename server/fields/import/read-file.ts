// Reading one boundary file into candidate fields: format, shapes, names, checks and acres.
// Pure (no database), so it runs in a compute worker; the farm's own checks follow in the service.
import type { FeatureCollection } from 'geojson';
import { FIELD_NAME_MAX, fieldNameProblems } from '../../../shared/field-names';
import { checkAndMeasureBoundary } from '../../../shared/geo/boundary-check';
import type { ImportPreview, ImportProblem, ImportedFeature } from '../../../shared/schemas/fields';
import { AppError } from '../../http/errors';
import { featuresOf } from './normalise';
import { parseGeoJson } from './parse-geojson';
import { parseKml, parseKmz } from './parse-kml';
import { parseShapefileZip } from './parse-shapefile';
import { isTaskDataName, parseTaskData, type TaskDataRead } from './parse-taskdata';
import { openArchive } from './archive';

type Format = ImportPreview['format'];

const NAME_KEYS = ['name', 'field', 'field_name', 'fieldname', 'label', 'title', 'id'];

const isZip = (buf: Buffer) => buf.length > 3 && buf[0] === 0x50 && buf[1] === 0x4b;

async function detectFormat(fileName: string, buf: Buffer): Promise<Format> {
  const ext = fileName.toLowerCase().split('.').pop() ?? '';
  const zip = isZip(buf);
  if (ext === 'kmz') return 'kmz';
  // A terminal's TASKDATA.zip by its name (so a damaged one is reported as task data), or any zip
  // that holds a TASKDATA.XML (only the zip's directory is read here).
  if (ext === 'zip' && /taskdata/i.test(fileName)) return 'taskdata';
  if (zip && ext !== 'kml') {
    const files = await openArchive(buf, { label: 'zip', damaged: 'The file is not a readable zip archive' }).then(
      (a) => a.files,
      () => [],
    );
    return files.some(isTaskDataName) ? 'taskdata' : 'shapefile';
  }
  if (ext === 'zip') return 'shapefile';
  if (ext === 'kml') return 'kml';
  if (['geojson', 'json'].includes(ext)) return 'geojson';
  const head = buf.subarray(0, 1024).toString('utf8').trimStart();
  if (head.startsWith('{')) return 'geojson';
  // ISO 11783-10 task data is TASKDATA.XML; any other .xml is read as task data too, and refused
  // with a message naming its root element when it is not.
  if (ext === 'xml' || (head.startsWith('<') && head.includes('ISO11783_TaskData'))) return 'taskdata';
  if (head.startsWith('<')) return 'kml';
  throw new AppError(
    415,
    'unknown_format',
    `Furlong reads GeoJSON (.geojson), KML (.kml, .kmz), zipped shapefiles (.zip) and ISO 11783-10 task data (TASKDATA.zip, TASKDATA.XML); "${fileName}" is none of these`,
  );
}

async function parse(format: Format, buf: Buffer, fileName: string): Promise<FeatureCollection | TaskDataRead> {
  switch (format) {
    case 'taskdata':
      return parseTaskData(buf, isZip(buf) || fileName.toLowerCase().endsWith('.zip'));
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

/** A feature of a file, read, checked and measured once: `areaM2` rides along to the save. */
export interface ReadFeature extends ImportedFeature {
  /** Square metres on the WGS84 ellipsoid; null when the boundary has a problem. */
  areaM2: number | null;
}

export interface ReadFile extends ImportPreview {
  features: ReadFeature[];
}

/**
 * Reads a boundary file (GeoJSON, KML, KMZ or zipped shapefile) and checks every shape in it as a
 * field boundary. Problems with the farm (a name already used) are for the caller to add.
 *
 * @param file the uploaded file's name and bytes
 * @param nameAttribute the attribute that holds field names (default: the first of NAME_KEYS found)
 */
export async function readBoundaryFile(file: { name: string; data: Buffer }, nameAttribute?: string): Promise<ReadFile> {
  if (file.data.length === 0) throw new AppError(400, 'empty_file', `The file "${file.name}" is empty`);
  const format = await detectFormat(file.name, file.data);
  const parsed = await parse(format, file.data, file.name);
  const guidance = 'guidance' in parsed ? parsed.guidance : undefined;
  const features = featuresOf('guidance' in parsed ? parsed.fc : parsed);
  if (features.length === 0) throw new AppError(422, 'no_features', `No shapes were found in "${file.name}"`);
  const attributes = [...new Set(features.flatMap((f) => Object.keys(f.properties ?? {})))];
  const nameAttr = pickNameAttribute(attributes, nameAttribute);
  const names = features.map((f, index) => {
    const raw: unknown = nameAttr ? f.properties?.[nameAttr] : undefined;
    // A NUL character cannot be stored in a name (PostgreSQL text): it is dropped.
    const text = raw === undefined || raw === null ? '' : String(raw).replaceAll('\u0000', '').trim();
    return { index, name: (text === '' ? `Field ${index + 1}` : text).slice(0, FIELD_NAME_MAX) };
  });
  // Names are never blank or too long here (see above): only a repeat can be wrong.
  const repeated = new Set(
    fieldNameProblems(names)
      .filter((p) => p.code === 'name-repeated')
      .map((p) => p.index),
  );
  const out: ReadFeature[] = features.map((f, index) => {
    const { name } = names[index];
    const label = `feature ${index + 1} ("${name}")`;
    const problems: ImportProblem[] = [];
    let area: { areaM2: number | null; acres: number | null } = { areaM2: null, acres: null };
    const g = f.geometry;
    if (!g) problems.push({ code: 'not-polygon', message: `${label} has no geometry`, index });
    else if (g.type !== 'Polygon' && g.type !== 'MultiPolygon')
      problems.push({
        code: 'not-polygon',
        message: `${label} is ${GEOMETRY_NAMES[g.type] ?? g.type}, not a field boundary: a field boundary must be an area (polygon)`,
        index,
      });
    else {
      const m = checkAndMeasureBoundary(g, label);
      if (m.problems.length) problems.push({ code: m.problems[0].code, message: m.problems[0].message, index });
      else area = m;
    }
    if (repeated.has(index))
      problems.push({ code: 'name-repeated', message: `${label}: the name "${name}" is used twice in this file`, index });
    return {
      index,
      name,
      acres: area.acres,
      areaM2: area.areaM2,
      geometry: g,
      properties: f.properties ?? {},
      problems,
      errors: problems.map((p) => p.message),
    };
  });
  return { format, attributes, nameAttribute: nameAttr, features: out, ...(guidance ? { guidance } : {}) };
}
