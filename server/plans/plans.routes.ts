import { planListQuery, planParams, planPreviewBody, planSettings } from '../../shared/schemas/plans';
import type { AppDeps } from '../app-deps';
import { heavyWork } from '../http/heavy';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { body, params, query } from '../http/validate';
import * as plans from './plans.service';

export function planRoutes(r: Routes, deps: AppDeps): void {
  // Every route here computes a plan in a compute worker.
  const previews = heavyWork(120);
  const reads = heavyWork(240);
  const saves = heavyWork(120);

  r.post('/preview', 'member', ...previews, async (req, res) => {
    res.json(await plans.preview(deps, principal(req).farmId, body(req, planPreviewBody)));
  });

  r.get('/', 'member', async (req, res) => {
    const q = query(req, planListQuery);
    res.json(await plans.listPlans(deps, principal(req).farmId, q.fieldId));
  });

  r.get('/:fieldId/:operation', 'member', ...reads, async (req, res) => {
    const p = params(req, planParams);
    res.json(await plans.getPlan(deps, principal(req).farmId, p.fieldId, p.operation));
  });

  r.get('/:fieldId/:operation/passes.geojson', 'member', ...reads, async (req, res) => {
    const p = params(req, planParams);
    const plan = await plans.getPlan(deps, principal(req).farmId, p.fieldId, p.operation);
    const name = `${plan.fieldName}-${plan.operation}-passes.geojson`.replace(/[^A-Za-z0-9._-]+/g, '-');
    res
      .set('Content-Disposition', `attachment; filename="${name}"`)
      .type('application/geo+json')
      .send(JSON.stringify(plans.passesGeoJson(plan)));
  });

  r.put('/:fieldId/:operation', ['owner'], ...saves, async (req, res) => {
    const p = params(req, planParams);
    const me = principal(req);
    res.json(await plans.savePlan(deps, me.farmId, me.id, p.fieldId, p.operation, body(req, planSettings)));
  });

  r.delete('/:fieldId/:operation', ['owner'], async (req, res) => {
    const p = params(req, planParams);
    await plans.deletePlan(deps, principal(req).farmId, p.fieldId, p.operation);
    res.status(204).end();
  });
}
