import { bumpDay, lockDay } from '../board/board-days.repository';
import type { Tx } from '../db/knex';
import { forbidden, notFound } from '../http/errors';
import type { SessionPrincipal } from '../http/session-user';
import { getAssignment, lockAssignment } from '../jobs/assignments.repository';
import type { DbAssignmentRow } from '../jobs/jobs.rows';
import type { BatchMemo } from './batch-memo';

export type JobActor = 'operator' | 'operator-or-mentor' | 'owner';

/**
 * Locks a job for a logged action, its board day first (the same order as board saves), and
 * checks who may act: the owner always; the operator (and, for problem reports, the mentor).
 */
export async function lockJob(tx: Tx, by: SessionPrincipal, id: number, who: JobActor, memo?: BatchMemo): Promise<DbAssignmentRow> {
  const a = (await lockedInBatch(tx, by, id, memo)) ?? (await lockAlone(tx, by, id));
  if (by.role === 'owner') return a;
  const mayAct =
    who === 'owner' ? false : a.operator_id === by.membershipId || (who === 'operator-or-mentor' && a.mentor_id === by.membershipId);
  if (!mayAct) throw forbidden("This job is on someone else's run sheet");
  return a;
}

async function lockAlone(tx: Tx, by: SessionPrincipal, id: number): Promise<DbAssignmentRow> {
  const first = await getAssignment(tx, by.farmId, id);
  if (!first) throw notFound('That job');
  await lockDay(tx, by.farmId, first.day);
  return (await lockAssignment(tx, by.farmId, id))!;
}

/** In a batch whose start locked the job's day: the job alone is locked (the day is held already). */
async function lockedInBatch(tx: Tx, by: SessionPrincipal, id: number, memo?: BatchMemo): Promise<DbAssignmentRow | null> {
  const day = memo?.dayOf.get(id);
  if (day === undefined || !memo!.lockedDays.has(day)) return null;
  const a = await lockAssignment(tx, by.farmId, id);
  if (!a) throw notFound('That job');
  // Moved to another day before the batch took its day: that day too, as board saves lock it.
  if (!memo!.lockedDays.has(a.day)) {
    await lockDay(tx, by.farmId, a.day);
    memo!.lockedDays.add(a.day);
  }
  return a;
}

/**
 * Every logged action changes the board day too: its version goes up so open boards reload. In a
 * batch the bump is written with the others when the batch ends (`flushMemo`).
 */
export async function touchBoard(tx: Tx, by: SessionPrincipal, a: DbAssignmentRow, summary: string, memo?: BatchMemo): Promise<void> {
  if (memo) memo.touches.push({ day: a.day, assignmentId: a.id, summary });
  else await bumpDay(tx, by.farmId, a.day, { byUserId: by.id, summary, assignmentIds: [a.id] });
}
