import { InjectionToken } from '@angular/core';
import type { PlanInput } from '@shared/plan/types';
import type { PlanLayout } from './passes-messages';

export type { PlanLayout, PlanPasses } from './passes-messages';

/**
 * A saved plan's passes and headland, worked out on this phone from the plan's own settings (so they are there
 * with no signal). The real one runs the shared planner in a web worker, loaded when first asked.
 */
export const PLAN_PASSES = new InjectionToken<(input: PlanInput) => Promise<PlanLayout>>('a saved plan’s passes', {
  providedIn: 'root',
  factory: () => (input) => import('./passes-worker-port').then((m) => m.passesInWorker(input)),
});

/** The phone's position service (the Geolocation API); a spec gives its own. */
export const GEOLOCATION = new InjectionToken<Geolocation | null>('the phone’s position', {
  providedIn: 'root',
  factory: () => (typeof navigator !== 'undefined' && 'geolocation' in navigator ? navigator.geolocation : null),
});
