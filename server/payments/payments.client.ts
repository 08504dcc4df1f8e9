// The payment service, reached through its official Node SDK. With STRIPE_SECRET_KEY set it is the
// real service; unset, the same SDK talks to the local fake payment server (./fake-payments) on
// loopback, pointed there with the SDK's own host / port / protocol options.
import Stripe from 'stripe';
import type { Config } from '../config';
import { FAKE_SECRET_KEY, FAKE_WEBHOOK_SECRET } from './fake-payments';

export interface PaymentService {
  stripe: Stripe;
  /** The secret webhook signatures are checked with. */
  webhookSecret: string;
  /** True when the local fake answers (no STRIPE_SECRET_KEY). */
  fake: boolean;
}

/** How long one call to the service may take before the owner is told it is not answering, ms. */
export const PAYMENT_TIMEOUT_MS = 10_000;

export function createPaymentService(
  config: Pick<Config, 'paymentSecretKey' | 'paymentWebhookSecret' | 'fakePaymentsPort'>,
): PaymentService {
  const common = { timeout: PAYMENT_TIMEOUT_MS, maxNetworkRetries: 1, telemetry: false } as const;
  if (config.paymentSecretKey) {
    return { stripe: new Stripe(config.paymentSecretKey, common), webhookSecret: config.paymentWebhookSecret ?? '', fake: false };
  }
  const stripe = new Stripe(FAKE_SECRET_KEY, { ...common, host: '127.0.0.1', port: config.fakePaymentsPort, protocol: 'http' });
  return { stripe, webhookSecret: config.paymentWebhookSecret ?? FAKE_WEBHOOK_SECRET, fake: true };
}
