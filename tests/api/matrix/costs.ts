import { DEFAULT_FUEL_GAL_PER_ACRE } from '../../../shared/costs';
import { insertMachine } from './board';
import type { Case, Expect } from './types';

/** Rates are money: the owner and viewers read them, operators are refused; another farm reads its own. */
const readers = (ok: number): Expect => ({ anon: 401, owner: ok, operator: 403, viewer: ok, other: ok });
/** Only the owner sets them; another farm's machine or person is not found. */
const ownerSets = (ok: number): Expect => ({ anon: 401, owner: ok, operator: 403, viewer: 403, other: 404 });

export const costs: Record<string, Case> = {
  'GET /api/costs': { expect: readers(200) },
  'PUT /api/costs/fuel': {
    body: { fuelPriceCents: 385, galPerAcre: DEFAULT_FUEL_GAL_PER_ACRE },
    expect: { anon: 401, owner: 200, operator: 403, viewer: 403, other: 200 },
  },
  'PUT /api/costs/machines/:id': {
    path: async (c) => `/api/costs/machines/${await insertMachine(c.t.db, c.farm.id)}`,
    body: { hourlyCents: 9500 },
    expect: ownerSets(200),
  },
  'PUT /api/costs/people/:id': {
    path: async (c) => `/api/costs/people/${await c.spareMember()}`,
    body: { hourlyCents: 2800 },
    expect: ownerSets(200),
  },
};
