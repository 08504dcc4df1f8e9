// What a completed checkout means for an invoice. The event's signature was checked by the route;
// here nothing in it is trusted that Furlong did not make: the invoice it names (metadata written
// when the checkout was made) must be this farm's, sent, unpaid and uncredited, and the amount and
// currency paid must be the invoice's own total. Anything else changes nothing and is recorded
// with the reason (the owner refunds a payment for a void or credited invoice by hand).
import type Stripe from 'stripe';
import { DB_INT_MAX } from '../../shared/schemas/common';
import type { PaymentEventOutcome } from '../../shared/schemas/payments';
import type { Tx } from '../db/knex';
import { formatMoney } from '../../shared/money';
import * as repo from './invoices.repository';

export interface AppliedEvent {
  outcome: PaymentEventOutcome;
  detail: string;
  farmId: number | null;
}

const idOf = (v: string | undefined): number | null => {
  const n = Number(v);
  return v && /^\d+$/.test(v) && n > 0 && n <= DB_INT_MAX ? n : null;
};

export async function applyCheckoutCompleted(tx: Tx, event: Stripe.Event): Promise<AppliedEvent> {
  const s = event.data.object as Stripe.Checkout.Session;
  const named = s.metadata?.invoiceId;
  const invoiceId = idOf(named);
  const farmId = idOf(s.metadata?.farmId);
  const inv = invoiceId === null ? undefined : await repo.lockInvoiceById(tx, invoiceId);
  if (!inv || inv.farm_id !== farmId || inv.kind !== 'invoice')
    return { outcome: 'unknown-invoice', detail: `No invoice ${named ?? '(none named)'} to mark paid`, farmId: null };
  const label = `Invoice ${inv.number}`;
  if (s.payment_status !== 'paid') return { outcome: 'ignored', detail: `${label}: the checkout completed unpaid`, farmId: inv.farm_id };
  if (s.amount_total !== inv.total_cents || (s.currency ?? '').toLowerCase() !== inv.currency)
    return {
      outcome: 'amount-mismatch',
      detail: `${label}: paid ${s.amount_total ?? '?'} ${s.currency ?? '?'} (cents) but its total is ${inv.total_cents} ${inv.currency}; not marked paid`,
      farmId: inv.farm_id,
    };
  if (inv.state === 'paid') return { outcome: 'ignored', detail: `${label} was paid already`, farmId: inv.farm_id };
  if (inv.state !== 'sent' || inv.credited_by)
    return {
      outcome: 'ignored',
      detail: `${label} is ${inv.credited_by ? 'credited' : inv.state}: a payment of ${formatMoney(inv.total_cents)} came for it and must be refunded by hand`,
      farmId: inv.farm_id,
    };
  const paidAt = new Date(event.created * 1000);
  await repo.updateInvoice(tx, inv.id, { state: 'paid', paid_at: paidAt, payment_error: null });
  await repo.insertPayment(tx, {
    farm_id: inv.farm_id,
    invoice_id: inv.id,
    event_id: event.id,
    checkout_session_id: s.id,
    payment_intent: typeof s.payment_intent === 'string' ? s.payment_intent : null,
    amount_cents: inv.total_cents,
    currency: inv.currency,
    paid_at: paidAt,
  });
  return { outcome: 'applied', detail: `${label} paid`, farmId: inv.farm_id };
}
