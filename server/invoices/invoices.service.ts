// Invoices for custom work. A draft is made from a customer's finished jobs over a period: one line
// per job (measured acres where the job's track measured them, else the acres logged; hours for an
// hourly rate), the rate in force copied onto the line, the farm's tax line, and the next gapless
// number of the farm, taken when the draft is made (the counter row is locked in the drafting
// transaction, so concurrent drafts queue for it). Numbered documents are never deleted: an
// unwanted draft is voided and keeps its number. Once sent, an invoice is never edited: it is paid,
// voided (if unpaid) or credited by a credit note of its own, the same lines with negative amounts.
// Money rules: shared/invoice-math.ts.
import { invoiceTotals, lineAmountCents } from '../../shared/invoice-math';
import type { InvoiceDetail, InvoiceDraftBody, InvoiceListItem, InvoiceSettings, Receivables } from '../../shared/schemas/invoices';
import { customerById } from '../customers/customers.repository';
import type { Tx } from '../db/knex';
import { AppError, notFound } from '../http/errors';
import { enqueueMail } from '../mail/outbox.repository';
import { ratesInForce } from '../rate-card/rate-card.service';
import { creditNoteMail } from './credit-note-mail';
import * as repo from './invoices.repository';

const NOT_FOUND = 'That invoice';
const iso = (d: Date | null) => (d ? d.toISOString() : null);

/** Today's date on the farm's clock, YYYY-MM-DD. */
export const farmToday = (timeZone: string, at = new Date()): string =>
  new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(at);

export function listItem(r: repo.InvoiceRow): InvoiceListItem {
  return {
    id: r.id,
    number: r.number,
    kind: r.kind,
    state: r.state,
    customer: { id: r.customer_id, name: r.customer_name },
    periodFrom: r.period_from,
    periodTo: r.period_to,
    issuedOn: r.issued_on,
    currency: r.currency,
    subtotalCents: r.subtotal_cents,
    taxCents: r.tax_cents,
    totalCents: r.total_cents,
    creditOf: r.credit_of,
    creditedBy: r.credited_by ?? null,
    sentAt: iso(r.sent_at),
    paidAt: iso(r.paid_at),
    voidedAt: iso(r.voided_at),
  };
}

export const paymentItem = (p: repo.PaymentRow) => ({
  id: p.id,
  invoiceId: p.invoice_id,
  number: p.number,
  customer: { id: p.customer_id, name: p.customer_name },
  amountCents: p.amount_cents,
  currency: p.currency,
  paidAt: p.paid_at.toISOString(),
  checkoutSessionId: p.checkout_session_id,
});

export async function listInvoices(db: Tx, farmId: number): Promise<InvoiceListItem[]> {
  return (await repo.listInvoices(db, farmId)).map(listItem);
}

export async function invoiceRow(db: Tx, farmId: number, id: number): Promise<repo.InvoiceRow> {
  const r = await repo.invoiceById(db, farmId, id);
  if (!r) throw notFound(NOT_FOUND);
  return r;
}

export async function getInvoice(db: Tx, farmId: number, id: number): Promise<InvoiceDetail> {
  const r = await invoiceRow(db, farmId, id);
  const [lines, payments] = await Promise.all([repo.linesOf(db, id), repo.paymentsOf(db, id)]);
  return {
    ...listItem(r),
    customerEmail: r.customer_email,
    customerAddress: r.customer_address,
    taxName: r.tax_name,
    taxBasisPoints: r.tax_basis_points,
    note: r.note,
    voidReason: r.void_reason,
    creditOfNumber: r.credit_of_number ?? null,
    creditedByNumber: r.credited_by_number ?? null,
    lines: lines.map((l) => ({
      position: l.position,
      assignmentId: l.assignment_id,
      fieldName: l.field_name,
      operation: l.operation,
      day: l.day,
      unit: l.unit,
      quantity: l.quantity,
      quantitySource: l.quantity_source,
      rateCents: l.rate_cents,
      amountCents: l.amount_cents,
    })),
    // Only while it can be paid: a credited invoice is settled by its credit note.
    paymentUrl: r.state === 'sent' && !r.credited_by ? r.checkout_url : null,
    paymentError: r.payment_error,
    mailed: r.mail_id !== null,
    payments: payments.map(paymentItem),
  };
}

export async function draftInvoice(db: Tx, farmId: number, today: string, body: InvoiceDraftBody): Promise<InvoiceDetail> {
  const id = await db.transaction(async (tx) => {
    // First: the number. Holding the counter row also keeps two drafts from billing one job twice.
    const number = await repo.takeNumber(tx, farmId);
    const customer = await customerById(tx, farmId, body.customerId);
    if (!customer) throw notFound('That customer');
    const jobs = await repo.billableJobs(tx, farmId, customer.id, body.from, body.to);
    if (!jobs.length)
      throw new AppError(
        422,
        'nothing_to_invoice',
        `${customer.name} has no finished work from ${body.from} to ${body.to} that is not on an invoice already`,
      );
    const rates = await ratesInForce(tx, farmId);
    const lines: repo.LineRow[] = [];
    for (const [i, j] of jobs.entries()) {
      const rate = rates[j.operation];
      const quantity = rate.unit === 'acre' ? j.acres_done : j.hours_worked;
      if (quantity === null)
        throw new AppError(
          422,
          'job_without_figures',
          `The ${j.operation} on ${j.field_name} on ${j.day} has no ${rate.unit === 'acre' ? 'acres' : 'hours'} logged; correct its log first`,
        );
      lines.push({
        position: i + 1,
        assignment_id: j.id,
        field_name: j.field_name,
        operation: j.operation,
        day: j.day,
        unit: rate.unit,
        quantity,
        quantity_source: rate.unit === 'hour' ? 'logged' : j.acres_source === 'measured' ? 'measured' : 'typed',
        rate_cents: rate.rateCents,
        amount_cents: lineAmountCents(quantity, rate.rateCents),
      });
    }
    const s = await repo.settings(tx, farmId);
    const basisPoints = s.tax_name ? s.tax_basis_points : 0;
    const totals = invoiceTotals(
      lines.map((l) => l.amount_cents),
      basisPoints,
    );
    return repo.insertInvoice(
      tx,
      {
        farm_id: farmId,
        customer_id: customer.id,
        kind: 'invoice',
        number,
        state: 'draft',
        credit_of: null,
        period_from: body.from,
        period_to: body.to,
        issued_on: today,
        customer_name: customer.name,
        customer_email: customer.email,
        customer_address: customer.address,
        currency: s.currency,
        tax_name: s.tax_name,
        tax_basis_points: basisPoints,
        subtotal_cents: totals.subtotalCents,
        tax_cents: totals.taxCents,
        total_cents: totals.totalCents,
        note: body.note ?? null,
      },
      lines,
    );
  });
  return getInvoice(db, farmId, id);
}

/** A draft or an unpaid sent invoice becomes void, with the reason; it keeps its number and its jobs can be billed again. */
export async function voidInvoice(
  db: Tx,
  farmId: number,
  id: number,
  reason: string,
): Promise<{ detail: InvoiceDetail; openCheckout: string | null }> {
  const openCheckout = await db.transaction(async (tx) => {
    const r = await repo.lockInvoice(tx, farmId, id);
    if (!r) throw notFound(NOT_FOUND);
    if (r.kind !== 'invoice') throw new AppError(409, 'not_an_invoice', 'A credit note cannot be voided');
    if (r.state === 'paid') throw new AppError(409, 'invoice_paid', `Invoice ${r.number} is paid: credit it instead of voiding it`);
    if (r.state === 'void') throw new AppError(409, 'invoice_void', `Invoice ${r.number} is already void`);
    if (await repo.creditNoteOf(tx, id)) throw new AppError(409, 'invoice_credited', `Invoice ${r.number} is credited already`);
    await repo.updateInvoice(tx, id, { state: 'void', void_reason: reason, voided_at: new Date() });
    return r.checkout_session_id;
  });
  return { detail: await getInvoice(db, farmId, id), openCheckout };
}

/**
 * A credit note for the whole of a sent or paid invoice: the same lines, negative, with the next
 * number, mailed to the customer with its PDF when the invoice was mailed. A sent invoice's open
 * checkout is answered so that the caller expires it, as after a void.
 */
export async function creditInvoice(
  db: Tx,
  farmId: number,
  id: number,
  today: string,
  reason: string,
): Promise<{ detail: InvoiceDetail; openCheckout: string | null }> {
  const { creditId, openCheckout } = await db.transaction(async (tx) => {
    const number = await repo.takeNumber(tx, farmId);
    const r = await repo.lockInvoice(tx, farmId, id);
    if (!r) throw notFound(NOT_FOUND);
    if (r.kind !== 'invoice') throw new AppError(409, 'not_an_invoice', 'A credit note cannot be credited');
    if (r.state !== 'sent' && r.state !== 'paid')
      throw new AppError(409, 'invoice_not_sent', `Only a sent or paid invoice is credited; invoice ${r.number} is ${r.state}`);
    if (await repo.creditNoteOf(tx, id)) throw new AppError(409, 'invoice_credited', `Invoice ${r.number} is credited already`);
    const lines = (await repo.linesOf(tx, id)).map((l) => ({ ...l, amount_cents: -l.amount_cents }));
    const noteId = await repo.insertInvoice(
      tx,
      {
        farm_id: farmId,
        customer_id: r.customer_id,
        kind: 'credit',
        number,
        state: 'issued',
        credit_of: id,
        period_from: r.period_from,
        period_to: r.period_to,
        issued_on: today,
        customer_name: r.customer_name,
        customer_email: r.customer_email,
        customer_address: r.customer_address,
        currency: r.currency,
        tax_name: r.tax_name,
        tax_basis_points: r.tax_basis_points,
        // The invoice's own figures negated, not recomputed: the credit answers for exactly what was billed.
        subtotal_cents: -r.subtotal_cents,
        tax_cents: -r.tax_cents,
        total_cents: -r.total_cents,
        note: reason,
      },
      lines,
    );
    // The customer had the invoice by mail: its credit note follows through the same outbox, with its
    // PDF, in this transaction. An invoice never mailed (the payment service was out) gets none either.
    if (r.mail_id !== null) {
      const note = await getInvoice(tx, farmId, noteId);
      const mail = await creditNoteMail(farmId, note, await repo.farmName(tx, farmId), { number: r.number, state: r.state });
      await repo.updateInvoice(tx, noteId, { mail_id: await enqueueMail(tx, mail) });
    }
    return { creditId: noteId, openCheckout: r.state === 'sent' ? r.checkout_session_id : null };
  });
  return { detail: await getInvoice(db, farmId, creditId), openCheckout };
}

export async function invoiceSettings(db: Tx, farmId: number): Promise<InvoiceSettings> {
  const s = await repo.settings(db, farmId);
  return { taxName: s.tax_name, taxBasisPoints: s.tax_basis_points, currency: s.currency as InvoiceSettings['currency'] };
}

export async function saveInvoiceSettings(db: Tx, farmId: number, s: InvoiceSettings): Promise<InvoiceSettings> {
  await repo.saveSettings(db, farmId, { tax_name: s.taxName || null, tax_basis_points: s.taxBasisPoints, currency: s.currency });
  return invoiceSettings(db, farmId);
}

/** Sent invoices neither paid nor credited, oldest first, with the whole days since they were sent (on the farm's calendar). */
export async function receivables(db: Tx, farmId: number, timeZone: string, now = new Date()): Promise<Receivables> {
  const open = (await repo.listInvoices(db, farmId))
    .filter((r) => r.kind === 'invoice' && r.state === 'sent' && !r.credited_by)
    .sort((a, b) => a.number - b.number);
  const day = (s: string) => Date.parse(`${s}T00:00:00Z`) / 86_400_000;
  const today = day(farmToday(timeZone, now));
  const invoices = open.map((r) => ({
    ...listItem(r),
    daysOutstanding: Math.max(0, today - day(farmToday(timeZone, r.sent_at ?? now))),
  }));
  return { invoices, totalCents: invoices.reduce((s, i) => s + i.totalCents, 0) };
}

export async function listPayments(db: Tx, farmId: number) {
  return (await repo.listPayments(db, farmId)).map(paymentItem);
}
