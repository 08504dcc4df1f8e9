// Works out a saved pass plan's passes off the page's thread (the planner takes a moment on a phone).
import { planPasses } from '@shared/plan/plan-passes';
import type { PassesReply, PassesRequest } from './passes-messages';

/** The worker global, typed without the webworker lib so the app's type check reads this file too. */
interface PassesScope {
  addEventListener(type: 'message', listener: (event: MessageEvent<PassesRequest>) => void): void;
  postMessage(reply: PassesReply): void;
}

const scope = self as unknown as PassesScope;

scope.addEventListener('message', ({ data }) => {
  try {
    const plan = planPasses(data.input);
    scope.postMessage({ layout: { passes: plan.passes, headland: plan.headland } });
  } catch (err) {
    scope.postMessage({ error: err instanceof Error ? err.message : 'The pass plan could not be worked out.' });
  }
});
