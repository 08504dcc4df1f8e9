import { ApiError, messageOf } from '../../core/http/api-error';

/** True when the request may not have reached the server: no signal, a timeout, a server hiccup. */
export const worthRetrying = (err: unknown): boolean =>
  !(err instanceof ApiError) || err.status === 0 || err.status === 408 || err.status >= 500;

/**
 * For a poor connection, the message that says nothing typed is lost and the same button sends it
 * again; null for a refusal from the server (a form places that on its boxes).
 */
export function retryMessage(err: unknown, button: string): string | null {
  return worthRetrying(err) ? `${messageOf(err).replace(/[.!]$/, '')}. Not sent yet, nothing is lost: tap ${button} to try again.` : null;
}
