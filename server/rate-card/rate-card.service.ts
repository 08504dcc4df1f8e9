// The custom-work rate card: the owner's rate where set, else the published default with its
// source. Invoices copy the rate in force when they are drafted, so a later change never alters
// an invoice already made.
import { RATE_DEFAULTS, type RateUnit } from '../../shared/custom-rates';
import { OPERATIONS, type Operation } from '../../shared/operations';
import type { RateBody, RateCard } from '../../shared/schemas/rate-card';
import type { Tx } from '../db/knex';
import * as repo from './rate-card.repository';

export async function rateCard(db: Tx, farmId: number): Promise<RateCard> {
  const own = new Map((await repo.ownRates(db, farmId)).map((r) => [r.operation, r]));
  return {
    rates: OPERATIONS.map((operation) => {
      const mine = own.get(operation);
      const d = RATE_DEFAULTS[operation];
      return {
        operation,
        unit: mine?.unit ?? d.unit,
        rateCents: mine?.rate_cents ?? d.rateCents,
        own: Boolean(mine),
        default: { unit: d.unit, rateCents: d.rateCents, source: d.source },
      };
    }),
  };
}

/** The rate in force per operation, for drafting invoices. */
export async function ratesInForce(db: Tx, farmId: number): Promise<Record<Operation, { unit: RateUnit; rateCents: number }>> {
  const card = await rateCard(db, farmId);
  return Object.fromEntries(card.rates.map((r) => [r.operation, { unit: r.unit, rateCents: r.rateCents }])) as Record<
    Operation,
    { unit: RateUnit; rateCents: number }
  >;
}

export async function setRate(db: Tx, farmId: number, operation: Operation, body: RateBody): Promise<RateCard> {
  await repo.setOwnRate(db, farmId, operation, body.unit, body.rateCents);
  return rateCard(db, farmId);
}

export async function clearRate(db: Tx, farmId: number, operation: Operation): Promise<RateCard> {
  await repo.clearOwnRate(db, farmId, operation);
  return rateCard(db, farmId);
}
