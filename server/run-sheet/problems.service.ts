// A problem reported from the field. A new hazard goes onto the field as `reported` until the
// owner confirms it; a breakdown pauses a job that is underway unless the operator says not to.
// A report written on a phone with no signal carries the device's id and the time it was written:
// recorded once per farm like a logged action, the same id again gets the first answer and changes
// nothing, and a report the world changed under (the job deleted or moved) is kept as a log.
import type { ProblemInput } from '../../shared/schemas/run-sheet';
import type { AppDeps } from '../app-deps';
import type { Db, Tx } from '../db/knex';
import { insertHazard } from '../fields/fields.repository';
import { checkHazardGeometry } from '../fields/geometry';
import type { SessionPrincipal } from '../http/session-user';
import { updateAssignment } from '../jobs/assignments.repository';
import { insertEvent } from '../jobs/events.repository';
import { markOpen } from '../reports/reports.repository';
import { mailOwners } from '../reports/reports.service';
import { claimClientEvent, findClientEvent, recordAnswer } from './client-events.repository';
import { type EventAnswer, keptOutcome, replay, tappedAt } from './events.service';
import { fieldNameOnce, type BatchMemo } from './batch-memo';
import { lockJob, touchBoard } from './job-lock';
import { runSheetItem } from './run-sheet.service';

/** Writes the report inside `tx`; returns its log entry and the job's state after it. */
async function apply(tx: Tx, deps: AppDeps, by: SessionPrincipal, id: number, input: ProblemInput, at: Date | undefined, memo?: BatchMemo) {
  const a = await lockJob(tx, by, id, 'operator-or-mentor', memo);
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
  const base = { farm_id: by.farmId, assignment_id: id, acres: null, engine_hours: null, by_user_id: by.id, ...(at ? { at } : {}) };
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
    fieldName: await fieldNameOnce(tx, by.farmId, a.field_id, memo),
    operation: a.operation,
    day: a.day,
    jobId: id,
    paused,
  });
  await touchBoard(tx, by, a, summary, memo);
  return { reportId, state: paused ? 'paused' : a.state, job: { day: a.day, operator_id: a.operator_id } };
}

/**
 * Reports a problem on a job. Without `clientEventId`, as an online report: written, or refused
 * with an error. With it, exactly once per farm, as `logEvent` does for the job's steps.
 */
export async function reportProblem(
  deps: AppDeps,
  by: SessionPrincipal,
  id: number,
  input: ProblemInput,
  requestId?: string,
  minimal = false,
): Promise<EventAnswer> {
  const at = input.at ? tappedAt(input) : undefined;
  const clientEventId = input.clientEventId;
  if (!clientEventId) {
    await deps.db.transaction((tx) => apply(tx, deps, by, id, input, at));
    deps.nudgeMail();
    return { status: 201, body: await runSheetItem(deps, by, id) };
  }
  const seen = await findClientEvent(deps.db, by.farmId, clientEventId);
  if (seen?.status != null) return replay(seen, by);
  const when = at ?? new Date();
  const answer = await deps.db.transaction((tx) =>
    reportClientProblem(tx, deps, by, id, { ...input, clientEventId }, when, requestId, minimal),
  );
  deps.nudgeMail();
  if (answer) return answer;
  return replay((await findClientEvent(deps.db, by.farmId, clientEventId))!, by);
}

/**
 * A report with a device-made id, inside `tx`, as `logClientEvent` does for the job's steps: null
 * when another copy claimed the id first. The owners' mail is queued in `tx`; the caller nudges
 * the mailer after the commit.
 */
export async function reportClientProblem(
  tx: Tx,
  deps: AppDeps,
  by: SessionPrincipal,
  id: number,
  input: ProblemInput & { clientEventId: string },
  when: Date,
  requestId: string | undefined,
  minimal: boolean,
  memo?: BatchMemo,
  /** In a batch, the id claimed already (with the others, in one statement). */
  claimed?: number,
): Promise<EventAnswer | null> {
  const { at: _at, clientEventId, ...rest } = input;
  const claim =
    claimed ??
    (await claimClientEvent(tx, {
      farm_id: by.farmId,
      client_event_id: clientEventId,
      user_id: by.id,
      assignment_id: id,
      type: 'problem',
      at: when,
      input: rest,
    }));
  if (claim === null) return null;
  let outcome: { status: number; body: unknown; outcome: string; message: string | null; eventId: number | null };
  try {
    const done = await tx.transaction((sp) => apply(sp, deps, by, id, input, when, memo));
    const body = minimal
      ? { clientEventId, id, state: done.state, eventId: done.reportId }
      : await runSheetItem(deps, by, id, tx as Db, done.job);
    outcome = { status: 201, body, outcome: 'applied', message: null, eventId: done.reportId };
  } catch (err) {
    const kept = await keptOutcome(tx, by, id, { type: 'problem' }, when, err);
    const error = {
      code: kept.code,
      message: kept.message,
      ...(kept.fields ? { fields: kept.fields } : {}),
      kept: { id: claim, type: 'problem', at: when.toISOString() },
      ...(requestId ? { requestId } : {}),
    };
    outcome = { status: kept.status, body: { error }, outcome: kept.code, message: kept.message, eventId: null };
  }
  if (memo) memo.answers.set(claim, { id: claim, ...outcome, response: outcome.body });
  else await recordAnswer(tx, claim, { ...outcome, response: outcome.body });
  return { status: outcome.status, body: outcome.body, minimal: minimal && outcome.status === 201 };
}
