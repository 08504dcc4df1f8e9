// Everything one board day needs, read in a few queries, and the cards built from it. The board,
// the run sheet and the work orders are all views of this one reading.
import type { Operation } from '../../shared/operations';
import type { UnitSystem } from '../../shared/schemas/auth';
import type { BoardAssignment } from '../../shared/schemas/board';
import type { SkillLevel } from '../../shared/schemas/fleet';
import { skillsOfFarm } from '../crew/crew.repository';
import type { Tx } from '../db/knex';
import { getFarmSettings } from '../farm/farm.repository';
import type { DbHazardRow } from '../fields/fields.repository';
import { whyCannotPull } from '../fleet/can-pull';
import { serviceDue } from '../fleet/service-due';
import { acresDone, assignmentViews, viewsOfDay } from '../jobs/assignments.repository';
import type { AssignmentView } from '../jobs/jobs.rows';
import { acresToDo, cardAcresLeft, seasonOf } from '../jobs/progress';
import { getDay } from './board-days.repository';
import type { DbBoardDayRow, DbPassPlanRow } from './board.rows';
import { formatMinutes } from './clock';
import type { ConflictCard, Skills } from './conflicts';
import { hazardsOfFields, machinesReportedDown, passPlansOf, peopleOfFarm, type PersonRow } from './day.repository';
import { farmTime } from '../../shared/farm-time';
import { planHours } from './plan-hours';
import { schedule } from './schedule';
import { roundTo } from '../../shared/round';

export interface DayContext {
  farmId: number;
  day: string;
  farm: { name: string; dayHoursLimit: number; timeZone: string; units: UnitSystem };
  boardDay: DbBoardDayRow | undefined;
  views: Map<number, AssignmentView>;
  /** In running order per operator. */
  cards: ConflictCard[];
  passPlans: Map<string, DbPassPlanRow>;
  hazards: DbHazardRow[];
  /** Empty when the day is read for one operator's column only. */
  skills: Skills;
  /** Empty when the day is read for one operator's column only. */
  people: PersonRow[];
}

/**
 * One operator's column instead of the whole day: enough to build that operator's cards, whose
 * times depend on their own column only (see `schedule`). The answer to a logged action reads
 * this, not the whole farm's day.
 */
export interface DayScope {
  operatorId: number;
}

export const planKey = (fieldId: number, operation: Operation) => `${fieldId}|${operation}`;

function toAssignment(v: AssignmentView, done: number, plan: DbPassPlanRow | undefined): BoardAssignment {
  const hours = planHours(v.acres_planned, v.field_acres, { widthM: v.implement_width_m, kind: v.implement_kind }, plan?.summary?.hours);
  return {
    id: v.id,
    date: v.day,
    order: v.run_order,
    state: v.state,
    field: { id: v.field_id, name: v.field_name, acres: roundTo(v.field_acres) },
    operation: v.operation,
    operator: { membershipId: v.operator_id, name: v.operator_name },
    machine: { id: v.machine_id, name: v.machine_name, kind: v.machine_kind },
    implement: { id: v.implement_id, name: v.implement_name, kind: v.implement_kind, widthM: v.implement_width_m },
    mentor: v.mentor_id ? { membershipId: v.mentor_id, name: v.mentor_name ?? '' } : null,
    plannedStart: v.start_min == null ? null : formatMinutes(v.start_min),
    plannedEnd: v.end_min == null ? null : formatMinutes(v.end_min),
    startTime: '',
    endTime: '',
    acresPlanned: roundTo(v.acres_planned),
    acresToDo: acresToDo(v, done),
    acresLeft: cardAcresLeft(v.field_acres, done),
    planHours: hours.hours,
    planSource: hours.source,
    // Set from the schedule below.
    bookedHours: 0,
    fitsWindow: true,
    note: v.note,
    problemCount: v.problem_count,
    log: {
      startedAt: v.started_at?.toISOString() ?? null,
      finishedAt: v.finished_at?.toISOString() ?? null,
      acresDone: v.acres_done,
      acresTyped: v.acres_source === 'measured' ? v.acres_typed : v.acres_done,
      acresMeasured: v.acres_source === 'measured',
      hoursWorked: v.hours_worked,
      engineHoursStart: v.engine_hours_start,
      engineHoursEnd: v.engine_hours_end,
      callOffReason: v.call_off_reason,
    },
  };
}

export async function loadDay(db: Tx, farmId: number, day: string, scope?: DayScope): Promise<DayContext> {
  // One query at a time: on a transaction they share one connection.
  const farm = await getFarmSettings(db, farmId);
  const boardDay = await getDay(db, farmId, day);
  const views = scope
    ? await assignmentViews(db, farmId, (q) => void q.where({ 'a.day': day, 'a.operator_id': scope.operatorId }))
    : await viewsOfDay(db, farmId, day);
  const skillRows = scope ? [] : await skillsOfFarm(db, farmId);
  const people = scope ? [] : await peopleOfFarm(db, farmId);
  const fieldIds = [...new Set(views.map((v) => v.field_id))];
  const done = await acresDone(db, farmId, seasonOf(day), fieldIds);
  const plans = await passPlansOf(db, farmId, fieldIds);
  const hazards = await hazardsOfFields(db, farmId, fieldIds);
  // Conflicts are read for the whole day only; one operator's column needs none.
  const down = scope ? [] : await machinesReportedDown(db, farmId, [...new Set(views.map((v) => v.machine_id))]);
  const downBy = new Map(down.map((d) => [d.machine_id, { since: farmTime(d.at, farm.timeZone, 'stamp'), note: d.note }]));
  const doneBy = new Map(done.map((d) => [planKey(d.field_id, d.operation), d.acres]));
  const passPlans = new Map(plans.map((p) => [planKey(p.field_id, p.operation), p]));
  const skills = new Map<number, Partial<Record<Operation, SkillLevel>>>();
  for (const s of skillRows) skills.set(s.membership_id, { ...skills.get(s.membership_id), [s.operation]: s.level });

  const assignments = views.map((v) =>
    toAssignment(v, doneBy.get(planKey(v.field_id, v.operation)) ?? 0, passPlans.get(planKey(v.field_id, v.operation))),
  );
  const times = schedule(
    assignments.map((a, i) => ({
      id: a.id,
      operatorId: a.operator.membershipId,
      order: a.order,
      startMin: views[i].start_min,
      endMin: views[i].end_min,
      planHours: a.planHours,
    })),
  );
  const cards: ConflictCard[] = assignments.map((a, i) => {
    const v = views[i];
    const t = times.get(a.id)!;
    a.startTime = formatMinutes(t.start);
    a.endTime = formatMinutes(t.end);
    a.bookedHours = roundTo((t.end - t.start) / 60);
    a.fitsWindow = t.fits;
    return {
      a,
      start: t.start,
      end: t.end,
      window: t.window,
      implementOperations: v.implement_operations,
      cannotPull: whyCannotPull(
        { id: v.machine_id, name: v.machine_name, kind: v.machine_kind, powerHp: v.machine_power_hp },
        { name: v.implement_name, machineIds: v.implement_machine_ids, minPowerHp: v.implement_min_power_hp },
      ),
      serviceDueInHours: serviceDue({
        engine_hours: v.machine_engine_hours,
        service_interval_hours: v.machine_service_interval_hours,
        hours_at_last_service: v.machine_hours_at_last_service,
      }).dueInHours,
      machineDown: downBy.get(v.machine_id) ?? null,
    };
  });
  return {
    farmId,
    day,
    farm: { name: farm.name, dayHoursLimit: farm.dayHoursLimit, timeZone: farm.timeZone, units: farm.units },
    boardDay,
    views: new Map(views.map((v) => [v.id, v])),
    cards,
    passPlans,
    hazards,
    skills,
    people,
  };
}
