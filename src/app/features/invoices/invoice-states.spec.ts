import { invoiceActions, stateLook } from './invoice-states';

describe('stateLook', () => {
  it('when an invoice is sent and not paid, then it reads so in words', () => {
    expect(stateLook({ state: 'sent', creditedBy: null }).label).toBe('Sent, not paid');
  });

  it('when an invoice is credited, then its state says so whatever it was', () => {
    expect(stateLook({ state: 'paid', creditedBy: 12 })).toMatchObject({ label: 'Paid, credited', tone: 'closed' });
  });

  it('then every state has its own words', () => {
    const labels = (['draft', 'sent', 'paid', 'void', 'issued'] as const).map((state) => stateLook({ state, creditedBy: null }).label);
    expect(new Set(labels).size).toBe(labels.length);
  });
});

describe('invoiceActions', () => {
  const inv = (state: 'draft' | 'sent' | 'paid' | 'void' | 'issued', over: { mailed?: boolean; creditedBy?: number | null } = {}) => ({
    kind: state === 'issued' ? ('credit' as const) : ('invoice' as const),
    state,
    mailed: over.mailed ?? state !== 'draft',
    creditedBy: over.creditedBy ?? null,
  });

  it('when a draft, then it is sent or voided, not credited', () => {
    expect(invoiceActions(inv('draft'))).toEqual({ send: 'send', void: true, credit: false });
  });

  it('when sent but not mailed (the payment service was out), then sending again is a retry', () => {
    expect(invoiceActions(inv('sent', { mailed: false }))).toEqual({ send: 'retry', void: true, credit: true });
    expect(invoiceActions(inv('sent')).send).toBeNull();
  });

  it('when paid, then only a credit note; when void, credited or a credit note, then nothing', () => {
    expect(invoiceActions(inv('paid'))).toEqual({ send: null, void: false, credit: true });
    const none = { send: null, void: false, credit: false };
    expect(invoiceActions(inv('void'))).toEqual(none);
    expect(invoiceActions(inv('issued'))).toEqual(none);
    expect(invoiceActions(inv('sent', { creditedBy: 9 }))).toEqual(none);
  });
});
