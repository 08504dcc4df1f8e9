import type { Feature, FeatureCollection } from 'geojson';
import { MAX_NESTING_DEPTH, MAX_UNPACKED_BYTES } from '../../../shared/limits';
import { AppError } from '../../http/errors';
import { formatFileSize } from '../../../shared/file-size';
import { checkFileBudget } from './normalise';

const bad = (message: string) => new AppError(422, 'bad_file', message);

/**
 * Whether JSON text nests arrays and objects deeper than `limit`, by one linear pass that skips
 * strings (escapes included). It stops at the first level past the limit, so `[[[[…` costs nothing.
 */
export function jsonNestsDeeperThan(text: string, limit: number): boolean {
  let depth = 0;
  const n = text.length;
  for (let i = 0; i < n; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x22 /* " */) {
      for (i++; i < n; i++) {
        const s = text.charCodeAt(i);
        if (s === 0x5c /* \ */) i++;
        else if (s === 0x22) break;
      }
    } else if (c === 0x5b /* [ */ || c === 0x7b /* { */) {
      if (++depth > limit) return true;
    } else if (c === 0x5d /* ] */ || c === 0x7d /* } */) depth--;
  }
  return false;
}

/** A GeoJSON file (RFC 7946): a FeatureCollection, a Feature or a bare geometry. */
export function parseGeoJson(text: string): FeatureCollection {
  if (text.length > MAX_UNPACKED_BYTES) {
    throw new AppError(
      413,
      'too_large',
      `The GeoJSON file is ${formatFileSize(text.length)}; Furlong reads at most ${formatFileSize(MAX_UNPACKED_BYTES)} per file`,
    );
  }
  // JSON.parse itself copes with deep nesting, but everything after it (our checks, the preview's
  // own JSON answer) walks the result recursively: a file nested deeper is refused unread.
  if (jsonNestsDeeperThan(text, MAX_NESTING_DEPTH)) {
    throw new AppError(
      422,
      'file_too_complex',
      `The GeoJSON file nests lists and objects more than ${MAX_NESTING_DEPTH} deep; a boundary file needs fewer than 10 levels`,
    );
  }
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (err) {
    throw bad(`The GeoJSON file is not valid JSON (${(err as Error).message})`);
  }
  const obj = data as { type?: string; crs?: { properties?: { name?: string } }; features?: unknown };
  if (!obj || typeof obj !== 'object' || typeof obj.type !== 'string')
    throw bad('The GeoJSON file has no "type"; it does not look like GeoJSON');
  const crs = obj.crs?.properties?.name;
  if (crs && !/CRS84|4326/i.test(String(crs))) {
    throw bad(
      `The GeoJSON file uses the coordinate system ${crs}; GeoJSON (RFC 7946) must be WGS84 longitude/latitude — export it again in WGS84`,
    );
  }
  let fc: FeatureCollection;
  if (obj.type === 'FeatureCollection') {
    if (!Array.isArray(obj.features)) throw bad('The FeatureCollection has no "features" list');
    fc = obj as FeatureCollection;
  } else if (obj.type === 'Feature') fc = { type: 'FeatureCollection', features: [obj as Feature] };
  else fc = { type: 'FeatureCollection', features: [{ type: 'Feature', properties: {}, geometry: obj as Feature['geometry'] }] };
  checkFileBudget(fc, 'GeoJSON file');
  return fc;
}
