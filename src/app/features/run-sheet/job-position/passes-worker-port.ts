import type { PlanInput } from '@shared/plan/types';
import type { PassesReply, PlanLayout } from './passes-messages';

/**
 * The planner worker, bundled by the Angular builder from `new URL(…, import.meta.url)`. Kept in its
 * own file, loaded only when asked: the CommonJS test transform cannot read `import.meta`.
 */
export function passesInWorker(input: PlanInput): Promise<PlanLayout> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(new URL('./passes.worker', import.meta.url), { type: 'module', name: 'plan-passes' });
    worker.addEventListener('message', ({ data }: MessageEvent<PassesReply>) => {
      worker.terminate();
      if (data.layout) resolve(data.layout);
      else reject(new Error(data.error));
    });
    worker.addEventListener('error', (e: ErrorEvent) => {
      worker.terminate();
      reject(new Error(e.message || 'The pass plan could not be worked out.'));
    });
    worker.postMessage({ input });
  });
}
