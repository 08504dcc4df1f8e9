import { jobIdParam } from '../../shared/schemas/background';
import type { AppDeps } from '../app-deps';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { params } from '../http/validate';
import * as background from './background.service';

export function backgroundRoutes(r: Routes, deps: AppDeps): void {
  r.get('/failed', ['owner'], async (req, res) => {
    res.json(await background.listFailed(deps, principal(req).farmId));
  });
  r.post('/failed/:id/retry', ['owner'], async (req, res) => {
    await background.retryFailed(deps, principal(req).farmId, params(req, jobIdParam).id);
    res.status(204).end();
  });
}
