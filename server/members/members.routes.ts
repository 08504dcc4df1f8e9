import { inviteBody, roleChangeBody } from '../../shared/schemas/auth';
import { idParam } from '../../shared/schemas/common';
import type { AppDeps } from '../app-deps';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { body, params } from '../http/validate';
import * as members from './members.service';

export function memberRoutes(r: Routes, deps: AppDeps): void {
  r.get('/', ['owner'], async (req, res) => {
    res.json(await members.listMembers(deps, principal(req).farmId));
  });
  r.post('/invite', ['owner'], async (req, res) => {
    res.status(201).json(await members.invite(deps, principal(req), body(req, inviteBody)));
  });
  r.patch('/:id', ['owner'], async (req, res) => {
    const { id } = params(req, idParam);
    res.json(await members.changeRole(deps, principal(req), id, body(req, roleChangeBody).role));
  });
  r.delete('/:id', ['owner'], async (req, res) => {
    await members.remove(deps, principal(req), params(req, idParam).id);
    res.status(204).end();
  });
}
