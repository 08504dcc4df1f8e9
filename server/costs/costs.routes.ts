import { costItemParams, fuelCostBody, hourlyCostBody } from '../../shared/schemas/costs';
import type { AppDeps } from '../app-deps';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { body, params } from '../http/validate';
import { costSettings, setFuel, setLabourCost, setMachineCost } from './costs.service';

/** Rates of the farm's own work: read by the owner and viewers (the accountant), set by the owner; operators see no money. */
const READERS = ['owner', 'viewer'] as const;

export function costRoutes(r: Routes, deps: AppDeps): void {
  r.get('/', READERS, async (req, res) => {
    res.json(await costSettings(deps.db, principal(req).farmId));
  });
  r.put('/fuel', ['owner'], async (req, res) => {
    res.json(await setFuel(deps.db, principal(req).farmId, body(req, fuelCostBody)));
  });
  r.put('/machines/:id', ['owner'], async (req, res) => {
    const { id } = params(req, costItemParams);
    res.json(await setMachineCost(deps.db, principal(req).farmId, id, body(req, hourlyCostBody).hourlyCents));
  });
  r.put('/people/:id', ['owner'], async (req, res) => {
    const { id } = params(req, costItemParams);
    res.json(await setLabourCost(deps.db, principal(req).farmId, id, body(req, hourlyCostBody).hourlyCents));
  });
}
