import type { InvoiceListItem, InvoiceState } from '@shared/schemas/invoices';

/** How a state reads: words first (never colour alone), an icon beside them. */
export interface StateLook {
  label: string;
  icon: string;
  /** The chip's tone class; the words carry the meaning. */
  tone: 'neutral' | 'waiting' | 'done' | 'closed';
}

const LOOKS: Record<InvoiceState, StateLook> = {
  draft: { label: 'Draft', icon: 'edit_note', tone: 'neutral' },
  sent: { label: 'Sent, not paid', icon: 'schedule', tone: 'waiting' },
  paid: { label: 'Paid', icon: 'check_circle', tone: 'done' },
  void: { label: 'Void', icon: 'block', tone: 'closed' },
  issued: { label: 'Credit note', icon: 'undo', tone: 'closed' },
};

/** The state of an invoice in words; a credited invoice says so (its state stays sent or paid). */
export function stateLook(inv: Pick<InvoiceListItem, 'state' | 'creditedBy'>): StateLook {
  const look = LOOKS[inv.state];
  return inv.creditedBy !== null ? { ...look, label: `${look.label}, credited`, tone: 'closed' } : look;
}

/** Which of the owner's actions an invoice takes now; the server decides again on each. */
export interface InvoiceActions {
  /** Send a draft, or send again a sent invoice whose payment link or e-mail was not made (a retry). */
  send: 'send' | 'retry' | null;
  void: boolean;
  credit: boolean;
}

/**
 * The owner's actions for an invoice: a draft is sent or voided; a sent one not yet mailed (the
 * payment service was out) is sent again; a sent or paid one is credited, a sent one voided; a
 * credit note, a void or credited invoice takes none.
 */
export function invoiceActions(inv: Pick<InvoiceListItem, 'kind' | 'state' | 'creditedBy'> & { mailed: boolean }): InvoiceActions {
  const none: InvoiceActions = { send: null, void: false, credit: false };
  if (inv.kind !== 'invoice' || inv.creditedBy !== null) return none;
  switch (inv.state) {
    case 'draft':
      return { send: 'send', void: true, credit: false };
    case 'sent':
      return { send: inv.mailed ? null : 'retry', void: true, credit: true };
    case 'paid':
      return { send: null, void: false, credit: true };
    default:
      return none;
  }
}
