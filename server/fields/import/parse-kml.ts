import { kml } from '@tmcw/togeojson';
import { DOMParser } from '@xmldom/xmldom';
import type { FeatureCollection } from 'geojson';
import { MAX_FILE_FEATURES, MAX_FILE_VERTICES, MAX_NESTING_DEPTH, MAX_UNPACKED_BYTES } from '../../../shared/limits';
import { AppError } from '../../http/errors';
import { formatFileSize } from '../../../shared/file-size';
import { openArchive } from './archive';
import { checkFileBudget } from './normalise';

const bad = (message: string) => new AppError(422, 'bad_file', message);
const tooComplex = (message: string) => new AppError(422, 'file_too_complex', message);
const int = (n: number) => n.toLocaleString('en-US');
type KmlDocument = Parameters<typeof kml>[0];

/**
 * Most XML nodes (elements, attributes, text) given to the DOM parser. xmldom keeps about 0.6 kB
 * per node (measured: 400,000 nodes took 231 MB and 3.7 s), so this bounds the document to about
 * 100 MB. A real boundary file of MAX_FILE_FEATURES placemarks, each with its name, a dozen
 * attribute values and its rings, has about 60 per placemark: 120,000 (common practice, no
 * published source).
 */
export const MAX_KML_NODES = 200_000;

const isSpace = (c: number) => c === 0x20 || c === 0x09 || c === 0x0a || c === 0x0d;

/** Whitespace-separated tokens in text[from, to): the tuples of a KML <coordinates> element. */
function tokens(text: string, from: number, to: number): number {
  let n = 0;
  let inToken = false;
  for (let i = from; i < to; i++) {
    const space = isSpace(text.charCodeAt(i));
    if (!space && !inToken) n++;
    inToken = !space;
  }
  return n;
}

function hasContent(text: string, from: number, to: number): boolean {
  for (let i = from; i < to; i++) if (!isSpace(text.charCodeAt(i))) return true;
  return false;
}

/**
 * One linear pass over KML text before any DOM is built: refuses document type declarations
 * (KML never needs them; they carry entity expansion and external entities), nesting deeper
 * than MAX_NESTING_DEPTH (togeojson walks folders recursively), and more placemarks, positions
 * or XML nodes than Furlong reads. Malformed markup is left for the XML parser to report.
 */
export function scanKml(text: string): void {
  if (/<!\s*(?:DOCTYPE|ENTITY)/i.test(text)) {
    throw bad(
      'The KML file declares a document type or entities (<!DOCTYPE>/<!ENTITY>); KML never needs them, so Furlong does not read such files. Export it again as plain KML',
    );
  }
  const n = text.length;
  let i = 0;
  let depth = 0;
  let nodes = 0;
  let positions = 0;
  let placemarks = 0;
  let inCoordinates = false;
  const check = () => {
    if (nodes > MAX_KML_NODES)
      throw tooComplex(
        `The KML file holds more than ${int(MAX_KML_NODES)} XML elements, attributes and texts; Furlong reads at most that many from one file`,
      );
    if (placemarks > MAX_FILE_FEATURES)
      throw tooComplex(
        `The KML file holds more than ${int(MAX_FILE_FEATURES)} placemarks; Furlong reads at most ${int(MAX_FILE_FEATURES)} shapes from one file`,
      );
    if (positions > MAX_FILE_VERTICES)
      throw tooComplex(
        `The KML file holds more than ${int(MAX_FILE_VERTICES)} points in its shapes; Furlong reads at most ${int(MAX_FILE_VERTICES)} points from one file`,
      );
  };
  while (i < n) {
    const lt = text.indexOf('<', i);
    const textEnd = lt < 0 ? n : lt;
    if (textEnd > i && hasContent(text, i, textEnd)) {
      nodes++;
      if (inCoordinates) positions += tokens(text, i, textEnd);
    }
    if (lt < 0) break;
    let skipTo: number;
    if (text.startsWith('<!--', lt)) {
      skipTo = text.indexOf('-->', lt + 4);
      nodes++;
      if (skipTo >= 0) skipTo += 3;
    } else if (text.startsWith('<![CDATA[', lt)) {
      skipTo = text.indexOf(']]>', lt + 9);
      nodes++;
      if (skipTo >= 0 && inCoordinates) positions += tokens(text, lt + 9, skipTo);
      if (skipTo >= 0) skipTo += 3;
    } else if (text.startsWith('<?', lt)) {
      skipTo = text.indexOf('?>', lt + 2);
      if (skipTo >= 0) skipTo += 2;
    } else if (text.startsWith('</', lt)) {
      skipTo = text.indexOf('>', lt + 2);
      if (skipTo >= 0) {
        if (/^(?:[\w.-]+:)?coordinates\s*$/.test(text.slice(lt + 2, Math.min(skipTo, lt + 80)))) inCoordinates = false;
        depth--;
        skipTo += 1;
      }
    } else {
      // A start tag: its name, then attributes up to the '>' outside quotes.
      let j = lt + 1;
      while (j < n && !isSpace(text.charCodeAt(j)) && text[j] !== '>' && text[j] !== '/') j++;
      const local = text.slice(lt + 1, j).replace(/^.*:/, '');
      let quote = '';
      let attributes = 0;
      for (; j < n; j++) {
        const c = text[j];
        if (quote) {
          if (c === quote) quote = '';
        } else if (c === '"' || c === "'") quote = c;
        else if (c === '=') attributes++;
        else if (c === '>') break;
      }
      if (j >= n) break;
      nodes += 1 + attributes;
      if (local === 'Placemark') placemarks++;
      else if (local === 'coord') positions++; // gx:coord in a gx:Track holds one position
      if (text[j - 1] !== '/') {
        if (++depth > MAX_NESTING_DEPTH) {
          throw tooComplex(
            `The KML file nests its elements more than ${MAX_NESTING_DEPTH} deep (folders inside folders); Furlong reads up to ${MAX_NESTING_DEPTH} levels`,
          );
        }
        inCoordinates = local === 'coordinates';
      }
      skipTo = j + 1;
    }
    check();
    if (skipTo < 0) break; // unterminated markup: the XML parser reports it
    i = skipTo;
  }
  check();
}

/** A KML 2.2 document (OGC 07-147r2): its Placemarks become features. */
export function parseKml(text: string): FeatureCollection {
  if (text.length > MAX_UNPACKED_BYTES) {
    throw new AppError(
      413,
      'too_large',
      `The KML file is ${formatFileSize(text.length)}; Furlong reads at most ${formatFileSize(MAX_UNPACKED_BYTES)} per file`,
    );
  }
  scanKml(text);
  let doc: KmlDocument;
  try {
    const parser = new DOMParser({
      onError: (level, message) => {
        if (level !== 'warning') throw new Error(message);
      },
    });
    doc = parser.parseFromString(text, 'text/xml') as unknown as KmlDocument;
  } catch (err) {
    const msg = (err as Error).message.split('\n')[0];
    throw bad(`The KML file is damaged and cannot be read (${msg})`);
  }
  if (!doc.documentElement || doc.documentElement.nodeName.replace(/^.*:/, '') !== 'kml') {
    throw bad('The file is XML but not KML (its root element is not <kml>)');
  }
  asPlainKml(doc.documentElement as unknown as KmlElement);
  const all = kml(doc) as FeatureCollection;
  // An image's footprint (GroundOverlay) and a region box (NetworkLink) are not boundaries.
  const features = all.features.filter((f) => !NOT_BOUNDARIES.has(String(f.properties?.['@geometry-type'] ?? '')));
  if (features.length === 0 && all.features.length > 0)
    throw new AppError(
      422,
      'no_features',
      'The KML file holds only image overlays or region boxes (GroundOverlay, NetworkLink), no field boundaries (placemarks with polygons)',
    );
  const fc: FeatureCollection = { type: 'FeatureCollection', features };
  checkFileBudget(fc, 'KML file');
  return fc;
}

/** togeojson's marks on features that come from elements other than placemarks. */
const NOT_BOUNDARIES = new Set(['groundoverlay', 'networklink']);

/** Namespaces of KML 2.0–2.2 (OGC 07-147r2 and the earlier Google ones). */
const KML_NAMESPACES = /^https?:\/\/(?:www\.opengis\.net\/kml\/|earth\.google\.com\/kml\/)/;

/**
 * Geometry containers some writers use in KML in place of MultiGeometry (GML's names); GDAL's KML
 * reader takes them as MultiGeometry (recalled from memory), and so does Furlong.
 */
const MULTI_GEOMETRY_NAMES = new Set(['MultiPolygon', 'MultiLineString', 'MultiPoint']);

interface KmlElement {
  nodeType: number;
  tagName: string;
  nodeName: string;
  localName: string | null;
  prefix: string | null;
  namespaceURI: string | null;
  childNodes: ArrayLike<KmlElement>;
}

/**
 * The document as togeojson reads it: it matches element names as written, so KML elements
 * written with a prefix (`<kml:Placemark>`) lose the prefix, and GML-style multi-geometries
 * become MultiGeometry. Iterative: the depth was bounded by scanKml, but no stack is needed.
 */
function asPlainKml(root: KmlElement): void {
  const stack = [root];
  while (stack.length) {
    const el = stack.pop()!;
    if (el.prefix && el.namespaceURI && KML_NAMESPACES.test(el.namespaceURI) && el.localName) rename(el, el.localName);
    if (MULTI_GEOMETRY_NAMES.has(el.tagName)) rename(el, 'MultiGeometry');
    for (let i = 0; i < el.childNodes.length; i++) if (el.childNodes[i].nodeType === 1) stack.push(el.childNodes[i]);
  }
}

function rename(el: KmlElement, name: string): void {
  el.tagName = name;
  el.nodeName = name;
  el.localName = name;
  el.prefix = null;
}

/** A KMZ is a zip holding a KML document (doc.kml, or the first .kml). */
export async function parseKmz(buffer: Buffer): Promise<FeatureCollection> {
  const zip = await openArchive(buffer, { label: 'KMZ', damaged: 'The KMZ file is damaged: it is not a readable zip archive' });
  const names = zip.files.filter((n) => n.toLowerCase().endsWith('.kml'));
  const name = names.find((n) => n.toLowerCase() === 'doc.kml') ?? names[0];
  if (!name) throw bad('The KMZ file holds no .kml document');
  return parseKml((await zip.read(name)).toString('utf8'));
}
