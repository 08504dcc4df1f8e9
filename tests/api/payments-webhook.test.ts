// The payment service's webhook: events made and signed by the local fake payment server (which
// signs with the service SDK's own helper) posted to the real app. The outside reference for the
// signature scheme is the SDK: `webhooks.constructEvent` decides, and the fake's events pass it.
import request from 'supertest';
import Stripe from 'stripe';
import type { FakeDelivery } from '../../server/payments/fake-payments';
import { startTestApp, type TestApp } from '../support/test-app';

let t: TestApp;

beforeAll(async () => {
  t = await startTestApp();
});
afterAll(() => t.close());

const stripe = () =>
  new Stripe('sk_test_webhook_test', { host: '127.0.0.1', port: t.payments.port, protocol: 'http', maxNetworkRetries: 0 });

/** A checkout paid on the fake's page; its event is kept by the fake (no webhook URL), not sent. */
async function paidEvent(invoiceId = '41'): Promise<FakeDelivery> {
  const session = await stripe().checkout.sessions.create({
    mode: 'payment',
    metadata: { invoiceId },
    line_items: [{ quantity: 1, price_data: { currency: 'cad', unit_amount: 50_000, product_data: { name: 'Seeding' } } }],
    success_url: 'http://127.0.0.1:3999/done',
  });
  await fetch(`${session.url!}/pay`, { method: 'POST', redirect: 'manual' });
  const delivery = t.payments.deliveries.at(-1)!;
  expect((delivery.event.data.object as { id: string }).id).toBe(session.id);
  return delivery;
}

const post = (payload: string, signature?: string) => {
  const r = request(t.app).post('/api/payments/webhook').set('Content-Type', 'application/json');
  return (signature ? r.set('Stripe-Signature', signature) : r).send(payload);
};

const rowsFor = (eventId: string) => t.db('payment_events').where({ event_id: eventId });

describe('the payment webhook', () => {
  beforeAll(() => {
    t.payments.webhookUrl = null;
  });

  it('when a signed event arrives with no session and no CSRF token, then it is recorded once with its outcome', async () => {
    const d = await paidEvent('41');
    const res = await post(d.payload, d.signature);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ received: true, outcome: 'unknown-invoice', replay: false });
    const rows = await rowsFor(d.event.id);
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ type: 'checkout.session.completed', outcome: 'unknown-invoice', livemode: false });
    expect(rows[0].detail).toContain('41');
  });

  it('when the same event is replayed (the service retrying, with a fresh signature), then it answers as before and writes nothing', async () => {
    const d = await paidEvent();
    await post(d.payload, d.signature).expect(200);
    const again = await t.payments.resend(d.event.id);
    const res = await post(again.payload, again.signature);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ received: true, outcome: 'unknown-invoice', replay: true });
    expect(await rowsFor(d.event.id)).toHaveLength(1);
  });

  it('when two copies of one event arrive at the same moment, then one row is written', async () => {
    const d = await paidEvent();
    const answers = await Promise.all([post(d.payload, d.signature), post(d.payload, d.signature), post(d.payload, d.signature)]);
    expect(answers.map((a) => a.status)).toEqual([200, 200, 200]);
    expect(answers.filter((a) => a.body.replay === false)).toHaveLength(1);
    expect(await rowsFor(d.event.id)).toHaveLength(1);
  });

  it('when the signature is missing, made with another secret, or the body was altered, then 400 with a reason and nothing is recorded', async () => {
    const d = await paidEvent();
    const missing = await post(d.payload);
    expect(missing.status).toBe(400);
    expect(missing.body.error.message).toBe('The payment event carries no signature');
    const forged = Stripe.webhooks.generateTestHeaderString({ payload: d.payload, secret: 'whsec_not_ours' });
    const wrong = await post(d.payload, forged);
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.message).toContain('signature does not match');
    const altered = await post(d.payload.replace('50000', '1'), d.signature);
    expect(altered.status).toBe(400);
    expect(await rowsFor(d.event.id)).toHaveLength(0);
  });

  it('when a signature is too old (outside the SDK’s five-minute tolerance), then it is refused', async () => {
    const d = await paidEvent();
    const stale = Stripe.webhooks.generateTestHeaderString({
      payload: d.payload,
      secret: t.payments.webhookSecret,
      timestamp: Math.floor(Date.now() / 1000) - 3600,
    });
    expect((await post(d.payload, stale)).status).toBe(400);
    expect(await rowsFor(d.event.id)).toHaveLength(0);
  });

  it('when the body is far larger than any event, then 413 and the server keeps answering', async () => {
    const d = await paidEvent();
    const huge = post('x'.repeat(400_000), d.signature);
    expect((await huge).status).toBe(413);
    await request(t.app).get('/api/health').expect(200);
  });

  it('when an event of a type Furlong does not act on arrives, then it is recorded as ignored', async () => {
    const session = await stripe().checkout.sessions.create({
      mode: 'payment',
      line_items: [{ quantity: 1, price_data: { currency: 'cad', unit_amount: 100, product_data: { name: 'x' } } }],
    });
    await stripe().checkout.sessions.expire(session.id);
    // The expiry's event is made as the call returns; wait for it to be kept.
    await new Promise((r) => setTimeout(r, 50));
    const d = t.payments.deliveries.find(
      (x) => x.event.type === 'checkout.session.expired' && (x.event.data.object as { id: string }).id === session.id,
    )!;
    const res = await post(d.payload, d.signature);
    expect(res.body).toMatchObject({ outcome: 'ignored', replay: false });
  });
});
