// ISO 11783-10 task data from a tractor terminal (TASKDATA.zip, or a bare TASKDATA.XML): its
// partfields become candidate fields (boundaries with their holes and parts) and its AB lines are
// offered as plan headings. Read with the npm `isoxml` package (fast-xml-parser underneath) only
// after a linear scan of the text has refused document types and entities (fast-xml-parser expands
// entities declared in a DOCTYPE), nesting deeper than the budget, and more elements or points
// than Furlong reads.
import type { Feature, FeatureCollection, MultiPolygon, Polygon } from 'geojson';
import { Geodesic } from 'geographiclib-geodesic';
import { ExtendedPolygon, ISOXMLManager, type ExtendedPartfield, type GuidancePattern } from 'isoxml';
import { MAX_FILE_FEATURES, MAX_FILE_VERTICES, MAX_NESTING_DEPTH, MAX_UNPACKED_BYTES } from '../../../shared/limits';
import type { ImportGuidance } from '../../../shared/schemas/fields';
import { AppError } from '../../http/errors';
import { formatFileSize } from '../../../shared/file-size';
import { openArchive } from './archive';

const bad = (message: string) => new AppError(422, 'bad_file', message);
const tooComplex = (message: string) => new AppError(422, 'file_too_complex', message);
const int = (n: number) => n.toLocaleString('en-US');

/**
 * Most XML elements read from one TASKDATA.XML. A partfield boundary of MAX_BOUNDARY_VERTICES
 * points is about as many elements; a terminal's file of a farm's fields, guidance lines and a
 * season's tasks stays far below this (common practice, no published source).
 */
export const MAX_TASKDATA_ELEMENTS = 600_000;

/** TASKDATA.XML, in any folder of the zip and in any letter case (terminals differ). */
export const isTaskDataName = (name: string) => /(^|\/)taskdata\.xml$/i.test(name);

/** What a task-data file gives the import: its partfields as features, and its AB lines. */
export interface TaskDataRead {
  fc: FeatureCollection;
  guidance: ImportGuidance[];
}

/**
 * One pass over the XML text before it is parsed: refuses a DOCTYPE or ENTITY declaration (task
 * data never needs one; they carry external entities and entity expansion), nesting deeper than
 * MAX_NESTING_DEPTH, more than MAX_TASKDATA_ELEMENTS elements, MAX_FILE_FEATURES partfields or
 * MAX_FILE_VERTICES points; and answers the root element's name.
 */
export function scanTaskDataXml(text: string): string {
  if (/<!\s*(?:DOCTYPE|ENTITY)/i.test(text))
    throw bad(
      'The task data declares a document type or entities (<!DOCTYPE>/<!ENTITY>); ISO 11783-10 task data never needs them, so Furlong does not read such files. Export it again from the terminal',
    );
  let depth = 0;
  let elements = 0;
  let points = 0;
  let partfields = 0;
  let root = '';
  const tag = /<(\/?)([A-Za-z_][\w.-]*)[^>]*?(\/?)>|<!--[\s\S]*?-->|<!\[CDATA\[[\s\S]*?\]\]>|<\?[\s\S]*?\?>/g;
  for (let m = tag.exec(text); m; m = tag.exec(text)) {
    const [, close, name, selfClose] = m;
    if (!name) continue; // a comment, CDATA or processing instruction
    if (close) {
      depth--;
      continue;
    }
    root ||= name;
    if (++elements > MAX_TASKDATA_ELEMENTS)
      throw tooComplex(
        `The task data holds more than ${int(MAX_TASKDATA_ELEMENTS)} XML elements; Furlong reads at most that many from one file`,
      );
    if (name === 'PNT' && ++points > MAX_FILE_VERTICES)
      throw tooComplex(
        `The task data holds more than ${int(MAX_FILE_VERTICES)} points; Furlong reads at most ${int(MAX_FILE_VERTICES)} points from one file`,
      );
    if (name === 'PFD' && ++partfields > MAX_FILE_FEATURES)
      throw tooComplex(
        `The task data holds more than ${int(MAX_FILE_FEATURES)} partfields; Furlong reads at most ${int(MAX_FILE_FEATURES)} fields from one file`,
      );
    if (!selfClose && ++depth > MAX_NESTING_DEPTH)
      throw tooComplex(
        `The task data nests its elements more than ${MAX_NESTING_DEPTH} deep; Furlong reads up to ${MAX_NESTING_DEPTH} levels`,
      );
  }
  return root;
}

/** Degrees in [0, 180): a plan's heading (passes run both ways). */
const planHeading = (deg: number) => ((deg % 180) + 180) % 180;

function guidanceOf(pfd: ExtendedPartfield, index: number): ImportGuidance[] {
  const out: ImportGuidance[] = [];
  for (const group of pfd.attributes.GuidanceGroup ?? []) {
    for (const gpn of (group.attributes.GuidancePattern ?? []) as GuidancePattern[]) {
      if (gpn.attributes.GuidancePatternType !== '1') continue; // AB lines only
      const line = gpn.attributes.LineString?.[0];
      const pts = line?.attributes.Point ?? [];
      const a = pts.find((p) => p.attributes.PointType === '6') ?? pts[0];
      const b = pts.find((p) => p.attributes.PointType === '7') ?? pts[pts.length - 1];
      let heading = gpn.attributes.GuidancePatternHeading;
      // Without a stated heading, the geodesic azimuth from A to B (GeographicLib).
      if (heading === undefined || heading === null) {
        if (!a || !b || a === b) continue;
        heading = Geodesic.WGS84.Inverse(
          a.attributes.PointNorth,
          a.attributes.PointEast,
          b.attributes.PointNorth,
          b.attributes.PointEast,
        ).azi1!;
      }
      const width = line?.attributes.LineStringWidth;
      out.push({
        index,
        fieldName: pfd.attributes.PartfieldDesignator,
        name: gpn.attributes.GuidancePatternDesignator ?? group.attributes.GuidanceGroupDesignator ?? 'AB line',
        headingDeg: planHeading(heading),
        widthM: width ? width / 1000 : null,
      });
    }
  }
  return out;
}

/** The XML of a TASKDATA.zip (TASKDATA/TASKDATA.XML, or the first TASKDATA.XML in any folder). */
async function xmlOfZip(buffer: Buffer): Promise<string> {
  const zip = await openArchive(buffer, {
    label: 'zip',
    damaged: 'The file is not a readable zip archive; task data comes as a zipped TASKDATA folder (TASKDATA.zip) or a bare TASKDATA.XML',
  });
  const names = zip.files.filter(isTaskDataName);
  const name = names.find((n) => n.toUpperCase() === 'TASKDATA/TASKDATA.XML') ?? names[0];
  if (!name) throw bad('The zip holds no TASKDATA.XML; task data from a terminal has a TASKDATA folder with TASKDATA.XML in it');
  return (await zip.read(name)).toString('utf8');
}

/** Reads ISO 11783-10 task data: a zip holding TASKDATA.XML, or the XML itself. */
export async function parseTaskData(buffer: Buffer, zipped: boolean): Promise<TaskDataRead> {
  const text = zipped ? await xmlOfZip(buffer) : buffer.toString('utf8');
  if (text.length > MAX_UNPACKED_BYTES)
    throw new AppError(
      413,
      'too_large',
      `TASKDATA.XML is ${formatFileSize(text.length)}; Furlong reads at most ${formatFileSize(MAX_UNPACKED_BYTES)} per file`,
    );
  const root = scanTaskDataXml(text);
  if (root !== 'ISO11783_TaskData')
    throw bad(
      `The file is XML but not ISO 11783-10 task data: its root element is ${root ? `<${root}>` : 'missing'}, not <ISO11783_TaskData>`,
    );
  if (/<XFR[\s/>]/.test(text))
    throw bad('The task data keeps parts of itself in separate files (XFR); export it again from the terminal as one TASKDATA.XML');
  const m = new ISOXMLManager();
  try {
    await m.parseISOXMLFile(text, 'text/xml');
  } catch (err) {
    throw bad(`The task data is damaged and cannot be read (${(err as Error).message.split('\n')[0]})`);
  }
  // A reference (TSK@E = "PFD9" …) to an id the file never defines.
  const dangling = Object.values(m.xmlReferences)
    .filter((ref) => !ref.entity)
    .map((ref) => ref.xmlId);
  if (dangling.length)
    throw bad(
      `The task data refers to ${dangling.slice(0, 3).join(', ')}${dangling.length > 3 ? ` and ${dangling.length - 3} more` : ''}, which it does not hold: a reference that does not resolve`,
    );
  const partfields = (m.rootElement.attributes.Partfield ?? []) as ExtendedPartfield[];
  if (partfields.length === 0) throw new AppError(422, 'no_features', 'The task data holds no partfields (fields with boundaries)');
  const features: Feature[] = [];
  const guidance: ImportGuidance[] = [];
  partfields.forEach((pfd, index) => {
    const name = pfd.attributes.PartfieldDesignator ?? '';
    // PLN@A = 1: the partfield boundary (ISO 11783-10).
    const boundary = (pfd.attributes.PolygonnonTreatmentZoneonly ?? []).filter((p) => p.attributes.PolygonType === '1');
    const multi = boundary.length ? ExtendedPolygon.toGeoJSON(boundary as ExtendedPolygon[]) : null;
    if (!multi || multi.coordinates.length === 0)
      throw bad(
        `Partfield ${index + 1} ("${name}") has no boundary (no polygon of type 1 with an exterior ring), so it cannot become a field`,
      );
    const geometry: Polygon | MultiPolygon =
      multi.coordinates.length === 1
        ? { type: 'Polygon', coordinates: multi.coordinates[0] }
        : { type: 'MultiPolygon', coordinates: multi.coordinates };
    const ref = m.getReferenceByEntity(pfd);
    features.push({
      type: 'Feature',
      properties: {
        name,
        ...(pfd.attributes.PartfieldCode ? { code: pfd.attributes.PartfieldCode } : {}),
        ...(ref ? { id: ref.xmlId } : {}),
      },
      geometry,
    });
    guidance.push(...guidanceOf(pfd, index));
  });
  return { fc: { type: 'FeatureCollection', features }, guidance };
}
