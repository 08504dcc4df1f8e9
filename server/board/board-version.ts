import type { Request } from 'express';
import { AppError } from '../http/errors';

/**
 * The board version a write was made on: from the body, else an `If-Match` header ("7", W/"7"
 * or 7), else a `?version=` query (for DELETE, which has no body).
 */
export function versionOf(req: Request, fromBody?: number): number | undefined {
  if (fromBody !== undefined) return fromBody;
  const raw = req.get('if-match') ?? (typeof req.query.version === 'string' ? req.query.version : undefined);
  if (raw === undefined) return undefined;
  const m = /^(?:W\/)?"?(\d{1,9})"?$/.exec(raw.trim());
  if (!m) throw new AppError(400, 'invalid_input', 'The board version must be a whole number, such as "7"', { version: 'A whole number' });
  return Number(m[1]);
}
