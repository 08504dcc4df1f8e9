import express from 'express';
import Stripe from 'stripe';
import type { AppDeps } from '../app-deps';
import { AppError } from '../http/errors';
import type { Routes } from '../http/routes';
import { receivePaymentEvent } from './payments.service';

/** A payment event is small; anything larger is not one. */
const WEBHOOK_BODY_LIMIT = '256kb';

/**
 * The payment service's webhook. It is public and outside the CSRF check: its authentication is
 * the signature over the exact bytes received, checked with the service's SDK, so the body is read
 * raw. A missing or wrong signature is a 400 and changes nothing.
 */
export function paymentWebhookRoutes(r: Routes, deps: AppDeps): void {
  r.post('/webhook', 'public', express.raw({ type: () => true, limit: WEBHOOK_BODY_LIMIT }), async (req, res) => {
    const signature = req.get('stripe-signature');
    if (!signature) throw new AppError(400, 'bad_signature', 'The payment event carries no signature');
    const body = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
    let event: Stripe.Event;
    try {
      event = deps.payments.stripe.webhooks.constructEvent(body, signature, deps.payments.webhookSecret);
    } catch (e) {
      if (e instanceof Stripe.errors.StripeSignatureVerificationError || e instanceof SyntaxError) {
        throw new AppError(400, 'bad_signature', 'The payment event’s signature does not match its content');
      }
      throw e;
    }
    const recorded = await receivePaymentEvent(deps, event, req.log);
    res.json({ received: true, outcome: recorded.outcome, replay: !recorded.first });
  });
}
