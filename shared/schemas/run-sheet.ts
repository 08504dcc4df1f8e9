// The run sheet: an operator's day, and what they (or the owner) log on a job.
import type { FeatureCollection, MultiPolygon, Polygon } from 'geojson';
import * as z from 'zod';
import type { Operation } from '../operations';
import type { Verdict, VerdictLevel } from '../weather/rules';
import type { BoardAssignment } from './board';
import { OUTBOX_BATCH_MAX } from '../limits';
import { dbId, isoDate } from './common';
import { HAZARD_KINDS } from './fields';
import type { MachineKind } from './fleet';
import { CALL_OFF_REASONS, EVENT_TYPES, PROBLEM_KINDS, jobNote as note, type AssignmentEvent, type PersonRef } from './jobs';

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
    /**
     * An id the device made when the action was tapped: the server records it once per farm, and
     * the same id sent again gets the first answer and changes nothing.
     */
    clientEventId: z.uuid({ message: 'The action id must be a UUID made on the device' }).optional(),
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

/**
 * The short answer to an action sent with a device-made id when the request says
 * `Prefer: return=minimal` (RFC 7240): the phone's outbox reads the day once after sending,
 * rather than the whole job after each action.
 */
export interface MinimalEventAnswer {
  clientEventId: string;
  /** The job. */
  id: number;
  /** The job's state after the action. */
  state: string;
  /** The log entry it made. */
  eventId: number;
}

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
    /** When it was reported (ISO 8601), for a report queued on a phone without a signal; default now. */
    at: z.iso.datetime({ offset: true, message: 'Use a date and time such as 2026-05-01T08:30:00Z' }).optional(),
    /** An id the device made when the report was written: recorded once per farm, as for logged actions. */
    clientEventId: z.uuid({ message: 'The report id must be a UUID made on the device' }).optional(),
  })
  .refine((v) => !v.geometry || v.kind === 'hazard', { message: 'Only a hazard report carries a place on the map', path: ['geometry'] });
export type ProblemInput = z.infer<typeof problemBody>;

/**
 * A phone's waiting actions sent at once, in tap order: each is what `POST /api/assignments/:id/events`
 * (or `/problems`, with `type: 'problem'`) takes, with its job's id, its device-made id and its tap
 * time. The rest of each action is checked on its own, so one malformed action is refused alone.
 */
export const outboxBody = z.object({
  events: z
    .array(
      z.looseObject({
        assignmentId: dbId,
        type: z.enum([...EVENT_TYPES, 'problem'], { message: `Type must be one of: ${[...EVENT_TYPES, 'problem'].join(', ')}` }),
        clientEventId: z.uuid({ message: 'The action id must be a UUID made on the device' }),
        at: z.iso.datetime({ offset: true, message: 'Use a date and time such as 2026-05-01T08:30:00Z' }),
      }),
    )
    .min(1, 'Send at least one action')
    .max(OUTBOX_BATCH_MAX, `Send at most ${OUTBOX_BATCH_MAX} actions at once`),
});
export type OutboxInput = z.infer<typeof outboxBody>;

/**
 * One action's answer in a batch: the status and body `POST /api/assignments/:id/events` (or
 * `/problems`) gives it when asked `Prefer: return=minimal`; a replay gets its first answer again.
 */
export interface OutboxResult {
  clientEventId: string;
  assignmentId: number;
  status: number;
  body: unknown;
}

/** The answers to a batch, in the order the actions were sent. */
export interface OutboxAnswer {
  results: OutboxResult[];
}

/** Without a date, the sheet opens on the person's next day with work (see `RunSheet.opened`). */
export const runSheetQuery = z.object({ date: isoDate.optional(), membershipId: dbId.optional() });

export interface PassPlanOnSheet {
  implementId: number | null;
  widthM: number;
  headlandPasses: number;
  headingDeg: number | null;
  coverage: 'full' | 'gaps-ok';
  /** Working speed, metres per second. */
  speedMps: number;
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
  events: RunSheetEvent[];
  /**
   * The job's hours from the stored forecast of its field, with its operation's verdict; null when
   * the field has no forecast that could be read (the run sheet never waits on or fails for weather).
   */
  weather?: JobWeather | null;
  /**
   * What the job took, in two separate measures: `engineHours` is the meter at the finish less the
   * meter at the start (null until both are logged); `clockHours` is the time from start to finish
   * less pauses, as the taps were logged (null until finished).
   */
  worked: { engineHours: number | null; clockHours: number | null };
}

/** One hour of a job's window as the run sheet shows it; SI units (°C, km/h, mm), the screen converts. */
export interface JobWeatherHour {
  /** ISO 8601 with the farm's offset: the hour's start (rain is the forecast's sum over the hour before). */
  time: string;
  temperatureC: number | null;
  windSpeedKmh: number | null;
  windGustKmh: number | null;
  /** Where the wind blows from, degrees clockwise from north. */
  windDirectionDeg: number | null;
  precipitationMm: number | null;
  precipitationProbabilityPct: number | null;
  /** Air minus wet-bulb temperature, °C (shown for spraying). */
  deltaTC: number | null;
  /** The job's operation judged for this hour; null for an operation without weather rules. */
  verdict: Verdict | null;
}

/** A job's hourly window from its field's newest stored forecast. */
export interface JobWeather {
  issuedAt: string | null;
  fetchedAt: string | null;
  /** Minutes since the forecast was fetched. */
  ageMinutes: number | null;
  stale: boolean;
  staleReason: string | null;
  /** `job`: the job's own hours (the window the owner set, or from the start the owner set for its planned hours); `working-day`: the farm's working day (no time set). */
  over: 'job' | 'working-day';
  /** 'HH:MM' of the hours judged. */
  from: string;
  to: string;
  /** The worst hour's verdict over the window with its reasons; null for an operation without weather rules or without hours. */
  verdict: Verdict | null;
  hours: JobWeatherHour[];
}

/** What a call-off for weather kept of the stored forecast, read on the server when it was logged. */
export interface CallOffWeather {
  /** When the forecast used was issued. */
  issuedAt: string;
  /** The forecast hour (ISO 8601 with the farm's offset). */
  hour: string;
  verdict: VerdictLevel | null;
  /** The hour's first reason, in words. */
  reason: string | null;
}

/** An entry of the job's log; a call-off for weather carries the forecast hour and reason (null without a forecast). */
export interface RunSheetEvent extends AssignmentEvent {
  weather?: CallOffWeather | null;
}

/**
 * Why the sheet shows its day: `asked` (a date was given), `today` (work today), `next-day-with-work`
 * (none today: the first published day after with work for the person), `no-work-ahead` (none today
 * nor on any published day after: today, empty).
 */
export const RUN_SHEET_OPENED = ['asked', 'today', 'next-day-with-work', 'no-work-ahead'] as const;
export type RunSheetOpened = (typeof RUN_SHEET_OPENED)[number];

export interface RunSheet {
  date: string;
  /** Today at the farm (its time zone). */
  today: string;
  opened: RunSheetOpened;
  person: PersonRef;
  assignments: RunSheetItem[];
}

/** A problem, breakdown or new hazard reported from a run sheet, waiting for the owner. */
export interface FieldReport {
  /** The report's entry in the job's log. */
  id: number;
  kind: (typeof PROBLEM_KINDS)[number];
  note: string | null;
  at: string;
  by: string | null;
  review: 'open' | 'confirmed' | 'dismissed';
  job: { id: number; date: string; operation: Operation; state: string };
  field: { id: number; name: string };
  machine: { id: number; name: string };
  hazardId: number | null;
}

/**
 * An action sent from a phone that could not be applied when it arrived (the job was deleted or
 * moved, or it did not fit the job's log in the order it was tapped): kept as a log for the owner.
 */
export interface KeptAction {
  id: number;
  /** The job as the phone sent it; `exists` is false when it has since been deleted. */
  job: { id: number; exists: boolean };
  type: (typeof EVENT_TYPES)[number] | 'problem';
  /** When it was tapped and when it arrived. */
  at: string;
  receivedAt: string;
  by: string | null;
  /** Why it was kept: job_deleted, job_moved, invalid_transition or the refusal's own code. */
  outcome: string;
  message: string;
  /** What was sent with it (acres, engine hours, reason, note). */
  input: Record<string, unknown>;
}

export interface FieldReports {
  /** Open reports, newest first. */
  reports: FieldReport[];
  /**
   * Machines with an open breakdown report: the board flags them (a breakdown is "down" until the
   * owner confirms it is dealt with or dismisses it).
   */
  machinesDown: Array<{ machineId: number; name: string; reportId: number; since: string }>;
  /**
   * Actions from phones kept as a log only, newest first (at most 100). The server always sends
   * it; optional so screens and fixtures written before it still type-check.
   */
  keptActions?: KeptAction[];
}
