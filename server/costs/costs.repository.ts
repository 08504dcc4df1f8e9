// Rates of the farm's own work: the only file that reads or writes the cost tables' rows.
import type { Operation } from '../../shared/operations';
import type { Tx } from '../db/knex';

export interface CostSettingsRow {
  fuel_price_cents: number | null;
  fuel_gal_per_acre: Partial<Record<Operation, number>>;
}

export async function settings(db: Tx, farmId: number): Promise<CostSettingsRow> {
  const row = (await db('cost_settings').where({ farm_id: farmId }).first('fuel_price_cents', 'fuel_gal_per_acre')) as
    CostSettingsRow | undefined;
  return row ?? { fuel_price_cents: null, fuel_gal_per_acre: {} };
}

export async function saveSettings(db: Tx, farmId: number, fuelPriceCents: number | null, galPerAcre: Partial<Record<Operation, number>>) {
  await db('cost_settings')
    .insert({ farm_id: farmId, fuel_price_cents: fuelPriceCents, fuel_gal_per_acre: JSON.stringify(galPerAcre), updated_at: db.fn.now() })
    .onConflict('farm_id')
    .merge(['fuel_price_cents', 'fuel_gal_per_acre', 'updated_at']);
}

export interface MachineCostRow {
  machine_id: number;
  name: string;
  hourly_cents: number | null;
}

export async function machineCosts(db: Tx, farmId: number): Promise<MachineCostRow[]> {
  return db('machines as m')
    .leftJoin('machine_costs as c', 'c.machine_id', 'm.id')
    .where('m.farm_id', farmId)
    .orderByRaw('lower(m.name), m.id')
    .select('m.id as machine_id', 'm.name', 'c.hourly_cents');
}

export interface PersonCostRow {
  membership_id: number;
  name: string;
  role: string;
  hourly_cents: number | null;
}

/** Active people of the farm and anyone who has a rate (a removed person's past work still costs). */
export async function personCosts(db: Tx, farmId: number): Promise<PersonCostRow[]> {
  return db('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .leftJoin('labour_costs as c', 'c.membership_id', 'm.id')
    .where('m.farm_id', farmId)
    .whereRaw("(m.status = 'active' or c.hourly_cents is not null)")
    .orderByRaw('lower(u.name), m.id')
    .select('m.id as membership_id', 'u.name', 'm.role', 'c.hourly_cents');
}

export async function machineOfFarm(db: Tx, farmId: number, machineId: number): Promise<boolean> {
  return Boolean(await db('machines').where({ id: machineId, farm_id: farmId }).first('id'));
}

export async function membershipOfFarm(db: Tx, farmId: number, membershipId: number): Promise<boolean> {
  return Boolean(await db('memberships').where({ id: membershipId, farm_id: farmId }).first('id'));
}

export async function setMachineCost(db: Tx, farmId: number, machineId: number, hourlyCents: number | null): Promise<void> {
  if (hourlyCents === null) await db('machine_costs').where({ machine_id: machineId, farm_id: farmId }).delete();
  else
    await db('machine_costs')
      .insert({ machine_id: machineId, farm_id: farmId, hourly_cents: hourlyCents, updated_at: db.fn.now() })
      .onConflict('machine_id')
      .merge(['hourly_cents', 'updated_at']);
}

export async function setLabourCost(db: Tx, farmId: number, membershipId: number, hourlyCents: number | null): Promise<void> {
  if (hourlyCents === null) await db('labour_costs').where({ membership_id: membershipId, farm_id: farmId }).delete();
  else
    await db('labour_costs')
      .insert({ membership_id: membershipId, farm_id: farmId, hourly_cents: hourlyCents, updated_at: db.fn.now() })
      .onConflict('membership_id')
      .merge(['hourly_cents', 'updated_at']);
}
