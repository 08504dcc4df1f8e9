import { DestroyRef, Injectable, InjectionToken, inject, signal } from '@angular/core';
import type { PlanInput, PlanResult } from '@shared/plan/types';
import type { PlanReply, PlanWorkerPort } from './plan-messages';

/** Makes the planner worker; specs provide a fake, since jsdom has no Worker. */
export const PLAN_WORKER = new InjectionToken<() => PlanWorkerPort>('PLAN_WORKER');

/** Quiet time after the last change before the planner runs, ms: one run per pause in a drag. */
export const PLAN_DEBOUNCE_MS = 120;

export interface LivePlanState {
  /** The last plan worked out; kept while a newer one is computing or after an error. */
  result: PlanResult | null;
  /** The planner's message for the latest input, if it refused it. */
  error: string | null;
  /** A newer input is waiting or computing. */
  computing: boolean;
}

const IDLE: LivePlanState = { result: null, error: null, computing: false };

/**
 * Plans as the settings change: waits for a pause (debounce), sends the input to the worker with a
 * request id, and keeps only the answer to the newest request, so a slow answer for an old heading
 * never overwrites a newer one. One per page (provided by the component), worker ended with it.
 */
@Injectable()
export class LivePlanner {
  private readonly makeWorker = inject(PLAN_WORKER);
  private worker: PlanWorkerPort | null = null;
  private timer: ReturnType<typeof setTimeout> | null = null;
  private lastId = 0;
  private readonly current = signal<LivePlanState>(IDLE);

  readonly state = this.current.asReadonly();

  constructor() {
    inject(DestroyRef).onDestroy(() => this.stop());
  }

  /** Plans `input` after the debounce; an Error (settings that cannot make an input) shows at once. */
  request(input: PlanInput | Error): void {
    this.cancelTimer();
    if (input instanceof Error) {
      this.lastId++; // anything still in flight is now stale
      this.current.update((s) => ({ ...s, error: input.message, computing: false }));
      return;
    }
    this.current.update((s) => ({ ...s, computing: true }));
    this.timer = setTimeout(() => this.send(input), PLAN_DEBOUNCE_MS);
  }

  /** Forgets the plan (another field or operation was chosen). */
  reset(): void {
    this.cancelTimer();
    this.lastId++;
    this.current.set(IDLE);
  }

  private send(input: PlanInput): void {
    this.timer = null;
    const id = ++this.lastId;
    try {
      this.port().postMessage({ id, input });
    } catch {
      this.current.update((s) => ({
        ...s,
        error: 'The planner could not start in this browser. Reload the page and try again.',
        computing: false,
      }));
    }
  }

  private receive(reply: PlanReply): void {
    if (reply.id !== this.lastId) return;
    if ('error' in reply) this.current.update((s) => ({ ...s, error: reply.error, computing: false }));
    else this.current.set({ result: reply.result, error: null, computing: false });
  }

  private port(): PlanWorkerPort {
    if (!this.worker) {
      const worker = this.makeWorker();
      worker.onmessage = (event) => this.receive(event.data);
      worker.onerror = (event) => {
        event.preventDefault?.();
        this.worker?.terminate();
        this.worker = null;
        this.lastId++;
        this.current.update((s) => ({ ...s, error: 'The planner stopped unexpectedly. Change a setting to try again.', computing: false }));
      };
      this.worker = worker;
    }
    return this.worker;
  }

  private cancelTimer(): void {
    if (this.timer !== null) clearTimeout(this.timer);
    this.timer = null;
  }

  private stop(): void {
    this.cancelTimer();
    this.worker?.terminate();
    this.worker = null;
  }
}
