import type { Provider } from '@angular/core';
import { PLAN_WORKER } from './live-planner';
import type { PlanWorkerPort } from './plan-messages';

/**
 * The real planner worker, bundled by the Angular builder from `new URL(…, import.meta.url)`. Kept
 * in its own file, out of what specs import: the CommonJS test transform cannot read `import.meta`.
 */
export function providePlanWorker(): Provider {
  return {
    provide: PLAN_WORKER,
    useValue: (): PlanWorkerPort =>
      new Worker(new URL('./plan.worker', import.meta.url), { type: 'module', name: 'pass-planner' }) as unknown as PlanWorkerPort,
  };
}
