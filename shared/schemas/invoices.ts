// Invoices for custom work, their receivables and payments: what the routes under /api/invoices
// take and answer. Money is whole cents (shared/money.ts); amounts on a credit note are negative.
// The owner drafts, sends, voids and credits; the owner and viewers (the accountant) read and
// export; operators are refused every route here.
import * as z from 'zod';
import { RATE_UNITS } from '../custom-rates';
import { OPERATIONS } from '../operations';
import { dbIdNumber, isoDate } from './common';

export const INVOICE_KINDS = ['invoice', 'credit'] as const;
/** An invoice is draft → sent → paid, or void (from draft or sent); a credit note is issued. */
export const INVOICE_STATES = ['draft', 'sent', 'paid', 'void', 'issued'] as const;
export type InvoiceState = (typeof INVOICE_STATES)[number];
export const CURRENCIES = ['usd', 'cad'] as const;

const reason = (what: string) =>
  z
    .string({ error: `Say why the ${what}` })
    .trim()
    .min(1, `Say why the ${what}`)
    .max(500, 'Keep the reason to 500 characters');

/** `POST /api/invoices`: draft an invoice from a customer's finished work over a period (days inclusive). */
export const invoiceDraftBody = z
  .object({
    customerId: dbIdNumber,
    from: isoDate,
    to: isoDate,
    note: z.string().trim().max(1000, 'Keep the note to 1000 characters').nullable().optional(),
  })
  .refine((b) => b.from <= b.to, { path: ['to'], message: 'The period ends before it starts' });
export type InvoiceDraftBody = z.infer<typeof invoiceDraftBody>;

/** `POST /api/invoices/:id/void` */
export const invoiceVoidBody = z.object({ reason: reason('invoice is void') });
/** `POST /api/invoices/:id/credit`: a credit note for the whole invoice. */
export const invoiceCreditBody = z.object({ reason: reason('invoice is credited') });

/** `PUT /api/invoices/settings`: the tax line new drafts get, and their currency. */
export const invoiceSettingsBody = z.object({
  taxName: z.string().trim().max(40, 'Keep the tax name to 40 characters').nullable(),
  taxBasisPoints: z
    .number({ error: 'Enter the tax rate in basis points (500 = 5 %)' })
    .int('Enter the tax rate in whole basis points (500 = 5 %)')
    .min(0, 'A tax rate cannot be negative')
    .max(10_000, 'A tax rate above 100 % is not believable'),
  currency: z.enum(CURRENCIES, { error: `Choose one of: ${CURRENCIES.join(', ')}` }),
});
export type InvoiceSettings = z.infer<typeof invoiceSettingsBody>;
export const invoiceSettings = invoiceSettingsBody;

export const invoiceExportParams = z.object({
  table: z.enum(['invoices', 'receivables', 'payments'], { error: 'Choose invoices, receivables or payments' }),
});

const customerRef = z.object({ id: z.number().int(), name: z.string() });

/** One row of `GET /api/invoices` (and the head of every invoice answer). */
export const invoiceListItem = z.object({
  id: z.number().int(),
  number: z.number().int(),
  kind: z.enum(INVOICE_KINDS),
  state: z.enum(INVOICE_STATES),
  customer: customerRef,
  periodFrom: z.string(),
  periodTo: z.string(),
  issuedOn: z.string(),
  currency: z.string(),
  subtotalCents: z.number().int(),
  taxCents: z.number().int(),
  totalCents: z.number().int(),
  /** The invoice a credit note credits. */
  creditOf: z.number().int().nullable(),
  /** The credit note that credits this invoice. */
  creditedBy: z.number().int().nullable(),
  sentAt: z.string().nullable(),
  paidAt: z.string().nullable(),
  voidedAt: z.string().nullable(),
});
export type InvoiceListItem = z.infer<typeof invoiceListItem>;
export const invoiceList = z.array(invoiceListItem);

export const invoiceLine = z.object({
  position: z.number().int(),
  assignmentId: z.number().int().nullable(),
  fieldName: z.string(),
  operation: z.enum(OPERATIONS),
  day: z.string(),
  unit: z.enum(RATE_UNITS),
  quantity: z.number(),
  /** measured: acres from the job's track; typed: acres logged; logged: hours logged. */
  quantitySource: z.enum(['measured', 'typed', 'logged']),
  rateCents: z.number().int(),
  amountCents: z.number().int(),
});

export const invoicePayment = z.object({
  id: z.number().int(),
  invoiceId: z.number().int(),
  number: z.number().int(),
  customer: customerRef,
  amountCents: z.number().int(),
  currency: z.string(),
  paidAt: z.string(),
  checkoutSessionId: z.string(),
});
export const paymentList = z.array(invoicePayment);

/** One invoice or credit note with its lines, its payment link and what went wrong with it last. */
export const invoiceDetail = invoiceListItem.extend({
  customerEmail: z.string(),
  customerAddress: z.string().nullable(),
  taxName: z.string().nullable(),
  taxBasisPoints: z.number().int(),
  note: z.string().nullable(),
  voidReason: z.string().nullable(),
  /** The number of the invoice a credit note credits (what the customer knows it by). */
  creditOfNumber: z.number().int().nullable(),
  /** The number of the credit note that credits this invoice, if any. */
  creditedByNumber: z.number().int().nullable(),
  lines: z.array(invoiceLine),
  /** The hosted checkout the mailed link opens (null until one was made). */
  paymentUrl: z.string().nullable(),
  /** Why the payment service could not be reached at the last try; sending again retries. */
  paymentError: z.string().nullable(),
  /** True once the invoice's e-mail (PDF and link) is in the outbox. */
  mailed: z.boolean(),
  payments: z.array(invoicePayment),
});
export type InvoiceDetail = z.infer<typeof invoiceDetail>;

/** `GET /api/invoices/receivables`: sent invoices not paid and not credited, oldest first. */
export const receivables = z.object({
  invoices: z.array(invoiceListItem.extend({ daysOutstanding: z.number().int() })),
  totalCents: z.number().int(),
});
export type Receivables = z.infer<typeof receivables>;
