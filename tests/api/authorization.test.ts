// The authorization matrix: every API route × {anonymous, owner, operator, viewer, a member
// of another farm} → the expected status. A route without an entry here fails the test.
import type { RouteEntry } from '../../server/http/routes';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { matrixContext } from './matrix/context';
import { Client, startTestApp, type TestApp } from '../support/test-app';

import { MATRIX, type Who } from './matrix';
import { MATRIX_WALK_MS } from './matrix/types';

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

  // Every route five times over, heavy ones (imports, task data, coverage) included: a walk, not one request.
  it(
    'when each principal calls each route, then the server answers the expected status',
    async () => {
      const ctx = matrixContext(t, farm);
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
          if (res.status !== c.expect[who])
            failures.push(`${key} as ${who}: got ${res.status}, expected ${c.expect[who]} ${JSON.stringify(res.body)}`);
          if (res.status >= 400) expect(res.body.error?.message).toEqual(expect.any(String));
        }
      }
      expect(failures).toEqual([]);
    },
    MATRIX_WALK_MS,
  );
});
