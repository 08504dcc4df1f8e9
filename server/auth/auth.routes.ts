import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { createPassport } from './passport';
import { forgotBody, loginBody, setPasswordBody, tokenParam } from '../../shared/schemas/auth';
import type { AppDeps } from '../app-deps';
import { AppError } from '../http/errors';
import type { Routes } from '../http/routes';
import { principal, type SessionPrincipal } from '../http/session-user';
import { body, params } from '../http/validate';
import * as auth from './auth.service';

const WINDOW_MS = 15 * 60_000;

function limiter(limit: number, key: (req: Request) => string, message: string): RequestHandler {
  return rateLimit({
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
const accountKey = (req: Request) => `account:${String(req.body?.email ?? '').trim().toLowerCase()}`;

function signIn(req: Request, res: Response, next: NextFunction, user: SessionPrincipal): void {
  // passport's req.login regenerates the session id, so a planted id is worthless (no fixation).
  req.login(user, (err) => (err ? next(err) : res.json(auth.toMe(user))));
}

export function authRoutes(r: Routes, deps: AppDeps, passport: ReturnType<typeof createPassport>): void {
  const perAccount = limiter(5, accountKey, 'Too many failed sign-ins for this account; wait 15 minutes and try again');
  const perAddress = limiter(30, ipKey, 'Too many failed sign-ins from this address; wait 15 minutes and try again');
  const mailLimit = rateLimit({
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
      signIn(req, res, next, user);
    })(req, res, next);
  });

  r.post('/logout', 'public', signing, (req, res, next) => {
    req.logout((err) => {
      if (err) return next(err);
      req.session.destroy(() => {
        res.clearCookie('furlong.sid', { path: '/' });
        res.status(204).end();
      });
    });
  });

  r.post('/forgot', 'public', mailLimit, async (req, res) => {
    const { email } = body(req, forgotBody);
    await auth.requestReset(deps, email);
    res.status(202).json({ message: 'If that address belongs to a Furlong account, a link to set a new password is on its way. Check your e-mail.' });
  });

  r.get('/token/:token', 'public', async (req, res) => {
    const { token } = params(req, tokenParam);
    res.json(await auth.tokenInfo(deps, token));
  });

  r.post('/set-password', 'public', signing, mailLimit, async (req, res, next) => {
    const input = body(req, setPasswordBody);
    const user = await auth.setPasswordWithToken(deps, input.token, input.password, input.name);
    signIn(req, res, next, user);
  });
}
