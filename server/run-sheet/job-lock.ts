import { bumpDay, lockDay } from '../board/board-days.repository';
import type { Tx } from '../db/knex';
import { forbidden, notFound } from '../http/errors';
import type { SessionPrincipal } from '../http/session-user';
import { getAssignment, lockAssignment } from '../jobs/assignments.repository';
import type { DbAssignmentRow } from '../jobs/jobs.rows';

export type JobActor = 'operator' | 'operator-or-mentor' | 'owner';

/**
 * Locks a job for a logged action, its board day first (the same order as board saves), and
 * checks who may act: the owner always; the operator (and, for problem reports, the mentor).
 */
export async function lockJob(tx: Tx, by: SessionPrincipal, id: number, who: JobActor): Promise<DbAssignmentRow> {
  const first = await getAssignment(tx, by.farmId, id);
  if (!first) throw notFound('That job');
  await lockDay(tx, by.farmId, first.day);
  const a = (await lockAssignment(tx, by.farmId, id))!;
  if (by.role === 'owner') return a;
  const mayAct =
    who === 'owner' ? false : a.operator_id === by.membershipId || (who === 'operator-or-mentor' && a.mentor_id === by.membershipId);
  if (!mayAct) throw forbidden("This job is on someone else's run sheet");
  return a;
}

/** Every logged action changes the board day too: its version goes up so open boards reload. */
export const touchBoard = (tx: Tx, by: SessionPrincipal, a: DbAssignmentRow, summary: string) =>
  bumpDay(tx, by.farmId, a.day, { byUserId: by.id, summary, assignmentIds: [a.id] });
