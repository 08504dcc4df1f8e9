// Reading a shapefile's .prj into a transformation to WGS84 longitude/latitude, twice: proj4 reads
// the WKT (its own parser), and we read the same WKT ourselves into a PROJ string that proj4 runs
// without its WKT parser. Every point is taken through both; where they differ, the file is
// refused rather than placed where one reading alone puts it. Datums are judged here as well:
// a datum that cannot be shifted to WGS84 within a few metres is refused by name.
import type { Position } from 'geojson';
import proj4 from 'proj4';
import { AppError } from '../../http/errors';
import { readWkt, type WktNode } from './prj-check';

const bad = (message: string) => new AppError(422, 'bad_file', message);

/** Two readings of one point may differ by this much before the .prj is judged unreadable (metres). */
export const READINGS_AGREE_M = 0.5;

/** Metres per degree of latitude, near enough to compare two readings (common practice, no published source). */
const M_PER_DEG = 111_320;

/** How a .prj takes the file's coordinates to WGS84. */
export interface PrjReading {
  /** File coordinates → [lon, lat] WGS84, through both readings; throws a 422 when they differ. */
  toWgs84(p: Position): Position;
  /** A distance that is about one millimetre in the file's own units (for telling touches apart). */
  millimetre: number;
}

type Arg = string | number | WktNode;
const child = (n: WktNode | undefined, kw: string): WktNode | undefined =>
  n?.args.find((a): a is WktNode => typeof a === 'object' && a.keyword === kw);
const children = (n: WktNode, kw: string): WktNode[] => n.args.filter((a): a is WktNode => typeof a === 'object' && a.keyword === kw);
const key = (s: unknown) =>
  String(s)
    .toLowerCase()
    .replace(/[^a-z0-9]/g, '');

/**
 * Projection methods read here: WKT 1 names (OGC 01-009 and the ESRI spellings, compared without
 * case or punctuation) → the PROJ method and the parameters it takes. Others are refused by name.
 */
const METHODS: Record<string, { proj: string; kind: 'tm' | 'lcc2' | 'lcc1' | 'lcc' | 'aea' | 'merc1' | 'merc2' | 'sterea' }> = {
  transversemercator: { proj: 'tmerc', kind: 'tm' },
  gausskruger: { proj: 'tmerc', kind: 'tm' },
  lambertconformalconic: { proj: 'lcc', kind: 'lcc' },
  lambertconformalconic2sp: { proj: 'lcc', kind: 'lcc2' },
  lambertconformalconic1sp: { proj: 'lcc', kind: 'lcc1' },
  albersconicequalarea: { proj: 'aea', kind: 'aea' },
  albers: { proj: 'aea', kind: 'aea' },
  mercator: { proj: 'merc', kind: 'merc1' },
  mercator1sp: { proj: 'merc', kind: 'merc1' },
  mercator2sp: { proj: 'merc', kind: 'merc2' },
  obliquestereographic: { proj: 'sterea', kind: 'sterea' },
  doublestereographic: { proj: 'sterea', kind: 'sterea' },
};

/** WKT parameter names (normalised) → the PROJ parameter they set. */
const PARAMS: Record<string, string> = {
  falseeasting: 'x_0',
  falsenorthing: 'y_0',
  centralmeridian: 'lon_0',
  longitudeofcenter: 'lon_0',
  longitudeoforigin: 'lon_0',
  latitudeoforigin: 'lat_0',
  latitudeofcenter: 'lat_0',
  scalefactor: 'k_0',
  standardparallel1: 'lat_1',
  standardparallel2: 'lat_2',
};

/** Default of a missing WKT parameter, as GDAL and PROJ take it: 0, and 1 for a scale factor (recalled from memory). */
const DEFAULT: Record<string, number> = { x_0: 0, y_0: 0, lon_0: 0, lat_0: 0, k_0: 1 };

/** Datums on which WGS84 and NAD83 (all realisations) coordinates are taken as they are. */
const GEOCENTRIC_ELLIPSOIDS = [
  { a: 6378137, rf: 298.257223563 }, // WGS 84 (NIMA TR8350.2)
  { a: 6378137, rf: 298.257222101 }, // GRS 1980 (Moritz, Geodetic Reference System 1980)
];

const isNad27 = (name: string) => /northamerican1927|nad27|nad1927/.test(key(name));

/** A datum's name as a farmer would read it ("D_North_American_1927" → "NAD27"). */
export function datumLabel(name: string): string {
  if (isNad27(name)) return 'NAD27';
  return name.replace(/^D_/i, '').replace(/_/g, ' ').trim() || 'unnamed';
}

const datumRefusal = (name: string) =>
  bad(
    `This file uses the ${datumLabel(name)} datum; convert it to WGS84 or NAD83 first (Furlong cannot shift it to WGS84 within a few metres)`,
  );

interface Proj4Datum {
  datum_type?: number;
  datum_params?: number[];
}
// proj4's datum kinds (lib/constants/values.js).
const PJD_3PARAM = 1;
const PJD_7PARAM = 2;
const PJD_GRIDSHIFT = 3;

function proj4Datum(def: string): Proj4Datum | undefined {
  return (proj4(def) as unknown as { oProj?: { datum?: Proj4Datum } }).oProj?.datum;
}

const allZero = (xs: number[]) => xs.every((x) => x === 0);

/**
 * The datum shift this file's coordinates need, as a PROJ `towgs84` list, or a refusal.
 * WGS84 and NAD83 (and other datums on their ellipsoids) are taken unshifted: NAD83 to WGS 84 is
 * a null transformation to within about 2 m (EPSG:1188, accuracy 4 m; recalled from memory).
 * A seven-parameter shift is applied, from the file's TOWGS84 or, failing that, from proj4's
 * table of published datums. NAD27 needs the NADCON grids to be placed within a few metres, and
 * a three-parameter shift is good to about 5–10 m at best: both are refused by name.
 */
function datumShift(datum: WktNode | undefined, a: number, rf: number, proj4Reading: Proj4Datum | undefined): number[] {
  const name = typeof datum?.args[0] === 'string' ? datum.args[0] : 'unnamed';
  if (isNad27(name) || proj4Reading?.datum_type === PJD_GRIDSHIFT) throw datumRefusal(name);
  const towgs84 = child(datum, 'TOWGS84')?.args.filter((x): x is number => typeof x === 'number');
  if (towgs84 && towgs84.length > 0) {
    if (allZero(towgs84)) return [0, 0, 0];
    if (towgs84.length === 7) return towgs84;
    throw datumRefusal(name);
  }
  if (GEOCENTRIC_ELLIPSOIDS.some((e) => Math.abs(e.a - a) < 1e-3 && Math.abs(e.rf - rf) < 1e-6)) return [0, 0, 0];
  const fromTable = proj4Reading?.datum_params?.map(Number);
  if (proj4Reading?.datum_type === PJD_7PARAM && fromTable?.length === 7) return fromTable;
  if (proj4Reading?.datum_type === PJD_3PARAM && fromTable && allZero(fromTable)) return [0, 0, 0];
  throw datumRefusal(name);
}

const numberArg = (n: WktNode | undefined, i: number): number | undefined => (typeof n?.args[i] === 'number' ? n.args[i] : undefined);
const nameArg = (n: WktNode | undefined): string => (typeof n?.args[0] === 'string' ? n.args[0] : '');

/** Writes a WKT tree back as WKT 1 text. */
function writeWkt(n: WktNode): string {
  const arg = (a: Arg): string => (typeof a === 'object' ? writeWkt(a) : typeof a === 'number' ? String(a) : `"${a.replace(/"/g, '""')}"`);
  return `${n.keyword}[${n.args.map(arg).join(',')}]`;
}

/**
 * Reads a .prj (OGC WKT 1, as shapefiles carry it) into a checked transformation to WGS84.
 * Missing parameters take GDAL's and PROJ's defaults (0; 1 for a scale factor); a conic
 * projection without its first standard parallel, a method not listed in METHODS, angles not in
 * degrees, and datums that cannot be shifted within a few metres are refused with a plain reason.
 * WKT 2 and PROJ strings are read by proj4 alone (no second reading), with the same datum rules.
 */
export function readPrj(prj: string, prjName: string): PrjReading {
  const unreadable = (why = '') =>
    bad(
      `The coordinate system in ${prjName} cannot be read${why ? ` (${why})` : ''}; export the shapefile again in WGS84 (EPSG:4326) or a UTM zone`,
    );
  const roots = readWkt(prj);
  const root = roots?.length === 1 ? roots[0] : undefined;
  if (!root || (root.keyword !== 'PROJCS' && root.keyword !== 'GEOGCS')) return singleReading(prj, unreadable);

  const projected = root.keyword === 'PROJCS';
  const geogcs = projected ? child(root, 'GEOGCS') : root;
  const datum = child(geogcs, 'DATUM');
  const spheroid = child(datum, 'SPHEROID');
  const a = numberArg(spheroid, 1);
  const rf = numberArg(spheroid, 2);
  if (a === undefined || rf === undefined) throw unreadable('it gives no ellipsoid');
  const angular = numberArg(child(geogcs, 'UNIT'), 1) ?? Math.PI / 180;
  if (Math.abs(angular - Math.PI / 180) > 1e-12) throw unreadable('its angles are not in degrees');
  const pm = numberArg(child(geogcs, 'PRIMEM'), 1) ?? 0;

  let filled = root;
  const parts: string[] = [];
  let linear = 1;
  if (projected) {
    const methodName = nameArg(child(root, 'PROJECTION'));
    const method = METHODS[key(methodName)];
    if (!method)
      throw bad(
        `The coordinate system in ${prjName} uses the ${methodName.replace(/_/g, ' ') || 'unnamed'} projection, which Furlong does not read; export the shapefile again in WGS84 (EPSG:4326) or a UTM zone`,
      );
    const given: Record<string, number> = {};
    for (const p of children(root, 'PARAMETER')) {
      const proj = PARAMS[key(p.args[0])];
      const v = numberArg(p, 1);
      if (proj && v !== undefined) given[proj] = v;
    }
    const conic = method.kind === 'lcc' || method.kind === 'lcc2' || method.kind === 'aea';
    if (conic && given.lat_1 === undefined)
      throw unreadable(`its ${methodName.replace(/_/g, ' ')} projection leaves out its standard parallel, which has no safe default`);
    const v: Record<string, number> = { ...DEFAULT, ...given };
    if (method.kind === 'lcc1') v.lat_1 = v.lat_0;
    if (conic) v.lat_2 = given.lat_2 ?? v.lat_1; // one standard parallel: a tangent cone, as PROJ's lcc takes it
    const names: Record<string, string[]> = {
      tm: ['lat_0', 'lon_0', 'k_0', 'x_0', 'y_0'],
      lcc: ['lat_1', 'lat_2', 'lat_0', 'lon_0', 'k_0', 'x_0', 'y_0'],
      lcc2: ['lat_1', 'lat_2', 'lat_0', 'lon_0', 'x_0', 'y_0'],
      lcc1: ['lat_1', 'lat_2', 'lat_0', 'lon_0', 'k_0', 'x_0', 'y_0'],
      aea: ['lat_1', 'lat_2', 'lat_0', 'lon_0', 'x_0', 'y_0'],
      merc1: ['lon_0', 'k_0', 'x_0', 'y_0'],
      merc2: ['lat_ts', 'lon_0', 'x_0', 'y_0'],
      sterea: ['lat_0', 'lon_0', 'k_0', 'x_0', 'y_0'],
    };
    if (method.kind === 'merc2' || (method.kind === 'merc1' && given.lat_1 !== undefined)) v.lat_ts = given.lat_1 ?? 0;
    const used = method.kind === 'merc1' && given.lat_1 !== undefined ? names.merc2 : names[method.kind];
    linear = numberArg(child(root, 'UNIT'), 1) ?? 1;
    if (!(linear > 0)) throw unreadable('its length unit has no usable size');
    parts.push(`+proj=${method.proj}`, ...used.map((n) => `+${n}=${v[n]}`), `+to_meter=${linear}`);
    // The WKT proj4 reads gets every parameter we default written out, so both readings start alike.
    const wktNames: Record<string, string> = {
      x_0: 'False_Easting',
      y_0: 'False_Northing',
      lon_0: 'Central_Meridian',
      lat_0: 'Latitude_Of_Origin',
      k_0: 'Scale_Factor',
      lat_1: 'Standard_Parallel_1',
      lat_2: 'Standard_Parallel_2',
    };
    const added = used
      .filter((n) => n !== 'lat_ts' && given[n] === undefined && wktNames[n])
      .map((n): WktNode => ({ keyword: 'PARAMETER', args: [wktNames[n], v[n]] }));
    if (added.length) {
      const at = root.args.findIndex((x) => typeof x === 'object' && x.keyword === 'UNIT');
      const args = [...root.args];
      args.splice(at < 0 ? args.length : at, 0, ...added);
      filled = { keyword: root.keyword, args };
    }
  } else parts.push('+proj=longlat');

  const filledWkt = writeWkt(filled);
  let proj4Reading: Proj4Datum | undefined;
  try {
    proj4Reading = proj4Datum(filledWkt);
  } catch {
    throw unreadable();
  }
  const shift = datumShift(datum, a, rf, proj4Reading);
  parts.push(`+a=${a}`, rf === 0 ? `+b=${a}` : `+rf=${rf}`, `+towgs84=${shift.join(',')}`, `+pm=${pm}`, '+no_defs');
  let first: proj4.Converter;
  let second: proj4.Converter;
  try {
    first = proj4(filledWkt, 'WGS84');
    second = proj4(parts.join(' '), 'WGS84');
  } catch {
    throw unreadable();
  }
  return {
    millimetre: projected ? 0.001 / linear : 1e-8,
    toWgs84(p) {
      const x = first.forward([p[0], p[1]]);
      const y = second.forward([p[0], p[1]]);
      const off = Math.hypot((x[1] - y[1]) * M_PER_DEG, (x[0] - y[0]) * M_PER_DEG * Math.cos((y[1] * Math.PI) / 180));
      if (!(off <= READINGS_AGREE_M) || !onEarth(x))
        throw bad(
          `The coordinate system in ${prjName} cannot be read for sure: two readings of it place the shapes ${Number.isFinite(off) ? `${Math.round(off).toLocaleString('en-US')} m` : 'far'} apart. Export the shapefile again in WGS84 (EPSG:4326) or a UTM zone`,
        );
      return x;
    },
  };
}

const onEarth = (p: number[]) => Number.isFinite(p[0]) && Number.isFinite(p[1]) && Math.abs(p[0]) <= 180 && Math.abs(p[1]) <= 90;

/** WKT 2 or a PROJ string: proj4's reading alone, with the datum rules. */
function singleReading(prj: string, unreadable: (why?: string) => AppError): PrjReading {
  let conv: proj4.Converter;
  let reading: Proj4Datum | undefined;
  let names: { a?: number; rf?: number; datumCode?: string; projName?: string; to_meter?: number };
  try {
    conv = proj4(prj, 'WGS84');
    const oProj = (proj4(prj) as unknown as { oProj?: typeof names & { datum?: Proj4Datum; b?: number } }).oProj ?? {};
    reading = oProj.datum;
    names = oProj;
  } catch {
    throw unreadable();
  }
  const datumName = names.datumCode ?? 'unnamed';
  if (isNad27(datumName) || reading?.datum_type === PJD_GRIDSHIFT) throw datumRefusal(datumName);
  const geocentric = GEOCENTRIC_ELLIPSOIDS.some((e) => Math.abs(e.a - (names.a ?? 0)) < 1e-3 && Math.abs(e.rf - (names.rf ?? 0)) < 1e-6);
  const params = reading?.datum_params?.map(Number) ?? [];
  if (!geocentric && !(reading?.datum_type === PJD_7PARAM) && !(params.length && allZero(params))) throw datumRefusal(datumName);
  const geographic = names.projName === 'longlat';
  return {
    millimetre: geographic ? 1e-8 : 0.001 / (names.to_meter ?? 1),
    toWgs84(p) {
      const x = conv.forward([p[0], p[1]]);
      if (!onEarth(x)) throw unreadable('its coordinates do not fall on Earth');
      return x;
    },
  };
}
