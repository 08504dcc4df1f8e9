import { idParam } from '../../shared/schemas/common';
import { implementBody, implementPatchBody, machineBody, machinePatchBody } from '../../shared/schemas/fleet';
import type { AppDeps } from '../app-deps';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { body, params } from '../http/validate';
import * as implementsService from './implements.service';
import * as machines from './machines.service';

/** Fleet: everyone on the farm reads it; the owner keeps it. */
export function fleetRoutes(r: Routes, deps: AppDeps): void {
  r.get('/machines', 'member', async (req, res) => {
    res.json(await machines.listMachines(deps, principal(req).farmId));
  });
  r.post('/machines', ['owner'], async (req, res) => {
    res.status(201).json(await machines.createMachine(deps, principal(req).farmId, body(req, machineBody)));
  });
  r.get('/machines/:id', 'member', async (req, res) => {
    res.json(await machines.getMachine(deps, principal(req).farmId, params(req, idParam).id));
  });
  r.patch('/machines/:id', ['owner'], async (req, res) => {
    res.json(await machines.updateMachine(deps, principal(req).farmId, params(req, idParam).id, body(req, machinePatchBody)));
  });
  r.delete('/machines/:id', ['owner'], async (req, res) => {
    await machines.deleteMachine(deps, principal(req).farmId, params(req, idParam).id);
    res.status(204).end();
  });

  r.get('/implements', 'member', async (req, res) => {
    res.json(await implementsService.listImplements(deps, principal(req).farmId));
  });
  r.post('/implements', ['owner'], async (req, res) => {
    res.status(201).json(await implementsService.createImplement(deps, principal(req).farmId, body(req, implementBody)));
  });
  r.get('/implements/:id', 'member', async (req, res) => {
    res.json(await implementsService.getImplement(deps, principal(req).farmId, params(req, idParam).id));
  });
  r.patch('/implements/:id', ['owner'], async (req, res) => {
    res.json(await implementsService.updateImplement(deps, principal(req).farmId, params(req, idParam).id, body(req, implementPatchBody)));
  });
  r.delete('/implements/:id', ['owner'], async (req, res) => {
    await implementsService.deleteImplement(deps, principal(req).farmId, params(req, idParam).id);
    res.status(204).end();
  });
}
