import { skillBody, skillParams } from '../../shared/schemas/fleet';
import type { AppDeps } from '../app-deps';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { body, params } from '../http/validate';
import * as crew from './crew.service';

/** Crew and skills: everyone on the farm reads them; the owner sets them. */
export function crewRoutes(r: Routes, deps: AppDeps): void {
  r.get('/', 'member', async (req, res) => {
    res.json(await crew.listCrew(deps, principal(req).farmId));
  });
  r.put('/:membershipId/skills/:operation', ['owner'], async (req, res) => {
    const p = params(req, skillParams);
    res.json(await crew.setSkill(deps, principal(req).farmId, p.membershipId, p.operation, body(req, skillBody).level));
  });
}
