// Heavy computations (pass-plan previews, boundary checks, file imports) run in a small pool of
// worker threads, each with a time and a memory limit, so one request can never stall or sink
// the server: a task over a limit is stopped and answered with a plain message, and every other
// request is served meanwhile.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { MessageChannel } from 'node:worker_threads';
import Piscina from 'piscina';
import { COMPUTE_MEMORY_LIMIT_MB, COMPUTE_TIME_LIMIT_MS } from '../../shared/limits';
import { AppError } from '../http/errors';
import type * as Tasks from './tasks';

type TaskName =
  'plan' | 'measureBoundary' | 'readBoundaryFile' | 'findFieldOverlaps' | 'buildTaskData' | 'trackCoverage' | 'pointsCoverage';
type Input<K extends TaskName> = Omit<Parameters<(typeof Tasks)[K]>[0], 'started'>;
type Output<K extends TaskName> = Awaited<ReturnType<(typeof Tasks)[K]>> extends Tasks.Envelope<infer T> ? T : never;

export interface ComputeOptions {
  /** Worker threads; default: cores − 1, at least 2 (one long task must not hold up the rest). */
  threads?: number;
  timeLimitMs?: number;
  memoryLimitMb?: number;
  /** Tasks waiting for a thread before new ones are turned away with a 503. */
  maxQueue?: number;
}

export interface ComputePool {
  run<K extends TaskName>(name: K, input: Input<K>): Promise<Output<K>>;
  /** Threads, tasks running and waiting: for the health page and the tests. */
  stats(): { threads: number; queued: number; completed: number };
  close(): Promise<void>;
}

/** The worker entry: compiled JavaScript when built, else the TypeScript source through tsx. */
function workerFile(): string {
  const js = path.join(__dirname, 'tasks.js');
  return fs.existsSync(js) ? js : path.join(__dirname, 'worker-entry.cjs');
}

const tooHeavy = (what: string) =>
  new AppError(
    422,
    'too_complex',
    `${what}, so Furlong stopped it. Simplify the input (a wider working width, fewer boundary points) and try again.`,
  );

export function createComputePool(options: ComputeOptions = {}): ComputePool {
  const threads = options.threads ?? Math.max(2, os.availableParallelism() - 1);
  const timeLimitMs = options.timeLimitMs ?? COMPUTE_TIME_LIMIT_MS;
  const memoryLimitMb = options.memoryLimitMb ?? COMPUTE_MEMORY_LIMIT_MB;
  const pool = new Piscina({
    filename: workerFile(),
    // The server's own flags (e.g. a TypeScript loader) are not for the workers.
    execArgv: [],
    minThreads: 1,
    maxThreads: threads,
    idleTimeout: 60_000,
    maxQueue: options.maxQueue ?? threads * 4,
    resourceLimits: { maxOldGenerationSizeMb: memoryLimitMb, maxYoungGenerationSizeMb: 32 },
  });
  // A worker that dies (out of memory) is replaced by the pool; its task is rejected below.
  pool.on('error', () => undefined);

  return {
    async run(name, input) {
      // The time limit counts from the moment a thread starts the task (the worker says so on a
      // port of its own); waiting for a thread is bounded separately and answered "busy".
      const abort = new AbortController();
      const { port1, port2 } = new MessageChannel();
      let timer = setTimeout(() => abort.abort('waited'), Math.max(60_000, 3 * timeLimitMs));
      port1.once('message', () => {
        clearTimeout(timer);
        timer = setTimeout(() => abort.abort('ran'), timeLimitMs);
      });
      let envelope: Tasks.Envelope<unknown>;
      try {
        envelope = (await pool.run(
          { ...input, started: port2 },
          { name, signal: abort.signal, transferList: [port2] },
        )) as Tasks.Envelope<unknown>;
      } catch (err) {
        const e = err as { name?: string; code?: string; message?: string };
        if (e?.name === 'AbortError' && abort.signal.reason === 'ran')
          throw tooHeavy(`This took longer than ${Math.round(timeLimitMs / 1000)} s to work out`);
        if (e?.name === 'AbortError' || /queue is at limit/i.test(e?.message ?? ''))
          throw new AppError(503, 'busy', 'Furlong is busy working out other plans and files; try again in a minute.');
        if (e?.code === 'ERR_WORKER_OUT_OF_MEMORY') throw tooHeavy(`This needed more than ${memoryLimitMb} MB of memory to work out`);
        if (e instanceof RangeError) throw tooHeavy('This was too large to work out');
        throw err;
      } finally {
        clearTimeout(timer);
        port1.close();
      }
      if (!envelope.ok) {
        const f = envelope.error;
        throw new AppError(f.status, f.code, f.message, f.fields, f.extra);
      }
      return envelope.value as never;
    },
    stats: () => ({ threads: pool.threads.length, queued: pool.queueSize, completed: pool.completed }),
    close: () => pool.destroy(),
  };
}

let shared: ComputePool | null = null;
/**
 * One pool per process for callers that were not given one (its idle threads do not keep the
 * process alive); the options of the first call make it.
 */
export function sharedComputePool(options: ComputeOptions = {}): ComputePool {
  shared ??= createComputePool(options);
  return shared;
}
