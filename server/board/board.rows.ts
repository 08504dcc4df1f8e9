// Row types of the board tables, as Knex returns them (DATE as 'YYYY-MM-DD', NUMERIC as number).
// A job's own rows (assignments, their events) are in server/jobs/jobs.rows.ts.

export interface DbBoardDayRow {
  farm_id: number;
  day: string;
  version: number;
  published_at: Date | null;
}

/** Pass plans are the plan feature's rows; the board reads them for a card's hours. */
export type { DbPassPlanRow } from '../plans/plans.repository';

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
