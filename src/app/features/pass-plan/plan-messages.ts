import type { PlanInput, PlanResult } from '@shared/plan/types';

/** What the page sends the planner worker: one plan input, numbered so late answers can be dropped. */
export interface PlanRequest {
  id: number;
  input: PlanInput;
}

/** The worker's answer to one request: the plan, or the planner's message for a farmer. */
export type PlanReply = { id: number; result: PlanResult } | { id: number; error: string };

/** The part of a Worker the page uses; specs hand in a fake (jsdom has no Worker). */
export interface PlanWorkerPort {
  postMessage(request: PlanRequest): void;
  onmessage: ((event: MessageEvent<PlanReply>) => void) | null;
  onerror: ((event: ErrorEvent) => void) | null;
  terminate(): void;
}
