import { Passport } from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { AppDeps } from '../app-deps';
import type { SessionPrincipal } from '../http/session-user';
import { verifyLogin } from './auth.service';
import { loadPrincipal } from './users.repository';

interface StoredUser {
  userId: number;
  membershipId: number;
}

/**
 * One passport instance per app. The session keeps only ids; every request reloads the
 * membership, so a removed member or a changed role takes effect at once.
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
    done(null, { userId: p.id, membershipId: p.membershipId } satisfies StoredUser);
  });
  passport.deserializeUser((stored: StoredUser, done) => {
    loadPrincipal(deps.db, stored.userId, stored.membershipId).then((p) => done(null, p ?? false), done);
  });
  return passport;
}
