// A job's log: the events its operator and the owner recorded.
import type { AssignmentEvent } from '../../shared/schemas/jobs';
import type { Tx } from '../db/knex';
import type { DbAssignmentEventRow } from './jobs.rows';

export async function insertEvent(db: Tx, e: Omit<DbAssignmentEventRow, 'id' | 'at'> & { at?: Date }): Promise<number> {
  const [row] = await db('assignment_events')
    .insert({ ...e, at: e.at ?? db.fn.now() })
    .returning('id');
  return row.id;
}

export const eventsOfJob = (db: Tx, farmId: number, assignmentId: number): Promise<DbAssignmentEventRow[]> =>
  db<DbAssignmentEventRow>('assignment_events')
    .where({ farm_id: farmId, assignment_id: assignmentId })
    .orderBy([{ column: 'at' }, { column: 'id' }]);

/** The logs of several jobs, oldest first, with who logged each entry. */
export async function eventsOfJobs(db: Tx, farmId: number, ids: number[]): Promise<Map<number, AssignmentEvent[]>> {
  const out = new Map<number, AssignmentEvent[]>(ids.map((id) => [id, []]));
  if (!ids.length) return out;
  const rows = await db('assignment_events as e')
    .leftJoin('users as u', 'u.id', 'e.by_user_id')
    .where('e.farm_id', farmId)
    .whereIn('e.assignment_id', ids)
    .orderBy([{ column: 'e.at' }, { column: 'e.id' }])
    .select('e.*', 'u.name as by_name');
  for (const r of rows) {
    out.get(r.assignment_id)!.push({
      id: r.id,
      type: r.type,
      at: (r.at as Date).toISOString(),
      by: r.by_name ?? null,
      acres: r.acres,
      engineHours: r.engine_hours,
      reason: r.reason,
      note: r.note,
      hazardId: r.hazard_id,
    });
  }
  return out;
}
