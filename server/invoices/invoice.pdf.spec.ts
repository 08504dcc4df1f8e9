// The invoice PDF read back with tests/support/pdf-text.ts (PDF 32000-1 text operators): each
// amount must come out as one string, as the reader sees it on one line. The PDF prints amounts as
// stored (nothing is recomputed there), so these are made up for the layout, five figures and more.
import type { InvoiceDetail } from '../../shared/schemas/invoices';
import { pdfText } from '../../tests/support/pdf-text';
import { invoicePdf } from './invoice.pdf';

const line = (fieldName: string, amountCents: number) => ({
  id: 1,
  assignmentId: 1,
  day: '2026-09-14',
  fieldName,
  operation: 'harrowing' as const,
  quantity: 640.25,
  unit: 'acre' as const,
  quantitySource: 'typed' as const,
  rateCents: 1_250,
  amountCents,
});

const invoice = (state: InvoiceDetail['state']) =>
  ({
    id: 9,
    number: 12,
    kind: 'invoice',
    state,
    issuedOn: '2026-10-01',
    periodFrom: '2026-09-01',
    periodTo: '2026-09-30',
    customer: { id: 3, name: 'Coulee Creek Grain' },
    customerEmail: 'office@example.test',
    customerAddress: null,
    currency: 'usd',
    subtotalCents: 2_401_126,
    taxCents: 0,
    totalCents: 2_401_126,
    taxName: null,
    taxBasisPoints: 0,
    note: null,
    voidReason: null,
    creditOfNumber: null,
    creditedByNumber: null,
    lines: [line('Long Coulee West Half by the Correction Line Road', 800_313), line('Section 9', 1_600_813)],
    paymentUrl: null,
    paymentError: null,
    mailed: false,
    payments: [],
  }) as unknown as InvoiceDetail;

describe('invoicePdf', () => {
  it('prints every amount, five figures and more, whole on one line, and marks a draft as a draft', async () => {
    const text = pdfText(await invoicePdf(invoice('draft'), { farmName: 'Tamarack Ridge Farm' }, null));
    for (const amount of ['$8,003.13', '$16,008.13', '$24,011.26']) expect(text).toContain(amount);
    expect(text).toContain('DRAFT: not yet sent, not a bill');
  });

  it('does not mark a sent invoice as a draft', async () => {
    const text = pdfText(await invoicePdf(invoice('sent'), { farmName: 'Tamarack Ridge Farm' }, null));
    expect(text.join('\n')).not.toContain('DRAFT');
  });
});
