import { all, members, ownerOnly, type Case } from './types';

export const foundation: Record<string, Case> = {
  'GET /api/health': { expect: all(200) },
  'GET /api/config': { expect: all(200) },
  'GET /api/auth/me': { expect: members(200) },
  'POST /api/auth/login': { body: {}, expect: all(400) },
  'POST /api/auth/logout': { fresh: true, expect: all(204) },
  'POST /api/auth/forgot': { body: { email: 'nobody@furlong.test' }, expect: all(202) },
  'GET /api/auth/token/:token': { path: () => '/api/auth/token/' + 'x'.repeat(43), expect: all(404) },
  'POST /api/auth/set-password': { body: { token: 'x'.repeat(43), password: 'long-enough-password' }, expect: all(404) },
  'GET /api/members': { expect: ownerOnly(200) },
  'POST /api/members/invite': { body: {}, expect: ownerOnly(400) },
  'PATCH /api/members/:id': {
    path: async (c) => `/api/members/${await c.spareMember()}`,
    body: { role: 'viewer' },
    expect: ownerOnly(200, 404),
  },
  'DELETE /api/members/:id': { path: async (c) => `/api/members/${await c.spareMember()}`, expect: ownerOnly(204, 404) },
  'GET /api/background/failed': { expect: ownerOnly(200) },
  'POST /api/background/failed/:id/retry': {
    path: () => '/api/background/failed/00000000-0000-4000-8000-000000000000/retry',
    expect: ownerOnly(404),
  },
  'GET /api/farm': { expect: members(200) },
  'PATCH /api/farm': { body: { dayHoursLimit: 12 }, expect: ownerOnly(200) },
};
