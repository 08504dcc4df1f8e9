// Invoices, receivables and payments as CSV for the accountant: money in dollars with two decimals
// (the stored cents ÷ 100, nothing rounded again), dates as YYYY-MM-DD.
import type { InvoiceListItem, Receivables } from '../../shared/schemas/invoices';
import { toCsv } from '../season/csv';
import type { paymentItem } from './invoices.service';

const dollars = (cents: number) => cents / 100;
/** The currency as the screens write it: its ISO 4217 code in capitals ('USD'). */
const code = (currency: string) => currency.toUpperCase();
const day = (iso: string | null) => (iso ? iso.slice(0, 10) : null);

export function invoicesCsv(rows: InvoiceListItem[]): string {
  // A credit note names the invoice it credits by its number, as the customer knows it.
  const numberOf = new Map(rows.map((r) => [r.id, r.number]));
  return toCsv(
    [
      'number',
      'kind',
      'state',
      'customer',
      'issued_on',
      'period_from',
      'period_to',
      'currency',
      'subtotal',
      'tax',
      'total',
      'credits_invoice',
      'paid_on',
    ],
    rows.map((r) => [
      r.number,
      r.kind,
      r.state,
      r.customer.name,
      r.issuedOn,
      r.periodFrom,
      r.periodTo,
      code(r.currency),
      dollars(r.subtotalCents),
      dollars(r.taxCents),
      dollars(r.totalCents),
      r.creditOf === null ? null : (numberOf.get(r.creditOf) ?? null),
      day(r.paidAt),
    ]),
    [0, 0, 0, 0, 0, 0, 0, 0, 2, 2, 2, 0, 0],
  );
}

export function receivablesCsv(r: Receivables): string {
  return toCsv(
    ['number', 'customer', 'issued_on', 'currency', 'total', 'days_outstanding'],
    r.invoices.map((i) => [i.number, i.customer.name, i.issuedOn, code(i.currency), dollars(i.totalCents), i.daysOutstanding]),
    [0, 0, 0, 0, 2, 0],
  );
}

export function paymentsCsv(rows: Array<ReturnType<typeof paymentItem>>): string {
  return toCsv(
    // The payment service's reference for the payment (its checkout session), to match statements.
    ['paid_on', 'invoice_number', 'customer', 'currency', 'amount', 'payment_reference'],
    rows.map((p) => [day(p.paidAt), p.number, p.customer.name, code(p.currency), dollars(p.amountCents), p.checkoutSessionId]),
    [0, 0, 0, 0, 2, 0],
  );
}
