import type { TestFarm } from '../../support/farm-factory';
import type { TestApp } from '../../support/test-app';

export type Who = 'anon' | 'owner' | 'operator' | 'viewer' | 'other';
export type Expect = Record<Who, number>;

/** What a matrix case may use to build its path: the farm under test and its database. */
export interface Ctx {
  farm: TestFarm;
  t: TestApp;
  /** A fresh invited member of the farm, for routes that change or remove one. */
  spareMember: () => Promise<number>;
  /** A fresh field of the farm (a small rectangle), for routes that change or remove one. */
  spareField: () => Promise<number>;
}

export interface Case {
  path?: (c: Ctx) => string | Promise<string>;
  body?: object;
  /** Sign in a new session for this call (for routes that end the session). */
  fresh?: boolean;
  expect: Expect;
}

export const all = (status: number): Expect => ({ anon: status, owner: status, operator: status, viewer: status, other: status });
/** Only the owner; a member of another farm gets `otherFarm` (404 for this farm's items). */
export const ownerOnly = (ok: number, otherFarm = ok): Expect => ({ anon: 401, owner: ok, operator: 403, viewer: 403, other: otherFarm });
/** Any signed-in member; a member of another farm gets `otherFarm`. */
export const members = (ok: number, otherFarm = ok): Expect => ({ anon: 401, owner: ok, operator: ok, viewer: ok, other: otherFarm });

/** How long one walk over every matrix case may take: hundreds of requests, heavy ones included. */
export const MATRIX_WALK_MS = 180_000;
