import { idParam } from '../../shared/schemas/common';
import { boardDateParam } from '../../shared/schemas/board';
import type { Response } from 'express';
import type { AppDeps } from '../app-deps';
import { heavyWork } from '../http/heavy';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { params } from '../http/validate';
import { dayTaskData, jobTaskData } from './taskdata.service';

function sendZip(res: Response, name: string, data: Uint8Array): void {
  res
    .set('Content-Disposition', `attachment; filename="${name}"`)
    .type('application/zip')
    .send(Buffer.from(data.buffer, data.byteOffset, data.byteLength));
}

/** A board day's task data for the terminal: the owner's, as the board is. */
export function boardTaskDataRoutes(r: Routes, deps: AppDeps): void {
  // Built in a compute worker (every field's headland and clearance zones): guarded as imports are.
  r.get('/:date/taskdata.zip', ['owner'], ...heavyWork(60), async (req, res) => {
    const { date } = params(req, boardDateParam);
    sendZip(res, `TASKDATA-${date}.zip`, await dayTaskData(deps, principal(req), date));
  });
}

/** One job's task data: the owner's and the job's operator's (checked in the service). */
export function jobTaskDataRoutes(r: Routes, deps: AppDeps): void {
  r.get('/:id/taskdata.zip', ['owner', 'operator'], ...heavyWork(60), async (req, res) => {
    const { id } = params(req, idParam);
    const { day, data } = await jobTaskData(deps, principal(req), id);
    sendZip(res, `TASKDATA-${day}-job-${id}.zip`, data);
  });
}
