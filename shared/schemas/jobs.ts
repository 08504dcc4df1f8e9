// A job (an assignment of the work board): its states, its log and what the log may hold. The
// work board, the run sheet and the season report all speak of jobs in these terms.
import * as z from 'zod';

import type { CALL_OFF_REASONS, EventType } from './terms';

export {
  ASSIGNMENT_STATES,
  CALL_OFF_REASONS,
  EVENT_TYPES,
  PROBLEM_KINDS,
  STATE_LABELS,
  type AssignmentState,
  type EventType,
} from './terms';
/** What the log may also hold besides the operator's buttons. */
export type LoggedEventType = EventType | 'problem' | 'log-edited' | 'log-deleted';

/** A note on a job or a logged entry. */
export const jobNote = z.string().trim().max(1000, 'Use at most 1000 characters').nullable().optional();

export interface PersonRef {
  membershipId: number;
  name: string;
}

/** What was logged when the job was done; all null until it is. */
export interface AssignmentLog {
  startedAt: string | null;
  finishedAt: string | null;
  /** The acres the job counts: measured from its track when it has one, else typed. */
  acresDone: number | null;
  /** The acres typed at the finish (or by the owner's correction), shown as typed even when measured acres count. */
  acresTyped: number | null;
  /** Whether acresDone was measured from the job's track (see acresTyped for what was typed). */
  acresMeasured: boolean;
  hoursWorked: number | null;
  engineHoursStart: number | null;
  engineHoursEnd: number | null;
  callOffReason: (typeof CALL_OFF_REASONS)[number] | null;
}

export interface AssignmentEvent {
  id: number;
  type: LoggedEventType;
  at: string;
  by: string | null;
  acres: number | null;
  engineHours: number | null;
  reason: string | null;
  note: string | null;
  hazardId: number | null;
}
