// The work board and its work orders: the owner's edits (request bodies), the rules between a
// card's fields, and the shapes the API answers. A job's states and log are in ./jobs, the run
// sheet's requests in ./run-sheet.
import * as z from 'zod';
import { OPERATIONS, type Operation } from '../operations';
import type { ImplementKind } from '../plan/implement-defaults';
import { DB_INT_MAX, dbIdNumber, isoDate } from './common';
import type { MachineKind, SkillLevel } from './fleet';
import { jobNote as note, type AssignmentLog, type AssignmentState, type PersonRef } from './jobs';

/** A board day's first job starts here when no times are set (minutes after midnight). */
export const DAY_START_MIN = 7 * 60;

/** 'HH:MM', 24-hour clock. */
export const timeOfDay = z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'Use a time written as HH:MM (24-hour clock)');
const id = dbIdNumber;
const operation = z.enum(OPERATIONS, { message: `Operation must be one of: ${OPERATIONS.join(', ')}` });
/** The board version the client last saw; may come in the body or an `If-Match` header instead. */
const version = z.number().int().min(0).max(DB_INT_MAX, 'That board version does not exist; reload the work board').optional();

/** What the rules between a card's fields look at: its times ('HH:MM') and its people. */
export interface CardFacts {
  startTime?: string | null;
  endTime?: string | null;
  operatorId?: number | null;
  mentorId?: number | null;
  /** The operator's skill for the card's operation (null: none); undefined when not looked up. */
  operatorSkill?: SkillLevel | null;
}

/** Someone who works an operation alone: qualified for it, or a mentor for it. */
export const worksAlone = (skill: SkillLevel | null | undefined): boolean => skill === 'qualified' || skill === 'mentor';

/** Someone who may mentor a learner in an operation. */
export const mayMentor = (skill: SkillLevel | null | undefined): boolean => skill === 'mentor';

/** When both times are set, the end comes after the start ('HH:MM' of equal width compares as text). */
export const endAfterStart = (c: CardFacts): boolean => !(c.startTime && c.endTime) || c.endTime > c.startTime;

/** A mentor, when there is one, is someone other than the operator. */
export const mentorIsNotOperator = (c: CardFacts): boolean => !c.mentorId || c.mentorId !== c.operatorId;

/** A mentor, when there is one, is for an operator who needs one: someone who works alone has none. */
export const mentorOnlyForLearner = (c: CardFacts): boolean => !c.mentorId || c.operatorSkill === undefined || !worksAlone(c.operatorSkill);

/**
 * The mentor a card keeps when its operator (or operation) changes and the owner did not name one:
 * none when the new operator works alone or is the mentor themself, so a learner's card moved to
 * someone qualified carries no stale mentor (and no error about one).
 */
export const settledMentor = (c: CardFacts): number | null =>
  !c.mentorId || !mentorIsNotOperator(c) || !mentorOnlyForLearner(c) ? null : c.mentorId;

export interface CardRule {
  field: 'mentorId' | 'endTime';
  holds: (c: CardFacts) => boolean;
  message: string;
  /** The short form shown beside the field. */
  hint: string;
}

/**
 * The rules between a card's fields: the one definition the request schemas, the board service
 * and the assignment form use. The schemas check the times of a request; the service checks every
 * rule on the card as it will be saved (a change may move one end, or the operator, only); the
 * form checks them before sending. Listed in the order the service has always checked them.
 */
export const CARD_RULES: readonly CardRule[] = [
  { field: 'mentorId', holds: mentorIsNotOperator, message: 'The mentor must be someone other than the operator', hint: 'Someone else' },
  {
    field: 'mentorId',
    holds: mentorOnlyForLearner,
    message: 'The operator is qualified for this operation and works without a mentor',
    hint: 'No mentor needed',
  },
  { field: 'endTime', holds: endAfterStart, message: 'The end time must be after the start time', hint: 'Must be after the start time' },
];

/** The rules a card breaks, in CARD_RULES order; empty when it keeps them all. */
export const brokenCardRules = (c: CardFacts): CardRule[] => CARD_RULES.filter((r) => !r.holds(c));

/**
 * The request schemas check only the times: a mentor who is the operator is refused by the
 * service (422, after the card's references are checked), as it always was, not here (400).
 */
const END_RULE = CARD_RULES.find((r) => r.field === 'endTime')!;
const endAfterStartIssue = { message: END_RULE.message, path: ['endTime'] };

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
  .refine(END_RULE.holds, endAfterStartIssue);
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
  .refine(END_RULE.holds, endAfterStartIssue)
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
  /** Field acres still to do after every job finished this season, this one included, ≥ 0. */
  acresLeft: number;
  /** Hours the work takes. */
  planHours: number;
  /** `pass-plan`: the saved pass plan's hours (scaled to the acres planned); `estimate`: acres ÷ effective field capacity. */
  planSource: 'pass-plan' | 'estimate';
  /**
   * Hours the card holds its people, from `startTime` to `endTime`: the longer of `planHours` and
   * the window the owner set (server/board/schedule.ts). The column's total and the day limit count these.
   */
  bookedHours: number;
  /** False when the window the owner set is shorter than `planHours` (a `window_too_short` warning). */
  fitsWindow: boolean;
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
    | 'window_too_short'
    | 'service_overdue'
    | 'machine_reported_down'
    | 'weather_no_go';
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
  /**
   * What changed since publishing, in jobs: new to the order, at another time or place in the day,
   * otherwise different, gone. Null when never published, or published before this was kept.
   */
  changes: OrderChanges | null;
  /** `withdrawn`: the person had jobs when last published and now has none. */
  kind: 'order' | 'withdrawn' | null;
}

export interface OrderChanges {
  added: number;
  moved: number;
  edited: number;
  removed: number;
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
  /** Go / caution / no-go per card and the day's hourly strip, from the stored forecasts. */
  weather: BoardWeather;
  /** The first day after this one with cards on it, or null when there is none. */
  nextDayWithWork: string | null;
  /** On the answer to a create or change: the card that was saved. */
  savedAssignmentId?: number;
}

/** A card's weather: the verdict of its operation over its window, from the newest stored forecast. */
export interface CardWeather {
  assignmentId: number;
  verdict: 'go' | 'caution' | 'no-go';
  /** The first reason in words ("wind 14 mph at 10:00, above the spraying limit of 10 mph"), or null when all is well. */
  reason: string | null;
  /** Every reason, worst first (spraying's label caution last). */
  reasons: string[];
  /** The hours judged, 'HH:MM': the card's own hours (see weatherWindowOf in server/board/conflicts.ts), or the farm's working day. */
  from: string;
  to: string;
  /** `card`: the card's own hours (the window the owner set, or from the start the owner set for its planned hours); `working-day`: the farm's working day (no time set). */
  over: 'card' | 'working-day';
  /** The owner made this operation's weather rule blocking: a no-go is a hard conflict. */
  blocking: boolean;
  /** When the forecast was fetched (ISO instant) and its age then, minutes. */
  fetchedAt: string;
  ageMinutes: number;
  /** Old, or its last refresh failed: shown with its age and why. */
  stale: boolean;
  staleReason: string | null;
  /** When a forecast that is fresh now turns stale by age alone (ISO instant): the page checks it against its clock. */
  staleAfter: string;
}

/** One hour of the day's strip, SI units (the page converts to the farm's). */
export interface StripHour {
  /** 'HH:MM' at the farm. */
  time: string;
  temperatureC: number | null;
  windSpeedKmh: number | null;
  windGustKmh: number | null;
  precipitationMm: number | null;
  precipitationProbabilityPct: number | null;
}

/** The farm's hourly strip for the day, from one representative forecast point. */
export interface DayStrip {
  /** Why this point: the point of most of the day's fields, else the farm's first field. */
  basis: 'most-fields' | 'first-field';
  /** A field at that point, to name it. */
  fieldName: string;
  fetchedAt: string;
  ageMinutes: number;
  stale: boolean;
  staleReason: string | null;
  staleAfter: string;
  hours: StripHour[];
}

export interface BoardWeather {
  /** Only cards whose operation the weather judges and whose field has a stored forecast for their hours. */
  cards: CardWeather[];
  /** Null when the farm has no stored forecast for the day. */
  strip: DayStrip | null;
  /** Why the day has no weather, in words, when it is past the forecasts' reach; null otherwise. */
  note: string | null;
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
