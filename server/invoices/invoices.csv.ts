// Invoices, receivables and payments as CSV for the accountant: money in dollars with two decimals
// (the stored cents ÷ 100, nothing rounded again), dates as YYYY-MM-DD.
import type { InvoiceListItem, Receivables } from '../../shared/schemas/invoices';
import { toCsv } from '../season/csv';
import type { paymentItem } from './invoices.service';

const dollars = (cents: number) => cents / 100;
const day = (iso: string | null) => (iso ? iso.slice(0, 10) : null);

export function invoicesCsv(rows: InvoiceListItem[]): string {
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
      'credit_of_id',
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
      r.currency,
      dollars(r.subtotalCents),
      dollars(r.taxCents),
      dollars(r.totalCents),
      r.creditOf,
      day(r.paidAt),
    ]),
    [0, 0, 0, 0, 0, 0, 0, 0, 2, 2, 2, 0, 0],
  );
}

export function receivablesCsv(r: Receivables): string {
  return toCsv(
    ['number', 'customer', 'issued_on', 'currency', 'total', 'days_outstanding'],
    r.invoices.map((i) => [i.number, i.customer.name, i.issuedOn, i.currency, dollars(i.totalCents), i.daysOutstanding]),
    [0, 0, 0, 0, 2, 0],
  );
}

export function paymentsCsv(rows: Array<ReturnType<typeof paymentItem>>): string {
  return toCsv(
    ['paid_on', 'invoice_number', 'customer', 'currency', 'amount', 'checkout_session'],
    rows.map((p) => [day(p.paidAt), p.number, p.customer.name, p.currency, dollars(p.amountCents), p.checkoutSessionId]),
    [0, 0, 0, 0, 2, 0],
  );
}
