import { eventBody, logPatchBody, problemBody, runSheetQuery } from '../../shared/schemas/run-sheet';
import { idParam } from '../../shared/schemas/common';
import type { AppDeps } from '../app-deps';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { body, params, query } from '../http/validate';
import { logEvent } from './events.service';
import { deleteLog, editLog } from './log.service';
import { reportProblem } from './problems.service';
import { readRunSheet } from './run-sheet.service';

/** The run sheet is for the people doing the work and the owner; viewers read the season instead. */
export function runSheetRoutes(r: Routes, deps: AppDeps): void {
  r.get('/', ['owner', 'operator'], async (req, res) => {
    const q = query(req, runSheetQuery);
    res.json(await readRunSheet(deps, principal(req), q.date, q.membershipId));
  });
}

/** What happens on a job, logged by its operator (or the owner); log corrections are the owner's. */
export function jobLogRoutes(r: Routes, deps: AppDeps): void {
  r.post('/:id/events', ['owner', 'operator'], async (req, res) => {
    res.status(201).json(await logEvent(deps, principal(req), params(req, idParam).id, body(req, eventBody)));
  });
  r.post('/:id/problems', ['owner', 'operator'], async (req, res) => {
    res.status(201).json(await reportProblem(deps, principal(req), params(req, idParam).id, body(req, problemBody)));
  });
  r.patch('/:id/log', ['owner'], async (req, res) => {
    res.json(await editLog(deps, principal(req), params(req, idParam).id, body(req, logPatchBody)));
  });
  r.delete('/:id/log', ['owner'], async (req, res) => {
    res.json(await deleteLog(deps, principal(req), params(req, idParam).id));
  });
}
