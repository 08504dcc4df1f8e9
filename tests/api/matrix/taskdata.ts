// Task data for the terminal: a board day's (the owner's) and one job's (the owner's and its operator's).
import { insertImplement, insertMachine } from './board';
import { ownerOnly, type Case, type Ctx, type Expect } from './types';

let dayOffset = Math.floor(Math.random() * 3000);
/** A day of its own in 2034, away from the other matrix rows' days. */
const freshDay = () => new Date(Date.UTC(2034, 0, 1) + dayOffset++ * 86_400_000).toISOString().slice(0, 10);

/** A harrowing job for the farm's operator on a fresh day. */
async function spareJob(c: Ctx): Promise<{ id: number; day: string }> {
  const db = c.t.db;
  const day = freshDay();
  const [a] = await db('assignments')
    .insert({
      farm_id: c.farm.id,
      day,
      field_id: await c.spareField(),
      operation: 'harrowing',
      operator_id: c.farm.operator.membershipId,
      machine_id: await insertMachine(db, c.farm.id),
      implement_id: await insertImplement(db, c.farm.id),
      run_order: 1,
      acres_planned: 1,
    })
    .returning('id');
  return { id: a.id, day };
}

/** The job's operator and the owner; a viewer may not; another farm does not see the job. */
const operatorAndOwner = (ok: number): Expect => ({ anon: 401, owner: ok, operator: ok, viewer: 403, other: 404 });

export const taskdata: Record<string, Case> = {
  // Another farm's owner asks for the same day of their own board: it holds no jobs.
  'GET /api/board/:date/taskdata.zip': {
    path: async (c) => `/api/board/${(await spareJob(c)).day}/taskdata.zip`,
    expect: ownerOnly(200, 404),
  },
  'GET /api/assignments/:id/taskdata.zip': {
    path: async (c) => `/api/assignments/${(await spareJob(c)).id}/taskdata.zip`,
    expect: operatorAndOwner(200),
  },
};
