// An operator's own day: each job they run or mentor, in time order, with the field's map and
// hazards, the saved pass plan, the machine and implement, the cautions and the log so far.
import { OPERATION_INFO } from '../../shared/operations';
import { dayIn } from '../../shared/calendar';
import type { RunSheet, RunSheetItem, RunSheetOpened } from '../../shared/schemas/run-sheet';
import type { AppDeps } from '../app-deps';
import { weatherWindowOf, type ConflictCard } from '../board/conflicts';
import { loadDay, planKey, type DayContext } from '../board/day-context';
import type { Db } from '../db/knex';
import type { Logger } from '../logging/logger';
import { hazardFeature } from '../fields/fields.service';
import { forbidden, notFound } from '../http/errors';
import type { SessionPrincipal } from '../http/session-user';
import { getAssignment } from '../jobs/assignments.repository';
import type { DbAssignmentRow } from '../jobs/jobs.rows';
import { eventsOfJobs } from '../jobs/events.repository';
import { engineHoursRun } from '../jobs/hours';
import { boundariesOf, callOffWeatherOf, nextDayWithWork } from './run-sheet.repository';
import { weatherOfJobs, type WeatherReader } from './run-sheet-weather';

/** Who reads: the farm, its clock and units (for the weather's words), and where failures are logged. */
interface Reader extends WeatherReader {
  log?: Logger;
}

async function itemsOf(db: Db, who: Reader, ctx: DayContext, cards: ConflictCard[], personId: number): Promise<RunSheetItem[]> {
  const ids = cards.map((c) => c.a.id);
  const fieldIds = [...new Set(cards.map((c) => c.a.field.id))];
  const events = await eventsOfJobs(db, ctx.farmId, ids);
  const notes = await callOffWeatherOf(db, ctx.farmId, ids, who.timeZone);
  const boundaryOf = await boundariesOf(db, ctx.farmId, fieldIds);
  const weather = await weatherOfJobs(
    db,
    who,
    cards.map((c) => ({ id: c.a.id, date: c.a.date, fieldId: c.a.field.id, operation: c.a.operation, window: weatherWindowOf(c) })),
    ctx.farm.dayHoursLimit,
    who.log,
  );
  return cards.map(({ a }) => {
    const plan = ctx.passPlans.get(planKey(a.field.id, a.operation));
    const view = ctx.views.get(a.id)!;
    return {
      ...a,
      role: a.operator.membershipId === personId ? 'operator' : 'mentor',
      field: {
        ...a.field,
        boundary: boundaryOf.get(a.field.id)!,
        hazards: { type: 'FeatureCollection', features: ctx.hazards.filter((h) => h.field_id === a.field.id).map(hazardFeature) },
      },
      machine: { ...a.machine, engineHours: view.machine_engine_hours },
      passPlan: plan
        ? {
            implementId: plan.implement_id,
            widthM: plan.width_m,
            headlandPasses: plan.headland_passes,
            headingDeg: plan.heading_deg,
            coverage: plan.coverage,
            speedMps: plan.speed_mps,
            efficiency: plan.efficiency,
            turnSeconds: plan.turn_seconds,
            summary: plan.summary,
            updatedAt: plan.updated_at.toISOString(),
          }
        : null,
      cautions: OPERATION_INFO[a.operation].cautions,
      events: (events.get(a.id) ?? []).map((e) => (e.type === 'call-off' ? { ...e, weather: notes.get(e.id) ?? null } : e)),
      weather: weather.get(a.id) ?? null,
      // Engine hours come from the meter, never from the clock: an operator who taps Start and
      // Finish at the end of the day still ran the engine for the hours the meter shows.
      worked: { engineHours: engineHoursRun(a.log.engineHoursStart, a.log.engineHoursEnd), clockHours: a.log.hoursWorked },
    };
  });
}

const readerOf = (deps: AppDeps, by: SessionPrincipal): Reader => ({
  farmId: by.farmId,
  timeZone: by.timeZone,
  units: by.units,
  log: deps.logger,
});

const mine = (ctx: DayContext, personId: number) =>
  ctx.cards
    .filter((c) => c.a.operator.membershipId === personId || c.a.mentor?.membershipId === personId)
    .sort((x, y) => x.start - y.start || x.a.order - y.a.order || x.a.id - y.a.id);

/**
 * An operator sees only their own sheet; an owner may look at anyone's. Without a date, the sheet
 * opens on the person's next day with work (today at the farm, else the first published day after),
 * and says which it chose.
 */
export async function readRunSheet(
  deps: AppDeps,
  by: SessionPrincipal,
  asked: string | undefined,
  membershipId?: number,
): Promise<RunSheet> {
  const personId = membershipId ?? by.membershipId;
  if (personId !== by.membershipId && by.role !== 'owner') throw forbidden('You can open only your own run sheet');
  const today = dayIn(by.timeZone);
  let date: string;
  let opened: RunSheetOpened = 'asked';
  if (asked) date = asked;
  else {
    const next = await nextDayWithWork(deps.db, by.farmId, personId, today);
    opened = next === null ? 'no-work-ahead' : next === today ? 'today' : 'next-day-with-work';
    date = next ?? today;
  }
  const ctx = await loadDay(deps.db, by.farmId, date);
  const person = ctx.people.find((p) => p.membership_id === personId);
  if (!person) throw notFound('That person');
  return {
    date,
    today,
    opened,
    person: { membershipId: personId, name: person.name },
    assignments: await itemsOf(deps.db, readerOf(deps, by), ctx, mine(ctx, personId), personId),
  };
}

/**
 * One job as its operator's run sheet shows it (the answer to a logged action); `db` may be the
 * action's own transaction, so an answer kept for replays is read before it commits. Only the
 * operator's column of that day is read (the job's times depend on it alone); `known` is the job's
 * day and operator when the caller has already read them (an action's locked row).
 */
export async function runSheetItem(
  deps: AppDeps,
  by: SessionPrincipal,
  id: number,
  db: Db = deps.db,
  known?: Pick<DbAssignmentRow, 'day' | 'operator_id'>,
): Promise<RunSheetItem> {
  const a = known ?? (await getAssignment(db, by.farmId, id));
  if (!a) throw notFound('That job');
  const ctx = await loadDay(db, by.farmId, a.day, { operatorId: a.operator_id });
  const card = ctx.cards.find((c) => c.a.id === id)!;
  return (await itemsOf(db, readerOf(deps, by), ctx, [card], a.operator_id))[0];
}
