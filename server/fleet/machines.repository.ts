import type { Tx } from '../db/knex';
import type { DbMachineRow } from './fleet.rows';

export type MachineColumns = Partial<
  Pick<DbMachineRow, 'name' | 'kind' | 'power_hp' | 'engine_hours' | 'service_interval_hours' | 'hours_at_last_service' | 'notes'>
>;

export const listMachines = (db: Tx, farmId: number) => db<DbMachineRow>('machines').where({ farm_id: farmId }).orderByRaw('lower(name)');

export const getMachine = (db: Tx, farmId: number, id: number) => db<DbMachineRow>('machines').where({ farm_id: farmId, id }).first();

export const lockMachine = (db: Tx, farmId: number, id: number) =>
  db<DbMachineRow>('machines').where({ farm_id: farmId, id }).forUpdate().first();

/** Ids among `ids` that are machines of this farm. */
export async function machineIdsOfFarm(db: Tx, farmId: number, ids: number[]): Promise<number[]> {
  if (!ids.length) return [];
  return (await db('machines').where({ farm_id: farmId }).whereIn('id', ids).pluck('id')) as number[];
}

export const machineNameTaken = async (db: Tx, farmId: number, name: string, exceptId?: number): Promise<boolean> => {
  const q = db('machines').where('farm_id', farmId).whereRaw('lower(name) = lower(?)', [name]);
  if (exceptId) q.whereNot('id', exceptId);
  return !!(await q.first('id'));
};

export async function insertMachine(db: Tx, farmId: number, cols: MachineColumns): Promise<number> {
  const [row] = await db('machines')
    .insert({ ...cols, farm_id: farmId })
    .returning('id');
  return row.id;
}

export async function updateMachine(db: Tx, id: number, cols: MachineColumns): Promise<void> {
  await db('machines')
    .where({ id })
    .update({ ...cols, updated_at: db.fn.now() });
}

/** Raises the meter to `reading` when it is higher; a meter never runs backwards. */
export async function raiseMeter(db: Tx, id: number, reading: number): Promise<void> {
  await db('machines').where({ id }).where('engine_hours', '<', reading).update({ engine_hours: reading, updated_at: db.fn.now() });
}

export const deleteMachine = (db: Tx, id: number) => db('machines').where({ id }).delete();

export async function machineHasJobs(db: Tx, id: number): Promise<boolean> {
  return !!(await db('assignments').where({ machine_id: id }).first('id'));
}
