// Sending an invoice: it becomes `sent` (never edited again), then a hosted checkout for its total is
// made through the payment service's SDK, then its e-mail (the PDF attached, the payment link in
// the text) is written to the outbox. The call to the payment service is made with no transaction
// open. If the service fails, the invoice stays `sent` with the reason in `paymentError` and
// nothing is mailed; sending again retries the checkout (each try with its own idempotency key,
// as the service may keep a failed answer under a key) and then mails it. Nothing is lost: the
// invoice, its number and lines are committed before the service is called.
import type { InvoiceDetail } from '../../shared/schemas/invoices';
import type { AppDeps } from '../app-deps';
import { AppError, notFound } from '../http/errors';
import { enqueueMail } from '../mail/outbox.repository';
import { formatMoney } from '../../shared/money';
import { invoicePdf, invoiceTitle } from './invoice.pdf';
import * as repo from './invoices.repository';
import { getInvoice } from './invoices.service';

/** Why a call to the payment service failed, in words the owner can act on. */
function serviceFailure(err: unknown): string {
  const e = err as { type?: string; message?: string; statusCode?: number };
  const what =
    e.type === 'StripeConnectionError' ? 'could not be reached' : `answered with an error${e.statusCode ? ` (${e.statusCode})` : ''}`;
  return `The payment service ${what}, so no payment link was made and the invoice was not mailed. Send it again to retry. ${e.message ?? ''}`.trim();
}

export async function sendInvoice(deps: AppDeps, farmId: number, id: number): Promise<InvoiceDetail> {
  const { db } = deps;
  // 1. The state change, committed first; a retry finds the invoice sent and not yet mailed.
  const attempt = await db.transaction(async (tx) => {
    const r = await repo.lockInvoice(tx, farmId, id);
    if (!r) throw notFound('That invoice');
    if (r.kind !== 'invoice') throw new AppError(409, 'not_an_invoice', 'A credit note is not sent for payment');
    if (r.state === 'sent' && r.mail_id !== null) throw new AppError(409, 'invoice_sent', `Invoice ${r.number} was sent already`);
    if (r.state !== 'draft' && r.state !== 'sent')
      throw new AppError(409, 'invoice_not_draft', `Invoice ${r.number} is ${r.state}: only a draft is sent`);
    if (r.total_cents <= 0) throw new AppError(422, 'nothing_to_pay', `Invoice ${r.number} totals nothing to pay`);
    const n = r.checkout_attempts + 1;
    await repo.updateInvoice(tx, id, { state: 'sent', sent_at: r.sent_at ?? new Date(), checkout_attempts: n });
    return n;
  });
  const inv = await getInvoice(db, farmId, id);
  const farm = await repo.farmName(db, farmId);

  // 2. The hosted checkout, outside any transaction.
  let session: { id: string; url: string | null };
  try {
    session = await deps.payments.stripe.checkout.sessions.create(
      {
        mode: 'payment',
        client_reference_id: `invoice-${inv.id}`,
        customer_email: inv.customerEmail,
        metadata: { invoiceId: String(inv.id), farmId: String(farmId), number: String(inv.number) },
        line_items: [
          {
            quantity: 1,
            price_data: {
              currency: inv.currency,
              unit_amount: inv.totalCents,
              product_data: { name: `${invoiceTitle(inv)} from ${farm}` },
            },
          },
        ],
        success_url: `${deps.config.publicUrl}/paid?invoice=${inv.id}`,
        cancel_url: `${deps.config.publicUrl}/`,
      },
      { idempotencyKey: `furlong-invoice-${inv.id}-checkout-${attempt}` },
    );
  } catch (err) {
    const reason = serviceFailure(err);
    deps.logger?.warn({ invoiceId: id, attempt, error: (err as Error).message }, 'payment checkout not made');
    await repo.updateInvoice(db, id, { payment_error: reason });
    return getInvoice(db, farmId, id);
  }
  if (!session.url) {
    await repo.updateInvoice(db, id, { payment_error: 'The payment service made a checkout without a link. Send it again to retry.' });
    return getInvoice(db, farmId, id);
  }

  // 3. The link and the e-mail, together.
  const pdf = await invoicePdf(inv, { farmName: farm }, session.url);
  await db.transaction(async (tx) => {
    // A second send racing this one, or a void while the checkout was made, got here first: mail nothing more.
    const now = await repo.lockInvoice(tx, farmId, id);
    if (!now || now.state !== 'sent' || now.mail_id !== null) return;
    const mailId = await enqueueMail(tx, {
      farmId,
      kind: 'invoice',
      ref: `invoice:${inv.id}`,
      to: inv.customerEmail,
      subject: `${invoiceTitle(inv)} from ${farm}: ${formatMoney(inv.totalCents)} ${inv.currency.toUpperCase()}`,
      text: [
        `Hello ${inv.customer.name},`,
        '',
        `${invoiceTitle(inv)} from ${farm} for custom work from ${inv.periodFrom} to ${inv.periodTo} is attached.`,
        `Total: ${formatMoney(inv.totalCents)} ${inv.currency.toUpperCase()}.`,
        '',
        `Pay online: ${session.url}`,
        '',
        `${farm}`,
      ].join('\n'),
      attachments: [{ filename: `invoice-${inv.number}.pdf`, contentType: 'application/pdf', content: pdf }],
    });
    await repo.updateInvoice(tx, id, { checkout_session_id: session.id, checkout_url: session.url, payment_error: null, mail_id: mailId });
  });
  deps.nudgeMail();
  return getInvoice(db, farmId, id);
}

/** The PDF as it stands now (with its payment link while it can be paid). */
export async function currentPdf(deps: AppDeps, farmId: number, id: number): Promise<{ pdf: Buffer; name: string }> {
  const inv = await getInvoice(deps.db, farmId, id);
  const pdf = await invoicePdf(inv, { farmName: await repo.farmName(deps.db, farmId) }, inv.paymentUrl);
  return { pdf, name: `${inv.kind === 'credit' ? 'credit-note' : 'invoice'}-${inv.number}.pdf` };
}

/** After a void or a credit note: the open checkout is expired so the old link cannot be paid (best effort; a payment that still comes is refused and logged). */
export async function expireCheckout(deps: AppDeps, sessionId: string | null): Promise<void> {
  if (!sessionId) return;
  try {
    await deps.payments.stripe.checkout.sessions.expire(sessionId);
  } catch (err) {
    deps.logger?.warn({ sessionId, error: (err as Error).message }, 'checkout of a void invoice not expired');
  }
}
