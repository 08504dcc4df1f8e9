import type { Db } from '../../../server/db/knex';
import { members, ownerOnly, type Case, type Ctx, type Expect } from './types';

let tag = 0;
const unique = () => `${Date.now().toString(36)}-${++tag}`;

/** A tractor on the farm (direct insert), for tests that need one quickly. */
export async function insertMachine(db: Db, farmId: number, cols: Record<string, unknown> = {}): Promise<number> {
  const [m] = await db('machines')
    .insert({ farm_id: farmId, name: `Tractor ${unique()}`, kind: 'tractor-4wd', power_hp: 400, engine_hours: 1000, ...cols })
    .returning('id');
  return m.id;
}

/** A harrow on the farm (direct insert) that any tractor may pull. */
export async function insertImplement(db: Db, farmId: number, cols: Record<string, unknown> = {}): Promise<number> {
  const [i] = await db('implements')
    .insert({ farm_id: farmId, name: `Harrow ${unique()}`, kind: 'harrow', width_m: 25.6, operations: ['harrowing'], ...cols })
    .returning('id');
  return i.id;
}

let dayOffset = Math.floor(Math.random() * 3000);
/** A day of its own (version 0, no board row yet), so one matrix call never makes another stale. */
const freshDay = () => new Date(Date.UTC(2031, 0, 1) + dayOffset++ * 86_400_000).toISOString().slice(0, 10);
/**
 * A day of its own already past, for a job that may be started now (a start waits for the job's day):
 * from 2001 on, so even the last of the random offsets (3000 days and the calls after) is years gone.
 */
const freshPastDay = () => new Date(Date.UTC(2001, 0, 1) + dayOffset++ * 86_400_000).toISOString().slice(0, 10);

/** An open report from the field on a spare job of the farm. */
async function openReport(c: Ctx): Promise<number> {
  const [e] = await c.t
    .db('assignment_events')
    .insert({
      farm_id: c.farm.id,
      assignment_id: await spareJob(c),
      type: 'problem',
      reason: 'other',
      note: 'Gate left open',
      review: 'open',
    })
    .returning('id');
  return e.id;
}

/** A harrowing job for the farm's operator on a fresh day; `finished` gives it a logged finish. */
async function spareJob(c: Ctx, finished = false, day = freshDay()): Promise<number> {
  const db = c.t.db;
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
      ...(finished ? { state: 'finished', acres_done: 1, hours_worked: 0.2, started_at: db.fn.now(), finished_at: db.fn.now() } : {}),
    })
    .returning('id');
  return a.id;
}

/** The job's operator and the owner may log on it; a viewer may not; another farm does not see it. */
const operatorAndOwner = (ok: number): Expect => ({ anon: 401, owner: ok, operator: ok, viewer: 403, other: 404 });

export const board: Record<string, Case> = {
  'GET /api/fleet/machines': { expect: members(200) },
  'POST /api/fleet/machines': { body: {}, expect: ownerOnly(400) },
  'GET /api/fleet/machines/:id': {
    path: async (c) => `/api/fleet/machines/${await insertMachine(c.t.db, c.farm.id)}`,
    expect: members(200, 404),
  },
  'PATCH /api/fleet/machines/:id': {
    path: async (c) => `/api/fleet/machines/${await insertMachine(c.t.db, c.farm.id)}`,
    body: { notes: 'greased' },
    expect: ownerOnly(200, 404),
  },
  'DELETE /api/fleet/machines/:id': {
    path: async (c) => `/api/fleet/machines/${await insertMachine(c.t.db, c.farm.id)}`,
    expect: ownerOnly(204, 404),
  },
  'GET /api/fleet/implements': { expect: members(200) },
  'POST /api/fleet/implements': { body: {}, expect: ownerOnly(400) },
  'GET /api/fleet/implements/:id': {
    path: async (c) => `/api/fleet/implements/${await insertImplement(c.t.db, c.farm.id)}`,
    expect: members(200, 404),
  },
  'PATCH /api/fleet/implements/:id': {
    path: async (c) => `/api/fleet/implements/${await insertImplement(c.t.db, c.farm.id)}`,
    body: { notes: 'new tines' },
    expect: ownerOnly(200, 404),
  },
  'DELETE /api/fleet/implements/:id': {
    path: async (c) => `/api/fleet/implements/${await insertImplement(c.t.db, c.farm.id)}`,
    expect: ownerOnly(204, 404),
  },
  'GET /api/crew': { expect: members(200) },
  'PUT /api/crew/:membershipId/skills/:operation': {
    path: async (c) => `/api/crew/${await c.spareMember()}/skills/harrowing`,
    body: { level: 'learning' },
    expect: ownerOnly(200, 404),
  },
  'GET /api/board': { path: () => '/api/board?date=2031-01-01', expect: ownerOnly(200) },
  'POST /api/board/:date/order': { path: () => '/api/board/2031-01-01/order', body: { columns: [] }, expect: ownerOnly(400) },
  'POST /api/board/:date/publish': { path: () => `/api/board/${freshDay()}/publish`, expect: ownerOnly(409) },
  'POST /api/assignments': { body: {}, expect: ownerOnly(400) },
  'PATCH /api/assignments/:id': {
    path: async (c) => `/api/assignments/${await spareJob(c)}?version=0`,
    body: { note: 'Start at the east gate' },
    expect: ownerOnly(200, 404),
  },
  'DELETE /api/assignments/:id': { path: async (c) => `/api/assignments/${await spareJob(c)}?version=0`, expect: ownerOnly(200, 404) },
  'POST /api/assignments/:id/events': {
    path: async (c) => `/api/assignments/${await spareJob(c, false, freshPastDay())}/events`,
    body: { type: 'start' },
    expect: operatorAndOwner(201),
  },
  'POST /api/assignments/:id/problems': {
    path: async (c) => `/api/assignments/${await spareJob(c)}/problems`,
    body: { kind: 'other', note: 'Gate left open' },
    expect: operatorAndOwner(201),
  },
  'PATCH /api/assignments/:id/log': {
    path: async (c) => `/api/assignments/${await spareJob(c, true)}/log`,
    body: { hoursWorked: 0.3 },
    expect: ownerOnly(200, 404),
  },
  'DELETE /api/assignments/:id/log': { path: async (c) => `/api/assignments/${await spareJob(c, true)}/log`, expect: ownerOnly(200, 404) },
  'GET /api/run-sheet': {
    path: () => '/api/run-sheet?date=2031-01-01',
    expect: { anon: 401, owner: 200, operator: 200, viewer: 403, other: 200 },
  },
  'POST /api/run-sheet/outbox': {
    // A job no farm has: the batch is taken (200) and that action answered 404 inside it, for
    // everyone allowed in; the access check comes first for the rest.
    body: {
      events: [
        { assignmentId: 2_000_000_000, type: 'start', clientEventId: '3f1c7a52-9d2e-4b8a-a1c4-6e0d2f9b7c15', at: '2026-05-01T08:00:00Z' },
      ],
    },
    expect: { anon: 401, owner: 200, operator: 200, viewer: 403, other: 200 },
  },
  'GET /api/reports': { expect: ownerOnly(200) },
  'POST /api/reports/:id/confirm': {
    path: async (c) => `/api/reports/${await openReport(c)}/confirm`,
    expect: ownerOnly(200, 404),
  },
  'POST /api/reports/:id/dismiss': {
    path: async (c) => `/api/reports/${await openReport(c)}/dismiss`,
    expect: ownerOnly(200, 404),
  },
};
