import { LRUCache } from 'lru-cache';
import type { Request } from 'express';
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

  // A saved plan is recomputed from the field, its hazards and the settings; all are farm tables,
  // so the farm's revision (read with the principal) names one result. Kept as promises, so the
  // run sheet's several requests for the same plan share one computation.
  const saved = new LRUCache<string, ReturnType<typeof plans.getPlan>>({ max: 50 });
  const savedPlan = (req: Request) => {
    const p = params(req, planParams);
    const me = principal(req);
    const key = `${me.farmId}:${me.farmRevision}:${p.fieldId}:${p.operation}`;
    let plan = saved.get(key);
    if (!plan) {
      plan = plans.getPlan(deps, me.farmId, p.fieldId, p.operation);
      saved.set(key, plan);
      plan.catch(() => saved.delete(key));
    }
    return plan;
  };

  r.post('/preview', 'member', ...previews, async (req, res) => {
    res.json(await plans.preview(deps, principal(req).farmId, body(req, planPreviewBody)));
  });

  r.get('/', 'member', async (req, res) => {
    const q = query(req, planListQuery);
    res.json(await plans.listPlans(deps, principal(req).farmId, q.fieldId));
  });

  r.get('/:fieldId/:operation', 'member', ...reads, async (req, res) => {
    res.json(await savedPlan(req));
  });

  r.get('/:fieldId/:operation/passes.geojson', 'member', ...reads, async (req, res) => {
    const plan = await savedPlan(req);
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
