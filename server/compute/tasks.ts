// The heavy computations, as run inside a compute worker thread (see pool.ts). Each answers an
// envelope instead of throwing, so an AppError's status, code and fields cross the thread intact.
import type { MessagePort } from 'node:worker_threads';
import { checkAndMeasureBoundary, type BoundaryMeasurement } from '../../shared/geo/boundary-check';
import { findOverlaps, type BoundaryOverlap, type OverlapCandidate } from '../../shared/geo/overlap';
import { planPasses } from '../../shared/plan/plan-passes';
import type { PlanInput, PlanResult } from '../../shared/plan/types';
import { readBoundaryFile as readFile, type ReadFile } from '../fields/import/read-file';
import { computeCoverage, type CoverageInput, type CoverageResult } from '../../shared/track-coverage/coverage';
import { readAnyTrack } from '../track-coverage/read-track';
import { AppError } from '../http/errors';
import { buildTaskData as buildTaskDataFile, type TaskDataInput } from '../taskdata/build-taskdata';

export interface TaskFailure {
  status: number;
  code: string;
  message: string;
  fields?: Record<string, string>;
  extra?: Record<string, unknown>;
}
export type Envelope<T> = { ok: true; value: T } | { ok: false; error: TaskFailure };

/** A checked and measured boundary; `problems` is empty when it can be used. */
export type MeasuredBoundary = BoundaryMeasurement;

/** Every task input carries a port on which the worker says when the task starts (see pool.ts). */
export interface Started {
  started?: MessagePort;
}

async function wrap<T>(input: Started, work: () => T | Promise<T>, plainErrorStatus: number, plainErrorCode: string): Promise<Envelope<T>> {
  input.started?.postMessage('started');
  input.started?.close();
  try {
    return { ok: true, value: await work() };
  } catch (err) {
    if (err instanceof AppError)
      return { ok: false, error: { status: err.status, code: err.code, message: err.message, fields: err.fields, extra: err.extra } };
    // The shared computations throw plain Errors with a message for the farmer (bad input).
    if (
      err instanceof Error &&
      !(err instanceof RangeError && /call stack|Invalid array length|Array buffer allocation/i.test(err.message))
    )
      return { ok: false, error: { status: plainErrorStatus, code: plainErrorCode, message: err.message } };
    throw err;
  }
}

/** A pass plan (the same code the browser's planning worker runs). */
export function plan(input: PlanInput & Started): Promise<Envelope<PlanResult>> {
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  const { started, ...planInput } = input;
  return wrap(input, () => planPasses(planInput), 422, 'bad_plan');
}

/** A field boundary's problems, and its area on the WGS84 ellipsoid when it has none. */
export function measureBoundary(input: { geometry: unknown; label?: string } & Started): Promise<Envelope<MeasuredBoundary>> {
  return wrap(input, () => checkAndMeasureBoundary(input.geometry, input.label), 422, 'bad_boundary');
}

/** A boundary file read into candidate fields (bytes arrive as a Uint8Array view). */
export function readBoundaryFile(input: { name: string; data: Uint8Array; nameAttribute?: string } & Started): Promise<Envelope<ReadFile>> {
  const data = Buffer.from(input.data.buffer, input.data.byteOffset, input.data.byteLength);
  return wrap(input, () => readFile({ name: input.name, data }, input.nameAttribute), 422, 'bad_file');
}

/** For each boundary (null: none to compare), the farm's fields it overlaps (shared/geo/overlap). */
export function findFieldOverlaps(
  input: { boundaries: Array<{ boundary: OverlapCandidate['boundary'] | null; exceptId?: number }>; fields: OverlapCandidate[] } & Started,
): Promise<Envelope<BoundaryOverlap[][]>> {
  return wrap(
    input,
    () =>
      input.boundaries.map(({ boundary, exceptId }) =>
        boundary ? findOverlaps(boundary, exceptId === undefined ? input.fields : input.fields.filter((f) => f.id !== exceptId)) : [],
      ),
    422,
    'bad_boundary',
  );
}

/** ISO 11783-10 task data (TASKDATA/TASKDATA.XML, zipped) for a day's jobs or one job. */
export function buildTaskData(input: TaskDataInput & Started): Promise<Envelope<Uint8Array>> {
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  const { started, ...data } = input;
  return wrap(input, () => buildTaskDataFile(data), 422, 'bad_task_data');
}

/**
 * Coverage of a track file over a field (bytes arrive as a Uint8Array view): the file is read
 * here too, so a huge or hostile file costs a worker, never the event loop.
 */
export function trackCoverage(
  input: { name: string; data: Uint8Array } & Omit<CoverageInput, 'track'> & Started,
): Promise<Envelope<CoverageResult & { format: 'gpx' | 'geojson' | 'timelog' }>> {
  const data = Buffer.from(input.data.buffer, input.data.byteOffset, input.data.byteLength);
  return wrap(
    input,
    async () => {
      const track = await readAnyTrack(input.name, data);
      const r = computeCoverage({ boundary: input.boundary, hazards: input.hazards, widthM: input.widthM, track: track.lines });
      return { ...r, format: track.format };
    },
    400,
    'bad_track',
  );
}

/** Coverage of a track already read into lines (the phone track a job's run sheet recorded). */
export function pointsCoverage(input: CoverageInput & Started): Promise<Envelope<CoverageResult>> {
  return wrap(
    input,
    () => computeCoverage({ boundary: input.boundary, hazards: input.hazards, widthM: input.widthM, track: input.track }),
    400,
    'bad_track',
  );
}
