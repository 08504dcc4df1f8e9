// The payment service's events as received, one row per event id.
import type { PaymentEventOutcome } from '../../shared/schemas/payments';
import type { Tx } from '../db/knex';

export type { PaymentEventOutcome };

export interface PaymentEventRow {
  eventId: string;
  type: string;
  objectId: string | null;
  livemode: boolean;
  createdAt: Date;
  farmId: number | null;
  outcome: PaymentEventOutcome;
  detail: string | null;
  payload: unknown;
}

/** What was recorded for an event id: the first receipt's outcome. */
export interface RecordedEvent {
  outcome: PaymentEventOutcome;
  detail: string | null;
  /** False when the id was already recorded (a replay or a duplicate): nothing was written. */
  first: boolean;
}

/**
 * Records an event once: a second insert of the same id (a replay, or a duplicate delivered at the
 * same moment) writes nothing and returns the first receipt's outcome.
 */
export async function recordPaymentEvent(db: Tx, row: PaymentEventRow): Promise<RecordedEvent> {
  const inserted = await db('payment_events')
    .insert({
      event_id: row.eventId,
      type: row.type,
      object_id: row.objectId,
      livemode: row.livemode,
      event_created_at: row.createdAt,
      farm_id: row.farmId,
      outcome: row.outcome,
      detail: row.detail,
      payload: JSON.stringify(row.payload),
    })
    .onConflict('event_id')
    .ignore()
    .returning(['outcome', 'detail']);
  if (inserted.length) return { ...(inserted[0] as { outcome: PaymentEventOutcome; detail: string | null }), first: true };
  const first = (await db('payment_events').where({ event_id: row.eventId }).first('outcome', 'detail')) as {
    outcome: PaymentEventOutcome;
    detail: string | null;
  };
  return { ...first, first: false };
}
