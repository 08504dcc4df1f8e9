import * as z from 'zod';

/** What Furlong did with a payment-service event. */
export const PAYMENT_EVENT_OUTCOMES = ['applied', 'ignored', 'unknown-invoice', 'amount-mismatch'] as const;
export type PaymentEventOutcome = (typeof PAYMENT_EVENT_OUTCOMES)[number];

/** The webhook's answer: the outcome of the first receipt of the event, and whether this was a replay. */
export const paymentWebhookAnswer = z.object({
  received: z.literal(true),
  outcome: z.enum(PAYMENT_EVENT_OUTCOMES),
  replay: z.boolean(),
});
export type PaymentWebhookAnswer = z.infer<typeof paymentWebhookAnswer>;
