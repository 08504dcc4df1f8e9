import { createHash, randomBytes } from 'node:crypto';

export const INVITE_DAYS = 7;
export const RESET_MINUTES = 60;

/** A one-time token for an e-mailed link; only its hash is stored. */
export function newToken(): { raw: string; hash: string } {
  const raw = randomBytes(32).toString('base64url');
  return { raw, hash: hashToken(raw) };
}

export const hashToken = (raw: string): string => createHash('sha256').update(raw).digest('hex');
