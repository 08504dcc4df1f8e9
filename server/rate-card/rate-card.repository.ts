// The owner's custom-work rates: the only file that reads or writes them.
import type { Operation } from '../../shared/operations';
import type { RateUnit } from '../../shared/custom-rates';
import type { Tx } from '../db/knex';

export interface OwnRateRow {
  operation: Operation;
  unit: RateUnit;
  rate_cents: number;
}

export const ownRates = (db: Tx, farmId: number): Promise<OwnRateRow[]> =>
  db('custom_rates').where({ farm_id: farmId }).select('operation', 'unit', 'rate_cents');

export async function setOwnRate(db: Tx, farmId: number, operation: Operation, unit: RateUnit, rateCents: number): Promise<void> {
  await db('custom_rates')
    .insert({ farm_id: farmId, operation, unit, rate_cents: rateCents, updated_at: db.fn.now() })
    .onConflict(['farm_id', 'operation'])
    .merge(['unit', 'rate_cents', 'updated_at']);
}

export async function clearOwnRate(db: Tx, farmId: number, operation: Operation): Promise<void> {
  await db('custom_rates').where({ farm_id: farmId, operation }).delete();
}
