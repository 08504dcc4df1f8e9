// The things a card points at must belong to the signed-in member's farm; anything else is
// refused as unknown, the same as an id that does not exist.
import type { Tx } from '../db/knex';
import { getField, type DbFieldRow } from '../fields/fields.repository';
import type { DbImplementRow, DbMachineRow } from '../fleet/fleet.rows';
import { getImplement } from '../fleet/implements.repository';
import { getMachine } from '../fleet/machines.repository';
import { AppError } from '../http/errors';
import { assignablePerson, type PersonRow } from './day.repository';

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
    out.machine = await getMachine(tx, farmId, r.machineId);
    if (!out.machine) throw unknown('machineId', "Choose a machine of this farm's fleet");
  }
  if (r.implementId !== undefined) {
    out.implement = await getImplement(tx, farmId, r.implementId);
    if (!out.implement) throw unknown('implementId', "Choose an implement of this farm's fleet");
  }
  return out;
}
