import { all, type Case } from './types';

/** The API's own description is public: it describes the routes and holds no farm data. */
export const openapi: Record<string, Case> = {
  'GET /api/openapi.json': { expect: all(200) },
  'GET /api/docs': { expect: all(200) },
};
