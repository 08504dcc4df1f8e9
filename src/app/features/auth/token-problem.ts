import { ApiError } from '../../core/http/api-error';

/**
 * What to tell someone whose e-mailed link cannot be used: the server's message for an expired or
 * used link (410), our own words for an unknown one (404) or a link without its token.
 */
export function linkProblem(error: unknown): string | null {
  if (error === undefined || error === null) return null;
  if (error === 'missing') return 'This link is incomplete. Open it again from the e-mail.';
  if (error instanceof ApiError) {
    if (error.status === 404) return 'This link is not valid. Ask the farm owner for a new one.';
    return error.message;
  }
  return 'This link cannot be used. Ask the farm owner for a new one.';
}
