import { idParam } from '../../shared/schemas/common';
import type { AppDeps } from '../app-deps';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { params } from '../http/validate';
import { listReports, reviewReport } from './reports.service';

/** Reports from the field are the owner's to act on. */
export function reportRoutes(r: Routes, deps: AppDeps): void {
  r.get('/', ['owner'], async (req, res) => {
    res.json(await listReports(deps, principal(req)));
  });
  r.post('/:id/confirm', ['owner'], async (req, res) => {
    res.json(await reviewReport(deps, principal(req), params(req, idParam).id, 'confirm'));
  });
  r.post('/:id/dismiss', ['owner'], async (req, res) => {
    res.json(await reviewReport(deps, principal(req), params(req, idParam).id, 'dismiss'));
  });
}
