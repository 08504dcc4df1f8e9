import type { RequestHandler } from 'express';
import { Passport } from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { AppDeps } from '../app-deps';
import type { SessionStore } from '../http/session';
import type { SessionPrincipal } from '../http/session-user';
import { verifyLogin } from './auth.service';

interface StoredUser {
  userId: number;
  membershipId: number;
  /** When this sign-in happened (ms since 1970); sessions from before it was kept count as 0. */
  signedInAt?: number;
}

/**
 * One passport instance per app, for signing in and out (the routes that do so use its
 * `initialize()`). The session keeps only ids; `restorePrincipal` reloads the membership on
 * every request, so a removed member or a changed role takes effect at once.
 */
export function createPassport(deps: AppDeps): InstanceType<typeof Passport> {
  const passport = new Passport();
  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password', session: true }, (email, password, done) => {
      verifyLogin(deps, email, password).then((p) => done(null, p), done);
    }),
  );
  passport.serializeUser((user, done) => {
    const p = user as SessionPrincipal;
    done(null, { userId: p.id, membershipId: p.membershipId, signedInAt: Date.now() } satisfies StoredUser);
  });
  return passport;
}

/**
 * Who is signed in, for every API request: what `passport.session()` does, without the sign-in
 * and sign-out helpers it attaches to each request (only the auth routes need them). Measured
 * with `npm run bench -- server`, that set-up cost about as much as the rest of a cached request.
 * A session whose membership is no longer active loses its sign-in, as with passport.
 */
export function restorePrincipal(sessions: Pick<SessionStore, 'principal'>): RequestHandler {
  return (req, _res, next) => {
    const login = (req.session as { passport?: { user?: StoredUser } } | undefined)?.passport;
    if (!login?.user) return next();
    sessions.principal(login.user.userId, login.user.membershipId, new Date(login.user.signedInAt ?? 0)).then((p) => {
      if (p) req.user = p;
      else delete login.user;
      next();
    }, next);
  };
}
