import { DEFAULT_LIMITS } from '../../../shared/weather/limits';
import { members, ownerOnly, type Case } from './types';

export const weather: Record<string, Case> = {
  // Another farm's field is not found; a field without a forecast yet still answers (stale, no hours).
  'GET /api/weather/fields/:fieldId': { path: async (c) => `/api/weather/fields/${await c.spareField()}`, expect: members(200, 404) },
  // Each farm reads and (its owner) sets its own limits.
  'GET /api/weather/limits': { expect: members(200) },
  'PUT /api/weather/limits': { body: DEFAULT_LIMITS, expect: ownerOnly(200) },
};
