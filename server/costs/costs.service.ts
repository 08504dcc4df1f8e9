// Rates of the farm's own work: a fuel price, fuel per acre per operation (a published default
// unless the owner changed it), an hourly cost per machine and per person. The season report
// (server/season) turns them into costs; this file only reads and sets them.
import { FUEL_DEFAULTS } from '../../shared/costs';
import { OPERATIONS, type Operation } from '../../shared/operations';
import type { CostSettingsAnswer, FuelCostBody } from '../../shared/schemas/costs';
import type { Tx } from '../db/knex';
import { AppError } from '../http/errors';
import * as repo from './costs.repository';

export async function costSettings(db: Tx, farmId: number): Promise<CostSettingsAnswer> {
  const [s, machines, people] = await Promise.all([repo.settings(db, farmId), repo.machineCosts(db, farmId), repo.personCosts(db, farmId)]);
  return {
    fuelPriceCents: s.fuel_price_cents,
    fuel: OPERATIONS.map((operation) => ({
      operation,
      galPerAcre: s.fuel_gal_per_acre[operation] ?? FUEL_DEFAULTS[operation].galPerAcre,
      defaultGalPerAcre: FUEL_DEFAULTS[operation].galPerAcre,
      source: FUEL_DEFAULTS[operation].source,
    })),
    machines: machines.map((m) => ({ machineId: m.machine_id, name: m.name, hourlyCents: m.hourly_cents })),
    people: people.map((p) => ({ membershipId: p.membership_id, name: p.name, role: p.role, hourlyCents: p.hourly_cents })),
  };
}

/** Only numbers that differ from the default are kept, so a later, better default reaches farms that never changed it. */
export async function setFuel(db: Tx, farmId: number, body: FuelCostBody): Promise<CostSettingsAnswer> {
  const changed: Partial<Record<Operation, number>> = {};
  for (const o of OPERATIONS) if (body.galPerAcre[o] !== FUEL_DEFAULTS[o].galPerAcre) changed[o] = body.galPerAcre[o];
  await repo.saveSettings(db, farmId, body.fuelPriceCents, changed);
  return costSettings(db, farmId);
}

export async function setMachineCost(db: Tx, farmId: number, machineId: number, hourlyCents: number | null): Promise<CostSettingsAnswer> {
  if (!(await repo.machineOfFarm(db, farmId, machineId))) throw new AppError(404, 'not_found', 'That machine is not in your fleet');
  await repo.setMachineCost(db, farmId, machineId, hourlyCents);
  return costSettings(db, farmId);
}

export async function setLabourCost(db: Tx, farmId: number, membershipId: number, hourlyCents: number | null): Promise<CostSettingsAnswer> {
  if (!(await repo.membershipOfFarm(db, farmId, membershipId)))
    throw new AppError(404, 'not_found', 'That person is not a member of your farm');
  await repo.setLabourCost(db, farmId, membershipId, hourlyCents);
  return costSettings(db, farmId);
}
