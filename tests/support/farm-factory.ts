import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';
import type { Role } from '../../shared/schemas/auth';
import type { Db } from '../../server/db/knex';

export interface TestPerson {
  id: number;
  membershipId: number;
  email: string;
  name: string;
  password: string;
  role: Role;
}

export interface TestFarm {
  id: number;
  name: string;
  owner: TestPerson;
  operator: TestPerson;
  viewer: TestPerson;
}

const PASSWORD = 'correct-horse-battery';
// A cheap hash keeps the tests quick; the app's own hashing uses its full cost.
const HASH = bcrypt.hashSync(PASSWORD, 4);

/** A farm of its own for one test file, with an owner, an operator and a viewer. */
export async function makeFarm(db: Db, label = 'Test'): Promise<TestFarm> {
  const tag = randomBytes(4).toString('hex');
  const [farm] = await db('farms')
    .insert({ name: `${label} Farm ${tag}` })
    .returning(['id', 'name']);
  const person = async (role: Role): Promise<TestPerson> => {
    const email = `${role}-${tag}@furlong.test`;
    const name = `${role[0].toUpperCase()}${role.slice(1)} ${tag}`;
    const [user] = await db('users').insert({ email, name, password_hash: HASH }).returning('id');
    const [m] = await db('memberships')
      .insert({ farm_id: farm.id, user_id: user.id, role, status: 'active', joined_at: db.fn.now() })
      .returning('id');
    return { id: user.id, membershipId: m.id, email, name, password: PASSWORD, role };
  };
  return { id: farm.id, name: farm.name, owner: await person('owner'), operator: await person('operator'), viewer: await person('viewer') };
}
