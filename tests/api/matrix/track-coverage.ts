import type { Case, Ctx } from './types';
import { insertImplement, insertMachine } from './board';

let day = 0;

/** A harrowing job for the farm's operator (direct insert) on its own far-future day. */
async function job(c: Ctx): Promise<number> {
  const [a] = await c.t
    .db('assignments')
    .insert({
      farm_id: c.farm.id,
      day: `2091-03-${String((day++ % 28) + 1).padStart(2, '0')}`,
      field_id: await c.spareField(),
      operation: 'harrowing',
      operator_id: c.farm.operator.membershipId,
      machine_id: await insertMachine(c.t.db, c.farm.id),
      implement_id: await insertImplement(c.t.db, c.farm.id),
      run_order: day,
      acres_planned: 1,
    })
    .returning('id');
  return a.id;
}

export const trackCoverage: Record<string, Case> = {
  // No file sent: the owner and the job's operator get 400 (choose a file); nothing else is read.
  'POST /api/assignments/:id/coverage': {
    path: async (c) => `/api/assignments/${await job(c)}/coverage`,
    expect: { anon: 401, owner: 400, operator: 400, viewer: 403, other: 404 },
  },
  // The job's map: the owner and the job's operator read it (null coverage until a track is sent).
  'GET /api/assignments/:id/coverage': {
    path: async (c) => `/api/assignments/${await job(c)}/coverage`,
    expect: { anon: 401, owner: 200, operator: 200, viewer: 403, other: 404 },
  },
};

// One point taken now; a chunk id of its own (a fresh job each time, so never a resend of another job's).
const chunk = () => ({
  chunkId: '6f1c2b9e-8d4a-4c3e-9b7a-2f5e1d0c3a41',
  points: [{ at: new Date().toISOString(), lat: 47.6, lon: -99.9, accuracyM: 5 }],
});

export const phoneTrack: Record<string, Case> = {
  // Only the job's operator's phone records its track: the owner too is refused (403).
  'POST /api/assignments/:id/track-points': {
    path: async (c) => `/api/assignments/${await job(c)}/track-points`,
    get body() {
      return chunk();
    },
    expect: { anon: 401, owner: 403, operator: 201, viewer: 403, other: 404 },
  },
  // The owner and the job's operator read the points (none yet).
  'GET /api/assignments/:id/track-points': {
    path: async (c) => `/api/assignments/${await job(c)}/track-points`,
    expect: { anon: 401, owner: 200, operator: 200, viewer: 403, other: 404 },
  },
  // No phone track recorded: the owner and the job's operator get 409 (nothing to measure).
  'POST /api/assignments/:id/coverage/from-phone-track': {
    path: async (c) => `/api/assignments/${await job(c)}/coverage/from-phone-track`,
    expect: { anon: 401, owner: 409, operator: 409, viewer: 403, other: 404 },
  },
};
