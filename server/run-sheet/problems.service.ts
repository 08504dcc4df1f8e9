// A problem reported from the field. A new hazard goes onto the field as `reported` until the
// owner confirms it; a breakdown pauses a job that is underway unless the operator says not to.
import type { ProblemInput, RunSheetItem } from '../../shared/schemas/run-sheet';
import type { AppDeps } from '../app-deps';
import { insertHazard } from '../fields/fields.repository';
import { checkHazardGeometry } from '../fields/geometry';
import type { SessionPrincipal } from '../http/session-user';
import { updateAssignment } from '../jobs/assignments.repository';
import { insertEvent } from '../jobs/events.repository';
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
    await insertEvent(tx, { ...base, type: 'problem', reason: input.kind, note: input.note, hazard_id: hazardId });
    let summary = `${by.name} reported a ${input.kind === 'other' ? 'problem' : input.kind}`;
    if (input.kind === 'breakdown' && a.state === 'underway' && input.pause !== false) {
      await insertEvent(tx, { ...base, type: 'pause', reason: null, note: 'Paused for a breakdown', hazard_id: null });
      await updateAssignment(tx, id, { state: 'paused' });
      summary += ' and paused the job';
    }
    await touchBoard(tx, by, a, summary);
  });
  return runSheetItem(deps.db, by.farmId, id);
}
