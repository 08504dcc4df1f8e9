// Row types of the tables, as Knex returns them.
import type { Role } from '../../shared/schemas/auth';

export interface DbFarmRow {
  id: number;
  name: string;
  units: 'us' | 'metric';
  day_hours_limit: number;
  created_at: Date;
}

export interface DbUserRow {
  id: number;
  email: string;
  name: string;
  password_hash: string | null;
  created_at: Date;
}

export interface DbMembershipRow {
  id: number;
  farm_id: number;
  user_id: number;
  role: Role;
  status: 'invited' | 'active' | 'removed';
  invited_at: Date | null;
  joined_at: Date | null;
  removed_at: Date | null;
}

export interface DbAuthTokenRow {
  id: number;
  user_id: number;
  farm_id: number | null;
  kind: 'invite' | 'reset';
  token_hash: string;
  expires_at: Date;
  used_at: Date | null;
  created_at: Date;
}

export interface DbMailRow {
  id: number;
  farm_id: number | null;
  kind: string;
  ref: string | null;
  to_address: string;
  subject: string;
  text_body: string;
  html_body: string | null;
  status: 'queued' | 'sent' | 'failed';
  attempts: number;
  next_attempt_at: Date;
  last_error: string | null;
  sent_at: Date | null;
  created_at: Date;
}
