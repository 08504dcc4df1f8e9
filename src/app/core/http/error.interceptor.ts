import { HttpErrorResponse, type HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';
import { AuthStore } from '../auth/auth-store';
import { toSignIn } from '../auth/to-sign-in';
import { ApiError, isApiErrorBody } from './api-error';

/** No answer at all (status 0): the network, or the server is down. Nothing typed is lost. */
export const OFFLINE_MESSAGE = "Cannot reach Furlong's server; your work is not lost. Check the connection and try again.";

/** Calls whose 401 is an answer ("not signed in", "wrong password"), not an expired session. */
const SESSION_PROBES = /\/api\/auth\/(me|login)(?:[?#]|$)/;

const FALLBACK_MESSAGES: Record<number, string> = {
  400: 'Furlong could not accept that request.',
  401: 'Your session has ended — sign in again.',
  403: 'Your role does not allow that.',
  404: 'That was not found.',
  409: 'That conflicts with what is already saved.',
  410: 'That link is no longer valid.',
  413: 'That file is too large.',
  422: 'Check the highlighted entries.',
  429: 'Too many attempts — wait a minute and try again.',
};

/**
 * Turns every HTTP failure into an ApiError carrying the server's message, so components never
 * see raw responses; an expired session sends the person to sign-in and back afterwards. Only a
 * 401 does that: a 503 (the farm's database not answering) or no answer at all keeps the person
 * signed in, with the server's message or OFFLINE_MESSAGE.
 */
export const errorInterceptor: HttpInterceptorFn = (req, next) => {
  const auth = inject(AuthStore);
  const router = inject(Router);

  return next(req).pipe(
    catchError((failure: unknown) => {
      if (!(failure instanceof HttpErrorResponse)) return throwError(() => failure);
      const error = toApiError(failure);
      if (failure.status === 401 && !SESSION_PROBES.test(req.url)) {
        auth.clear();
        toSignIn(router);
      }
      return throwError(() => error);
    }),
  );
};

export function toApiError(failure: HttpErrorResponse): ApiError {
  const body: unknown = failure.error;
  // With no network the service worker answers a request it could not send with a bare 504
  // (Angular's ngsw-worker.js, safeFetch); the server never sends a 504 of its own.
  if (failure.status === 0 || (failure.status === 504 && !isApiErrorBody(body))) return new ApiError(0, 'offline', OFFLINE_MESSAGE);
  if (isApiErrorBody(body)) {
    const { code, message, fields, ...details } = body.error;
    return new ApiError(failure.status, code, message, fields ?? {}, details);
  }
  const fallback =
    FALLBACK_MESSAGES[failure.status] ??
    (failure.status >= 500 ? 'Furlong hit a problem on the server. Try again in a moment.' : 'Something went wrong. Try again.');
  return new ApiError(failure.status, `http_${failure.status}`, fallback);
}
