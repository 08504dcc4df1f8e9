import { rateBody, rateParams } from '../../shared/schemas/rate-card';
import type { AppDeps } from '../app-deps';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { body, params } from '../http/validate';
import { clearRate, rateCard, setRate } from './rate-card.service';

/** Rates are money: read by the owner and viewers, set by the owner; operators are refused. */
const READERS = ['owner', 'viewer'] as const;

export function rateCardRoutes(r: Routes, deps: AppDeps): void {
  r.get('/', READERS, async (req, res) => {
    res.json(await rateCard(deps.db, principal(req).farmId));
  });
  r.put('/:operation', ['owner'], async (req, res) => {
    const { operation } = params(req, rateParams);
    res.json(await setRate(deps.db, principal(req).farmId, operation, body(req, rateBody)));
  });
  r.delete('/:operation', ['owner'], async (req, res) => {
    res.json(await clearRate(deps.db, principal(req).farmId, params(req, rateParams).operation));
  });
}
