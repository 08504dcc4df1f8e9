import type { Tx } from '../db/knex';
import type { DbImplementRow, ImplementWithHitches } from './fleet.rows';

export type ImplementColumns = Partial<
  Pick<DbImplementRow, 'name' | 'kind' | 'width_m' | 'transport_width_m' | 'operations' | 'min_power_hp' | 'notes'>
>;

const withHitches = (db: Tx) =>
  db('implements as i').select(
    'i.*',
    db.raw(
      'coalesce((select array_agg(h.machine_id order by h.machine_id) from implement_hitches h where h.implement_id = i.id), ?::int[]) as machine_ids',
      ['{}'],
    ),
  );

export const listImplements = (db: Tx, farmId: number): Promise<ImplementWithHitches[]> =>
  withHitches(db).where('i.farm_id', farmId).orderByRaw('lower(i.name)');

export const getImplement = (db: Tx, farmId: number, id: number): Promise<ImplementWithHitches | undefined> =>
  withHitches(db).where({ 'i.farm_id': farmId, 'i.id': id }).first();

export const implementNameTaken = async (db: Tx, farmId: number, name: string, exceptId?: number): Promise<boolean> => {
  const q = db('implements').where('farm_id', farmId).whereRaw('lower(name) = lower(?)', [name]);
  if (exceptId) q.whereNot('id', exceptId);
  return !!(await q.first('id'));
};

export async function insertImplement(db: Tx, farmId: number, cols: ImplementColumns): Promise<number> {
  const [row] = await db('implements')
    .insert({ ...cols, farm_id: farmId })
    .returning('id');
  return row.id;
}

export async function updateImplement(db: Tx, id: number, cols: ImplementColumns): Promise<void> {
  await db('implements')
    .where({ id })
    .update({ ...cols, updated_at: db.fn.now() });
}

export async function setHitches(db: Tx, farmId: number, implementId: number, machineIds: number[]): Promise<void> {
  await db('implement_hitches').where({ implement_id: implementId }).delete();
  if (machineIds.length)
    await db('implement_hitches').insert(machineIds.map((machine_id) => ({ farm_id: farmId, implement_id: implementId, machine_id })));
}

export const deleteImplement = (db: Tx, id: number) => db('implements').where({ id }).delete();

export async function implementHasJobs(db: Tx, id: number): Promise<boolean> {
  return !!(await db('assignments').where({ implement_id: id }).first('id'));
}
