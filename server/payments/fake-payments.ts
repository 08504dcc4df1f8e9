// A local payment server for development and tests: answers the hosted payment service's REST
// calls that Furlong makes through the service's own Node SDK (`stripe`, pointed here with its
// host / port / protocol options), serves a local checkout page where a person or a test pays or
// declines, and sends webhook events signed the way the service signs them (the SDK's own
// signing helper, HMAC-SHA256 over "<timestamp>.<body>" in a `Stripe-Signature` header).
//
// Only what Furlong uses is answered: creating, reading and expiring a checkout session.
// `mode` makes the service look down (HTTP 500 with the service's error shape) or drop the
// connection, for outage tests. `npm start` and `npm test` start one on loopback when
// STRIPE_SECRET_KEY is unset.
import { randomBytes } from 'node:crypto';
import http from 'node:http';
import { closeNow, listenOnLoopback } from '../http/loopback';
import { centsToDecimal } from '../../shared/money';
import express, { type Request, type Response } from 'express';
import Stripe from 'stripe';

/** ok: answers. down: HTTP 500 with an api_error. reset: the connection is dropped without an answer. */
export type FakePaymentMode = 'ok' | 'down' | 'reset';

/** The webhook signing secret the fake uses when none is configured (local only, never a real one). */
export const FAKE_WEBHOOK_SECRET = 'whsec_local_fake_payment_server';

/** The API key the fake accepts when none is configured; any key of this test-mode shape is taken. */
export const FAKE_SECRET_KEY = 'sk_test_local_fake_payment_server';

/** A checkout session as the service describes it (the fields Furlong reads, plus the usual ones). */
export interface FakeCheckoutSession {
  id: string;
  object: 'checkout.session';
  amount_total: number;
  amount_subtotal: number;
  currency: string;
  client_reference_id: string | null;
  customer_email: string | null;
  metadata: Record<string, string>;
  mode: 'payment';
  payment_status: 'unpaid' | 'paid';
  status: 'open' | 'complete' | 'expired';
  payment_intent: string | null;
  success_url: string | null;
  cancel_url: string | null;
  url: string | null;
  created: number;
  expires_at: number;
  livemode: false;
}

/** One event sent (or to be sent) to the webhook, with what the receiver answered. */
export interface FakeDelivery {
  event: Stripe.Event;
  payload: string;
  signature: string;
  status: number | null;
  error: string | null;
}

interface LineItem {
  quantity?: string;
  price_data?: { currency?: string; unit_amount?: string; product_data?: { name?: string } };
}

const newId = (prefix: string) => `${prefix}_test_${randomBytes(12).toString('hex')}`;
const nowSeconds = () => Math.floor(Date.now() / 1000);

/** The service's error body: `{ error: { type, code?, message, param? } }`. */
function stripeError(res: Response, status: number, type: string, message: string, extra: { code?: string; param?: string } = {}) {
  res.status(status).json({ error: { type, message, ...extra } });
}

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

export class FakePaymentServer {
  mode: FakePaymentMode = 'ok';
  /** Where events go (Furlong's `/api/payments/webhook`); null: events are kept but not sent. */
  webhookUrl: string | null = null;
  webhookSecret = FAKE_WEBHOOK_SECRET;
  readonly sessions = new Map<string, FakeCheckoutSession>();
  /** Every event made, oldest first, with what the webhook answered. */
  readonly deliveries: FakeDelivery[] = [];
  /** Every API call, as "METHOD /path", oldest first. */
  readonly calls: string[] = [];
  port = 0;
  private server: http.Server | null = null;

  async start(port = 0): Promise<number> {
    const server = http.createServer(this.app());
    this.port = await listenOnLoopback(server, port);
    this.server = server;
    return this.port;
  }

  async stop(): Promise<void> {
    const server = this.server;
    this.server = null;
    if (!server) return;
    await closeNow(server);
  }

  /** Sends an already-made event again, as the service does when it retries (same id, new signature). */
  async resend(eventId: string): Promise<FakeDelivery> {
    const first = this.deliveries.find((d) => d.event.id === eventId);
    if (!first) throw new Error(`no event ${eventId}`);
    return this.deliver(first.event);
  }

  /** Makes an event about a session and sends it to the webhook. */
  async emit(type: 'checkout.session.completed' | 'checkout.session.expired', session: FakeCheckoutSession): Promise<FakeDelivery> {
    const event = {
      id: newId('evt'),
      object: 'event',
      api_version: Stripe.API_VERSION,
      created: nowSeconds(),
      livemode: false,
      pending_webhooks: 1,
      request: { id: null, idempotency_key: null },
      type,
      data: { object: { ...session } },
    } as unknown as Stripe.Event;
    return this.deliver(event);
  }

  private async deliver(event: Stripe.Event): Promise<FakeDelivery> {
    const payload = JSON.stringify(event, null, 2);
    // The SDK's own signing helper signs exactly as the service does.
    const signature = Stripe.webhooks.generateTestHeaderString({ payload, secret: this.webhookSecret });
    const delivery: FakeDelivery = { event, payload, signature, status: null, error: null };
    this.deliveries.push(delivery);
    if (!this.webhookUrl) return delivery;
    try {
      const res = await fetch(this.webhookUrl, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json; charset=utf-8', 'Stripe-Signature': signature },
        body: payload,
        signal: AbortSignal.timeout(10_000),
      });
      delivery.status = res.status;
      await res.arrayBuffer();
    } catch (e) {
      delivery.error = e instanceof Error ? e.message : String(e);
    }
    return delivery;
  }

  private app(): express.Express {
    const app = express();
    app.disable('x-powered-by');
    // The SDK sends form-encoded bodies with bracketed keys (line_items[0][quantity]=1).
    app.use(express.urlencoded({ extended: true, limit: '100kb' }));
    app.use('/v1', (req, res, next) => {
      this.calls.push(`${req.method} ${req.baseUrl}${req.path}`);
      if (this.mode === 'reset') return void req.socket.destroy();
      if (this.mode === 'down') return stripeError(res, 500, 'api_error', 'The payment service is unavailable (local fake, mode "down").');
      const key = /^Bearer (.+)$/.exec(req.get('authorization') ?? '')?.[1] ?? '';
      if (!/^sk_test_\w+$/.test(key)) return stripeError(res, 401, 'invalid_request_error', 'Invalid API Key provided.');
      next();
    });
    app.post('/v1/checkout/sessions', (req, res) => this.createSession(req, res));
    app.get('/v1/checkout/sessions/:id', (req, res) => {
      const session = this.sessions.get(String(req.params.id));
      if (!session)
        return stripeError(res, 404, 'invalid_request_error', `No such checkout.session: '${req.params.id}'`, {
          code: 'resource_missing',
          param: 'session',
        });
      res.json(session);
    });
    app.post('/v1/checkout/sessions/:id/expire', (req, res) => {
      const session = this.sessions.get(String(req.params.id));
      if (!session)
        return stripeError(res, 404, 'invalid_request_error', `No such checkout.session: '${req.params.id}'`, {
          code: 'resource_missing',
          param: 'session',
        });
      if (session.status !== 'open') return stripeError(res, 400, 'invalid_request_error', 'Only open sessions can be expired.');
      session.status = 'expired';
      session.url = null;
      void this.emit('checkout.session.expired', session);
      res.json(session);
    });
    app.use('/v1', (req, res) =>
      stripeError(res, 404, 'invalid_request_error', `Unrecognized request URL (${req.method}: ${req.originalUrl}).`),
    );

    app.get('/pay/:id', (req, res) => {
      const session = this.sessions.get(String(req.params.id));
      if (!session) return void res.status(404).type('text/plain').send('No such checkout');
      res.type('html').send(this.page(session));
    });
    app.post('/pay/:id/:choice', async (req, res) => {
      const session = this.sessions.get(String(req.params.id));
      if (!session) return void res.status(404).type('text/plain').send('No such checkout');
      if (session.status !== 'open') return void res.status(409).type('html').send(this.page(session, 'This checkout is no longer open.'));
      if (req.params.choice === 'decline') {
        // A declined card leaves the session open and sends no event, as on the hosted page.
        return void res
          .status(402)
          .type('html')
          .send(this.page(session, 'Your card was declined (local test checkout). Nothing was charged.'));
      }
      if (req.params.choice !== 'pay') return void res.status(404).type('text/plain').send('Unknown choice');
      session.status = 'complete';
      session.payment_status = 'paid';
      session.payment_intent = newId('pi');
      session.url = null;
      await this.emit('checkout.session.completed', session);
      const next = session.success_url?.replace('{CHECKOUT_SESSION_ID}', session.id);
      if (next) return void res.redirect(303, next);
      res.type('html').send(this.page(session, 'Paid.'));
    });
    return app;
  }

  private createSession(req: Request, res: Response): void {
    const body = req.body as Record<string, unknown>;
    const items = (Array.isArray(body.line_items) ? body.line_items : []) as LineItem[];
    if (!items.length)
      return stripeError(res, 400, 'invalid_request_error', 'Missing required param: line_items.', { param: 'line_items' });
    let total = 0;
    let currency = '';
    for (const [i, item] of items.entries()) {
      const quantity = Number(item.quantity ?? 1);
      const amount = Number(item.price_data?.unit_amount);
      if (!Number.isInteger(quantity) || quantity < 1)
        return stripeError(res, 400, 'invalid_request_error', 'Invalid integer: quantity', { param: `line_items[${i}][quantity]` });
      if (!Number.isInteger(amount) || amount < 0)
        return stripeError(res, 400, 'invalid_request_error', 'Invalid integer: unit_amount', {
          param: `line_items[${i}][price_data][unit_amount]`,
        });
      if (!item.price_data?.currency)
        return stripeError(res, 400, 'invalid_request_error', 'Missing required param: currency.', {
          param: `line_items[${i}][price_data][currency]`,
        });
      currency = item.price_data.currency.toLowerCase();
      total += quantity * amount;
    }
    if (body.mode !== 'payment')
      return stripeError(res, 400, 'invalid_request_error', 'This local fake answers mode=payment only.', { param: 'mode' });
    const created = nowSeconds();
    const id = newId('cs');
    const session: FakeCheckoutSession = {
      id,
      object: 'checkout.session',
      amount_total: total,
      amount_subtotal: total,
      currency,
      client_reference_id: typeof body.client_reference_id === 'string' ? body.client_reference_id : null,
      customer_email: typeof body.customer_email === 'string' ? body.customer_email : null,
      metadata: (body.metadata && typeof body.metadata === 'object' ? body.metadata : {}) as Record<string, string>,
      mode: 'payment',
      payment_status: 'unpaid',
      status: 'open',
      payment_intent: null,
      success_url: typeof body.success_url === 'string' ? body.success_url : null,
      cancel_url: typeof body.cancel_url === 'string' ? body.cancel_url : null,
      url: `http://127.0.0.1:${this.port}/pay/${id}`,
      created,
      expires_at: created + 24 * 3600,
      livemode: false,
    };
    this.sessions.set(id, session);
    res.json(session);
  }

  private page(session: FakeCheckoutSession, notice = ''): string {
    const amount = `${centsToDecimal(session.amount_total)} ${session.currency.toUpperCase()}`;
    const open = session.status === 'open';
    return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Local test checkout</title>
<meta name="viewport" content="width=device-width, initial-scale=1"></head>
<body style="font-family: sans-serif; max-width: 28rem; margin: 2rem auto; padding: 0 1rem">
<h1>Local test checkout</h1>
<p>This page stands in for the payment service in development and tests. No money moves.</p>
<p>Amount: <strong data-testid="amount">${escapeHtml(amount)}</strong></p>
<p>Reference: ${escapeHtml(session.client_reference_id ?? session.id)}</p>
<p role="status">${escapeHtml(notice || (open ? '' : `This checkout is ${session.status}.`))}</p>
${
  open
    ? `<form method="post" action="/pay/${session.id}/pay"><button type="submit">Pay ${escapeHtml(amount)}</button></form>
<form method="post" action="/pay/${session.id}/decline" style="margin-top: 1rem"><button type="submit">Decline the card</button></form>`
    : ''
}
${session.cancel_url ? `<p><a href="${escapeHtml(session.cancel_url)}">Back</a></p>` : ''}
</body></html>`;
  }
}
