// What a payment-service event means for Furlong. The event's signature has been checked by the
// route; here it is recorded once by its id and acted on in the same transaction, so a replay or a
// duplicate arriving at the same moment finds the first receipt and changes nothing.
import type Stripe from 'stripe';
import type { AppDeps } from '../app-deps';
import { applyCheckoutCompleted, type AppliedEvent } from '../invoices/invoice-payments';
import type { Tx } from '../db/knex';
import type { Logger } from '../logging/logger';
import { recordPaymentEvent, type RecordedEvent } from './payment-events.repository';

/** The object an event is about, when it has an id. */
const objectIdOf = (event: Stripe.Event): string | null => {
  const object = event.data.object as { id?: unknown };
  return typeof object.id === 'string' ? object.id : null;
};

/**
 * A completed checkout pays the invoice it was made for (server/invoices/invoice-payments.ts).
 * Every other type is recorded as ignored: an expired checkout, also one arriving after the
 * payment (events may come out of order), changes nothing.
 */
async function outcomeOf(tx: Tx, event: Stripe.Event): Promise<AppliedEvent> {
  if (event.type === 'checkout.session.completed') return applyCheckoutCompleted(tx, event);
  return { outcome: 'ignored', detail: `Furlong does not act on ${event.type} events`, farmId: null };
}

/** `log`: the request's logger, so the line carries its request id (the app's logger otherwise). */
export async function receivePaymentEvent(
  deps: AppDeps,
  event: Stripe.Event,
  log: Logger | undefined = deps.logger,
): Promise<RecordedEvent> {
  const recorded = await deps.db.transaction(async (tx) => {
    const first = await recordPaymentEvent(tx, {
      eventId: event.id,
      type: event.type,
      objectId: objectIdOf(event),
      livemode: event.livemode,
      createdAt: new Date(event.created * 1000),
      farmId: null,
      outcome: 'ignored',
      detail: null,
      payload: event,
    });
    if (!first.first) return first;
    const { outcome, detail, farmId } = await outcomeOf(tx, event);
    await tx('payment_events').where({ event_id: event.id }).update({ outcome, detail, farm_id: farmId });
    return { outcome, detail, first: true };
  });
  if (recorded.first && recorded.outcome !== 'applied')
    log?.warn({ eventId: event.id, type: event.type, outcome: recorded.outcome, detail: recorded.detail }, 'payment event not applied');
  return recorded;
}
