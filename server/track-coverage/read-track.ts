// Reading a track file (GPX 1.1 or GeoJSON) into lines of fixes for the coverage computation.
// Pure (no database), so it runs in a compute worker; the command uses it too.
import { gpx } from '@tmcw/togeojson';
import { DOMParser } from '@xmldom/xmldom';
import type { Feature, Geometry, Position } from 'geojson';
import type { TrackPoint } from '../../shared/track-coverage/coverage';
import { MAX_NESTING_DEPTH, MAX_TRACK_POINTS, MAX_UNPACKED_BYTES } from '../../shared/limits';
import { AppError } from '../http/errors';
import { jsonNestsDeeperThan } from '../fields/import/parse-geojson';
import { readTimeLogZip } from './read-timelog';

const bad = (message: string) => new AppError(400, 'bad_track', message);
const int = (n: number) => n.toLocaleString('en-US');
type GpxDocument = Parameters<typeof gpx>[0];

export interface ReadTrack {
  format: 'gpx' | 'geojson' | 'timelog';
  lines: TrackPoint[][];
}

/** Time of a fix: ISO 8601 text or ms since 1970; anything else is no time. */
function timeOf(v: unknown): number | undefined {
  if (typeof v === 'number' && Number.isFinite(v)) return v;
  if (typeof v === 'string') {
    const t = Date.parse(v);
    return Number.isFinite(t) ? t : undefined;
  }
  return undefined;
}

/** Work state of a fix: a boolean, 0/1, or "on"/"off"; anything else is unknown. */
function workingOf(v: unknown): boolean | undefined {
  if (typeof v === 'boolean') return v;
  if (v === 1 || v === '1' || v === 'on' || v === 'true') return true;
  if (v === 0 || v === '0' || v === 'off' || v === 'false') return false;
  return undefined;
}

function fix(p: Position, t: unknown, working: unknown): TrackPoint {
  if (!Array.isArray(p) || typeof p[0] !== 'number' || typeof p[1] !== 'number')
    throw bad('The track has a position that is not a pair of numbers (longitude, latitude)');
  const out: TrackPoint = { lon: p[0], lat: p[1] };
  const time = timeOf(t);
  if (time !== undefined) out.t = time;
  const w = workingOf(working);
  if (w !== undefined) out.working = w;
  return out;
}

/**
 * The lines of a GeoJSON track. Point features, in file order, are one line; each takes its time
 * from `properties.time` (or `timestamp`) and its work state from `properties.working`. A
 * LineString (or each part of a MultiLineString) is a line of its own; per-position times and
 * work states may come in `properties.coordinateProperties.times` / `.working` (the layout GPX
 * converters write), and `properties.working: false` marks a whole line as not working.
 */
function linesOfGeoJson(features: Feature[]): TrackPoint[][] {
  const lines: TrackPoint[][] = [];
  let points: TrackPoint[] = [];
  for (const f of features) {
    const g = f?.geometry as Geometry | null;
    const props = (f?.properties ?? {}) as Record<string, unknown>;
    if (!g) continue;
    if (g.type === 'Point') {
      points.push(fix(g.coordinates, props.time ?? props.timestamp, props.working));
      continue;
    }
    if (points.length) lines.push(points);
    points = [];
    const cp = (props.coordinateProperties ?? {}) as { times?: unknown; working?: unknown };
    const whole = workingOf(props.working);
    const line = (coords: Position[], times: unknown, working: unknown) => {
      if (!Array.isArray(coords)) throw bad('A line in the track has no list of positions');
      const ts = Array.isArray(times) ? times : [];
      const ws = Array.isArray(working) ? working : [];
      lines.push(coords.map((p, i) => fix(p, ts[i], whole === false ? false : ws[i])));
    };
    if (g.type === 'LineString') line(g.coordinates, cp.times, cp.working);
    else if (g.type === 'MultiLineString')
      g.coordinates.forEach((c, k) =>
        line(c, Array.isArray(cp.times) ? cp.times[k] : undefined, Array.isArray(cp.working) ? cp.working[k] : undefined),
      );
    // Polygons (a boundary sent by mistake) are not tracks: refused below when nothing else is there.
  }
  if (points.length) lines.push(points);
  return lines;
}

function parseGeoJsonTrack(text: string): TrackPoint[][] {
  if (jsonNestsDeeperThan(text, MAX_NESTING_DEPTH))
    throw bad(`The GeoJSON file nests lists and objects more than ${MAX_NESTING_DEPTH} deep; a track needs fewer than 10 levels`);
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (err) {
    throw bad(`The GeoJSON file is not valid JSON (${(err as Error).message})`);
  }
  const obj = data as { type?: unknown; features?: unknown };
  if (!obj || typeof obj !== 'object' || typeof obj.type !== 'string')
    throw bad('The GeoJSON file has no "type"; it does not look like GeoJSON');
  if (obj.type === 'FeatureCollection') {
    if (!Array.isArray(obj.features)) throw bad('The FeatureCollection has no "features" list');
    return linesOfGeoJson(obj.features as Feature[]);
  }
  if (obj.type === 'Feature') return linesOfGeoJson([obj as Feature]);
  return linesOfGeoJson([{ type: 'Feature', properties: {}, geometry: obj as Geometry }]);
}

/** A GPX 1.1 file (topografix.com/GPX/1/1): its tracks' segments and its routes are lines. */
function parseGpx(text: string): TrackPoint[][] {
  // GPX never needs a document type; one can carry entity expansion and external entities.
  if (/<!\s*(?:DOCTYPE|ENTITY)/i.test(text))
    throw bad(
      'The GPX file declares a document type or entities (<!DOCTYPE>/<!ENTITY>); GPX never needs them. Export it again as plain GPX',
    );
  const elements = text.split('<').length - 1;
  if (elements > 20 * MAX_TRACK_POINTS)
    throw bad(
      `The GPX file holds more than ${int(20 * MAX_TRACK_POINTS)} XML elements; Furlong reads tracks of at most ${int(MAX_TRACK_POINTS)} points`,
    );
  let depth = 0;
  for (const m of text.matchAll(/<(\/?)[A-Za-z][^>]*?(\/?)>/g)) {
    if (m[1]) depth--;
    else if (!m[2] && ++depth > MAX_NESTING_DEPTH)
      throw bad(`The GPX file nests its elements more than ${MAX_NESTING_DEPTH} deep; a track needs fewer than 10 levels`);
  }
  let doc: GpxDocument;
  try {
    const parser = new DOMParser({
      onError: (level, message) => {
        if (level !== 'warning') throw new Error(message);
      },
    });
    doc = parser.parseFromString(text, 'text/xml') as unknown as GpxDocument;
  } catch (err) {
    throw bad(`The GPX file is damaged and cannot be read (${(err as Error).message.split('\n')[0]})`);
  }
  if (!doc.documentElement || doc.documentElement.nodeName.replace(/^.*:/, '') !== 'gpx')
    throw bad('The file is XML but not GPX (its root element is not <gpx>)');
  const fc = gpx(doc);
  return linesOfGeoJson(fc.features.filter((f) => f.geometry?.type !== 'Point'));
}

/**
 * Reads a track file: GPX (tracks and routes; waypoints are not a track) or GeoJSON (points or
 * lines, with optional times and work states). Refused with a 400 and a plain reason when it is
 * neither, is damaged, holds no line of two or more positions, or more than MAX_TRACK_POINTS.
 */
export function readTrackFile(name: string, data: Buffer): ReadTrack {
  if (data.length > MAX_UNPACKED_BYTES) throw bad(`The track file is larger than ${MAX_UNPACKED_BYTES / 1024 / 1024} MB`);
  const text = data.toString('utf8').replace(/^\uFEFF/, '');
  const head = text.trimStart();
  const ext = name.toLowerCase().split('.').pop() ?? '';
  let format: ReadTrack['format'];
  if (ext === 'gpx' || (ext !== 'geojson' && ext !== 'json' && head.startsWith('<'))) format = 'gpx';
  else if (ext === 'geojson' || ext === 'json' || head.startsWith('{')) format = 'geojson';
  else
    throw bad(`Furlong reads tracks from GPX (.gpx), GeoJSON (.geojson) and TASKDATA.zip files with a TimeLog; "${name}" is none of them`);
  const lines = (format === 'gpx' ? parseGpx(text) : parseGeoJsonTrack(text)).filter((l) => l.length > 0);
  const points = lines.reduce((n, l) => n + l.length, 0);
  if (points > MAX_TRACK_POINTS)
    throw bad(`The track holds ${int(points)} points; Furlong reads at most ${int(MAX_TRACK_POINTS)} from one file`);
  if (!lines.some((l) => l.length >= 2))
    throw bad(
      format === 'gpx'
        ? 'The GPX file holds no track or route with two or more points'
        : 'The GeoJSON file holds no track: it needs points or lines with two or more positions',
    );
  return { format, lines };
}

/** A zip (by its name or its first bytes, "PK"): task data that may hold TimeLogs. */
export const isZip = (name: string, data: Buffer) => /\.zip$/i.test(name) || (data[0] === 0x50 && data[1] === 0x4b);

/** Any track file: a TASKDATA.zip with TimeLogs (read-timelog.ts), or GPX / GeoJSON (readTrackFile). */
export async function readAnyTrack(name: string, data: Buffer): Promise<ReadTrack> {
  if (isZip(name, data)) return { format: 'timelog', lines: await readTimeLogZip(data) };
  return readTrackFile(name, data);
}
