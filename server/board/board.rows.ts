// Row types of the board tables, as Knex returns them (DATE as 'YYYY-MM-DD', NUMERIC as number).
// A job's own rows (assignments, their events) are in server/jobs/jobs.rows.ts.
import type { Operation } from '../../shared/operations';

export interface DbBoardDayRow {
  farm_id: number;
  day: string;
  version: number;
  published_at: Date | null;
}

export interface DbPassPlanRow {
  id: number;
  farm_id: number;
  field_id: number;
  operation: Operation;
  implement_id: number | null;
  width_m: number;
  headland_passes: number;
  heading_deg: number | null;
  coverage: 'full' | 'gaps-ok';
  speed_mph: number;
  efficiency: number;
  turn_seconds: number;
  summary: Record<string, unknown>;
  updated_at: Date;
}

export interface DbWorkOrderRow {
  farm_id: number;
  day: string;
  membership_id: number;
  kind: 'order' | 'withdrawn';
  content_hash: string;
  mail_id: number | null;
  board_version: number;
  /** What the order said of each job (work-order.content.ts `orderMarks`); null when published before it was kept. */
  jobs: Array<{ id: number; at: string; body: string }> | null;
  published_at: Date;
}
