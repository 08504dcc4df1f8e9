import * as z from 'zod';
import { email } from './common';

export const ROLES = ['owner', 'operator', 'viewer'] as const;
export const role = z.enum(ROLES);
export type Role = z.infer<typeof role>;

export const UNIT_SYSTEMS = ['us', 'metric'] as const;
export type UnitSystem = (typeof UNIT_SYSTEMS)[number];

export const loginBody = z.object({
  email,
  password: z.string().min(1, 'Enter your password').max(200),
});

export const forgotBody = z.object({ email });

/** Passwords: at least 10 characters (NIST SP 800-63B allows 8; we ask a little more). */
export const newPassword = z.string().min(10, 'Use at least 10 characters').max(200, 'Use at most 200 characters');

export const setPasswordBody = z.object({
  token: z.string().min(20).max(200),
  password: newPassword,
  name: z.string().trim().min(1).max(120).optional(),
});

export const tokenParam = z.object({ token: z.string().min(20).max(200) });

export const inviteBody = z.object({
  email,
  name: z.string().trim().min(1, 'Enter a name').max(120),
  role,
});

export const roleChangeBody = z.object({ role });

export interface SessionUser {
  id: number;
  email: string;
  name: string;
}

export interface SessionFarm {
  id: number;
  name: string;
  units: UnitSystem;
  /** IANA time zone of the farm: which day is today and tomorrow on its board and run sheets. */
  timeZone: string;
}

/** What `GET /api/auth/me` and `POST /api/auth/login` answer. */
export interface Me {
  user: SessionUser;
  farm: SessionFarm;
  role: Role;
  /** The membership the person acts in (their column on the board, their run sheet). */
  membershipId: number;
}

/** What `GET /api/auth/token/:token` tells the invitation / set-password page. */
export interface TokenInfo {
  kind: 'invite' | 'reset';
  email: string;
  name: string;
  farmName: string | null;
}

export interface Member {
  id: number;
  /** null while invited: an existing account's (older) id would tell the inviter it exists. */
  userId: number | null;
  name: string;
  email: string;
  role: Role;
  status: 'active' | 'invited';
  invitedAt: string | null;
}
