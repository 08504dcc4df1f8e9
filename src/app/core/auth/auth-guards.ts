import { inject } from '@angular/core';
import { type CanActivateFn, Router } from '@angular/router';
import type { Role } from '@shared/schemas/auth';
import { AuthStore } from './auth-store';
import { ROLE_HOME } from './role-home';

/**
 * Lets signed-in people through; others go to sign-in and come back to where they were going.
 * When the server could not say who this is (an outage), nobody is sent to sign-in: the app shows
 * the outage and a way to try again.
 */
export const signedIn: CanActivateFn = (_route, state) => {
  const auth = inject(AuthStore);
  if (auth.signedIn()) return true;
  if (auth.unavailable()) {
    auth.retryUrl = state.url;
    return false;
  }
  return inject(Router).createUrlTree(['/sign-in'], {
    queryParams: state.url === '/' ? {} : { next: state.url },
  });
};

/** Keeps signed-in people off the sign-in page: they go to their role's home. */
export const signedOut: CanActivateFn = () => {
  const role = inject(AuthStore).role();
  return role === null ? true : inject(Router).parseUrl(ROLE_HOME[role]);
};

/** Only the given roles may open the route; others are sent to their home. Use after `signedIn`. */
export function roleGuard(roles: readonly Role[]): CanActivateFn {
  return () => {
    const auth = inject(AuthStore);
    const router = inject(Router);
    const role = auth.role();
    if (role === null) return router.createUrlTree(['/sign-in']);
    return roles.includes(role) ? true : router.parseUrl(ROLE_HOME[role]);
  };
}
