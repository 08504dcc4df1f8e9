import { z } from 'zod';

/** The one error shape every API failure uses; the UI shows `message`. */
export interface ApiErrorBody {
  error: {
    code: string;
    message: string;
    /** Per-field messages for forms, keyed by the input's path (`email`, `boundary.coordinates.0`). */
    fields?: Record<string, string>;
  };
}

export const idParam = z.object({ id: z.coerce.number().int().positive() });

export const isoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date written as YYYY-MM-DD')
  .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)), 'That is not a real date');

export const email = z.string().trim().toLowerCase().max(254).email('Enter a valid e-mail address');
