import type { FeatureCollection, Geometry, Position } from 'geojson';
import proj4 from 'proj4';
import { MAX_BOUNDARY_RINGS, MAX_FILE_FEATURES, MAX_FILE_VERTICES } from '../../../shared/limits';
import { AppError } from '../../http/errors';
import { openArchive, type Archive } from './archive';
import { checkFileBudget } from './normalise';
import { EARTH_SEMI_MAJOR_M, prjNotOnEarth } from './prj-check';
import { readPrj, type PrjReading } from './prj-read';
import { nodeTouches } from './touch-nodes';

// shpjs's Node build reads `self`.
(globalThis as { self?: unknown }).self ??= globalThis;
// eslint-disable-next-line @typescript-eslint/no-require-imports
const shp = require('shpjs') as {
  parseShp: (shp: ArrayBufferView, prj?: string) => Array<Geometry | null>;
  parseDbf: (dbf: ArrayBufferView, cpg?: string) => Array<Record<string, unknown>>;
};

const bad = (message: string) => new AppError(422, 'bad_file', message);
const tooComplex = (message: string) => new AppError(422, 'file_too_complex', message);
const int = (n: number) => n.toLocaleString('en-US');

/** A .prj is a line of WKT, well under a kilobyte; anything this big is not one. */
const MAX_PRJ_BYTES = 64 * 1024;

/**
 * Most columns in a .dbf attribute table: dBASE (and so the shapefile's table) allows 255 fields
 * (ESRI shapefile documentation; recalled from memory).
 */
const MAX_DBF_FIELDS = 255;

/** Shape types whose records carry parts and points (ESRI shapefile technical description, 1998, table 1). */
const POLY_TYPES = new Set([3, 5, 13, 15, 23, 25, 31]);
const POLYGON_TYPES = new Set([5, 15, 25]);
const MULTIPOINT_TYPES = new Set([8, 18, 28]);

/**
 * Walks the .shp's record headers (ESRI technical description: a 100-byte header, then records
 * of an 8-byte big-endian header and their content) without reading any coordinates, and refuses
 * a file that would make too many shapes, points or rings before shpjs allocates them.
 * Mirrors how shpjs steps through the records (it stops at a record running past the end).
 */
export function checkShpHeader(data: Buffer, shpName: string): void {
  if (data.length < 100 || data.readInt32BE(0) !== 9994) throw bad(`${shpName} is not a shapefile (its header is missing or damaged)`);
  let offset = 100;
  let records = 0;
  let positions = 0;
  while (offset + 8 <= data.length) {
    const len = data.readInt32BE(offset + 4) * 2;
    if (len !== 0 && (len < 4 || offset + 8 + len > data.length)) break;
    records++;
    if (records > MAX_FILE_FEATURES)
      throw tooComplex(
        `${shpName} holds more than ${int(MAX_FILE_FEATURES)} shapes; Furlong reads at most ${int(MAX_FILE_FEATURES)} shapes from one file`,
      );
    const c = offset + 8;
    if (len >= 44) {
      const type = data.readInt32LE(c);
      // Counts are clamped to what the record can hold: shpjs stops (throws) at the record's end.
      if (POLY_TYPES.has(type)) {
        const parts = Math.min(Math.max(0, data.readInt32LE(c + 36)), Math.floor(len / 4));
        positions += Math.min(Math.max(0, data.readInt32LE(c + 40)), Math.floor(len / 16));
        // shpjs matches every hole against every outer ring: quadratic in the rings of one shape.
        if (POLYGON_TYPES.has(type) && parts > MAX_BOUNDARY_RINGS) {
          throw tooComplex(
            `Shape ${int(records)} in ${shpName} has ${int(parts)} rings; a field boundary may have at most ${int(MAX_BOUNDARY_RINGS)}`,
          );
        }
      } else if (MULTIPOINT_TYPES.has(type)) positions += Math.min(Math.max(0, data.readInt32LE(c + 36)), Math.floor(len / 16));
      else positions++;
    } else if (len > 0) positions++;
    if (positions > MAX_FILE_VERTICES)
      throw tooComplex(
        `${shpName} holds more than ${int(MAX_FILE_VERTICES)} points; Furlong reads at most ${int(MAX_FILE_VERTICES)} points from one file`,
      );
    offset += 8 + len;
  }
}

/** Reads the .dbf header (dBASE: record count at byte 4, header and record lengths at 8 and 10). */
export function checkDbfHeader(data: Buffer, dbfName: string): void {
  if (data.length < 32) throw bad(`The attribute table ${dbfName} is damaged (too short to hold its header)`);
  const records = data.readUInt32LE(4);
  const headerLen = data.readUInt16LE(8);
  const recordLen = data.readUInt16LE(10);
  if (records > MAX_FILE_FEATURES)
    throw tooComplex(`${dbfName} lists ${int(records)} rows; Furlong reads at most ${int(MAX_FILE_FEATURES)} shapes from one file`);
  const fields = Math.floor((headerLen - 33) / 32);
  if (fields > MAX_DBF_FIELDS)
    throw tooComplex(`${dbfName} has ${int(fields)} columns; a shapefile's attribute table has at most ${MAX_DBF_FIELDS}`);
  if (headerLen < 33 || headerLen + records * recordLen > data.length) {
    throw bad(`The attribute table ${dbfName} is damaged: it is shorter than its header says`);
  }
}

/**
 * A zipped ESRI shapefile (.shp + .dbf + .prj, ESRI technical description 1998), reprojected
 * to WGS84 from its .prj. A missing or unreadable .prj is refused: coordinates are never guessed.
 */
export async function parseShapefileZip(buffer: Buffer): Promise<FeatureCollection> {
  const zip = await openArchive(buffer, { label: 'zip', damaged: 'The zip file is damaged and cannot be opened' });
  const layers = zip.files.filter((n) => n.toLowerCase().endsWith('.shp'));
  if (layers.length === 0) throw bad('The zip holds no .shp file; a shapefile needs its .shp, .dbf and .prj files');
  const features: FeatureCollection['features'] = [];
  for (const shpName of layers) {
    features.push(...(await readLayer(zip, shpName)));
    if (features.length > MAX_FILE_FEATURES) break; // the count check below names it
  }
  const fc: FeatureCollection = { type: 'FeatureCollection', features };
  checkFileBudget(fc, 'zip');
  return fc;
}

/** One shapefile layer of the zip (name.shp with its name.dbf, name.prj and optional name.cpg). */
async function readLayer(zip: Archive, shpName: string): Promise<FeatureCollection['features']> {
  const base = shpName.slice(0, -4);
  const sibling = (ext: string) => zip.files.find((n) => n.toLowerCase() === `${base}.${ext}`.toLowerCase());
  const dbfName = sibling('dbf');
  if (!dbfName) throw bad(`The zip holds ${shpName} but no matching .dbf file (the attribute table); include it`);
  const prjName = sibling('prj');
  if (!prjName) throw bad(`The zip holds ${shpName} but no .prj file, so its coordinate system is unknown; export it again with its .prj`);
  const prjData = await zip.read(prjName);
  const unreadable = bad(
    `The coordinate system in ${prjName} cannot be read; export the shapefile again in WGS84 (EPSG:4326) or a UTM zone`,
  );
  if (prjData.length > MAX_PRJ_BYTES) throw unreadable;
  const prj = prjData.toString('utf8').trim();
  const elsewhere = prjNotOnEarth(prj, prjName);
  if (elsewhere) throw bad(elsewhere);
  let semiMajor: number | undefined;
  try {
    semiMajor = (proj4(prj) as unknown as { oProj?: { a?: number } }).oProj?.a;
  } catch {
    throw unreadable;
  }
  // What proj4 itself understood, in case its reading differs from ours.
  if (semiMajor !== undefined && (semiMajor < EARTH_SEMI_MAJOR_M.min || semiMajor > EARTH_SEMI_MAJOR_M.max)) {
    throw bad(
      `The coordinate system in ${prjName} is for another body (semi-major axis ${int(Math.round(semiMajor))} m); Furlong maps fields on Earth`,
    );
  }
  const reading = readPrj(prj, prjName);
  const shpData = withoutPadding(await zip.read(shpName));
  checkShpHeader(shpData, shpName);
  const dbfData = await zip.read(dbfName);
  checkDbfHeader(dbfData, dbfName);
  const cpgName = sibling('cpg');
  const cpg = cpgName ? (await zip.read(cpgName)).subarray(0, 256).toString('utf8') : undefined;
  let geoms: Array<Geometry | null>;
  let rows: Array<Record<string, unknown>>;
  try {
    // Read in the file's own coordinates; reprojected below through both readings of the .prj.
    geoms = shp.parseShp(shpData);
    rows = shp.parseDbf(dbfData, cpg);
  } catch (err) {
    throw bad(`The shapefile ${shpName} is damaged and cannot be read (${(err as Error).message})`);
  }
  // A null shape stays null (GeoJSON allows it); the preview names it "no geometry".
  return geoms.map((geometry, i) => ({
    type: 'Feature',
    geometry: (geometry && toWgs84(geometry, reading)) as Geometry,
    properties: rows[i] ?? {},
  }));
}

/**
 * The .shp without bytes after its last record. The header gives the file's length (16-bit words
 * at byte 24, ESRI technical description); some writers pad past it, or pad inside it with zeros.
 * No record has a content length of 0 (even a null shape holds its 4-byte type), so a record
 * header of zeros is padding: the records end there.
 */
export function withoutPadding(data: Buffer): Buffer {
  if (data.length < 100) return data;
  const declared = data.readInt32BE(24) * 2;
  let end = declared >= 100 && declared < data.length ? declared : data.length;
  for (let offset = 100; offset + 8 <= end;) {
    const len = data.readInt32BE(offset + 4) * 2;
    if (len === 0) {
      end = offset;
      break;
    }
    if (len < 0) break;
    offset += 8 + len;
  }
  return end < data.length ? data.subarray(0, end) : data;
}

/** A shape in the file's coordinates → WGS84, touches between its rings kept as touches. */
function toWgs84(g: Geometry, reading: PrjReading): Geometry {
  const pt = (p: Position) => reading.toWgs84(p);
  switch (g.type) {
    case 'Point':
      return { type: 'Point', coordinates: pt(g.coordinates) };
    case 'MultiPoint':
    case 'LineString':
      return { ...g, coordinates: g.coordinates.map(pt) } as Geometry;
    case 'MultiLineString':
      return { type: 'MultiLineString', coordinates: g.coordinates.map((l) => l.map(pt)) };
    case 'Polygon':
    case 'MultiPolygon': {
      const polys = g.type === 'Polygon' ? [g.coordinates] : g.coordinates;
      nodeTouches(
        polys.flatMap((rings) => rings),
        reading.millimetre,
      );
      const out = polys.map((rings) => rings.map((ring) => ring.map(pt)));
      return g.type === 'Polygon' ? { type: 'Polygon', coordinates: out[0] } : { type: 'MultiPolygon', coordinates: out };
    }
    default:
      return g;
  }
}
