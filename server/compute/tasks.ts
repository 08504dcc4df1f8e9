// The heavy computations, as run inside a compute worker thread (see pool.ts). Each answers an
// envelope instead of throwing, so an AppError's status, code and fields cross the thread intact.
import type { MessagePort } from 'node:worker_threads';
import { checkAndMeasureBoundary, type BoundaryMeasurement } from '../../shared/geo/boundary-check';
import { findOverlaps, type BoundaryOverlap, type OverlapCandidate } from '../../shared/geo/overlap';
import { planPasses } from '../../shared/plan/plan-passes';
import type { PlanInput, PlanResult } from '../../shared/plan/types';
import { readBoundaryFile as readFile, type ReadFile } from '../fields/import/read-file';
import { AppError } from '../http/errors';

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
