import { insertCustomer, insertCustomerField, insertInvoice, insertJob } from '../../support/invoice-fixtures';
import type { Case, Ctx, Expect } from './types';

/** Money: the owner and viewers read, operators are refused; another farm does not see this farm's invoices. */
const readers = (ok: number, other = ok): Expect => ({ anon: 401, owner: ok, operator: 403, viewer: ok, other });
/** Only the owner changes them; another farm's invoice or customer is not found. */
const ownerOnly = (ok: number, other = 404): Expect => ({ anon: 401, owner: ok, operator: 403, viewer: 403, other });

/** A customer of the farm with one finished harrowing job on their field; the draft body names them. */
let billable = 0;
async function customerWithWork(c: Ctx): Promise<string> {
  const customer = await insertCustomer(c.t.db, c.farm.id);
  const field = await insertCustomerField(c.t.db, c.farm.id, customer);
  await insertJob(c.t.db, c.farm.id, field, c.farm.operator.membershipId, {
    day: '2026-04-15',
    operation: 'harrowing',
    acres: '80',
    hours: '2',
  });
  billable = customer;
  return '/api/invoices';
}
const invoiceIn =
  (state: 'draft' | 'sent' | 'paid', tail = '') =>
  async (c: Ctx) =>
    `/api/invoices/${await insertInvoice(c.t.db, c.farm.id, await insertCustomer(c.t.db, c.farm.id), state)}${tail}`;

export const invoices: Record<string, Case> = {
  'GET /api/invoices/settings': { expect: readers(200) },
  'PUT /api/invoices/settings': { body: { taxName: 'Sales tax', taxBasisPoints: 500, currency: 'usd' }, expect: ownerOnly(200, 200) },
  'GET /api/invoices/receivables': { expect: readers(200) },
  'GET /api/invoices/payments': { expect: readers(200) },
  'GET /api/invoices/export/:table.csv': { path: () => '/api/invoices/export/receivables.csv', expect: readers(200) },
  'GET /api/invoices': { expect: readers(200) },
  'POST /api/invoices': {
    path: customerWithWork,
    get body() {
      return { customerId: billable, from: '2026-04-01', to: '2026-04-30' };
    },
    expect: ownerOnly(201),
  },
  'GET /api/invoices/:id': { path: invoiceIn('sent'), expect: readers(200, 404) },
  'GET /api/invoices/:id/pdf': { path: invoiceIn('sent', '/pdf'), expect: readers(200, 404) },
  'POST /api/invoices/:id/send': { path: invoiceIn('draft', '/send'), expect: ownerOnly(200) },
  'POST /api/invoices/:id/void': { path: invoiceIn('draft', '/void'), body: { reason: 'Drafted twice' }, expect: ownerOnly(200) },
  'POST /api/invoices/:id/credit': {
    path: invoiceIn('paid', '/credit'),
    body: { reason: 'Billed the wrong field' },
    expect: ownerOnly(201),
  },
};
