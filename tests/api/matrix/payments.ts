import { all, type Case } from './types';

/** The payment service's webhook is public; with no signature it is refused for everyone alike. */
export const payments: Record<string, Case> = {
  'POST /api/payments/webhook': { body: {}, expect: all(400) },
};
