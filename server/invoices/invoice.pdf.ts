// The invoice (or credit note) as a PDF, drawn with pdfkit in its built-in Helvetica, so no font
// file is read. Figures come from the stored invoice as they are; nothing is recomputed here.
import PDFDocument from 'pdfkit';
import { billedQuantity, figure } from '../../shared/figures';
import { formatMoney } from '../../shared/money';
import { OPERATION_INFO } from '../../shared/operations';
import type { InvoiceDetail } from '../../shared/schemas/invoices';

export interface PdfParty {
  farmName: string;
}

/** The standard PDF fonts' encoding (WinAnsi) has no U+2212 minus sign: a hyphen-minus stands in. */
const money = (cents: number) => formatMoney(cents).replace('\u2212', '-');

const quantityText = (l: InvoiceDetail['lines'][number]) =>
  `${billedQuantity(l.quantity, l.unit)}${l.quantitySource === 'measured' ? ' (measured)' : ''}`;

export const invoiceTitle = (inv: Pick<InvoiceDetail, 'kind' | 'number'>) =>
  `${inv.kind === 'credit' ? 'Credit note' : 'Invoice'} ${inv.number}`;

/** The PDF's bytes. `paymentUrl` is printed when the invoice can be paid online. */
export function invoicePdf(inv: InvoiceDetail, from: PdfParty, paymentUrl: string | null): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'LETTER',
    margin: 54,
    info: { Title: `${invoiceTitle(inv)} — ${from.farmName}`, Author: from.farmName, Creator: 'Furlong' },
  });
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  doc.font('Helvetica-Bold').fontSize(18).text(invoiceTitle(inv));
  doc.font('Helvetica').fontSize(10).moveDown(0.3);
  if (inv.state === 'draft') doc.font('Helvetica-Bold').text('DRAFT: not yet sent, not a bill').font('Helvetica');
  doc.text(`From: ${from.farmName}`);
  doc.text(`Date: ${inv.issuedOn}`);
  doc.text(`Work from ${inv.periodFrom} to ${inv.periodTo}`);
  if (inv.kind === 'credit' && inv.creditOfNumber !== null) doc.text(`Credits invoice ${inv.creditOfNumber}`);
  doc.moveDown();
  doc.font('Helvetica-Bold').text('Bill to');
  doc.font('Helvetica').text(inv.customer.name);
  if (inv.customerAddress) doc.text(inv.customerAddress);
  doc.text(inv.customerEmail);
  doc.moveDown();

  // Column starts across the 504 pt between the margins; the money columns are wide enough for
  // "-$999,999.99" on one line (pdfkit wraps a figure that does not fit).
  const cols = [54, 114, 234, 314, 396, 472];
  const right = 558;
  const row = (cells: string[], bold = false) => {
    const y = doc.y;
    let bottom = y;
    doc.font(bold ? 'Helvetica-Bold' : 'Helvetica');
    cells.forEach((c, i) => {
      doc.text(c, cols[i], y, { width: (cols[i + 1] ?? right) - cols[i] - 6, align: i >= 3 ? 'right' : 'left' });
      bottom = Math.max(bottom, doc.y);
    });
    // The next row starts below the tallest cell (a long field name may take two lines).
    doc.x = 54;
    doc.y = bottom;
    doc.moveDown(0.4);
  };
  row(['Date', 'Field', 'Operation', 'Quantity', 'Rate', 'Amount'], true);
  for (const l of inv.lines)
    row([
      l.day,
      l.fieldName,
      OPERATION_INFO[l.operation].label,
      quantityText(l),
      `${money(l.rateCents)}/${l.unit === 'acre' ? 'ac' : 'h'}`,
      money(l.amountCents),
    ]);
  doc.moveDown();
  const sum = (label: string, cents: number, bold = false) => row(['', '', '', '', label, money(cents)], bold);
  sum('Subtotal', inv.subtotalCents);
  if (inv.taxName) sum(`${inv.taxName} ${figure(inv.taxBasisPoints / 100, 2)} %`, inv.taxCents);
  sum(`Total ${inv.currency.toUpperCase()}`, inv.totalCents, true);
  doc.moveDown();
  if (inv.note) doc.text(inv.note, 54);
  if (paymentUrl) {
    doc.moveDown().text('Pay online:', 54);
    doc.fillColor('#1a4f8a').text(paymentUrl, { link: paymentUrl, underline: true }).fillColor('black');
  }
  doc
    .moveDown()
    .fontSize(8)
    .text('Amounts are rounded once per line to the cent, a half cent away from zero; tax is rounded once on the subtotal.', 54);
  doc.end();
  return done;
}
