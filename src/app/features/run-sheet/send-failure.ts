import type { FormGroup } from '@angular/forms';
import { ApiError, messageOf } from '../../core/http/api-error';
import { applyServerErrors } from '../../shared/forms/server-errors';

/** True when the request may not have reached the server: no signal, a timeout, a server hiccup. */
export const worthRetrying = (err: unknown): boolean =>
  !(err instanceof ApiError) || err.status === 0 || err.status === 408 || err.status >= 500;

/**
 * The message to show when a logged action did not go through: the server's words, and for a poor
 * connection a reminder that nothing typed is lost and the same button sends it again.
 */
export function sendFailure(err: unknown, button: string, form?: FormGroup): string | null {
  if (worthRetrying(err)) return `${messageOf(err).replace(/[.!]$/, '')}. Not sent yet, nothing is lost: tap ${button} to try again.`;
  return form ? applyServerErrors(form, err) : messageOf(err);
}
