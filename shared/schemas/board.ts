// Work board, run sheet and work orders: request bodies and the shapes the API answers.
import type { FeatureCollection, MultiPolygon, Polygon } from 'geojson';
import { z } from 'zod';
import { OPERATIONS, type Operation } from '../operations';
import type { ImplementKind } from '../plan/implement-defaults';
import { DB_INT_MAX, dbId, dbIdNumber, isoDate } from './common';
import { HAZARD_KINDS } from './fields';
import type { MachineKind } from './fleet';

export const ASSIGNMENT_STATES = ['planned', 'underway', 'paused', 'finished', 'called-off'] as const;
export type AssignmentState = (typeof ASSIGNMENT_STATES)[number];
export const STATE_LABELS: Record<AssignmentState, string> = {
  planned: 'planned',
  underway: 'underway',
  paused: 'paused',
  finished: 'finished',
  'called-off': 'called off',
};

export const EVENT_TYPES = ['start', 'pause', 'resume', 'finish', 'call-off'] as const;
export type EventType = (typeof EVENT_TYPES)[number];
/** What the log may also hold besides the operator's buttons. */
export type LoggedEventType = EventType | 'problem' | 'log-edited' | 'log-deleted';

export const CALL_OFF_REASONS = ['weather', 'breakdown', 'other'] as const;
export const PROBLEM_KINDS = ['breakdown', 'hazard', 'other'] as const;

/** A board day's first job starts here when no times are set (minutes after midnight). */
export const DAY_START_MIN = 7 * 60;

/** 'HH:MM', 24-hour clock. */
export const timeOfDay = z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'Use a time written as HH:MM (24-hour clock)');
const id = dbIdNumber;
const operation = z.enum(OPERATIONS, { message: `Operation must be one of: ${OPERATIONS.join(', ')}` });
const note = z.string().trim().max(1000, 'Use at most 1000 characters').nullable().optional();
/** The board version the client last saw; may come in the body or an `If-Match` header instead. */
const version = z.number().int().min(0).max(DB_INT_MAX, 'That board version does not exist; reload the work board').optional();
const endAfterStart = (v: { startTime?: string | null; endTime?: string | null }) => !(v.startTime && v.endTime) || v.endTime > v.startTime;
const END_MESSAGE = { message: 'The end time must be after the start time', path: ['endTime'] };

export const boardQuery = z.object({ date: isoDate });
export const boardDateParam = z.object({ date: isoDate });

export const assignmentCreateBody = z
  .object({
    version,
    date: isoDate,
    fieldId: id,
    operation,
    operatorId: id,
    machineId: id,
    implementId: id,
    mentorId: id.nullable().optional(),
    /** 1-based place in the operator's day; default: last. */
    order: z.number().int().min(1).max(100).optional(),
    startTime: timeOfDay.nullable().optional(),
    endTime: timeOfDay.nullable().optional(),
    note,
    /** Default: the field's acres still to do for this operation this season. */
    acresPlanned: z.number().positive('Acres planned must be more than 0').max(100_000).optional(),
  })
  .refine(endAfterStart, END_MESSAGE);
export type AssignmentCreate = z.infer<typeof assignmentCreateBody>;

export const assignmentPatchBody = z
  .object({
    version,
    date: isoDate.optional(),
    fieldId: id.optional(),
    operation: operation.optional(),
    operatorId: id.optional(),
    machineId: id.optional(),
    implementId: id.optional(),
    mentorId: id.nullable().optional(),
    order: z.number().int().min(1).max(100).optional(),
    startTime: timeOfDay.nullable().optional(),
    endTime: timeOfDay.nullable().optional(),
    note,
    acresPlanned: z.number().positive('Acres planned must be more than 0').max(100_000).optional(),
  })
  .refine(endAfterStart, END_MESSAGE)
  .refine((v) => Object.keys(v).some((k) => k !== 'version'), 'Nothing to change');
export type AssignmentPatch = z.infer<typeof assignmentPatchBody>;

/** Drag and drop: each listed column gets exactly these cards, in this order. */
export const boardOrderBody = z.object({
  version,
  columns: z
    .array(z.object({ membershipId: id, assignmentIds: z.array(id).max(100) }))
    .min(1, 'Send at least one column')
    .max(100),
});
export type BoardOrder = z.infer<typeof boardOrderBody>;

export const publishBody = z.object({ version });

export const eventBody = z
  .object({
    type: z.enum(EVENT_TYPES, { message: `Type must be one of: ${EVENT_TYPES.join(', ')}` }),
    /** On finish: acres done; default the acres planned. */
    acres: z.number().positive('Acres must be more than 0').max(100_000).optional(),
    /** Engine-hour meter reading, on start and finish. */
    engineHours: z.number().min(0, 'Engine hours cannot be negative').max(200_000).optional(),
    note,
    reason: z.enum(CALL_OFF_REASONS, { message: 'Reason must be weather, breakdown or other' }).optional(),
    /** When it happened (ISO 8601), for taps queued on a phone without a signal; default now. */
    at: z.iso.datetime({ offset: true, message: 'Use a date and time such as 2026-05-01T08:30:00Z' }).optional(),
  })
  .refine((v) => v.type !== 'call-off' || v.reason, {
    message: 'Say why the job is called off: weather, breakdown or other',
    path: ['reason'],
  })
  .refine((v) => v.type !== 'call-off' || v.reason !== 'other' || (v.note && v.note.length > 0), {
    message: 'Add a note saying why',
    path: ['note'],
  });
export type EventInput = z.infer<typeof eventBody>;

export const logPatchBody = z
  .object({
    acresDone: z.number().positive('Acres done must be more than 0').max(100_000).optional(),
    hoursWorked: z.number().min(0, 'Hours worked cannot be negative').max(48, 'Hours worked is at most 48 h').optional(),
    engineHoursStart: z.number().min(0).max(200_000).nullable().optional(),
    engineHoursEnd: z.number().min(0).max(200_000).nullable().optional(),
  })
  .refine((v) => Object.keys(v).length > 0, 'Nothing to change');
export type LogPatch = z.infer<typeof logPatchBody>;

export const problemBody = z
  .object({
    kind: z.enum(PROBLEM_KINDS, { message: 'Kind must be breakdown, hazard or other' }),
    note: z.string().trim().min(1, 'Say what the problem is').max(1000, 'Use at most 1000 characters'),
    /** A new hazard: a GeoJSON Point, LineString or Polygon (lon/lat). */
    geometry: z
      .object({
        type: z.enum(['Point', 'LineString', 'Polygon'], { message: 'Mark the hazard as a point, a line or an area' }),
        coordinates: z.unknown(),
      })
      .optional(),
    hazardKind: z.enum(HAZARD_KINDS).optional(),
    clearanceM: z.number().min(0, 'Clearance cannot be negative').max(500).optional(),
    /** A breakdown pauses the job unless this is false. */
    pause: z.boolean().optional(),
  })
  .refine((v) => !v.geometry || v.kind === 'hazard', { message: 'Only a hazard report carries a place on the map', path: ['geometry'] });
export type ProblemInput = z.infer<typeof problemBody>;

export const runSheetQuery = z.object({ date: isoDate, membershipId: dbId.optional() });

export interface PersonRef {
  membershipId: number;
  name: string;
}

/** What was logged when the job was done; all null until it is. */
export interface AssignmentLog {
  startedAt: string | null;
  finishedAt: string | null;
  acresDone: number | null;
  hoursWorked: number | null;
  engineHoursStart: number | null;
  engineHoursEnd: number | null;
  callOffReason: (typeof CALL_OFF_REASONS)[number] | null;
}

export interface BoardAssignment {
  id: number;
  date: string;
  /** 1-based place in the operator's day. */
  order: number;
  state: AssignmentState;
  field: { id: number; name: string; acres: number };
  operation: Operation;
  operator: PersonRef;
  machine: { id: number; name: string; kind: MachineKind };
  implement: { id: number; name: string; kind: ImplementKind; widthM: number };
  mentor: PersonRef | null;
  /** Times the owner set, or null. */
  plannedStart: string | null;
  plannedEnd: string | null;
  /** Effective times: as set, else back-to-back from 07:00 in running order using `planHours`. */
  startTime: string;
  endTime: string;
  acresPlanned: number;
  /** Field acres less the acres other jobs finished for this operation this season, ≥ 0. */
  acresToDo: number;
  planHours: number;
  /** `pass-plan`: the saved pass plan's hours (scaled to the acres planned); `estimate`: acres ÷ effective field capacity. */
  planSource: 'pass-plan' | 'estimate';
  note: string | null;
  problemCount: number;
  log: AssignmentLog;
}

export interface Conflict {
  code:
    | 'machine_double_booked'
    | 'implement_double_booked'
    | 'person_double_booked'
    | 'implement_wrong_operation'
    | 'implement_wrong_machine'
    | 'learner_without_mentor'
    | 'field_finished'
    | 'over_day_hours'
    | 'service_overdue';
  severity: 'hard' | 'soft';
  message: string;
  assignmentIds: number[];
}

export interface BoardOperator extends PersonRef {
  plannedHours: number;
}

export type OrderStatus = 'none' | 'queued' | 'sent' | 'failed';

export interface WorkOrderState {
  membershipId: number;
  name: string;
  status: OrderStatus;
  sentAt: string | null;
  /** The order as it would be mailed now differs from the one last published. */
  changedSincePublish: boolean;
  /** `withdrawn`: the person had jobs when last published and now has none. */
  kind: 'order' | 'withdrawn' | null;
}

export interface Board {
  date: string;
  version: number;
  publishedAt: string | null;
  dayHoursLimit: number;
  assignments: BoardAssignment[];
  conflicts: Conflict[];
  operators: BoardOperator[];
  orders: WorkOrderState[];
  /** On the answer to a create or change: the card that was saved. */
  savedAssignmentId?: number;
}

export interface BoardChange {
  version: number;
  at: string;
  by: string;
  summary: string;
  assignmentIds: number[];
}

/** The `error` of a 409 `stale_board`: what changed since the client's version, and the board now. */
export interface StaleBoardError {
  code: 'stale_board';
  message: string;
  changes: BoardChange[];
  current: Board;
}

export interface PublishResult {
  /** People mailed this time (a new or changed order, or a withdrawal). */
  sent: Array<PersonRef & { kind: 'order' | 'withdrawn' }>;
  /** People whose order had not changed since the last publish. */
  unchanged: PersonRef[];
  board: Board;
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

export interface PassPlanOnSheet {
  implementId: number | null;
  widthM: number;
  headlandPasses: number;
  headingDeg: number | null;
  coverage: 'full' | 'gaps-ok';
  speedMph: number;
  efficiency: number;
  turnSeconds: number;
  summary: Record<string, unknown>;
  updatedAt: string;
}

export interface RunSheetItem extends Omit<BoardAssignment, 'field' | 'machine'> {
  /** `mentor`: the signed-in person mentors the operator on this job. */
  role: 'operator' | 'mentor';
  field: { id: number; name: string; acres: number; boundary: Polygon | MultiPolygon; hazards: FeatureCollection };
  machine: { id: number; name: string; kind: MachineKind; engineHours: number };
  passPlan: PassPlanOnSheet | null;
  cautions: readonly string[];
  events: AssignmentEvent[];
}

export interface RunSheet {
  date: string;
  person: PersonRef;
  assignments: RunSheetItem[];
}
