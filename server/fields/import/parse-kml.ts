import { kml } from '@tmcw/togeojson';
import { DOMParser } from '@xmldom/xmldom';
import type { FeatureCollection } from 'geojson';
import JSZip from 'jszip';
import { AppError } from '../../http/errors';

const bad = (message: string) => new AppError(422, 'bad_file', message);
type KmlDocument = Parameters<typeof kml>[0];

/** A KML 2.2 document (OGC 07-147r2): its Placemarks become features. */
export function parseKml(text: string): FeatureCollection {
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
  return kml(doc) as FeatureCollection;
}

/** A KMZ is a zip holding a KML document (doc.kml, or the first .kml). */
export async function parseKmz(buffer: Buffer): Promise<FeatureCollection> {
  let zip: JSZip;
  try {
    zip = await JSZip.loadAsync(buffer);
  } catch {
    throw bad('The KMZ file is damaged: it is not a readable zip archive');
  }
  const names = Object.keys(zip.files).filter((n) => n.toLowerCase().endsWith('.kml'));
  const name = names.find((n) => n.toLowerCase() === 'doc.kml') ?? names[0];
  if (!name) throw bad('The KMZ file holds no .kml document');
  return parseKml(await zip.file(name)!.async('string'));
}
