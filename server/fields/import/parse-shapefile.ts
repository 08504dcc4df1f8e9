import type { FeatureCollection } from 'geojson';
import JSZip from 'jszip';
import proj4 from 'proj4';
import { AppError } from '../../http/errors';

// shpjs's Node build reads `self`.
(globalThis as { self?: unknown }).self ??= globalThis;
// eslint-disable-next-line @typescript-eslint/no-require-imports
const shp = require('shpjs') as {
  parseShp: (shp: ArrayBufferView, prj?: string) => Array<FeatureCollection['features'][number]['geometry']>;
  parseDbf: (dbf: ArrayBufferView, cpg?: string) => Array<Record<string, unknown>>;
};

const bad = (message: string) => new AppError(422, 'bad_file', message);

/**
 * A zipped ESRI shapefile (.shp + .dbf + .prj, ESRI technical description 1998), reprojected
 * to WGS84 from its .prj. A missing or unreadable .prj is refused: coordinates are never guessed.
 */
export async function parseShapefileZip(buffer: Buffer): Promise<FeatureCollection> {
  let zip: JSZip;
  try {
    zip = await JSZip.loadAsync(buffer);
  } catch {
    throw bad('The zip file is damaged and cannot be opened');
  }
  const files = Object.keys(zip.files).filter((n) => !zip.files[n].dir && !n.startsWith('__MACOSX/'));
  const layers = files.filter((n) => n.toLowerCase().endsWith('.shp'));
  if (layers.length === 0) throw bad('The zip holds no .shp file; a shapefile needs its .shp, .dbf and .prj files');
  const features: FeatureCollection['features'] = [];
  for (const shpName of layers) features.push(...(await readLayer(zip, files, shpName)));
  return { type: 'FeatureCollection', features };
}

/** One shapefile layer of the zip (name.shp with its name.dbf, name.prj and optional name.cpg). */
async function readLayer(zip: JSZip, files: string[], shpName: string): Promise<FeatureCollection['features']> {
  const base = shpName.slice(0, -4);
  const sibling = (ext: string) => files.find((n) => n.toLowerCase() === `${base}.${ext}`.toLowerCase());
  const dbfName = sibling('dbf');
  if (!dbfName) throw bad(`The zip holds ${shpName} but no matching .dbf file (the attribute table); include it`);
  const prjName = sibling('prj');
  if (!prjName) throw bad(`The zip holds ${shpName} but no .prj file, so its coordinate system is unknown; export it again with its .prj`);
  const prj = (await zip.file(prjName)!.async('string')).trim();
  try {
    proj4(prj);
  } catch {
    throw bad(`The coordinate system in ${prjName} cannot be read; export the shapefile again in WGS84 (EPSG:4326) or a UTM zone`);
  }
  const cpgName = sibling('cpg');
  const cpg = cpgName ? await zip.file(cpgName)!.async('string') : undefined;
  try {
    const geoms = shp.parseShp(await zip.file(shpName)!.async('uint8array'), prj);
    const rows = shp.parseDbf(await zip.file(dbfName)!.async('uint8array'), cpg);
    return geoms.map((geometry, i) => ({ type: 'Feature', geometry, properties: rows[i] ?? {} }));
  } catch (err) {
    throw bad(`The shapefile ${shpName} is damaged and cannot be read (${(err as Error).message})`);
  }
}
