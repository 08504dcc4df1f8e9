import { weatherFieldParams, weatherLimitsBody } from '../../shared/schemas/weather';
import type { AppDeps } from '../app-deps';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { body, params } from '../http/validate';
import { changeLimits, fieldForecast, limitsAnswer } from './weather.service';

/** A field's forecast with verdicts (any member), and the farm's weather limits (read by members, set by the owner). */
export function weatherRoutes(r: Routes, deps: AppDeps): void {
  r.get('/fields/:fieldId', 'member', async (req, res) => {
    const { fieldId } = params(req, weatherFieldParams);
    res.json(await fieldForecast(deps.db, principal(req), fieldId));
  });
  r.get('/limits', 'member', async (req, res) => {
    res.json(await limitsAnswer(deps.db, principal(req).farmId));
  });
  r.put('/limits', ['owner'], async (req, res) => {
    const limits = body(req, weatherLimitsBody);
    res.json(await changeLimits(deps.db, principal(req).farmId, limits));
  });
}
