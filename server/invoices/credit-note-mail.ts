// The e-mail that carries a credit note to the customer: its PDF attached and, in the text, the
// invoice it credits (by that invoice's number), the amount credited and what it means for that
// invoice now. It goes through the outbox like the invoice's own e-mail, written in the same
// transaction as the credit note, so it exists exactly when the credit note does.
import { formatMoney } from '../../shared/money';
import type { InvoiceDetail } from '../../shared/schemas/invoices';
import type { OutgoingMail } from '../mail/outbox.repository';
import { invoicePdf, invoiceTitle } from './invoice.pdf';

export interface CreditedInvoice {
  number: number;
  /** `sent` (unpaid: nothing is owed on it now) or `paid` (the farm settles the payment with the customer). */
  state: 'sent' | 'paid';
}

export async function creditNoteMail(
  farmId: number,
  note: InvoiceDetail,
  farmName: string,
  credited: CreditedInvoice,
): Promise<OutgoingMail> {
  const currency = note.currency.toUpperCase();
  // The note's figures are negative; the customer reads the amount credited to them.
  const amount = `${formatMoney(-note.totalCents)} ${currency}`;
  const title = invoiceTitle(note);
  const pdf = await invoicePdf(note, { farmName }, null);
  return {
    farmId,
    kind: 'credit-note',
    ref: `invoice:${note.id}`,
    to: note.customerEmail,
    subject: `${title} from ${farmName}: invoice ${credited.number} credited, ${amount}`,
    text: [
      `Hello ${note.customer.name},`,
      '',
      `${title} from ${farmName} is attached. It credits invoice ${credited.number} (custom work from ${note.periodFrom} to ${note.periodTo}) in full.`,
      `Amount credited: ${amount}.`,
      ...(note.note ? [`Reason: ${note.note}`] : []),
      '',
      credited.state === 'paid'
        ? `Invoice ${credited.number} was paid; ${farmName} settles the amount credited with you.`
        : `Nothing is owed on invoice ${credited.number} any more, and its payment link no longer takes a payment.`,
      '',
      farmName,
    ].join('\n'),
    attachments: [{ filename: `credit-note-${note.number}.pdf`, contentType: 'application/pdf', content: pdf }],
  };
}
