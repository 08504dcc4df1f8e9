// The authorization matrix: every API route × {anonymous, owner, operator, viewer, a member
// of another farm} → the expected status. A route without an entry here fails the test.
import type { RouteEntry } from '../../server/http/routes';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { Client, startTestApp, type TestApp } from '../support/test-app';

type Who = 'anon' | 'owner' | 'operator' | 'viewer' | 'other';
type Expect = Record<Who, number>;

interface Ctx {
  farm: TestFarm;
  t: TestApp;
  /** A fresh invited member of the farm, for routes that change or remove one. */
  spareMember: () => Promise<number>;
}

interface Case {
  path?: (c: Ctx) => string | Promise<string>;
  body?: object;
  /** Sign in a new session for this call (for routes that end the session). */
  fresh?: boolean;
  expect: Expect;
}

const all = (status: number): Expect => ({ anon: status, owner: status, operator: status, viewer: status, other: status });
const ownerOnly = (ok: number, otherFarm = ok): Expect => ({ anon: 401, owner: ok, operator: 403, viewer: 403, other: otherFarm });
const members = (ok: number): Expect => ({ anon: 401, owner: ok, operator: ok, viewer: ok, other: ok });

export const MATRIX: Record<string, Case> = {
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
  'DELETE /api/members/:id': {
    path: async (c) => `/api/members/${await c.spareMember()}`,
    expect: ownerOnly(204, 404),
  },
};

const keyOf = (r: RouteEntry) => `${r.method.toUpperCase()} ${r.path.replace(/\/$/, '')}`;

describe('authorization matrix', () => {
  let t: TestApp;
  let farm: TestFarm;
  let other: TestFarm;
  let routes: RouteEntry[];
  const clients = {} as Record<Who, Client>;

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Matrix');
    other = await makeFarm(t.db, 'Elsewhere');
    routes = t.app.locals.routes as RouteEntry[];
    clients.anon = new Client(t.app);
    await clients.anon.prime();
    for (const who of ['owner', 'operator', 'viewer'] as const) {
      clients[who] = new Client(t.app);
      await clients[who].signIn(farm[who].email, farm[who].password);
    }
    clients.other = new Client(t.app);
    await clients.other.signIn(other.owner.email, other.owner.password);
  });
  afterAll(() => t.close());

  it('when a route is registered, then the matrix has an entry for it (and no stale entries)', () => {
    const registered = routes.map(keyOf).sort();
    expect(registered).toEqual(Object.keys(MATRIX).sort());
  });

  it('when each principal calls each route, then the server answers the expected status', async () => {
    const ctx: Ctx = {
      farm,
      t,
      spareMember: async () => {
        const [u] = await t.db('users').insert({ email: `spare-${Date.now()}-${Math.random()}@furlong.test`, name: 'Spare' }).returning('id');
        const [m] = await t.db('memberships').insert({ farm_id: farm.id, user_id: u.id, role: 'operator', status: 'invited' }).returning('id');
        return m.id as number;
      },
    };
    const failures: string[] = [];
    for (const route of routes) {
      const key = keyOf(route);
      const c = MATRIX[key];
      for (const who of Object.keys(c.expect) as Who[]) {
        let client = clients[who];
        if (c.fresh && who !== 'anon') {
          client = new Client(t.app);
          const person = who === 'other' ? other.owner : farm[who];
          await client.signIn(person.email, person.password);
        }
        const path = c.path ? await c.path(ctx) : route.path;
        const res = await client[route.method](path, c.body);
        if (res.status !== c.expect[who]) failures.push(`${key} as ${who}: got ${res.status}, expected ${c.expect[who]} ${JSON.stringify(res.body)}`);
        if (res.status >= 400) expect(res.body.error?.message).toEqual(expect.any(String));
      }
    }
    expect(failures).toEqual([]);
  });
});
