// What task data reads: the day's jobs (or one), their fields, hazards and saved plans, the
// operators' names, the farm and its owner. Every query is scoped by farm.
import type { MultiPolygon, Polygon } from 'geojson';
import type { Operation } from '../../shared/operations';
import type { AssignmentState } from '../../shared/schemas/jobs';
import type { Tx } from '../db/knex';
import type { DbHazardRow } from '../fields/fields.repository';
import type { DbPassPlanRow } from '../plans/plans.repository';

export interface TaskDataJobRow {
  id: number;
  day: string;
  field_id: number;
  field_name: string;
  operation: Operation;
  operator_id: number;
  state: AssignmentState;
}

export interface TaskDataFieldRow {
  id: number;
  name: string;
  boundary: Polygon | MultiPolygon;
  area_m2: number;
}

const jobs = (db: Tx, farmId: number) =>
  db('assignments as a')
    .join('fields as f', 'f.id', 'a.field_id')
    .where('a.farm_id', farmId)
    .select('a.id', 'a.day', 'a.field_id', 'f.name as field_name', 'a.operation', 'a.operator_id', 'a.state')
    .orderBy([{ column: 'a.operator_id' }, { column: 'a.run_order' }, { column: 'a.id' }]);

export const jobsOfDay = (db: Tx, farmId: number, day: string): Promise<TaskDataJobRow[]> => jobs(db, farmId).where('a.day', day);

export const jobById = (db: Tx, farmId: number, id: number): Promise<TaskDataJobRow | undefined> =>
  jobs(db, farmId).where('a.id', id).first();

export const fieldsByIds = (db: Tx, farmId: number, ids: number[]): Promise<TaskDataFieldRow[]> =>
  db('fields').where({ farm_id: farmId }).whereIn('id', ids).orderBy('name').select('id', 'name', 'boundary', 'area_m2');

export const hazardsOf = (db: Tx, farmId: number, fieldIds: number[]): Promise<DbHazardRow[]> =>
  db<DbHazardRow>('hazards').where({ farm_id: farmId }).whereIn('field_id', fieldIds).orderBy('id');

export const plansOf = (db: Tx, farmId: number, fieldIds: number[]): Promise<DbPassPlanRow[]> =>
  db<DbPassPlanRow>('pass_plans').where({ farm_id: farmId }).whereIn('field_id', fieldIds);

export const peopleNamed = (db: Tx, farmId: number, membershipIds: number[]): Promise<Array<{ id: number; name: string }>> =>
  db('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where('m.farm_id', farmId)
    .whereIn('m.id', membershipIds)
    .select('m.id', 'u.name');

/** The farm's name and its (first) owner's, the customer of its tasks. */
export async function farmAndOwner(db: Tx, farmId: number): Promise<{ farmName: string; ownerName: string }> {
  const row = await db('farms as f')
    .where('f.id', farmId)
    .first(
      'f.name as farm_name',
      db.raw(
        "(select u.name from memberships m join users u on u.id = m.user_id where m.farm_id = f.id and m.role = 'owner' order by m.id limit 1) as owner_name",
      ),
    );
  return { farmName: row.farm_name, ownerName: row.owner_name ?? row.farm_name };
}
