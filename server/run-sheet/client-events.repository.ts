// Actions sent with a device-made id (client_events) and what happened to jobs meanwhile
// (assignment_history, written by triggers).
import type { EventType } from '../../shared/schemas/jobs';
import type { KeptAction } from '../../shared/schemas/run-sheet';
import type { Tx } from '../db/knex';

export interface DbClientEventRow {
  id: number;
  farm_id: number;
  client_event_id: string;
  user_id: number | null;
  assignment_id: number;
  /** A step of the job, or `problem` for a report from the field. */
  type: EventType | 'problem';
  at: Date;
  input: Record<string, unknown>;
  event_id: number | null;
  outcome: string | null;
  message: string | null;
  status: number | null;
  response: unknown;
  received_at: Date;
}

/**
 * Claims a device's action id for the farm. The unique key decides between two copies sent at
 * once: the second waits here until the first commits, then gets nothing (and reads the first's
 * answer); if the first rolls back, the second claims it.
 */
export async function claimClientEvent(
  tx: Tx,
  row: Pick<DbClientEventRow, 'farm_id' | 'client_event_id' | 'user_id' | 'assignment_id' | 'type' | 'at' | 'input'>,
): Promise<number | null> {
  const [claimed] = await tx('client_events')
    .insert({ ...row, input: JSON.stringify(row.input) })
    .onConflict(['farm_id', 'client_event_id'])
    .ignore()
    .returning('id');
  return claimed ? (claimed.id as number) : null;
}

/**
 * Claims many ids at once (a batch from one phone): the ids claimed here, by device id. An id left
 * out was claimed by another copy of the same action, whose answer is read once it has committed.
 */
export async function claimClientEvents(
  tx: Tx,
  rows: Array<Pick<DbClientEventRow, 'farm_id' | 'client_event_id' | 'user_id' | 'assignment_id' | 'type' | 'at' | 'input'>>,
): Promise<Map<string, number>> {
  if (!rows.length) return new Map();
  const claimed: Array<{ id: number; client_event_id: string }> = await tx('client_events')
    .insert(rows.map((r) => ({ ...r, input: JSON.stringify(r.input) })))
    .onConflict(['farm_id', 'client_event_id'])
    .ignore()
    .returning(['id', 'client_event_id']);
  return new Map(claimed.map((c) => [c.client_event_id, c.id]));
}

/** Takes back claims whose actions were refused without a record (as a rolled-back single request does). */
export async function dropClaims(tx: Tx, ids: number[]): Promise<void> {
  if (ids.length) await tx('client_events').whereIn('id', ids).delete();
}

export const findClientEvent = (db: Tx, farmId: number, clientEventId: string): Promise<DbClientEventRow | undefined> =>
  db<DbClientEventRow>('client_events').where({ farm_id: farmId, client_event_id: clientEventId }).first();

export const recordAnswer = (
  tx: Tx,
  id: number,
  answer: { outcome: string; message: string | null; status: number; response: unknown; eventId: number | null },
) =>
  tx('client_events')
    .where({ id })
    .update({
      outcome: answer.outcome,
      message: answer.message,
      status: answer.status,
      response: JSON.stringify(answer.response),
      event_id: answer.eventId,
    });

/** The job's last move away from a person or its deletion, with the name of whoever has it now. */
export async function lastChange(
  db: Tx,
  farmId: number,
  assignmentId: number,
  kind: 'moved' | 'deleted',
  fromOperatorId?: number,
): Promise<{ at: Date; fromOperatorId: number; toName: string | null } | undefined> {
  const q = db('assignment_history as h')
    .leftJoin('memberships as m', 'm.id', 'h.to_operator_id')
    .leftJoin('users as u', 'u.id', 'm.user_id')
    .where({ 'h.farm_id': farmId, 'h.assignment_id': assignmentId, 'h.kind': kind })
    .orderBy('h.id', 'desc')
    .first('h.at', 'h.from_operator_id', 'u.name as to_name');
  if (fromOperatorId !== undefined) void q.where('h.from_operator_id', fromOperatorId);
  const row = await q;
  return row ? { at: row.at, fromOperatorId: row.from_operator_id, toName: row.to_name } : undefined;
}

/** Actions kept as a log only, newest first, for the owner. */
export async function keptActions(db: Tx, farmId: number, limit = 100): Promise<KeptAction[]> {
  const rows = await db('client_events as c')
    .leftJoin('users as u', 'u.id', 'c.user_id')
    .leftJoin('assignments as a', 'a.id', 'c.assignment_id')
    .where('c.farm_id', farmId)
    .whereNot('c.outcome', 'applied')
    .orderBy([
      { column: 'c.received_at', order: 'desc' },
      { column: 'c.id', order: 'desc' },
    ])
    .limit(limit)
    .select('c.*', 'u.name as by_name', 'a.id as job_exists');
  return rows.map((r) => ({
    id: r.id,
    job: { id: r.assignment_id, exists: r.job_exists !== null },
    type: r.type,
    at: (r.at as Date).toISOString(),
    receivedAt: (r.received_at as Date).toISOString(),
    by: r.by_name ?? null,
    outcome: r.outcome,
    message: r.message ?? '',
    input: r.input,
  }));
}
