import type { Case, Expect } from './types';

/** Rates are money: the owner and viewers read them, operators are refused; another farm reads its own card. */
const readers = (ok: number): Expect => ({ anon: 401, owner: ok, operator: 403, viewer: ok, other: ok });
/** Only the owner sets them; another farm sets its own card. */
const ownerSets = (ok: number): Expect => ({ anon: 401, owner: ok, operator: 403, viewer: 403, other: ok });

export const rateCard: Record<string, Case> = {
  'GET /api/rate-card': { expect: readers(200) },
  'PUT /api/rate-card/:operation': {
    path: () => '/api/rate-card/harrowing',
    body: { unit: 'acre', rateCents: 650 },
    expect: ownerSets(200),
  },
  'DELETE /api/rate-card/:operation': { path: () => '/api/rate-card/harrowing', expect: ownerSets(200) },
};
