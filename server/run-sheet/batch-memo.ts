// What a batch of outbox actions shares inside its one transaction, so that 200 actions do not
// cost 200 times the work only needed once: the board days are locked once (before any action,
// outside every savepoint, so a refused action's rollback cannot release them), field names are
// read once, and the board's version bumps and the stored answers are written once at the end,
// with the very rows the actions one at a time would have written.
import { lockDay } from '../board/board-days.repository';
import type { Tx } from '../db/knex';
import type { SessionPrincipal } from '../http/session-user';
import { fieldName } from './run-sheet.repository';

export interface StoredAnswer {
  /** The client_events row claimed for the action. */
  id: number;
  outcome: string;
  message: string | null;
  status: number;
  response: unknown;
  eventId: number | null;
}

export interface BatchMemo {
  lockedDays: Set<string>;
  /** The day of each job the batch names, as read before its days were locked. */
  dayOf: Map<number, string>;
  fieldNames: Map<number, string>;
  /** Board changes in the order the actions were applied. */
  touches: Array<{ day: string; assignmentId: number; summary: string }>;
  /** Answers to store with their ids, by client_events id. */
  answers: Map<number, StoredAnswer>;
}

export const newMemo = (): BatchMemo => ({
  lockedDays: new Set(),
  dayOf: new Map(),
  fieldNames: new Map(),
  touches: [],
  answers: new Map(),
});

/** Locks, in date order (as board saves do), the board days of the jobs the batch names. */
export async function lockBatchDays(tx: Tx, farmId: number, assignmentIds: number[], memo: BatchMemo): Promise<void> {
  const rows: Array<{ id: number; day: string }> = await tx('assignments')
    .where({ farm_id: farmId })
    .whereIn('id', [...new Set(assignmentIds)])
    .select('id', 'day');
  for (const r of rows) memo.dayOf.set(r.id, r.day);
  for (const day of [...new Set(memo.dayOf.values())].sort()) {
    await lockDay(tx, farmId, day);
    memo.lockedDays.add(day);
  }
}

/** A field's name, read once per batch. */
export async function fieldNameOnce(tx: Tx, farmId: number, fieldId: number, memo: BatchMemo | undefined): Promise<string> {
  if (!memo) return fieldName(tx, farmId, fieldId);
  let name = memo.fieldNames.get(fieldId);
  if (name === undefined) memo.fieldNames.set(fieldId, (name = await fieldName(tx, farmId, fieldId)));
  return name;
}

/**
 * Writes what the batch put off: each day's version raised by the number of its changes, one
 * board change per action with its own version (as one bump per action numbers them), and the
 * stored answers.
 */
export async function flushMemo(tx: Tx, by: SessionPrincipal, memo: BatchMemo): Promise<void> {
  const days = [...new Set(memo.touches.map((t) => t.day))].sort();
  for (const day of days) {
    const touches = memo.touches.filter((t) => t.day === day);
    const [row] = await tx('board_days').where({ farm_id: by.farmId, day }).increment('version', touches.length).returning('version');
    const first = (row.version as number) - touches.length + 1;
    await tx('board_changes').insert(
      touches.map((t, k) => ({
        farm_id: by.farmId,
        day,
        version: first + k,
        by_user_id: by.id,
        summary: t.summary.slice(0, 500),
        assignment_ids: [t.assignmentId],
      })),
    );
  }
  if (memo.answers.size) {
    const rows = [...memo.answers.values()].map((a) => ({
      id: a.id,
      outcome: a.outcome,
      message: a.message,
      status: a.status,
      response: a.response,
      event_id: a.eventId,
    }));
    await tx.raw(
      `update client_events c
          set outcome = v.outcome, message = v.message, status = v.status, response = v.response, event_id = v.event_id
         from json_to_recordset(?::json) as v(id int, outcome text, message text, status smallint, response json, event_id int)
        where c.id = v.id`,
      [JSON.stringify(rows)],
    );
  }
  memo.touches = [];
  memo.answers.clear();
}
