// Saved pass plans: one row per field and operation, with the figures of its last computation.
import type { Operation } from '../../shared/operations';
import type { PlanSummary } from '../../shared/schemas/plans';
import type { Tx } from '../db/knex';

/** A row of `pass_plans` as Knex returns it (the board reads these too). */
export interface DbPassPlanRow {
  id: number;
  farm_id: number;
  field_id: number;
  operation: Operation;
  implement_id: number | null;
  width_m: number;
  headland_passes: number;
  heading_deg: number | null;
  coverage: 'gaps-ok' | 'full';
  /** Working speed, metres per second. */
  speed_mps: number;
  efficiency: number;
  turn_seconds: number;
  summary: PlanSummary;
  updated_at: Date;
}

/** A saved plan as the plan screens read it: with its field's name and its implement's. */
export interface DbPlanRow extends Omit<DbPassPlanRow, 'farm_id'> {
  field_name: string;
  implement_name: string | null;
  implement_width_m: number | null;
}

/** What a save writes; `updated_at` is set here. */
export type PlanWrite = Omit<DbPassPlanRow, 'id' | 'updated_at' | 'summary'> & {
  /** The summary as JSON text. */
  summary: string;
  updated_by: number;
};

// The implement's width comes along so a plan worked at another width can say so beside it.
const plans = (db: Tx, farmId: number) =>
  db('pass_plans as p')
    .join('fields as f', 'f.id', 'p.field_id')
    .leftJoin('implements as i', function () {
      this.on('i.id', 'p.implement_id').andOn('i.farm_id', 'p.farm_id');
    })
    .where('p.farm_id', farmId)
    .select('p.*', 'f.name as field_name', 'i.name as implement_name', 'i.width_m as implement_width_m');

export async function listPlanRows(db: Tx, farmId: number, fieldId?: number): Promise<DbPlanRow[]> {
  const q = plans(db, farmId).orderBy(['f.name', 'p.operation']);
  if (fieldId) q.where('p.field_id', fieldId);
  return (await q) as DbPlanRow[];
}

export async function findPlanRow(db: Tx, farmId: number, fieldId: number, operation: Operation): Promise<DbPlanRow | undefined> {
  return (await plans(db, farmId).where({ 'p.field_id': fieldId, 'p.operation': operation }).first()) as DbPlanRow | undefined;
}

export async function upsertPlan(db: Tx, row: PlanWrite): Promise<void> {
  await db('pass_plans')
    .insert({ ...row, updated_at: db.fn.now() })
    .onConflict(['field_id', 'operation'])
    .merge();
}

/** How many rows were deleted (0 or 1). */
export function deletePlanRow(db: Tx, farmId: number, fieldId: number, operation: Operation): Promise<number> {
  return db('pass_plans').where({ farm_id: farmId, field_id: fieldId, operation }).delete();
}
