import type { TestFarm } from '../../support/farm-factory';
import type { TestApp } from '../../support/test-app';
import { spareField } from './fields';
import type { Ctx } from './types';

/** What the matrix cases build their paths from: the farm under test, its database, spare rows. */
export function matrixContext(t: TestApp, farm: TestFarm): Ctx {
  return {
    farm,
    t,
    spareMember: async () => {
      const [u] = await t
        .db('users')
        .insert({ email: `spare-${Date.now()}-${Math.random()}@furlong.test`, name: 'Spare' })
        .returning('id');
      const [m] = await t
        .db('memberships')
        .insert({ farm_id: farm.id, user_id: u.id, role: 'operator', status: 'invited' })
        .returning('id');
      return m.id as number;
    },
    spareField: () => spareField({ t, farm }),
  };
}
