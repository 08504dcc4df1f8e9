import type { Request } from 'express';
import type { Role, UnitSystem } from '../../shared/schemas/auth';
import { AppError } from './errors';

/** The signed-in person as every route sees them: one user acting in one farm. */
export interface SessionPrincipal {
  id: number;
  email: string;
  name: string;
  membershipId: number;
  farmId: number;
  farmName: string;
  units: UnitSystem;
  /** IANA time zone of the farm. */
  timeZone: string;
  role: Role;
  /**
   * The farm's data revision as this request began (see the farm_revisions migration): read with
   * the principal, so a cached reading can be checked without another query.
   */
  farmRevision: string;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SessionPrincipal {}
  }
}

/** The signed-in principal; routes behind `requireAccess` always have one. */
export function principal(req: Request): SessionPrincipal {
  if (!req.user) throw new AppError(401, 'signed_out', 'Sign in to continue');
  return req.user;
}
