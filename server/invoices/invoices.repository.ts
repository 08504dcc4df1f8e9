// Invoices, their lines, the farm's invoice counter and settings, and payments received: the only
// file that reads or writes those tables.
import type { Operation } from '../../shared/operations';
import type { RateUnit } from '../../shared/custom-rates';
import type { InvoiceState } from '../../shared/schemas/invoices';
import type { Tx } from '../db/knex';

export interface InvoiceRow {
  id: number;
  farm_id: number;
  customer_id: number;
  kind: 'invoice' | 'credit';
  number: number;
  state: InvoiceState;
  credit_of: number | null;
  credited_by: number | null;
  /** The number of the invoice a credit note credits (read with the row, never stored). */
  credit_of_number?: number | null;
  credited_by_number?: number | null;
  period_from: string;
  period_to: string;
  issued_on: string;
  customer_name: string;
  customer_email: string;
  customer_address: string | null;
  currency: string;
  tax_name: string | null;
  tax_basis_points: number;
  subtotal_cents: number;
  tax_cents: number;
  total_cents: number;
  note: string | null;
  void_reason: string | null;
  sent_at: Date | null;
  paid_at: Date | null;
  voided_at: Date | null;
  checkout_session_id: string | null;
  checkout_url: string | null;
  checkout_attempts: number;
  payment_error: string | null;
  mail_id: number | null;
}

export interface LineRow {
  position: number;
  assignment_id: number | null;
  field_name: string;
  operation: Operation;
  day: string;
  unit: RateUnit;
  quantity: number;
  quantity_source: 'measured' | 'typed' | 'logged';
  rate_cents: number;
  amount_cents: number;
}

export interface PaymentRow {
  id: number;
  invoice_id: number;
  number: number;
  customer_id: number;
  customer_name: string;
  amount_cents: number;
  currency: string;
  paid_at: Date;
  checkout_session_id: string;
}

/** Every invoice column, with the credit note that credits it and the number of the invoice a credit note credits. */
const invoiceQuery = (db: Tx) =>
  db('invoices as i')
    // Its credit note, read once for its id and number (at most one: index invoices_one_credit),
    // and the invoice a credit note credits.
    .leftJoin('invoices as c', 'c.credit_of', 'i.id')
    .leftJoin('invoices as o', 'o.id', 'i.credit_of')
    .select('i.*', 'c.id as credited_by', 'c.number as credited_by_number', 'o.number as credit_of_number');

export const listInvoices = (db: Tx, farmId: number): Promise<InvoiceRow[]> =>
  invoiceQuery(db).where('i.farm_id', farmId).orderBy('i.number', 'desc');

export const invoiceById = (db: Tx, farmId: number, id: number): Promise<InvoiceRow | undefined> =>
  invoiceQuery(db).where({ 'i.farm_id': farmId, 'i.id': id }).first();

/** The invoice row locked for a change of state (the caller's transaction holds it). */
export const lockInvoice = (db: Tx, farmId: number, id: number): Promise<InvoiceRow | undefined> =>
  db('invoices as i').where({ 'i.farm_id': farmId, 'i.id': id }).forUpdate().first('i.*');

/** Locked by id alone, for the payment webhook (the event names the farm in its metadata). */
export const lockInvoiceById = (db: Tx, id: number): Promise<InvoiceRow | undefined> =>
  db('invoices as i')
    .where({ 'i.id': id })
    .forUpdate()
    .first('i.*', db.raw('(select c.id from invoices c where c.credit_of = i.id) as credited_by'));

const LINE_COLUMNS = [
  'position',
  'assignment_id',
  'field_name',
  'operation',
  'day',
  'unit',
  'quantity',
  'quantity_source',
  'rate_cents',
  'amount_cents',
] as const;

/** The id of the credit note that credits an invoice, if any. */
export async function creditNoteOf(db: Tx, invoiceId: number): Promise<number | null> {
  const row = (await db('invoices').where({ credit_of: invoiceId }).first('id')) as { id: number } | undefined;
  return row?.id ?? null;
}

export const linesOf = (db: Tx, invoiceId: number): Promise<LineRow[]> =>
  db('invoice_lines').where({ invoice_id: invoiceId }).orderBy('position').select(LINE_COLUMNS);

/**
 * Takes the farm's next invoice number. The counter row is created if missing and then locked
 * FOR UPDATE: a second drafting transaction waits here until the first commits or rolls back, so
 * numbers are consecutive, never repeated, and a rolled-back draft gives its number back.
 */
export async function takeNumber(db: Tx, farmId: number): Promise<number> {
  await db('invoice_counters').insert({ farm_id: farmId, last_number: 0 }).onConflict('farm_id').ignore();
  const row = (await db('invoice_counters').where({ farm_id: farmId }).forUpdate().first('last_number')) as { last_number: number };
  const next = row.last_number + 1;
  await db('invoice_counters').where({ farm_id: farmId }).update({ last_number: next });
  return next;
}

export interface BillableJobRow {
  id: number;
  day: string;
  operation: Operation;
  field_name: string;
  acres_done: number | null;
  acres_source: 'typed' | 'measured' | null;
  hours_worked: number | null;
}

/**
 * The customer's finished jobs over a period that no invoice bills yet (a void invoice bills
 * nothing; a credited one still does: its credit note answers for it), by day.
 */
export function billableJobs(db: Tx, farmId: number, customerId: number, from: string, to: string): Promise<BillableJobRow[]> {
  return db('assignments as a')
    .join('fields as f', 'f.id', 'a.field_id')
    .where({ 'a.farm_id': farmId, 'f.customer_id': customerId, 'a.state': 'finished' })
    .whereBetween('a.day', [from, to])
    .whereNotExists(
      db('invoice_lines as l')
        .join('invoices as i', 'i.id', 'l.invoice_id')
        .whereRaw('l.assignment_id = a.id')
        .where('i.kind', 'invoice')
        .whereNot('i.state', 'void')
        .select(db.raw('1')),
    )
    .orderBy([{ column: 'a.day' }, { column: 'a.id' }])
    .select('a.id', 'a.day', 'a.operation', 'f.name as field_name', 'a.acres_done', 'a.acres_source', 'a.hours_worked');
}

export async function insertInvoice(
  db: Tx,
  row: Omit<
    InvoiceRow,
    | 'id'
    | 'credited_by'
    | 'credit_of_number'
    | 'credited_by_number'
    | 'sent_at'
    | 'paid_at'
    | 'voided_at'
    | 'checkout_session_id'
    | 'checkout_url'
    | 'checkout_attempts'
    | 'payment_error'
    | 'mail_id'
    | 'void_reason'
  >,
  lines: LineRow[],
): Promise<number> {
  const [{ id }] = await db('invoices').insert(row).returning('id');
  if (lines.length) await db('invoice_lines').insert(lines.map((l) => ({ ...l, invoice_id: id })));
  return id as number;
}

export async function updateInvoice(
  db: Tx,
  id: number,
  change: Partial<Omit<InvoiceRow, 'id' | 'credited_by' | 'credit_of_number' | 'credited_by_number'>>,
): Promise<void> {
  await db('invoices')
    .where({ id })
    .update({ ...change, updated_at: db.fn.now() });
}

export async function settings(db: Tx, farmId: number): Promise<{ tax_name: string | null; tax_basis_points: number; currency: string }> {
  const row = await db('invoice_settings').where({ farm_id: farmId }).first('tax_name', 'tax_basis_points', 'currency');
  return row ?? { tax_name: null, tax_basis_points: 0, currency: 'usd' };
}

export async function saveSettings(db: Tx, farmId: number, s: { tax_name: string | null; tax_basis_points: number; currency: string }) {
  await db('invoice_settings')
    .insert({ farm_id: farmId, ...s, updated_at: db.fn.now() })
    .onConflict('farm_id')
    .merge(['tax_name', 'tax_basis_points', 'currency', 'updated_at']);
}

const paymentQuery = (db: Tx) =>
  db('invoice_payments as p')
    .join('invoices as i', 'i.id', 'p.invoice_id')
    .select(
      'p.id',
      'p.invoice_id',
      'i.number',
      'i.customer_id',
      'i.customer_name',
      'p.amount_cents',
      'p.currency',
      'p.paid_at',
      'p.checkout_session_id',
    );

export const listPayments = (db: Tx, farmId: number): Promise<PaymentRow[]> =>
  paymentQuery(db)
    .where('p.farm_id', farmId)
    .orderBy([
      { column: 'p.paid_at', order: 'desc' },
      { column: 'p.id', order: 'desc' },
    ]);

export const paymentsOf = (db: Tx, invoiceId: number): Promise<PaymentRow[]> =>
  paymentQuery(db).where('p.invoice_id', invoiceId).orderBy('p.id');

export async function insertPayment(
  db: Tx,
  p: {
    farm_id: number;
    invoice_id: number;
    event_id: string;
    checkout_session_id: string;
    payment_intent: string | null;
    amount_cents: number;
    currency: string;
    paid_at: Date;
  },
): Promise<void> {
  await db('invoice_payments').insert(p);
}

/** The farm's name as invoices print it. */
export async function farmName(db: Tx, farmId: number): Promise<string> {
  return ((await db('farms').where({ id: farmId }).first('name')) as { name: string }).name;
}
