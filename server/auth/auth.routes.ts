import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { createPassport } from './passport';
import { forgotBody, loginBody, setPasswordBody, tokenParam } from '../../shared/schemas/auth';
import type { AppDeps } from '../app-deps';
import { issueXsrfToken } from '../http/csrf';
import { AppError } from '../http/errors';
import type { Routes } from '../http/routes';
import { principal, type SessionPrincipal } from '../http/session-user';
import { rateStore } from '../http/rate-store';
import { body, params } from '../http/validate';
import * as auth from './auth.service';

const WINDOW_MS = 15 * 60_000;

function limiter(name: string, limit: number, key: (req: Request) => string, message: string): RequestHandler {
  return rateLimit({
    store: rateStore(name),
    windowMs: WINDOW_MS,
    limit,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: key,
    handler: (_req, _res, next) => next(new AppError(429, 'rate_limited', message)),
  });
}

const ipKey = (req: Request) => ipKeyGenerator(req.ip ?? '0.0.0.0');
/**
 * Failed sign-ins count per account and client address together: a stranger guessing from
 * elsewhere runs out of tries without locking the owner out of their own account. Guessing one
 * account from many addresses is still held back by each address's own limit (`perAddress`).
 */
const accountKey = (req: Request) =>
  `account:${String(req.body?.email ?? '')
    .trim()
    .toLowerCase()}|${ipKey(req)}`;

function signIn(req: Request, res: Response, next: NextFunction, deps: AppDeps, user: SessionPrincipal): void {
  // passport's req.login regenerates the session id, so a planted id is worthless (no fixation).
  // The XSRF token is bound to the session id, so the new session gets its own token at once.
  req.login(user, (err) => {
    if (err) return next(err);
    issueXsrfToken(req, res, deps.config.sessionSecret, deps.config.secureCookies);
    res.json(auth.toMe(user));
  });
}

export function authRoutes(r: Routes, deps: AppDeps, passport: ReturnType<typeof createPassport>): void {
  const perAccount = limiter('sign-in-account', 5, accountKey, 'Too many failed sign-ins for this account; wait 15 minutes and try again');
  const perAddress = limiter('sign-in-address', 30, ipKey, 'Too many failed sign-ins from this address; wait 15 minutes and try again');
  const mailLimit = rateLimit({
    store: rateStore('mail-links'),
    windowMs: WINDOW_MS,
    limit: 10,
    keyGenerator: ipKey,
    handler: (_req, _res, next) => next(new AppError(429, 'rate_limited', 'Too many requests; wait a few minutes and try again')),
  });

  r.get('/me', 'member', (req, res) => {
    res.json(auth.toMe(principal(req)));
  });

  // Only these routes sign in or out, so only they get passport's req.login and req.logout.
  const signing = passport.initialize();

  r.post('/login', 'public', signing, perAddress, perAccount, (req, res, next) => {
    body(req, loginBody);
    passport.authenticate('local', (err: unknown, user: SessionPrincipal | false) => {
      if (err) return next(err);
      if (!user) return next(new AppError(401, 'bad_credentials', 'That e-mail and password do not match an account'));
      signIn(req, res, next, deps, user);
    })(req, res, next);
  });

  r.post('/logout', 'public', signing, (req, res, next) => {
    req.logout((err) => {
      if (err) return next(err);
      req.session.destroy(() => {
        res.clearCookie('furlong.sid', { path: '/' });
        // The signed-in session's token ends with it; the sign-in page gets an anonymous one.
        issueXsrfToken(req, res, deps.config.sessionSecret, deps.config.secureCookies);
        res.status(204).end();
      });
    });
  });

  r.post('/forgot', 'public', mailLimit, (req, res) => {
    const { email } = body(req, forgotBody);
    // The lookup and the mail wait until the answer is sent: how long the answer takes must not
    // tell a stranger whether the address has an account. A failure is logged, never shown.
    res.on('close', () => {
      auth.requestReset(deps, email).catch((err: unknown) => (deps.log ?? console.error)(err));
    });
    res
      .status(202)
      .json({ message: 'If that address belongs to a Furlong account, a link to set a new password is on its way. Check your e-mail.' });
  });

  r.get('/token/:token', 'public', async (req, res) => {
    const { token } = params(req, tokenParam);
    res.json(await auth.tokenInfo(deps, token));
  });

  r.post('/set-password', 'public', signing, mailLimit, async (req, res, next) => {
    const input = body(req, setPasswordBody);
    const user = await auth.setPasswordWithToken(deps, input.token, input.password, input.name);
    signIn(req, res, next, deps, user);
  });
}
