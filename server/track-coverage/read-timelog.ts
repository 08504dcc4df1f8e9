// ISO 11783-10 TimeLogs from a terminal's TASKDATA.zip as a track: each TimeLog (a TLGnnnnn.XML
// header and its TLGnnnnn.BIN records) is a line of fixes, with the implement's work state where
// the log has it. Read with the npm `isoxml` package (its ExtendedTimeLog reads the binary
// records), after the zip has been opened with bounded reads (server/fields/import/archive.ts)
// and every XML in it scanned for document types, entities, depth and size
// (server/fields/import/parse-taskdata.ts): isoxml itself would inflate anything a zip claims.
import { ISOXMLManager, type ExtendedTimeLog, type Task } from 'isoxml';
import JSZip from 'jszip';
import { MAX_TRACK_POINTS } from '../../shared/limits';
import type { TrackPoint } from '../../shared/track-coverage/coverage';
import { openArchive } from '../fields/import/archive';
import { isTaskDataName, scanTaskDataXml } from '../fields/import/parse-taskdata';
import { AppError } from '../http/errors';

const bad = (message: string) => new AppError(400, 'bad_track', message);
const int = (n: number) => n.toLocaleString('en-US');

/**
 * DDI 141, "Actual Work State" (ISO 11783-11 data dictionary; the name and number as the isoxml
 * package's copy of the dictionary, DDEntities.js, gives them). Its values 0 = off, 1 = on,
 * 2 = error, 3 = not available are recalled from memory of the dictionary: only 0 and 1 are
 * taken as a state here, anything else leaves the state unknown.
 */
export const DDI_ACTUAL_WORK_STATE = 141;

/** A TimeLog's file name without its extension: TLG and five digits (ISO 11783-10). */
const TLG_NAME = /^TLG\d{5}$/i;

/**
 * The TimeLogs of a TASKDATA.zip as track lines, in the order the tasks list them. A fix takes
 * its work state from DDI 141 (working when any device element logging it says on; a record that
 * does not log it keeps the last value logged); without DDI 141 the state is unknown (taken as
 * working). Positions logged as 0, 0 (no fix) are left out.
 *
 * @throws AppError 400 with a plain reason: not a zip, no TASKDATA.XML, no TimeLog, a TimeLog
 *   without its header or binary file, a header without positions, a binary that ends mid-record
 */
export async function readTimeLogZip(data: Buffer): Promise<TrackPoint[][]> {
  let zip: Awaited<ReturnType<typeof openArchive>>;
  try {
    zip = await openArchive(data, {
      label: 'zip',
      damaged: 'The file is not a readable zip archive; a TimeLog comes in a zipped TASKDATA folder (TASKDATA.zip)',
    });
  } catch (err) {
    throw err instanceof AppError ? bad(err.message) : err;
  }
  const mains = zip.files.filter(isTaskDataName);
  const main = mains.find((n) => n.toUpperCase() === 'TASKDATA/TASKDATA.XML') ?? mains[0];
  if (!main) throw bad('The zip holds no TASKDATA.XML; task data from a terminal has a TASKDATA folder with TASKDATA.XML in it');
  const folder = main.slice(0, main.length - 'TASKDATA.XML'.length);

  // Only TASKDATA.XML and the TimeLog files go on to isoxml, each read within the budget and scanned first.
  const safe = new JSZip();
  const read = async (name: string) => {
    try {
      return await zip.read(name);
    } catch (err) {
      throw err instanceof AppError ? bad(err.message) : err;
    }
  };
  const scan = (name: string, text: string) => {
    try {
      return scanTaskDataXml(text);
    } catch (err) {
      throw err instanceof AppError ? bad(`${name}: ${err.message}`) : err;
    }
  };
  const mainText = (await read(main)).toString('utf8');
  if (scan('TASKDATA.XML', mainText) !== 'ISO11783_TaskData')
    throw bad('TASKDATA.XML in the zip is not ISO 11783-10 task data (its root element is not <ISO11783_TaskData>)');
  safe.file('TASKDATA/TASKDATA.XML', mainText);
  for (const name of zip.files) {
    if (!name.startsWith(folder)) continue;
    const base = name.slice(folder.length);
    const m = /^(TLG\d{5})\.(xml|bin)$/i.exec(base);
    if (!m) continue;
    const bytes = await read(name);
    if (m[2].toLowerCase() === 'xml') {
      const root = scan(base, bytes.toString('utf8'));
      if (root !== 'TIM') throw bad(`${base} is not a TimeLog header: its root element is <${root || '?'}>, not <TIM>`);
    }
    safe.file(`TASKDATA/${base}`, bytes);
  }

  const manager = new ISOXMLManager();
  try {
    await manager.parseISOXMLFile(await safe.generateAsync({ type: 'uint8array', compression: 'STORE' }), 'application/zip');
  } catch (err) {
    throw bad(`The task data is damaged and cannot be read (${(err as Error).message.split('\n')[0]})`);
  }
  const tasks = (manager.rootElement.attributes.Task ?? []) as Task[];
  const logs = tasks.flatMap((t) => (t.attributes.TimeLog ?? []) as ExtendedTimeLog[]);
  if (!logs.length)
    throw bad('The task data holds no TimeLog (TLG): export the task again from the terminal with its logged data, or send a GPX track');

  const lines: TrackPoint[][] = [];
  let points = 0;
  for (const tlg of logs) {
    const name = tlg.attributes.Filename;
    if (!TLG_NAME.test(name)) throw bad(`A task names its TimeLog "${name}"; a TimeLog file is named TLG and five digits`);
    if (!tlg.timeLogHeader) throw bad(`The TimeLog ${name} has no header file ${name}.XML in the zip`);
    if (!tlg.binaryData) throw bad(`The TimeLog ${name} has no binary file ${name}.BIN in the zip`);
    const position = tlg.timeLogHeader.attributes.Position?.[0]?.attributes;
    if (!position || position.PositionNorth !== null || position.PositionEast !== null)
      throw bad(`The TimeLog ${name} does not log positions (its header has no PTN with north and east to read), so it is not a track`);
    const parsed = tlg.parseBinaryFile();
    if (tlg.parsingErrors.length)
      throw bad(
        `The TimeLog ${name}.BIN ends in the middle of record ${int(parsed.timeLogs.length + 1)}: the file is cut short or damaged`,
      );
    const stateKeys = (tlg.timeLogHeader.attributes.DataLogValue ?? [])
      .filter((d) => parseInt(d.attributes.ProcessDataDDI, 16) === DDI_ACTUAL_WORK_STATE)
      .map((d) => `${d.attributes.ProcessDataDDI}_${d.attributes.DeviceElementIdRef?.xmlId}`);
    const line: TrackPoint[] = [];
    const last: Record<string, number> = {};
    for (const r of parsed.timeLogs) {
      for (const k of stateKeys) if (k in r.values) last[k] = r.values[k];
      if (!r.isValidPosition) continue;
      if (++points > MAX_TRACK_POINTS)
        throw bad(`The TimeLogs hold more than ${int(MAX_TRACK_POINTS)} positions; Furlong reads at most that many from one file`);
      const p: TrackPoint = { lon: r.position.PositionEast, lat: r.position.PositionNorth, t: r.time.getTime() };
      const states = stateKeys.map((k) => last[k]).filter((v) => v === 0 || v === 1);
      if (states.length) p.working = states.includes(1);
      line.push(p);
    }
    if (line.length) lines.push(line);
  }
  if (!lines.some((l) => l.length >= 2))
    throw bad('The TimeLogs hold fewer than two positions with a GPS fix; there is no track to measure');
  return lines;
}
