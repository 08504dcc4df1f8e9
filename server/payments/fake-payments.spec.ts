// The local fake payment server, driven by the payment service's official Node SDK (`stripe`)
// exactly as Furlong drives the real service. The outside references are the SDK itself: it
// must parse every answer, raise its own error classes for the service's error shapes, and its
// `webhooks.constructEvent` must accept the fake's signatures (and refuse a wrong secret).
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';
import { createPaymentService } from './payments.client';
import { FAKE_WEBHOOK_SECRET, FakePaymentServer } from './fake-payments';

describe('the local fake payment server through the official SDK', () => {
  const fake = new FakePaymentServer();
  let stripe: Stripe;
  let hook: http.Server;
  const received: Array<{ body: string; signature: string }> = [];

  beforeAll(async () => {
    await fake.start(0);
    stripe = createPaymentService({ paymentSecretKey: null, paymentWebhookSecret: null, fakePaymentsPort: fake.port }).stripe;
    hook = http.createServer((req, res) => {
      let body = '';
      req.on('data', (c: Buffer) => (body += c.toString('utf8')));
      req.on('end', () => {
        received.push({ body, signature: String(req.headers['stripe-signature'] ?? '') });
        res.writeHead(200, { 'Content-Type': 'application/json' }).end('{"received":true}');
      });
    });
    await new Promise<void>((resolve) => hook.listen(0, '127.0.0.1', () => resolve()));
    fake.webhookUrl = `http://127.0.0.1:${(hook.address() as AddressInfo).port}/api/payments/webhook`;
  });
  afterAll(async () => {
    await fake.stop();
    await new Promise<void>((resolve) => hook.close(() => resolve()));
  });
  beforeEach(() => {
    fake.mode = 'ok';
    received.length = 0;
  });

  const newSession = () =>
    stripe.checkout.sessions.create({
      mode: 'payment',
      client_reference_id: 'invoice-7',
      metadata: { invoiceId: '7', farmId: '1' },
      line_items: [
        { quantity: 1, price_data: { currency: 'cad', unit_amount: 123_450, product_data: { name: 'Harrowing, 150 ac' } } },
        { quantity: 2, price_data: { currency: 'cad', unit_amount: 1_000, product_data: { name: 'Travel' } } },
      ],
      success_url: 'http://127.0.0.1:3999/invoices/7?paid={CHECKOUT_SESSION_ID}',
      cancel_url: 'http://127.0.0.1:3999/invoices/7',
    });

  it('when a checkout session is created, then the SDK reads back its amount, reference and a local checkout URL', async () => {
    const session = await newSession();
    expect(session.id).toMatch(/^cs_test_/);
    expect(session.amount_total).toBe(123_450 + 2 * 1_000);
    expect(session.currency).toBe('cad');
    expect(session.metadata).toEqual({ invoiceId: '7', farmId: '1' });
    expect(session.status).toBe('open');
    expect(session.url).toBe(`http://127.0.0.1:${fake.port}/pay/${session.id}`);
    const again = await stripe.checkout.sessions.retrieve(session.id);
    expect(again.amount_total).toBe(session.amount_total);
  });

  it('when the checkout page is paid, then a signed checkout.session.completed event reaches the webhook and the SDK verifies it', async () => {
    const session = await newSession();
    const page = await fetch(session.url!);
    expect(await page.text()).toContain('1254.50 CAD');
    const paid = await fetch(`${session.url!}/pay`, { method: 'POST', redirect: 'manual' });
    expect(paid.status).toBe(303);
    expect(paid.headers.get('location')).toBe(`http://127.0.0.1:3999/invoices/7?paid=${session.id}`);
    expect(received).toHaveLength(1);
    const event = stripe.webhooks.constructEvent(received[0].body, received[0].signature, FAKE_WEBHOOK_SECRET);
    expect(event.type).toBe('checkout.session.completed');
    const object = event.data.object as Stripe.Checkout.Session;
    expect(object.id).toBe(session.id);
    expect(object.payment_status).toBe('paid');
    expect((await stripe.checkout.sessions.retrieve(session.id)).status).toBe('complete');
  });

  it('when the event is checked with another secret or altered, then the SDK refuses it', async () => {
    const session = await newSession();
    await fetch(`${session.url!}/pay`, { method: 'POST', redirect: 'manual' });
    const { body, signature } = received[0];
    expect(() => stripe.webhooks.constructEvent(body, signature, 'whsec_someone_else')).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    );
    expect(() => stripe.webhooks.constructEvent(body.replace('"paid"', '"unpaid"'), signature, FAKE_WEBHOOK_SECRET)).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    );
  });

  it('when a card is declined, then the session stays open and no event is sent', async () => {
    const session = await newSession();
    const declined = await fetch(`${session.url!}/decline`, { method: 'POST' });
    expect(declined.status).toBe(402);
    expect(await declined.text()).toContain('declined');
    expect(received).toHaveLength(0);
    expect((await stripe.checkout.sessions.retrieve(session.id)).status).toBe('open');
  });

  it('when an event is sent again, then it keeps its id and carries a fresh valid signature', async () => {
    const session = await newSession();
    await fetch(`${session.url!}/pay`, { method: 'POST', redirect: 'manual' });
    const first = fake.deliveries.at(-1)!;
    await fake.resend(first.event.id);
    expect(received).toHaveLength(2);
    const [a, b] = received.map((r) => stripe.webhooks.constructEvent(r.body, r.signature, FAKE_WEBHOOK_SECRET));
    expect(b.id).toBe(a.id);
  });

  it('when the service is down or drops the connection, then the SDK raises its own errors', async () => {
    fake.mode = 'down';
    await expect(newSession()).rejects.toBeInstanceOf(Stripe.errors.StripeAPIError);
    fake.mode = 'reset';
    await expect(newSession()).rejects.toBeInstanceOf(Stripe.errors.StripeConnectionError);
  });

  it('when the key is missing or a session is unknown, then the SDK raises the service’s error classes', async () => {
    const noKey = new Stripe('rk_live_not_a_test_key', { host: '127.0.0.1', port: fake.port, protocol: 'http', maxNetworkRetries: 0 });
    await expect(noKey.checkout.sessions.retrieve('cs_test_x')).rejects.toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
    await expect(stripe.checkout.sessions.retrieve('cs_test_unknown')).rejects.toMatchObject({ code: 'resource_missing', statusCode: 404 });
  });

  it('when line items are missing, then the SDK raises an invalid request naming the parameter', async () => {
    await expect(stripe.checkout.sessions.create({ mode: 'payment', success_url: 'http://127.0.0.1/x' })).rejects.toMatchObject({
      type: 'StripeInvalidRequestError',
      param: 'line_items',
    });
  });
});
