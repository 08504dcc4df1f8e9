import type { Role } from '@shared/schemas/auth';

/** Where each role lands after signing in. Every role starts on Home until its own screens land. */
export const ROLE_HOME: Record<Role, string> = {
  owner: '/home',
  operator: '/home',
  viewer: '/home',
};

/** A `next` value from the query string, if it is a path inside Furlong (never another site). */
export function safeNext(next: string | null | undefined): string | null {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return null;
  if (next.startsWith('/sign-in')) return null;
  return next;
}
