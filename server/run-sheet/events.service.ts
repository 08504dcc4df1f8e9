// The operator's buttons: start, pause, resume, finish, call off. Each is a step of a small state
// machine, logged as an event; finishing records acres and hours worked in columns the season
// report adds up, and moves the machine's engine-hour meter forward. A call-off for weather keeps
// the stored forecast's hour and reason with its log entry.
import { OPERATION_INFO } from '../../shared/operations';
import type { EventInput, RunSheetItem } from '../../shared/schemas/run-sheet';
import type { AppDeps } from '../app-deps';
import { lockMachine, raiseMeter } from '../fleet/machines.repository';
import { AppError } from '../http/errors';
import type { SessionPrincipal } from '../http/session-user';
import { checkAcres } from '../jobs/acres-check';
import { getAssignment, updateAssignment, type AssignmentColumns } from '../jobs/assignments.repository';
import { loadDay } from '../board/day-context';
import { eventsOfJob, insertEvent } from '../jobs/events.repository';
import { hoursWorked } from '../jobs/hours';
import { nextState, pastTense } from '../jobs/state-machine';
import { backwards } from './engine-hours';
import { lockJob, touchBoard } from './job-lock';
import { fieldName, saveCallOffWeather } from './run-sheet.repository';
import { callOffWeather, forecastOrNull } from './run-sheet-weather';
import { runSheetItem } from './run-sheet.service';

/** A phone's clock may run a little ahead of the server's. */
const CLOCK_SKEW_MS = 5 * 60_000;

/**
 * A call-off for weather keeps what the stored forecast says of the job's window. Read before the
 * transaction (no lock is held while the forecast is judged), from the database only; any failure
 * leaves the call-off without its forecast note.
 */
async function forecastForCallOff(deps: AppDeps, by: SessionPrincipal, id: number) {
  const row = await getAssignment(deps.db, by.farmId, id);
  if (!row) return null;
  const forecast = await forecastOrNull(deps.db, by, row.field_id, deps.logger);
  if (!forecast?.issuedAt) return null;
  const ctx = await loadDay(deps.db, by.farmId, row.day);
  const card = ctx.cards.find((c) => c.a.id === id);
  if (!card) return null;
  const job = { id, date: row.day, fieldId: row.field_id, operation: row.operation, window: card.window };
  return { forecast, job, dayHoursLimit: ctx.farm.dayHoursLimit };
}

export async function logEvent(deps: AppDeps, by: SessionPrincipal, id: number, input: EventInput): Promise<RunSheetItem> {
  const weather = input.type === 'call-off' && input.reason === 'weather' ? await forecastForCallOff(deps, by, id) : null;
  await deps.db.transaction(async (tx) => {
    const a = await lockJob(tx, by, id, 'operator');
    const next = nextState(a.state, input.type);
    if ('error' in next) throw new AppError(409, 'invalid_transition', next.error);
    const log = await eventsOfJob(tx, by.farmId, id);
    const at = input.at ? new Date(input.at) : new Date();
    if (at.getTime() > Date.now() + CLOCK_SKEW_MS)
      throw new AppError(422, 'invalid_input', 'That time is in the future; check the clock on your phone', { at: 'In the future' });
    const last = log.at(-1);
    if (last && at < last.at)
      throw new AppError(422, 'invalid_input', `That time is before the last entry in this job's log (${last.at.toISOString()})`, {
        at: 'Before the last entry',
      });

    const machine = (await lockMachine(tx, by.farmId, a.machine_id))!;
    const cols: AssignmentColumns = { state: next.state };
    let acres: number | null = null;
    if (input.type === 'start') {
      cols.started_at = at;
      if (input.engineHours !== undefined) {
        if (input.engineHours < machine.engine_hours)
          throw backwards(input.engineHours, machine.engine_hours, `the last reading of ${machine.name}`);
        cols.engine_hours_start = input.engineHours;
        await raiseMeter(tx, machine.id, input.engineHours);
      }
    } else if (input.type === 'finish') {
      acres = input.acres ?? a.acres_planned;
      await checkAcres(tx, by.farmId, a, acres);
      if (input.engineHours !== undefined) {
        if (a.engine_hours_start != null && input.engineHours < a.engine_hours_start)
          throw backwards(input.engineHours, a.engine_hours_start, 'the reading at the start of this job');
        if (input.engineHours < machine.engine_hours)
          throw backwards(input.engineHours, machine.engine_hours, `the last reading of ${machine.name}`);
        cols.engine_hours_end = input.engineHours;
        await raiseMeter(tx, machine.id, input.engineHours);
      }
      cols.acres_done = acres;
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
    const field = await fieldName(tx, by.farmId, a.field_id);
    await touchBoard(tx, by, a, `${by.name} ${pastTense(input.type)} ${field} ${OPERATION_INFO[a.operation].label.toLowerCase()}`);
  });
  return runSheetItem(deps, by, id);
}
