// The things a card points at must belong to the signed-in member's farm; anything else is
// refused as unknown, the same as an id that does not exist.
import type { Operation } from '../../shared/operations';
import type { Tx } from '../db/knex';
import { getField, type DbFieldRow } from '../fields/fields.repository';
import type { DbImplementRow, DbMachineRow } from '../fleet/fleet.rows';
import { AppError } from '../http/errors';
import { acresDoneOn, assignablePerson, type PersonRow } from './assignments.repository';
import { FINISHED_TOLERANCE_ACRES } from './conflicts';
import { seasonOf } from './day-context';

export interface CardRefs {
  fieldId?: number;
  operatorId?: number;
  mentorId?: number | null;
  machineId?: number;
  implementId?: number;
}

export interface Resolved {
  field?: DbFieldRow;
  operator?: PersonRow;
  mentor?: PersonRow | null;
  machine?: DbMachineRow;
  implement?: DbImplementRow;
}

const unknown = (key: string, message: string) => new AppError(422, 'unknown_reference', message, { [key]: message });

export async function resolveRefs(tx: Tx, farmId: number, r: CardRefs): Promise<Resolved> {
  const out: Resolved = {};
  if (r.fieldId !== undefined) {
    out.field = await getField(tx, farmId, r.fieldId);
    if (!out.field) throw unknown('fieldId', 'Choose a field of this farm');
  }
  if (r.operatorId !== undefined) {
    out.operator = await assignablePerson(tx, farmId, r.operatorId);
    if (!out.operator) throw unknown('operatorId', 'Choose an operator of this farm (an active owner or operator)');
  }
  if (r.mentorId) {
    out.mentor = await assignablePerson(tx, farmId, r.mentorId);
    if (!out.mentor) throw unknown('mentorId', 'Choose a mentor of this farm (an active owner or operator)');
  } else if (r.mentorId === null) out.mentor = null;
  if (r.machineId !== undefined) {
    out.machine = await tx<DbMachineRow>('machines').where({ farm_id: farmId, id: r.machineId }).first();
    if (!out.machine) throw unknown('machineId', "Choose a machine of this farm's fleet");
  }
  if (r.implementId !== undefined) {
    out.implement = await tx<DbImplementRow>('implements').where({ farm_id: farmId, id: r.implementId }).first();
    if (!out.implement) throw unknown('implementId', "Choose an implement of this farm's fleet");
  }
  return out;
}

/** Default acres for a new card: what is left of the field for the operation this season, or the whole field when nothing is. */
export async function defaultAcres(tx: Tx, farmId: number, field: DbFieldRow, operation: Operation, day: string): Promise<number> {
  const left = field.acres - (await acresDoneOn(tx, farmId, field.id, operation, seasonOf(day)));
  return left >= FINISHED_TOLERANCE_ACRES ? Math.round(left * 10_000) / 10_000 : field.acres;
}
