import type { InvoiceDetail } from '@shared/schemas/invoices';

/** One payment received, as `GET /api/invoices/payments` and an invoice's detail list them. */
export type InvoicePayment = InvoiceDetail['payments'][number];
