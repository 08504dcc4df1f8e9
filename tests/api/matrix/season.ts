import type { Case, Expect } from './types';

/** The season is read by the owner and viewers; operators are refused; another farm reads its own season. */
const readers = (ok: number): Expect => ({ anon: 401, owner: ok, operator: 403, viewer: ok, other: ok });

export const season: Record<string, Case> = {
  'GET /api/season': { expect: readers(200) },
  'GET /api/season/:year/summary': { path: () => '/api/season/2026/summary', expect: readers(200) },
  'GET /api/season/:year/export/:table.csv': { path: () => '/api/season/2026/export/fields.csv', expect: readers(200) },
};
