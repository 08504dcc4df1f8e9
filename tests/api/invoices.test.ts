// Invoices for custom work, end to end against the real database, the local fake payment server
// (spoken to through the payment service's own SDK) and the fake mail server.
// Outside references beside the checks:
// - the money rule is worked by hand here with exact integer arithmetic (BigInt), not by the code
//   under test: line = quantity × rate rounded once, a half cent away from zero; tax on the subtotal
//   rounded the same way (the half-away rule is PostgreSQL's round(numeric), from memory);
// - default rates: USDA NASS with NDSU, "North Dakota 2020 Custom Rates" (seeding $17.82/ac, seen in a
//   secondary summary; ground spraying ~$7/ac recalled from memory, not read);
// - webhook signatures: the SDK's own `webhooks.generateTestHeaderString` / `constructEvent`;
// - the mailed PDF is read back with tests/support/pdf-text.ts (PDF 32000-1 text operators, zlib).
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';
import type { InvoiceDetail, InvoiceListItem, Receivables } from '../../shared/schemas/invoices';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { insertCustomer, insertCustomerField, insertJob, type FinishedJob } from '../support/invoice-fixtures';
import { pdfText } from '../support/pdf-text';
import { signedIn, startTestApp, type Client, type TestApp } from '../support/test-app';

let t: TestApp;
let server: http.Server;
let farm: TestFarm;
let owner: Client;
let viewer: Client;
let operator: Client;

beforeAll(async () => {
  t = await startTestApp();
  // The fake payment server posts its webhooks to the app, listening on loopback for that.
  server = http.createServer(t.app);
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  t.payments.webhookUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/payments/webhook`;
  farm = await makeFarm(t.db, 'Invoices');
  owner = await signedIn(t.app, farm.owner.email, farm.owner.password);
  viewer = await signedIn(t.app, farm.viewer.email, farm.viewer.password);
  operator = await signedIn(t.app, farm.operator.email, farm.operator.password);
});
afterAll(async () => {
  await new Promise<void>((r) => server.close(() => r()));
  await t.close();
});

// ── Exact arithmetic, written here (no call into the code under test) ──────────────────────────
/** "118.5" → 1_185_000n (ten-thousandths). */
const q4 = (s: string): bigint => {
  const [w, f = ''] = s.split('.');
  return BigInt(w) * 10_000n + BigInt(f.padEnd(4, '0'));
};
/** n / d to the nearest integer, a half away from zero. */
const roundDiv = (n: bigint, d: bigint): number => {
  const neg = n < 0n;
  const a = neg ? -n : n;
  const r = (2n * a + d) / (2n * d);
  return Number(neg ? -r : r);
};
const line = (quantity: string, rateCents: number) => roundDiv(q4(quantity) * BigInt(rateCents), 10_000n);

async function jobs(customerId: number, list: FinishedJob[], fieldId?: number): Promise<number[]> {
  const f = fieldId ?? (await insertCustomerField(t.db, farm.id, customerId));
  const ids: number[] = [];
  for (const j of list) ids.push(await insertJob(t.db, farm.id, f, farm.operator.membershipId, j));
  return ids;
}

const draft = (customerId: number, from = '2026-04-01', to = '2026-06-30') => owner.post('/api/invoices', { customerId, from, to });

describe('drafting', () => {
  it('when a customer’s finished work is drafted, then each job is a line and the totals match the hand-worked figures to the cent', async () => {
    await owner.put('/api/rate-card/harrowing', { unit: 'acre', rateCents: 1175 });
    await owner.put('/api/rate-card/baling', { unit: 'hour', rateCents: 9550 });
    await owner.put('/api/invoices/settings', { taxName: 'Sales tax', taxBasisPoints: 625, currency: 'usd' });
    const customer = await insertCustomer(t.db, farm.id, 'Prairie Gate Farms');
    const field = await insertCustomerField(t.db, farm.id, customer, 'Gate Quarter');
    const billed = await jobs(
      customer,
      [
        { day: '2026-04-20', operation: 'harrowing', acres: '100.25', hours: '3.5' },
        // Measured acres count where the track measured them; the typed 121 stays beside them.
        { day: '2026-05-04', operation: 'seeding', acres: '118.5', typed: '121', source: 'measured', hours: '6.75' },
        { day: '2026-06-10', operation: 'spraying', acres: '80.5', hours: '1.25' },
        { day: '2026-06-20', operation: 'baling', acres: '80.5', hours: '3.75' },
      ],
      field,
    );
    // Not billed: called off, still planned, outside the period, the farm's own field, another customer's field.
    await jobs(customer, [{ day: '2026-05-05', operation: 'seeding', acres: null, hours: null, state: 'called-off' }], field);
    await jobs(customer, [{ day: '2026-05-06', operation: 'seeding', acres: null, hours: null, state: 'planned' }], field);
    await jobs(customer, [{ day: '2026-07-01', operation: 'harrowing', acres: '10', hours: '1' }], field);
    await jobs(
      customer,
      [{ day: '2026-04-21', operation: 'harrowing', acres: '50', hours: '2' }],
      await insertCustomerField(t.db, farm.id, null),
    );
    const otherCustomer = await insertCustomer(t.db, farm.id);
    await jobs(otherCustomer, [{ day: '2026-04-22', operation: 'harrowing', acres: '60', hours: '2' }]);

    const res = await draft(customer);
    expect(res.status).toBe(201);
    const inv = res.body as InvoiceDetail;
    // Hand-worked: 100.25 × 1175 = 117,793.75 → 117,794; 118.5 × 1782 = 211,167 (North Dakota 2020
    // survey seeding default); 80.5 × 700 = 56,350 (spraying default, recalled from memory);
    // 3.75 h × 9550 = 35,812.5 → 35,813.
    const expected = [line('100.25', 1175), line('118.5', 1782), line('80.5', 700), line('3.75', 9550)];
    expect(expected).toEqual([117_794, 211_167, 56_350, 35_813]);
    expect(inv.lines.map((l) => [l.assignmentId, l.operation, l.unit, l.quantity, l.quantitySource, l.rateCents, l.amountCents])).toEqual([
      [billed[0], 'harrowing', 'acre', 100.25, 'typed', 1175, expected[0]],
      [billed[1], 'seeding', 'acre', 118.5, 'measured', 1782, expected[1]],
      [billed[2], 'spraying', 'acre', 80.5, 'typed', 700, expected[2]],
      [billed[3], 'baling', 'hour', 3.75, 'logged', 9550, expected[3]],
    ]);
    const subtotal = expected.reduce((s, c) => s + c, 0);
    // 421,124 × 625 / 10,000 = 26,320.25 → 26,320.
    const tax = roundDiv(BigInt(subtotal) * 625n, 10_000n);
    expect([subtotal, tax]).toEqual([421_124, 26_320]);
    expect(inv).toMatchObject({
      state: 'draft',
      kind: 'invoice',
      number: 1,
      customer: { id: customer, name: 'Prairie Gate Farms' },
      taxName: 'Sales tax',
      taxBasisPoints: 625,
      subtotalCents: subtotal,
      taxCents: tax,
      totalCents: subtotal + tax,
      mailed: false,
      paymentUrl: null,
    });
    expect(inv.lines.every((l) => l.fieldName === 'Gate Quarter')).toBe(true);

    const list = (await viewer.get('/api/invoices')).body as InvoiceListItem[];
    expect(list.find((i) => i.id === inv.id)).toMatchObject({
      number: 1,
      state: 'draft',
      totalCents: 447_444,
      customer: { name: 'Prairie Gate Farms' },
    });
    // Drafting again finds nothing left to bill: the jobs are on the draft.
    const again = await draft(customer);
    expect(again.status).toBe(422);
    expect(again.body.error.message).toContain('Prairie Gate Farms has no finished work');
  });

  it('when ten drafts are made at the same moment, then they take the numbers 1 to 10 with no gap or repeat, and a refused draft takes none', async () => {
    const fresh = await makeFarm(t.db, 'Numbering');
    const boss = await signedIn(t.app, fresh.owner.email, fresh.owner.password);
    const customers: number[] = [];
    for (let i = 0; i < 10; i++) {
      const c = await insertCustomer(t.db, fresh.id);
      const f = await insertCustomerField(t.db, fresh.id, c);
      await insertJob(t.db, fresh.id, f, fresh.operator.membershipId, {
        day: '2026-05-01',
        operation: 'harrowing',
        acres: '10',
        hours: '1',
      });
      customers.push(c);
    }
    const answers = await Promise.all(
      customers.map((customerId) => boss.post('/api/invoices', { customerId, from: '2026-05-01', to: '2026-05-01' })),
    );
    expect(answers.map((a) => a.status)).toEqual(Array(10).fill(201));
    expect(answers.map((a) => a.body.number as number).sort((a, b) => a - b)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10]);
    // Nothing left for the first customer: refused, and the number is not used up.
    expect((await boss.post('/api/invoices', { customerId: customers[0], from: '2026-05-01', to: '2026-05-01' })).status).toBe(422);
    const c = await insertCustomer(t.db, fresh.id);
    await insertJob(t.db, fresh.id, await insertCustomerField(t.db, fresh.id, c), fresh.operator.membershipId, {
      day: '2026-05-02',
      operation: 'harrowing',
      acres: '5',
      hours: '1',
    });
    expect((await boss.post('/api/invoices', { customerId: c, from: '2026-05-02', to: '2026-05-02' })).body.number).toBe(11);
  });

  it('when the period is backwards, the customer unknown or another farm’s, then a clear 4xx and nothing is numbered', async () => {
    const bad = await owner.post('/api/invoices', { customerId: 1, from: '2026-05-02', to: '2026-05-01' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.to).toBe('The period ends before it starts');
    const elsewhere = await makeFarm(t.db, 'Elsewhere');
    const theirs = await insertCustomer(t.db, elsewhere.id);
    expect((await draft(theirs)).status).toBe(404);
    const before = (await t.db('invoice_counters').where({ farm_id: farm.id }).first('last_number'))?.last_number;
    expect((await draft(2_147_483_000)).status).toBe(404);
    expect((await t.db('invoice_counters').where({ farm_id: farm.id }).first('last_number'))?.last_number).toBe(before);
  });
});

/** A customer with one harrowing job of 40 ac at the farm's rate, drafted. */
async function oneJobDraft(day = '2026-04-25'): Promise<InvoiceDetail> {
  const customer = await insertCustomer(t.db, farm.id, `Neighbour on ${day}`);
  await jobs(customer, [{ day, operation: 'harrowing', acres: '40', hours: '2' }]);
  const res = await draft(customer, day, day);
  expect(res.status).toBe(201);
  return res.body as InvoiceDetail;
}

async function drainMail(): Promise<void> {
  for (let i = 0; i < 20; i++) {
    await t.flushMail();
    const [{ n }] = await t.db('mail_outbox').where({ farm_id: farm.id, status: 'queued' }).count({ n: '*' });
    if (Number(n) === 0) return;
    await new Promise((r) => setTimeout(r, 100));
  }
}

describe('sending and paying', () => {
  it('when a draft is sent, then the customer’s e-mail carries the PDF (number, lines, total, link) and the link opens a checkout for the total; paying it marks the invoice paid once', async () => {
    const inv = await oneJobDraft('2026-04-26');
    const sent = await owner.post(`/api/invoices/${inv.id}/send`);
    expect(sent.status).toBe(200);
    expect(sent.body).toMatchObject({ state: 'sent', mailed: true, paymentError: null });
    const url = sent.body.paymentUrl as string;
    expect(url).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/pay\/cs_test_/);

    await drainMail();
    const mail = await t.mail.waitFor((m) => m.to.includes(inv.customerEmail));
    expect(mail.subject).toContain(`Invoice ${inv.number}`);
    expect(mail.text).toContain(url);
    expect(mail.attachments).toHaveLength(1);
    expect(mail.attachments[0]).toMatchObject({ filename: `invoice-${inv.number}.pdf`, contentType: 'application/pdf' });
    const text = pdfText(mail.attachments[0].content).join('\n');
    expect(text).toContain(`Invoice ${inv.number}`);
    expect(text).toContain(inv.customer.name);
    expect(text).toContain('40.00 ac');
    // 40 ac × $11.75 = $470.00; 6.25 % tax = $29.375 → $29.38; total $499.38 (by hand).
    expect(inv.totalCents).toBe(line('40', 1175) + roundDiv(BigInt(line('40', 1175)) * 625n, 10_000n));
    expect(inv.totalCents).toBe(49_938);
    expect(text).toContain('$499.38');
    expect(text).toContain(url);

    // The link: the fake checkout page for exactly the invoice's total.
    const page = await (await fetch(url)).text();
    expect(page).toContain('499.38 USD');
    const session = [...t.payments.sessions.values()].find((s) => s.url === url)!;
    expect(session).toMatchObject({ amount_total: 49_938, currency: 'usd', metadata: { invoiceId: String(inv.id) } });

    // Pay on the fake checkout: it sends checkout.session.completed, signed, to the webhook.
    const paid = await fetch(`${url}/pay`, { method: 'POST', redirect: 'manual' });
    expect(paid.status).toBe(303);
    const delivery = t.payments.deliveries.at(-1)!;
    expect(delivery.status).toBe(200);
    const after = (await viewer.get(`/api/invoices/${inv.id}`)).body as InvoiceDetail;
    expect(after).toMatchObject({ state: 'paid', paymentUrl: null });
    expect(after.payments).toEqual([expect.objectContaining({ amountCents: 49_938, checkoutSessionId: session.id })]);

    // Replayed (the service retrying with a fresh signature): answered as before, nothing more written.
    const replay = await t.payments.resend(delivery.event.id);
    expect(replay.status).toBe(200);
    expect((await t.db('invoice_payments').where({ invoice_id: inv.id })).length).toBe(1);
    expect((await t.db('payment_events').where({ event_id: delivery.event.id }).first('outcome')).outcome).toBe('applied');

    // Sent once: a second send is refused; the viewer sees it among payments, not receivables.
    expect((await owner.post(`/api/invoices/${inv.id}/send`)).status).toBe(409);
    expect(((await viewer.get('/api/invoices/payments')).body as Array<{ invoiceId: number }>).some((p) => p.invoiceId === inv.id)).toBe(
      true,
    );
    expect(((await viewer.get('/api/invoices/receivables')).body as Receivables).invoices.some((i) => i.id === inv.id)).toBe(false);
  });

  it('when the card is declined on the checkout, then no event is sent and the invoice stays sent and receivable', async () => {
    const inv = await oneJobDraft('2026-04-27');
    const url = (await owner.post(`/api/invoices/${inv.id}/send`)).body.paymentUrl as string;
    const events = t.payments.deliveries.length;
    expect((await fetch(`${url}/decline`, { method: 'POST' })).status).toBe(402);
    expect(t.payments.deliveries.length).toBe(events);
    expect((await owner.get(`/api/invoices/${inv.id}`)).body.state).toBe('sent');
    // Sent ten days ago (240 h earlier on a calendar with no clock change between): 10 days outstanding.
    await t
      .db('invoices')
      .where({ id: inv.id })
      .update({ sent_at: new Date(Date.now() - 240 * 3_600_000) });
    const r = (await viewer.get('/api/invoices/receivables')).body as Receivables;
    expect(r.invoices.find((i) => i.id === inv.id)).toMatchObject({ totalCents: inv.totalCents, daysOutstanding: 10 });
    expect(r.totalCents).toBe(r.invoices.reduce((sum, i) => sum + i.totalCents, 0));
  });

  it('when the payment service is down at sending, then the invoice is sent but not mailed and says why; sending again once it is back mails it with a link', async () => {
    const inv = await oneJobDraft('2026-04-28');
    t.payments.mode = 'down';
    try {
      const res = await owner.post(`/api/invoices/${inv.id}/send`);
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ state: 'sent', mailed: false, paymentUrl: null });
      expect(res.body.paymentError).toContain('The payment service answered with an error');
      expect(await t.db('mail_outbox').where({ ref: `invoice:${inv.id}` })).toHaveLength(0);
      t.payments.mode = 'reset';
      const dropped = await owner.post(`/api/invoices/${inv.id}/send`);
      expect(dropped.body.paymentError).toContain('could not be reached');
    } finally {
      t.payments.mode = 'ok';
    }
    const retry = await owner.post(`/api/invoices/${inv.id}/send`);
    expect(retry.body).toMatchObject({ state: 'sent', mailed: true, paymentError: null, number: inv.number, totalCents: inv.totalCents });
    expect(retry.body.paymentUrl).toMatch(/\/pay\/cs_test_/);
    expect(await t.db('mail_outbox').where({ ref: `invoice:${inv.id}` })).toHaveLength(1);
  });

  it('when the owner sends one draft twice at the same moment, then it is mailed once', async () => {
    const inv = await oneJobDraft('2026-04-29');
    const answers = await Promise.all([owner.post(`/api/invoices/${inv.id}/send`), owner.post(`/api/invoices/${inv.id}/send`)]);
    expect(answers.every((a) => a.status === 200 || a.status === 409)).toBe(true);
    expect(await t.db('mail_outbox').where({ ref: `invoice:${inv.id}` })).toHaveLength(1);
    expect((await owner.get(`/api/invoices/${inv.id}`)).body).toMatchObject({ state: 'sent', mailed: true });
  });
});

describe('state machine and credits', () => {
  it('when a draft is voided, then it keeps its number, its job can be billed again, and it can be neither sent nor voided again', async () => {
    const inv = await oneJobDraft('2026-05-11');
    expect((await owner.post(`/api/invoices/${inv.id}/void`, { reason: '' })).status).toBe(400);
    const voided = await owner.post(`/api/invoices/${inv.id}/void`, { reason: 'Wrong period' });
    expect(voided.body).toMatchObject({ state: 'void', number: inv.number, voidReason: 'Wrong period' });
    expect((await owner.post(`/api/invoices/${inv.id}/send`)).status).toBe(409);
    expect((await owner.post(`/api/invoices/${inv.id}/void`, { reason: 'again' })).status).toBe(409);
    const redraft = await draft(inv.customer.id, '2026-05-11', '2026-05-11');
    expect(redraft.status).toBe(201);
    expect(redraft.body.lines[0].assignmentId).toBe(inv.lines[0].assignmentId);
    expect(redraft.body.number).toBeGreaterThan(inv.number);
  });

  it('when a sent invoice is voided, then its checkout is expired and a late payment for it changes nothing and is recorded', async () => {
    const inv = await oneJobDraft('2026-05-12');
    const url = (await owner.post(`/api/invoices/${inv.id}/send`)).body.paymentUrl as string;
    const session = [...t.payments.sessions.values()].find((s) => s.url === url)!;
    expect((await owner.post(`/api/invoices/${inv.id}/void`, { reason: 'Customer disputes the acres' })).body.state).toBe('void');
    expect(session.status).toBe('expired');
    // A completed checkout for it arriving anyway (made before the void): refused, recorded, invoice unchanged.
    const d = await t.payments.emit('checkout.session.completed', { ...session, status: 'complete', payment_status: 'paid' });
    expect(d.status).toBe(200);
    const row = await t.db('payment_events').where({ event_id: d.event.id }).first('outcome', 'detail');
    expect(row).toMatchObject({ outcome: 'ignored' });
    expect(row.detail).toContain('refunded by hand');
    expect((await owner.get(`/api/invoices/${inv.id}`)).body.state).toBe('void');
  });

  it('when a paid invoice is credited, then a credit note of its own takes the next number with the negative total, and the invoice is never changed', async () => {
    const inv = await oneJobDraft('2026-05-13');
    expect((await owner.post(`/api/invoices/${inv.id}/credit`, { reason: 'x' })).status).toBe(409);
    const url = (await owner.post(`/api/invoices/${inv.id}/send`)).body.paymentUrl as string;
    await fetch(`${url}/pay`, { method: 'POST', redirect: 'manual' });
    expect((await owner.get(`/api/invoices/${inv.id}`)).body.state).toBe('paid');
    expect((await owner.post(`/api/invoices/${inv.id}/void`, { reason: 'x' })).status).toBe(409);
    const before = await t.db('invoices').where({ id: inv.id }).first();

    const credit = await owner.post(`/api/invoices/${inv.id}/credit`, { reason: 'Harrowed the wrong quarter' });
    expect(credit.status).toBe(201);
    const note = credit.body as InvoiceDetail;
    const last = Math.max(
      ...((await owner.get('/api/invoices')).body as InvoiceListItem[]).filter((i) => i.id !== note.id).map((i) => i.number),
    );
    expect(note).toMatchObject({
      kind: 'credit',
      state: 'issued',
      creditOf: inv.id,
      creditOfNumber: inv.number,
      number: last + 1,
      subtotalCents: -inv.subtotalCents,
      taxCents: -inv.taxCents,
      totalCents: -inv.totalCents,
      note: 'Harrowed the wrong quarter',
    });
    expect(note.lines.map((l) => l.amountCents)).toEqual(inv.lines.map((l) => -l.amountCents));
    expect((await owner.post(`/api/invoices/${inv.id}/credit`, { reason: 'again' })).status).toBe(409);
    expect((await owner.post(`/api/invoices/${note.id}/send`)).status).toBe(409);
    // The invoice itself: the same row, only now referenced by its credit note.
    expect(await t.db('invoices').where({ id: inv.id }).first()).toEqual(before);
    expect((await owner.get(`/api/invoices/${inv.id}`)).body).toMatchObject({
      state: 'paid',
      creditedBy: note.id,
      creditedByNumber: note.number,
    });
    const pdf = await owner
      .get(`/api/invoices/${note.id}/pdf`)
      .buffer(true)
      .parse((res, cb) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(pdf.headers['content-type']).toBe('application/pdf');
    const text = pdfText(pdf.body as Buffer).join('\n');
    expect(text).toContain(`Credit note ${note.number}`);
    // The customer knows the invoice by its number, never by the database's id.
    expect(text).toContain(`Credits invoice ${inv.number}`);
    expect(text).toContain(`-$${(inv.totalCents / 100).toFixed(2)}`);
  });

  it('when a paid invoice is credited, then the customer is mailed the credit note with its PDF through the outbox, naming the invoice by its number', async () => {
    const inv = await oneJobDraft('2026-05-15');
    const url = (await owner.post(`/api/invoices/${inv.id}/send`)).body.paymentUrl as string;
    await fetch(`${url}/pay`, { method: 'POST', redirect: 'manual' });
    expect((await owner.get(`/api/invoices/${inv.id}`)).body.state).toBe('paid');

    const credit = await owner.post(`/api/invoices/${inv.id}/credit`, { reason: 'Harrowed twice by mistake' });
    expect(credit.status).toBe(201);
    const note = credit.body as InvoiceDetail;
    expect(note).toMatchObject({ kind: 'credit', mailed: true });
    // Written to the outbox in the credit note's own transaction, like the invoice's e-mail.
    const queued = await t.db('mail_outbox').where({ ref: `invoice:${note.id}` });
    expect(queued.map((m) => [m.kind, m.to_address])).toEqual([['credit-note', inv.customerEmail]]);

    await drainMail();
    const mail = await t.mail.waitFor((m) => m.to.includes(inv.customerEmail) && m.subject.startsWith(`Credit note ${note.number}`));
    // The amount as the customer reads it, worked here from the invoice's cents: whole dollars and two digits.
    const dollars = `$${Math.trunc(inv.totalCents / 100)}.${String(inv.totalCents % 100).padStart(2, '0')}`;
    expect(mail.subject).toContain(`invoice ${inv.number} credited`);
    expect(mail.text).toContain(`It credits invoice ${inv.number}`);
    expect(mail.text).toContain(`Amount credited: ${dollars} USD.`);
    expect(mail.text).toContain('Reason: Harrowed twice by mistake');
    expect(mail.text).toContain(`Invoice ${inv.number} was paid`);
    expect(mail.attachments.map((a) => [a.filename, a.contentType])).toEqual([[`credit-note-${note.number}.pdf`, 'application/pdf']]);
    const text = pdfText(mail.attachments[0].content).join('\n');
    expect(text).toContain(`Credit note ${note.number}`);
    expect(text).toContain(`Credits invoice ${inv.number}`);
    expect(text).toContain(`Total USD`);
    expect(text).toContain(`-${dollars}`);
    // A credit note is not paid: no payment link in it.
    expect(text).not.toContain('Pay online');
    expect(mail.text).not.toContain('/pay/');
    // The accountant's export names the credited invoice by its number too, never a database id.
    const csv = (await owner.get('/api/invoices/export/invoices.csv')).text.replace(/^\uFEFF/, '').split('\r\n');
    expect(csv.find((r) => r.startsWith(`${note.number},credit,`))!.split(',')[11]).toBe(String(inv.number));
    // Mailed once: the invoice's own e-mail and this one, nothing more.
    expect(t.mail.to(inv.customerEmail).map((m) => m.subject.split(' from ')[0])).toEqual([
      `Invoice ${inv.number}`,
      `Credit note ${note.number}`,
    ]);
  });

  it('when an invoice that was never mailed (the payment service was out) is credited, then its credit note is not mailed either and says so', async () => {
    const inv = await oneJobDraft('2026-05-16');
    t.payments.mode = 'down';
    try {
      expect((await owner.post(`/api/invoices/${inv.id}/send`)).body).toMatchObject({ state: 'sent', mailed: false });
    } finally {
      t.payments.mode = 'ok';
    }
    const credit = await owner.post(`/api/invoices/${inv.id}/credit`, { reason: 'Billed to the wrong neighbour' });
    expect(credit.status).toBe(201);
    expect(credit.body).toMatchObject({ kind: 'credit', mailed: false });
    expect(await t.db('mail_outbox').where({ ref: `invoice:${credit.body.id}` })).toHaveLength(0);
    await drainMail();
    expect(t.mail.to(inv.customerEmail)).toHaveLength(0);
  });

  it('when a sent invoice is credited, then it leaves the receivables and its payment link stops taking payments', async () => {
    const inv = await oneJobDraft('2026-05-14');
    const url = (await owner.post(`/api/invoices/${inv.id}/send`)).body.paymentUrl as string;
    const session = [...t.payments.sessions.values()].find((s) => s.url === url)!;
    expect(((await viewer.get('/api/invoices/receivables')).body as Receivables).invoices.some((i) => i.id === inv.id)).toBe(true);
    expect((await owner.post(`/api/invoices/${inv.id}/credit`, { reason: 'Goodwill' })).status).toBe(201);
    expect(((await viewer.get('/api/invoices/receivables')).body as Receivables).invoices.some((i) => i.id === inv.id)).toBe(false);
    // Nothing is owed on it now: the checkout is expired (as after a void), so the old link takes no payment,
    // and neither the invoice nor its PDF offers the link any more.
    expect(session.status).toBe('expired');
    expect((await fetch(`${url}/pay`, { method: 'POST', redirect: 'manual' })).status).toBe(409);
    expect((await owner.get(`/api/invoices/${inv.id}`)).body).toMatchObject({ state: 'sent', paymentUrl: null });
    const pdf = await owner
      .get(`/api/invoices/${inv.id}/pdf`)
      .buffer(true)
      .parse((res, cb) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    const text = pdfText(pdf.body as Buffer).join('\n');
    expect(text).toContain(`Invoice ${inv.number}`);
    expect(text).not.toContain('Pay online');
  });
});

describe('webhook and the invoice', () => {
  const sdk = () =>
    new Stripe('sk_test_invoice_test', { host: '127.0.0.1', port: t.payments.port, protocol: 'http', maxNetworkRetries: 0 });

  it('when a checkout Furlong did not make pays a different amount for a sent invoice, then the invoice is not marked paid and the mismatch is recorded', async () => {
    const inv = await oneJobDraft('2026-05-20');
    await owner.post(`/api/invoices/${inv.id}/send`);
    const forged = await sdk().checkout.sessions.create({
      mode: 'payment',
      metadata: { invoiceId: String(inv.id), farmId: String(farm.id) },
      line_items: [{ quantity: 1, price_data: { currency: 'usd', unit_amount: 100, product_data: { name: 'cheap' } } }],
    });
    await fetch(`${forged.url!}/pay`, { method: 'POST', redirect: 'manual' });
    const d = t.payments.deliveries.at(-1)!;
    expect(d.status).toBe(200);
    const row = await t.db('payment_events').where({ event_id: d.event.id }).first('outcome', 'detail');
    expect(row.outcome).toBe('amount-mismatch');
    expect((await owner.get(`/api/invoices/${inv.id}`)).body.state).toBe('sent');
  });

  it('when an event names an invoice that does not exist or is another farm’s, then it is answered 2xx, logged and nothing changes', async () => {
    const inv = await oneJobDraft('2026-05-21');
    await owner.post(`/api/invoices/${inv.id}/send`);
    const wrongFarm = await sdk().checkout.sessions.create({
      mode: 'payment',
      metadata: { invoiceId: String(inv.id), farmId: String(farm.id + 100_000) },
      line_items: [{ quantity: 1, price_data: { currency: 'usd', unit_amount: inv.totalCents, product_data: { name: 'x' } } }],
    });
    await fetch(`${wrongFarm.url!}/pay`, { method: 'POST', redirect: 'manual' });
    const d = t.payments.deliveries.at(-1)!;
    expect(d.status).toBe(200);
    expect((await t.db('payment_events').where({ event_id: d.event.id }).first('outcome')).outcome).toBe('unknown-invoice');
    expect((await owner.get(`/api/invoices/${inv.id}`)).body.state).toBe('sent');
  });

  it('when the checkout’s expiry arrives after its payment (out of order), then the invoice stays paid', async () => {
    const inv = await oneJobDraft('2026-05-22');
    const url = (await owner.post(`/api/invoices/${inv.id}/send`)).body.paymentUrl as string;
    await fetch(`${url}/pay`, { method: 'POST', redirect: 'manual' });
    const session = [...t.payments.sessions.values()].find((s) => s.id === url.split('/').pop())!;
    const late = await t.payments.emit('checkout.session.expired', { ...session, status: 'expired' });
    expect(late.status).toBe(200);
    expect((await owner.get(`/api/invoices/${inv.id}`)).body.state).toBe('paid');
  });
});

describe('removing', () => {
  it('when a customer with invoices is removed, then 409 says why; when the whole farm is removed, its customers and invoices go with it', async () => {
    const inv = await oneJobDraft('2026-05-26');
    const res = await owner.delete(`/api/customers/${inv.customer.id}`);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toContain('has invoices');
    const gone = await makeFarm(t.db, 'Closing');
    const c = await insertCustomer(t.db, gone.id);
    await insertJob(t.db, gone.id, await insertCustomerField(t.db, gone.id, c), gone.operator.membershipId, {
      day: '2026-05-26',
      operation: 'harrowing',
      acres: '5',
      hours: '1',
    });
    const boss = await signedIn(t.app, gone.owner.email, gone.owner.password);
    expect((await boss.post('/api/invoices', { customerId: c, from: '2026-05-26', to: '2026-05-26' })).status).toBe(201);
    await t.db('farms').where({ id: gone.id }).delete();
    expect(await t.db('invoices').where({ farm_id: gone.id })).toHaveLength(0);
    expect(await t.db('customers').where({ farm_id: gone.id })).toHaveLength(0);
  });
});

describe('who sees money', () => {
  it('when an operator asks for invoices, receivables, payments, a PDF or an export, then each is refused; the viewer reads and exports but cannot change', async () => {
    const inv = await oneJobDraft('2026-05-25');
    for (const path of [
      '/api/invoices',
      '/api/invoices/receivables',
      '/api/invoices/payments',
      `/api/invoices/${inv.id}`,
      `/api/invoices/${inv.id}/pdf`,
      '/api/invoices/export/invoices.csv',
    ])
      expect([path, (await operator.get(path)).status]).toEqual([path, 403]);
    expect((await viewer.post(`/api/invoices/${inv.id}/send`)).status).toBe(403);
    expect((await viewer.post('/api/invoices', { customerId: inv.customer.id, from: '2026-01-01', to: '2026-12-31' })).status).toBe(403);
    const csv = await viewer.get('/api/invoices/export/invoices.csv');
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toContain('text/csv');
    const rows = csv.text.replace(/^\uFEFF/, '').split('\r\n');
    expect(rows[0]).toBe('number,kind,state,customer,issued_on,period_from,period_to,currency,subtotal,tax,total,credits_invoice,paid_on');
    // The draft's total in dollars: cents ÷ 100 with two decimals (49,938 ¢ → 499.38).
    expect(rows.find((r) => r.startsWith(`${inv.number},`))).toContain(',499.38,');
    expect((await viewer.get('/api/invoices/export/payments.csv')).text).toContain('paid_on,invoice_number');
    expect((await viewer.get('/api/invoices/export/receivables.csv')).status).toBe(200);
    expect((await viewer.get('/api/invoices/export/secrets.csv')).status).toBe(400);
  });
});
