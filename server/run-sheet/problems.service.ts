// A problem reported from the field. A new hazard goes onto the field as `reported` until the
// owner confirms it; a breakdown pauses a job that is underway unless the operator says not to.
import type { ProblemInput, RunSheetItem } from '../../shared/schemas/run-sheet';
import type { AppDeps } from '../app-deps';
import { insertHazard } from '../fields/fields.repository';
import { checkHazardGeometry } from '../fields/geometry';
import type { SessionPrincipal } from '../http/session-user';
import { updateAssignment } from '../jobs/assignments.repository';
import { insertEvent } from '../jobs/events.repository';
import { markOpen } from '../reports/reports.repository';
import { mailOwners } from '../reports/reports.service';
import { fieldName } from './run-sheet.repository';
import { lockJob, touchBoard } from './job-lock';
import { runSheetItem } from './run-sheet.service';

export async function reportProblem(deps: AppDeps, by: SessionPrincipal, id: number, input: ProblemInput): Promise<RunSheetItem> {
  await deps.db.transaction(async (tx) => {
    const a = await lockJob(tx, by, id, 'operator-or-mentor');
    let hazardId: number | null = null;
    if (input.geometry) {
      const geometry = checkHazardGeometry(input.geometry);
      hazardId = await insertHazard(tx, {
        farm_id: by.farmId,
        field_id: a.field_id,
        kind: input.hazardKind ?? 'other',
        geometry,
        clearance_m: input.clearanceM ?? 0,
        note: input.note,
        status: 'reported',
      });
    }
    const base = { farm_id: by.farmId, assignment_id: id, acres: null, engine_hours: null, by_user_id: by.id };
    const reportId = await insertEvent(tx, { ...base, type: 'problem', reason: input.kind, note: input.note, hazard_id: hazardId });
    // The report waits for the owner (open) and the owners hear of it at once, in this transaction.
    await markOpen(tx, reportId);
    let summary = `${by.name} reported a ${input.kind === 'other' ? 'problem' : input.kind}`;
    const paused = input.kind === 'breakdown' && a.state === 'underway' && input.pause !== false;
    if (paused) {
      await insertEvent(tx, { ...base, type: 'pause', reason: null, note: 'Paused for a breakdown', hazard_id: null });
      await updateAssignment(tx, id, { state: 'paused' });
      summary += ' and paused the job';
    }
    await mailOwners(tx, deps.config.publicUrl, by.farmId, {
      id: reportId,
      kind: input.kind,
      note: input.note,
      by: by.name,
      fieldName: await fieldName(tx, by.farmId, a.field_id),
      operation: a.operation,
      day: a.day,
      jobId: id,
      paused,
    });
    await touchBoard(tx, by, a, summary);
  });
  deps.nudgeMail();
  return runSheetItem(deps, by, id);
}
