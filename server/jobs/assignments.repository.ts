// A job's row and what the board, the run sheet and the acres checks read of jobs.
import type { Knex } from 'knex';
import type { Operation } from '../../shared/operations';
import type { Tx } from '../db/knex';
import type { AssignmentView, DbAssignmentRow } from './jobs.rows';
import { DONE_STATE, seasonDays } from './progress';

export type AssignmentColumns = Partial<Omit<DbAssignmentRow, 'id' | 'farm_id' | 'created_at' | 'updated_at'>>;

/** Assignments with their names and facts; `filter` narrows the rows (always scoped by farm). */
export function assignmentViews(db: Tx, farmId: number, filter: (q: Knex.QueryBuilder) => void): Promise<AssignmentView[]> {
  const q = db('assignments as a')
    .join('fields as f', 'f.id', 'a.field_id')
    .join('machines as m', 'm.id', 'a.machine_id')
    .join('implements as i', 'i.id', 'a.implement_id')
    .where('a.farm_id', farmId)
    .select(
      'a.*',
      'f.name as field_name',
      'f.acres as field_acres',
      // Names by scalar subqueries rather than four more joins: planning an eight-way join cost
      // more than running it (about 11 ms against 3 ms for a busy day, measured by npm run bench).
      db.raw('(select u.name from memberships m join users u on u.id = m.user_id where m.id = a.operator_id) as operator_name'),
      db.raw('(select u.name from memberships m join users u on u.id = m.user_id where m.id = a.mentor_id) as mentor_name'),
      'm.name as machine_name',
      'm.kind as machine_kind',
      'm.power_hp as machine_power_hp',
      'm.engine_hours as machine_engine_hours',
      'm.service_interval_hours as machine_service_interval_hours',
      'm.hours_at_last_service as machine_hours_at_last_service',
      'i.name as implement_name',
      'i.kind as implement_kind',
      'i.width_m as implement_width_m',
      'i.operations as implement_operations',
      'i.min_power_hp as implement_min_power_hp',
      db.raw(
        'coalesce((select array_agg(h.machine_id) from implement_hitches h where h.implement_id = a.implement_id), ?::int[]) as implement_machine_ids',
        ['{}'],
      ),
      db.raw("(select count(*)::int from assignment_events e where e.assignment_id = a.id and e.type = 'problem') as problem_count"),
    )
    .orderBy([{ column: 'a.operator_id' }, { column: 'a.run_order' }, { column: 'a.id' }]);
  filter(q);
  return q;
}

export const viewsOfDay = (db: Tx, farmId: number, day: string) => assignmentViews(db, farmId, (q) => void q.where('a.day', day));

export const getAssignment = (db: Tx, farmId: number, id: number) =>
  db<DbAssignmentRow>('assignments').where({ farm_id: farmId, id }).first();

export const lockAssignment = (db: Tx, farmId: number, id: number) =>
  db<DbAssignmentRow>('assignments').where({ farm_id: farmId, id }).forUpdate().first();

export async function insertAssignment(db: Tx, farmId: number, cols: AssignmentColumns): Promise<number> {
  const [row] = await db('assignments')
    .insert({ ...cols, farm_id: farmId })
    .returning('id');
  return row.id;
}

export async function updateAssignment(db: Tx, id: number, cols: AssignmentColumns): Promise<void> {
  await db('assignments')
    .where({ id })
    .update({ ...cols, updated_at: db.fn.now() });
}

export const deleteAssignment = (db: Tx, id: number) => db('assignments').where({ id }).delete();

/** One operator's cards on a day, in running order. */
export const columnOf = (db: Tx, farmId: number, day: string, operatorId: number): Promise<DbAssignmentRow[]> =>
  db<DbAssignmentRow>('assignments')
    .where({ farm_id: farmId, day, operator_id: operatorId })
    .orderBy([{ column: 'run_order' }, { column: 'id' }]);

export const cardsOfDay = (db: Tx, farmId: number, day: string): Promise<DbAssignmentRow[]> =>
  db<DbAssignmentRow>('assignments').where({ farm_id: farmId, day });

/** Renumbers a column 1..n in the given order. */
export async function renumber(db: Tx, ids: number[]): Promise<void> {
  for (const [i, id] of ids.entries())
    await db('assignments')
      .where({ id })
      .update({ run_order: i + 1 });
}

/** Acres finished per field and operation in one season (calendar year), from finished jobs. */
export async function acresDone(
  db: Tx,
  farmId: number,
  season: number,
  fieldIds: number[],
): Promise<Array<{ field_id: number; operation: Operation; acres: number }>> {
  if (!fieldIds.length) return [];
  const { from, to } = seasonDays(season);
  return db('assignments')
    .where({ farm_id: farmId, state: DONE_STATE })
    .whereIn('field_id', fieldIds)
    .andWhere('day', '>=', from)
    .andWhere('day', '<', to)
    .groupBy('field_id', 'operation')
    .select('field_id', 'operation', db.raw('coalesce(sum(acres_done), 0)::float as acres'));
}

/** Acres of a field finished for an operation in a season, leaving out one job if given. */
export async function acresDoneOn(
  db: Tx,
  farmId: number,
  fieldId: number,
  operation: Operation,
  season: number,
  exceptId?: number,
): Promise<number> {
  const { from, to } = seasonDays(season);
  const q = db('assignments')
    .where({ farm_id: farmId, field_id: fieldId, operation, state: DONE_STATE })
    .andWhere('day', '>=', from)
    .andWhere('day', '<', to);
  if (exceptId) q.whereNot('id', exceptId);
  const [row] = await q.select(db.raw('coalesce(sum(acres_done), 0)::float as acres'));
  return row.acres;
}
