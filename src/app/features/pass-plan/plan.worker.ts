// Runs the shared pass planner off the page's thread, so dragging the heading never freezes it.
import { planPasses } from '@shared/plan/plan-passes';
import type { PlanReply, PlanRequest } from './plan-messages';

/** The worker global, typed without the webworker lib so the app's type check reads this file too. */
interface PlannerScope {
  addEventListener(type: 'message', listener: (event: MessageEvent<PlanRequest>) => void): void;
  postMessage(reply: PlanReply): void;
}

const scope = self as unknown as PlannerScope;

scope.addEventListener('message', ({ data }) => {
  try {
    scope.postMessage({ id: data.id, result: planPasses(data.input) });
  } catch (err) {
    scope.postMessage({ id: data.id, error: err instanceof Error ? err.message : 'The pass plan could not be worked out.' });
  }
});
