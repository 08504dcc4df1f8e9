// The operator's buttons: start, pause, resume, finish, call off. Each is a step of a small state
// machine, logged as an event; finishing records acres and hours worked in columns the season
// report adds up, and moves the machine's engine-hour meter forward. A call-off for weather keeps
// the stored forecast's hour and reason with its log entry.
//
// Actions keep the time they were tapped and are judged in that order (a phone with no signal
// sends them later). One sent with a device-made id is recorded once per farm with its answer:
// the same id again gets that answer and changes nothing. What such an action cannot do (the job
// was deleted or moved, it does not fit the log, a reading is refused) is kept as a log the owner
// sees, and the answer says so in plain words.
import { DateTime } from 'luxon';
import { dayIn } from '../../shared/calendar';
import { farmTime } from '../../shared/farm-time';
import { OPERATION_INFO } from '../../shared/operations';
import type { EventInput } from '../../shared/schemas/run-sheet';
import type { AppDeps } from '../app-deps';
import { lockMachine, raiseMeter } from '../fleet/machines.repository';
import type { Db, Tx } from '../db/knex';
import { AppError } from '../http/errors';
import type { SessionPrincipal } from '../http/session-user';
import { checkAcres } from '../jobs/acres-check';
import { getAssignment, updateAssignment, type AssignmentColumns } from '../jobs/assignments.repository';
import { loadDay } from '../board/day-context';
import { eventsOfJob, insertEvent } from '../jobs/events.repository';
import { hoursWorked } from '../jobs/hours';
import type { DbAssignmentEventRow } from '../jobs/jobs.rows';
import { judgeInOrder, nextState, pastTense, type OrderVerdict } from '../jobs/state-machine';
import { claimClientEvent, findClientEvent, lastChange, recordAnswer, type DbClientEventRow } from './client-events.repository';
import { backwards } from './engine-hours';
import { lockJob, touchBoard } from './job-lock';
import { STATE_LABELS, type EventType } from '../../shared/schemas/jobs';
import { saveCallOffWeather } from './run-sheet.repository';
import { fieldNameOnce, type BatchMemo } from './batch-memo';
import { callOffWeather, forecastOrNull } from './run-sheet-weather';
import { weatherWindowOf } from '../board/conflicts';
import { runSheetItem } from './run-sheet.service';
import { coverageOf } from '../track-coverage/coverage.repository';
import { finishAcres } from '../track-coverage/measured-acres';

/** A phone's clock may run a little ahead of the server's (common practice, no published source). */
const CLOCK_SKEW_MS = 5 * 60_000;
/**
 * How far before the job's day a tap sent late may be: an operator may log a day late, not weeks
 * early; a time further back means the phone's clock is wrong (common practice, no published source).
 */
export const MAX_DAYS_BEFORE_JOB = 14;
/** Nothing older than a season is taken at all (a phone whose clock reset, an outbox a year old). */
export const MAX_AGE_DAYS = 366;

/**
 * A call-off for weather keeps what the stored forecast says of the job's window. Read before the
 * transaction (no lock is held while the forecast is judged), from the database only; any failure
 * leaves the call-off without its forecast note.
 */
export async function forecastForCallOff(deps: AppDeps, by: SessionPrincipal, id: number) {
  const row = await getAssignment(deps.db, by.farmId, id);
  if (!row) return null;
  const forecast = await forecastOrNull(deps.db, by, row.field_id, deps.logger);
  if (!forecast?.issuedAt) return null;
  const ctx = await loadDay(deps.db, by.farmId, row.day, { operatorId: row.operator_id });
  const card = ctx.cards.find((c) => c.a.id === id);
  if (!card) return null;
  const job = { id, date: row.day, fieldId: row.field_id, operation: row.operation, window: weatherWindowOf(card) };
  return { forecast, job, dayHoursLimit: ctx.farm.dayHoursLimit };
}

/** The answer to a logged action: sent as it is, and sent again for a replay of the same id. */
export interface EventAnswer {
  status: number;
  body: unknown;
  /** True when the body is the short record asked for by `Prefer: return=minimal` (first answers only). */
  minimal?: boolean;
}

export type CallOffForecast = Awaited<ReturnType<typeof forecastForCallOff>>;

/** "16:40" at the farm's clock, as the run sheet shows it. */
const hhmm = (at: Date, timeZone: string) => farmTime(at, timeZone, 'clock');

/** When the action was tapped: the time sent, or now; a time far ahead or long past is refused. */
export function tappedAt(input: { at?: string }): Date {
  if (!input.at) return new Date();
  const at = new Date(input.at);
  if (at.getTime() > Date.now() + CLOCK_SKEW_MS)
    throw new AppError(
      400,
      'at_in_future',
      "That time is more than 5 minutes ahead of the farm's clock; check the date and time on your phone",
      { at: 'In the future' },
    );
  if (at.getTime() < Date.now() - MAX_AGE_DAYS * 86_400_000)
    throw new AppError(
      400,
      'at_too_old',
      `That action was tapped more than ${MAX_AGE_DAYS} days ago, which is too long ago to log. Check the date on your phone, or ask the owner to log it.`,
      { at: `More than ${MAX_AGE_DAYS} days ago` },
    );
  return at;
}

/**
 * A start tapped before the job's day at the farm (the evening before, on a phone showing the next
 * day's sheet): the job is planned for that day's conditions and crew, so it waits for the day. A
 * start later than the day (a job carried over, or logged late) is fine.
 */
function startBeforeDay(day: string, at: Date, timeZone: string): AppError | null {
  if (dayIn(timeZone, at) >= day) return null;
  const label = DateTime.fromISO(day).setLocale('en-US').toFormat('ccc, LLL d');
  return new AppError(409, 'start_before_day', `This job is for ${label}; it can be started from that day.`);
}

/** An action that does not fit the job's log in the order the taps were made. */
function notInOrder(v: Extract<OrderVerdict, { ok: false }>, type: EventType, at: Date, timeZone: string): AppError {
  const own = v.failing.at === at;
  const message = !own
    ? `This job was already ${pastTense(v.failing.type as EventType)} at ${hhmm(v.failing.at, timeZone)}: a ${type} at ${hhmm(at, timeZone)} does not fit before it.`
    : v.after
      ? `This job was already ${STATE_LABELS[v.state]} at ${hhmm(v.after.at, timeZone)}: it cannot be ${pastTense(type)} at ${hhmm(at, timeZone)}.`
      : `This job had not been started by ${hhmm(at, timeZone)}: it cannot be ${pastTense(type)} then.`;
  return new AppError(409, 'invalid_transition', message);
}

/** What an applied action leaves: its log entry, the job's new state, and its day and operator (for the answer). */
interface Applied {
  eventId: number;
  state: string;
  job: { day: string; operator_id: number };
}

/** Applies one action inside `tx` (the job locked first); throws an AppError when it cannot. */
async function apply(
  tx: Tx,
  by: SessionPrincipal,
  id: number,
  input: EventInput,
  at: Date,
  weather: CallOffForecast,
  memo?: BatchMemo,
): Promise<Applied> {
  const a = await lockJob(tx, by, id, 'operator', memo);
  // A tap sent late, with a time the phone made, is checked against its job's day: one far before it
  // means the phone's clock is wrong.
  if (
    input.at &&
    Date.now() - at.getTime() > 2 * CLOCK_SKEW_MS &&
    at.getTime() < Date.parse(`${a.day}T00:00:00Z`) - (MAX_DAYS_BEFORE_JOB + 1) * 86_400_000
  )
    throw new AppError(
      400,
      'at_too_old',
      `That time is more than ${MAX_DAYS_BEFORE_JOB} days before the job's day (${a.day}); check the date on your phone`,
      { at: `More than ${MAX_DAYS_BEFORE_JOB} days before the job's day` },
    );
  const early = input.type === 'start' ? startBeforeDay(a.day, at, by.timeZone) : null;
  if (early) throw early;
  const log: DbAssignmentEventRow[] = await eventsOfJob(tx, by.farmId, id);
  const order = judgeInOrder(log, { type: input.type, at });
  const cols: AssignmentColumns = {};
  if (!order.late) {
    // The newest tap: judged against the job's state, as it stands.
    const next = nextState(a.state, input.type);
    if ('error' in next) throw new AppError(409, 'invalid_transition', next.error);
    cols.state = next.state;
  } else {
    // Tapped before entries already logged: the whole log, in tap order, must still hold.
    if (!order.ok) throw notInOrder(order, input.type, at, by.timeZone);
    cols.state = order.state;
    if (order.startedAt) cols.started_at = order.startedAt;
    if (order.state === 'finished') cols.hours_worked = hoursWorked([...log, { type: input.type, at }]);
  }

  const machine = (await lockMachine(tx, by.farmId, a.machine_id))!;
  let acres: number | null = null;
  if (input.type === 'start') {
    cols.started_at = at;
    if (input.engineHours !== undefined) {
      // A late start is older than readings logged after it: only the newest tap moves the meter.
      if (!order.late && input.engineHours < machine.engine_hours)
        throw backwards(input.engineHours, machine.engine_hours, `the last reading of ${machine.name}`);
      cols.engine_hours_start = input.engineHours;
      await raiseMeter(tx, machine.id, input.engineHours);
    }
  } else if (input.type === 'finish') {
    const typed = input.acres ?? a.acres_planned;
    // A job whose track was measured counts the measured acres (server/track-coverage/measured-acres.ts);
    // the typed figure is kept as typed and not checked against what is left.
    const measured = await coverageOf(tx, by.farmId, id);
    if (!measured) await checkAcres(tx, by.farmId, by.units, a, typed);
    Object.assign(cols, finishAcres(typed, measured));
    acres = cols.acres_done!;
    if (input.engineHours !== undefined) {
      if (a.engine_hours_start != null && input.engineHours < a.engine_hours_start)
        throw backwards(input.engineHours, a.engine_hours_start, 'the reading at the start of this job');
      if (input.engineHours < machine.engine_hours)
        throw backwards(input.engineHours, machine.engine_hours, `the last reading of ${machine.name}`);
      cols.engine_hours_end = input.engineHours;
      await raiseMeter(tx, machine.id, input.engineHours);
    }
    cols.finished_at = at;
    cols.hours_worked = hoursWorked([...log, { type: 'finish', at }]);
  } else if (input.type === 'call-off') {
    cols.call_off_reason = input.reason!;
  }
  const eventId = await insertEvent(tx, {
    farm_id: by.farmId,
    assignment_id: id,
    type: input.type,
    at,
    acres,
    engine_hours: input.engineHours ?? null,
    reason: input.reason ?? null,
    note: input.note ?? null,
    hazard_id: null,
    by_user_id: by.id,
  });
  // Kept only when the job is still on the field and operation the forecast was judged for.
  if (weather && weather.job.fieldId === a.field_id && weather.job.operation === a.operation) {
    const note = callOffWeather(weather.forecast, weather.job, at, by.timeZone, weather.dayHoursLimit);
    if (note) await saveCallOffWeather(tx, eventId, note);
  }
  await updateAssignment(tx, id, cols);
  const field = await fieldNameOnce(tx, by.farmId, a.field_id, memo);
  await touchBoard(tx, by, a, `${by.name} ${pastTense(input.type)} ${field} ${OPERATION_INFO[a.operation].label.toLowerCase()}`, memo);
  return { eventId, state: cols.state ?? a.state, job: { day: a.day, operator_id: a.operator_id } };
}

/**
 * What a refused action with a device-made id becomes: a log kept for the owner, when it is
 * tapped work the world changed under (the job was deleted or moved away from this person) or
 * work the job's log refuses (out of order, a reading or acres refused). Anything else (another
 * person's job, a fault) is thrown again and nothing is recorded.
 */
export async function keptOutcome(
  tx: Tx,
  by: SessionPrincipal,
  id: number,
  input: { type: string },
  at: Date,
  err: unknown,
): Promise<{ status: number; code: string; message: string; fields?: Record<string, string> }> {
  if (!(err instanceof AppError)) throw err;
  const what = input.type === 'problem' ? 'problem report' : input.type;
  const yours = `your ${what} at ${hhmm(at, by.timeZone)} was kept as your log`;
  if (err.status === 404 && err.code === 'not_found') {
    const deleted = await lastChange(tx, by.farmId, id, 'deleted');
    if (deleted && (by.role === 'owner' || deleted.fromOperatorId === by.membershipId))
      return { status: 410, code: 'job_deleted', message: `The owner deleted this job; ${yours}.` };
    throw err;
  }
  if (err.status === 403) {
    const moved = await lastChange(tx, by.farmId, id, 'moved', by.membershipId);
    if (moved)
      return { status: 409, code: 'job_moved', message: `The owner moved this job to ${moved.toName ?? 'someone else'}; ${yours}.` };
    throw err;
  }
  if (err.status === 409 || err.status === 422)
    return {
      status: err.status,
      code: err.code,
      // Refused as tapped (a reading, the acres, the order of taps): not applied, but not lost.
      message: `${err.message} Your ${what} at ${hhmm(at, by.timeZone)} was not applied; it is kept on record with the job.`,
      ...(err.fields ? { fields: err.fields } : {}),
    };
  throw err;
}

/** A replay: the first answer, for the person who sent it only. */
export function replay(row: DbClientEventRow, by: SessionPrincipal): EventAnswer {
  if (row.user_id !== by.id) throw new AppError(403, 'forbidden', 'That action was sent by someone else; nothing was changed');
  return { status: row.status!, body: row.response };
}

/**
 * Logs an action on a job. Without `clientEventId`, as an online tap: applied or refused with an
 * error. With it, exactly once per farm: the first answer (applied, or kept as a log) is stored
 * with the id in the same transaction and a replay gets it again.
 *
 * @param requestId the request's id, kept in a stored error answer like any error body
 */
export async function logEvent(
  deps: AppDeps,
  by: SessionPrincipal,
  id: number,
  input: EventInput,
  requestId?: string,
  minimal = false,
): Promise<EventAnswer> {
  const at = tappedAt(input);
  const clientEventId = input.clientEventId;
  if (clientEventId) {
    const seen = await findClientEvent(deps.db, by.farmId, clientEventId);
    if (seen?.status != null) return replay(seen, by);
  }
  const weather = input.type === 'call-off' && input.reason === 'weather' ? await forecastForCallOff(deps, by, id) : null;
  if (!clientEventId) {
    // Read again after the commit: the job may have been moved meanwhile.
    await deps.db.transaction((tx) => apply(tx, by, id, input, at, weather));
    return { status: 201, body: await runSheetItem(deps, by, id) };
  }
  const answer = await deps.db.transaction((tx) =>
    logClientEvent(tx, deps, by, id, { ...input, clientEventId }, at, weather, requestId, minimal),
  );
  if (answer) return answer;
  // Another copy of the same action claimed the id first and has committed its answer.
  return replay((await findClientEvent(deps.db, by.farmId, clientEventId))!, by);
}

/**
 * An action with a device-made id, inside `tx`: the id claimed, the action applied or kept as a
 * log, and the answer stored with the id. Null when another copy claimed the id first (its answer
 * is then read once that copy has committed). A refusal that is not kept (another person's job, a
 * reading refused before anything was claimed) is thrown and the caller rolls the claim back.
 */
export async function logClientEvent(
  tx: Tx,
  deps: AppDeps,
  by: SessionPrincipal,
  id: number,
  input: EventInput & { clientEventId: string },
  at: Date,
  weather: CallOffForecast,
  requestId: string | undefined,
  minimal: boolean,
  memo?: BatchMemo,
  /** In a batch, the id claimed already (with the others, in one statement). */
  claimed?: number,
): Promise<EventAnswer | null> {
  const { type, at: _at, clientEventId, ...rest } = input;
  const claim =
    claimed ??
    (await claimClientEvent(tx, {
      farm_id: by.farmId,
      client_event_id: clientEventId,
      user_id: by.id,
      assignment_id: id,
      type,
      at,
      input: rest,
    }));
  if (claim === null) return null;
  let outcome: { status: number; body: unknown; outcome: string; message: string | null; eventId: number | null };
  try {
    // A savepoint: a refused action rolls back its own changes but keeps the claim.
    const { eventId, state, job } = await tx.transaction((sp) => apply(sp, by, id, input, at, weather, memo));
    // Asked short (the outbox): no reading of the job's day and forecast for each action.
    const body = minimal ? { clientEventId, id, state, eventId } : await runSheetItem(deps, by, id, tx as Db, job);
    outcome = { status: 201, body, outcome: 'applied', message: null, eventId };
  } catch (err) {
    const kept = await keptOutcome(tx, by, id, input, at, err);
    const error = {
      code: kept.code,
      message: kept.message,
      ...(kept.fields ? { fields: kept.fields } : {}),
      kept: { id: claim, type, at: at.toISOString() },
      ...(requestId ? { requestId } : {}),
    };
    outcome = { status: kept.status, body: { error }, outcome: kept.code, message: kept.message, eventId: null };
  }
  // In a batch the answers are stored together when it ends.
  if (memo) memo.answers.set(claim, { id: claim, ...outcome, response: outcome.body });
  else await recordAnswer(tx, claim, { ...outcome, response: outcome.body });
  return { status: outcome.status, body: outcome.body, minimal: minimal && outcome.status === 201 };
}
