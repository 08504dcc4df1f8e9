import * as z from 'zod';

/** The one error shape every API failure uses; the UI shows `message`. */
export interface ApiErrorBody {
  error: {
    code: string;
    message: string;
    /** Per-field messages for forms, keyed by the input's path (`email`, `boundary.coordinates.0`). */
    fields?: Record<string, string>;
    /** The request's id (its `X-Request-Id`), to find its log lines. */
    requestId?: string;
  };
}

/**
 * Row ids (and board versions) are PostgreSQL `integer` columns: at most 2^31 - 1 (PostgreSQL
 * manual, "Numeric Types"). A larger number names no row, and would make the query itself fail.
 */
export const DB_INT_MAX = 2_147_483_647;
const ID_TOO_LARGE = 'That number is too large to be anything on Furlong';

/** A row id written in an address or query string (text, so it is read as a number). */
export const dbId = z.coerce.number().int().positive().max(DB_INT_MAX, ID_TOO_LARGE);
/** A row id in a JSON body: already a number (a string or true is refused, not converted). */
export const dbIdNumber = z.number().int().positive().max(DB_INT_MAX, ID_TOO_LARGE);

export const idParam = z.object({ id: dbId });

/** PostgreSQL text and jsonb cannot hold U+0000; it is never typed on purpose either. */
export const hasNul = (s: string): boolean => s.includes('\u0000');
export const NUL_MESSAGE = 'must not contain a NUL character (an invisible control character, often pasted in by mistake)';
/** A string that must not hold a NUL character, for text parsed outside `server/http/validate`. */
export const textWithoutNul = (what = 'This text') => z.string().refine((s) => !hasNul(s), `${what} ${NUL_MESSAGE}`);

export const isoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date written as YYYY-MM-DD')
  .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)), 'That is not a real date');

export const email = z.string().trim().toLowerCase().max(254).email('Enter a valid e-mail address');
