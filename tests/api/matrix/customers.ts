import type { Db } from '../../../server/db/knex';
import type { Case, Ctx, Expect } from './types';

/** Customers are money matters: the owner and viewers read, operators are refused; another farm lists its own. */
const readers = (ok: number, other = ok): Expect => ({ anon: 401, owner: ok, operator: 403, viewer: ok, other });
/** Only the owner changes them; another farm's customer or field is not found. */
const ownerChanges = (ok: number, other = 404): Expect => ({ anon: 401, owner: ok, operator: 403, viewer: 403, other });

let n = 0;
/** A customer of the farm under test (direct insert). */
export async function insertCustomer(db: Db, farmId: number): Promise<number> {
  const [row] = await db('customers')
    .insert({ farm_id: farmId, name: `Neighbour ${Date.now()}-${++n}`, email: `neighbour-${n}@furlong.test` })
    .returning('id');
  return row.id as number;
}
const spareCustomer = (c: Ctx) => insertCustomer(c.t.db, c.farm.id);

export const customers: Record<string, Case> = {
  'GET /api/customers': { expect: readers(200) },
  'POST /api/customers': {
    body: { name: 'Matrix Neighbour', email: 'matrix-neighbour@furlong.test', address: '1 Range Road' },
    expect: ownerChanges(201, 201),
  },
  'GET /api/customers/:id': { path: async (c) => `/api/customers/${await spareCustomer(c)}`, expect: readers(200, 404) },
  'PATCH /api/customers/:id': {
    path: async (c) => `/api/customers/${await spareCustomer(c)}`,
    body: { address: '2 Range Road' },
    expect: ownerChanges(200),
  },
  'DELETE /api/customers/:id': { path: async (c) => `/api/customers/${await spareCustomer(c)}`, expect: ownerChanges(204) },
  'PUT /api/fields/:id/customer': {
    path: async (c) => `/api/fields/${await c.spareField()}/customer`,
    body: { customerId: null },
    expect: ownerChanges(200),
  },
};
