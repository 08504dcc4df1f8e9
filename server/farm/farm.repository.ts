import type { FarmSettings } from '../../shared/schemas/farm';
import type { Tx } from '../db/knex';

export async function getFarmSettings(db: Tx, farmId: number): Promise<FarmSettings> {
  const f = await db('farms').where({ id: farmId }).first();
  return { id: f.id, name: f.name, units: f.units, dayHoursLimit: f.day_hours_limit, timeZone: f.time_zone };
}

export async function updateFarmSettings(db: Tx, farmId: number, p: Partial<Omit<FarmSettings, 'id'>>): Promise<void> {
  await db('farms')
    .where({ id: farmId })
    .update({
      ...(p.name ? { name: p.name } : {}),
      ...(p.units ? { units: p.units } : {}),
      ...(p.dayHoursLimit ? { day_hours_limit: p.dayHoursLimit } : {}),
      ...(p.timeZone ? { time_zone: p.timeZone } : {}),
    });
}
