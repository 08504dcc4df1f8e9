// The custom-work rate card: per operation a rate per acre or per hour in whole cents, the owner's
// own or the published default (shared/custom-rates.ts). Read by the owner and viewers.
import * as z from 'zod';
import { RATE_LIMITS, RATE_UNITS } from '../custom-rates';
import { OPERATIONS } from '../operations';

const operation = z.enum(OPERATIONS, { error: `Choose one of: ${OPERATIONS.join(', ')}` });
export const rateParams = z.object({ operation });

/** `PUT /api/rate-card/:operation`: the owner's own rate. */
export const rateBody = z
  .object({
    unit: z.enum(RATE_UNITS, { error: 'Charge per acre or per hour' }),
    rateCents: z
      .number({ error: 'Enter the rate as a number of cents' })
      .int('Enter the rate in whole cents')
      .min(0, 'A rate cannot be negative'),
  })
  .superRefine((b, ctx) => {
    const max = b.unit === 'acre' ? RATE_LIMITS.acreCentsMax : RATE_LIMITS.hourCentsMax;
    if (b.rateCents > max)
      ctx.addIssue({
        code: 'custom',
        path: ['rateCents'],
        message: `A rate above $${max / 100} per ${b.unit} is not believable; check the number`,
      });
  });
export type RateBody = z.infer<typeof rateBody>;

const source = z.object({ kind: z.enum(['published', 'from memory', 'common practice, no published source']), note: z.string() });

/** What every rate-card route answers. */
export const rateCard = z.object({
  rates: z.array(
    z.object({
      operation,
      unit: z.enum(RATE_UNITS),
      rateCents: z.number().int(),
      /** True when the owner set this rate; false when the default applies. */
      own: z.boolean(),
      default: z.object({ unit: z.enum(RATE_UNITS), rateCents: z.number().int(), source }),
    }),
  ),
});
export type RateCard = z.infer<typeof rateCard>;
