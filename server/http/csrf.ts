import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { Request, RequestHandler, Response } from 'express';
import { AppError } from './errors';

const COOKIE = 'XSRF-TOKEN';
const HEADER = 'x-xsrf-token';
const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * What a token is bound to: the stored session of a signed-in person, else one fixed marker.
 * Before sign-in there is no stored session (sessions are saved only at sign-in), and the id
 * express-session makes up for such a request is new every time, so it cannot be used.
 */
function bindingOf(req: Request): string {
  const login = (req.session as { passport?: { user?: unknown } } | undefined)?.passport;
  return login?.user && req.sessionID ? `sid:${req.sessionID}` : 'anonymous';
}

function tokens(secret: string) {
  const sign = (binding: string, nonce: string) => createHmac('sha256', secret).update(`xsrf:${binding}:${nonce}`).digest('base64url');
  return {
    mint: (req: Request) => {
      const nonce = randomBytes(18).toString('base64url');
      return `${nonce}.${sign(bindingOf(req), nonce)}`;
    },
    valid: (req: Request, token: unknown): token is string => {
      if (typeof token !== 'string') return false;
      const [nonce, mac] = token.split('.');
      if (!nonce || !mac) return false;
      const want = Buffer.from(sign(bindingOf(req), nonce));
      const got = Buffer.from(mac);
      return want.length === got.length && timingSafeEqual(want, got);
    },
  };
}

const setCookie = (res: Response, token: string, secure: boolean) =>
  res.cookie(COOKIE, token, { sameSite: 'lax', secure, path: '/', httpOnly: false });

/**
 * Signed double-submit cookie, in Angular's own convention: the server sets a readable
 * `XSRF-TOKEN` cookie and requires its value back in the `X-XSRF-TOKEN` header on every
 * state-changing request. The signature (an HMAC over the session id and a nonce, as in the
 * OWASP CSRF cheat sheet's "signed double-submit cookie") stops a token planted by another site,
 * or one taken from another person's session, from passing.
 */
export function csrfProtection(secret: string, secure: boolean): RequestHandler {
  const { mint, valid } = tokens(secret);
  return (req, res, next) => {
    const cookie = req.cookies?.[COOKIE];
    const ok = valid(req, cookie);
    if (!ok) setCookie(res, mint(req), secure);
    if (SAFE.has(req.method)) return next();
    if (!ok || req.get(HEADER) !== cookie) {
      throw new AppError(403, 'csrf', 'This page is out of date or was opened from another site; reload Furlong and try again');
    }
    next();
  };
}

/**
 * Sets a fresh token for the session as it is now: after sign-in gave the session a new id, or
 * sign-out ended it, the token the browser holds no longer fits, and the page's next save needs one.
 */
export function issueXsrfToken(req: Request, res: Response, secret: string, secure: boolean): void {
  setCookie(res, tokens(secret).mint(req), secure);
}
