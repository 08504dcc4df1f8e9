// The owner's corrections to a finished job's log. The season totals read the job's columns, so
// an edit or a deletion changes them; each correction is kept in the job's event log.
import type { LogPatch, RunSheetItem } from '../../shared/schemas/run-sheet';
import type { AppDeps } from '../app-deps';
import { raiseMeter } from '../fleet/machines.repository';
import { AppError } from '../http/errors';
import type { SessionPrincipal } from '../http/session-user';
import { checkAcres } from '../jobs/acres-check';
import { updateAssignment, type AssignmentColumns } from '../jobs/assignments.repository';
import { insertEvent } from '../jobs/events.repository';
import type { DbAssignmentRow } from '../jobs/jobs.rows';
import { backwards } from './engine-hours';
import { lockJob, touchBoard } from './job-lock';
import { runSheetItem } from './run-sheet.service';

const mustBeFinished = (a: DbAssignmentRow) => {
  if (a.state !== 'finished') throw new AppError(409, 'not_finished', 'Only a finished job has a log to correct');
};

export async function editLog(deps: AppDeps, by: SessionPrincipal, id: number, patch: LogPatch): Promise<RunSheetItem> {
  await deps.db.transaction(async (tx) => {
    const a = await lockJob(tx, by, id, 'owner');
    mustBeFinished(a);
    if (patch.acresDone !== undefined) await checkAcres(tx, by.farmId, by.units, a, patch.acresDone);
    const start = patch.engineHoursStart === undefined ? a.engine_hours_start : patch.engineHoursStart;
    const end = patch.engineHoursEnd === undefined ? a.engine_hours_end : patch.engineHoursEnd;
    if (start != null && end != null && end < start) throw backwards(end, start, 'the reading at the start');
    const cols: AssignmentColumns = {};
    const said: string[] = [];
    if (patch.acresDone !== undefined) {
      // The owner's correction is their word: it counts, as typed, over a measured figure (server/track-coverage/measured-acres.ts).
      cols.acres_done = patch.acresDone;
      cols.acres_typed = patch.acresDone;
      cols.acres_source = 'typed';
      said.push(`acres ${a.acres_done ?? '–'}${a.acres_source === 'measured' ? ' (measured)' : ''} → ${patch.acresDone}`);
    }
    if (patch.hoursWorked !== undefined) {
      cols.hours_worked = patch.hoursWorked;
      said.push(`hours ${a.hours_worked ?? '–'} → ${patch.hoursWorked}`);
    }
    if (patch.engineHoursStart !== undefined) cols.engine_hours_start = patch.engineHoursStart;
    if (patch.engineHoursEnd !== undefined) cols.engine_hours_end = patch.engineHoursEnd;
    if (patch.engineHoursStart !== undefined || patch.engineHoursEnd !== undefined) said.push(`engine hours ${start ?? '–'}–${end ?? '–'}`);
    if (end != null) await raiseMeter(tx, a.machine_id, end);
    await updateAssignment(tx, id, cols);
    await insertEvent(tx, {
      farm_id: by.farmId,
      assignment_id: id,
      type: 'log-edited',
      acres: patch.acresDone ?? null,
      engine_hours: null,
      reason: null,
      note: said.join('; '),
      hazard_id: null,
      by_user_id: by.id,
    });
    await touchBoard(tx, by, a, `Corrected the log of a finished job (${said.join('; ')})`);
  });
  return runSheetItem(deps, by, id);
}

/** Deleting the log puts the job back on the board as planned; its acres leave the season totals. */
export async function deleteLog(deps: AppDeps, by: SessionPrincipal, id: number): Promise<RunSheetItem> {
  await deps.db.transaction(async (tx) => {
    const a = await lockJob(tx, by, id, 'owner');
    mustBeFinished(a);
    await updateAssignment(tx, id, {
      state: 'planned',
      acres_done: null,
      acres_typed: null,
      acres_source: null,
      hours_worked: null,
      engine_hours_start: null,
      engine_hours_end: null,
      started_at: null,
      finished_at: null,
    });
    await insertEvent(tx, {
      farm_id: by.farmId,
      assignment_id: id,
      type: 'log-deleted',
      acres: a.acres_done,
      engine_hours: null,
      reason: null,
      note: null,
      hazard_id: null,
      by_user_id: by.id,
    });
    await touchBoard(tx, by, a, 'Deleted the log of a finished job; it is planned again');
  });
  return runSheetItem(deps, by, id);
}
