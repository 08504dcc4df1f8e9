import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { RequestHandler } from 'express';
import { AppError } from './errors';

const COOKIE = 'XSRF-TOKEN';
const HEADER = 'x-xsrf-token';
const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Signed double-submit cookie, in Angular's own convention: the server sets a readable
 * `XSRF-TOKEN` cookie and requires its value back in the `X-XSRF-TOKEN` header on every
 * state-changing request. The signature stops a token planted by another site from passing.
 */
export function csrfProtection(secret: string, secure: boolean): RequestHandler {
  const sign = (nonce: string) => createHmac('sha256', secret).update(`xsrf:${nonce}`).digest('base64url');
  const valid = (token: unknown): token is string => {
    if (typeof token !== 'string') return false;
    const [nonce, mac] = token.split('.');
    if (!nonce || !mac) return false;
    const want = Buffer.from(sign(nonce));
    const got = Buffer.from(mac);
    return want.length === got.length && timingSafeEqual(want, got);
  };
  return (req, res, next) => {
    const cookie = req.cookies?.[COOKIE];
    if (!valid(cookie)) {
      const nonce = randomBytes(18).toString('base64url');
      res.cookie(COOKIE, `${nonce}.${sign(nonce)}`, { sameSite: 'lax', secure, path: '/', httpOnly: false });
    }
    if (SAFE.has(req.method)) return next();
    const header = req.get(HEADER);
    if (!valid(cookie) || header !== cookie) {
      throw new AppError(403, 'csrf', 'This page is out of date or was opened from another site; reload Furlong and try again');
    }
    next();
  };
}
