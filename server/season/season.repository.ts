// The season report's SQL. Every total is summed in PostgreSQL (GROUP BY, FILTER, window sums over
// date_trunc('week')); Node only receives the grouped rows. All sections come from one statement:
// one plan, one index-only scan of the season's jobs (migration 20261201004000), one snapshot, so
// the sections always agree with each other even while an owner corrects a log. The weather days
// lost also read the log entries of the season's called-off jobs.
// What counts as done, when a field is finished and what a job's engine hours are: server/jobs.
import { DEFAULT_FUEL_GAL_PER_ACRE } from '../../shared/costs';
import { OPERATIONS, type Operation } from '../../shared/operations';
import type { Tx } from '../db/knex';
import { ENGINE_HOURS_SQL } from '../jobs/hours';
import { FINISHED_TOLERANCE_ACRES, PROGRESS_SQL, seasonDays } from '../jobs/progress';

/** Operations a field planned as fallow still gets. */
export const FALLOW_OPERATIONS: readonly Operation[] = ['harrowing', 'tillage'];

export interface OperationLogRow {
  operation: Operation;
  acres: number;
  hours: number;
  engine_hours: number;
  jobs_finished: number;
  jobs_called_off: number;
  cost_cents: number;
  machine_cents: number;
  labour_cents: number;
  fuel_cents: number;
  cost_per_acre_cents: number | null;
  jobs_unpriced: number;
  /** Finished jobs whose acres were measured from their track, and those acres. */
  jobs_measured: number;
  acres_measured: number;
}

export interface OperationPlanRow {
  operation: Operation;
  acres_planned: number;
  acres_covered: number;
  acres_with_plan: number;
  planned_hours: number | null;
}

export interface WeekRow {
  operation: Operation;
  week: string;
  acres: number;
  cumulative: number;
}

export interface FieldRow {
  id: number;
  name: string;
  acres: number;
  crop: string | null;
}

export interface FieldOperationRow {
  field_id: number;
  operation: Operation;
  acres: number;
  hours: number;
  cost_cents: number;
  date_finished: string | null;
  jobs: number;
  /** Of the jobs, those whose acres were measured from their track; the sums below are theirs (null when none). */
  jobs_measured: number;
  measured_acres: number | null;
  measured_typed_acres: number | null;
  skipped_acres: number | null;
  worked_twice_acres: number | null;
}

/** Money is whole cents, each figure rounded once in SQL. */
export interface FieldCostRow {
  field_id: number;
  cost_cents: number;
  cost_per_acre_cents: number | null;
}

export interface CostTotalsRow {
  cost_cents: number;
  cost_per_acre_cents: number | null;
  jobs_unpriced: number;
}

export interface MachineCostRow {
  machine_id: number;
  cost_cents: number;
  machine_cents: number;
  cost_per_acre_cents: number | null;
}

export interface PersonOperationRow {
  membership_id: number;
  name: string;
  operation: Operation;
  acres: number;
  hours: number;
}

export interface MachineOperationRow {
  machine_id: number;
  name: string;
  operation: Operation;
  acres: number;
  hours: number;
  engine_hours: number;
  cost_cents: number;
  machine_cents: number;
}

/** Call-offs for weather: one row per operation, and one with a null operation for the whole farm. */
export interface WeatherDaysRow {
  operation: Operation | null;
  days: number;
  jobs: number;
}

export interface SeasonRows {
  operationLogs: OperationLogRow[];
  weatherDays: WeatherDaysRow[];
  operationPlans: OperationPlanRow[];
  weeks: WeekRow[];
  fields: FieldRow[];
  fieldOperations: FieldOperationRow[];
  personOperations: PersonOperationRow[];
  machineOperations: MachineOperationRow[];
  fieldCosts: FieldCostRow[];
  costTotals: CostTotalsRow[];
  machineCosts: MachineCostRow[];
}

const IN_SEASON = `farm_id = :farmId and ${PROGRESS_SQL.inSeason}`;

/**
 * The finished jobs of one farm and season: what the totals add up, as the work board counts a
 * field done. Engine hours only where both meter readings are there and run forwards. Summed as
 * double precision (fast; exact well past the hundredth of an acre the report shows).
 * Each job's cost parts (shared/costs.ts has the rules) stay numeric, exact: the money figures are
 * rounded once each, to the cent, after summing (`cents`). A machine's hours are its engine hours,
 * or the hours worked when a meter reading is missing; a missing rate or price leaves its part
 * null (it adds nothing) and marks the job unpriced.
 * A job whose acres were measured from its track (server/track-coverage/measured-acres.ts) counts
 * those; its typed acres, and its track's skipped and twice-worked acres, come along to be shown.
 */
const DONE = `done as materialized (
  select j.field_id, j.operation, j.operator_id, j.machine_id, j.day, j.acres, j.hours, j.engine_hours,
         j.measured, j.acres_typed, c.skipped_acres, c.worked_twice_acres,
         j.machine_hours * mc.hourly_cents as machine_cents,
         j.hours_exact * lc.hourly_cents as labour_cents,
         j.acres_exact * coalesce((cs.fuel_gal_per_acre ->> j.operation)::numeric, (:fuelDefaults::jsonb ->> j.operation)::numeric)
           * cs.fuel_price_cents as fuel_cents,
         (mc.hourly_cents is null or lc.hourly_cents is null or cs.fuel_price_cents is null) as unpriced
  from (
    select id, field_id, operation, operator_id, machine_id, day, ${PROGRESS_SQL.acresDone}::float8 as acres, coalesce(hours_worked, 0)::float8 as hours,
           acres_source = 'measured' as measured, acres_typed::float8 as acres_typed,
           (${ENGINE_HOURS_SQL})::float8 as engine_hours,
           ${PROGRESS_SQL.acresDone} as acres_exact, coalesce(hours_worked, 0) as hours_exact,
           coalesce(${ENGINE_HOURS_SQL}, hours_worked, 0) as machine_hours
    from assignments where ${IN_SEASON} and ${PROGRESS_SQL.isDone}
  ) j
  left join assignment_coverage c on c.assignment_id = j.id and c.farm_id = :farmId and j.measured
  left join machine_costs mc on mc.machine_id = j.machine_id and mc.farm_id = :farmId
  left join labour_costs lc on lc.membership_id = j.operator_id and lc.farm_id = :farmId
  left join cost_settings cs on cs.farm_id = :farmId
)`;

/** Whole cents, rounded once from an exact numeric sum (round(numeric) rounds a half away from zero: shared/money.ts). */
const cents = (sum: string) => `round(coalesce(${sum}, 0))::bigint`;
/** The exact cost of the jobs in a group. */
const COST = 'sum(coalesce(machine_cents, 0) + coalesce(labour_cents, 0) + coalesce(fuel_cents, 0))';
/** Cents per acre of the group, rounded once; null without acres. */
const perAcre = (acres: string) => `round(${COST} / nullif(${acres}, 0))::bigint`;

/** Fields with a crop this season; a crop whose name holds the word "fallow" is fallow. */
const PLANNED = `planned as (
  select f.id, f.acres, c.crop ~* '\\mfallow\\M' as fallow
  from crop_plans c join fields f on f.id = c.field_id
  where c.farm_id = :farmId and f.farm_id = :farmId and c.season = :year
)`;

/** The operations this farm does: one an implement of its fleet does, or one with work this season. */
const FARM_OPS = `farm_ops as (
  select distinct unnest(operations) as operation from implements where farm_id = :farmId
  union
  select distinct operation from done
)`;

/**
 * Per field and operation: acres, hours, and the first day the running total reached the field's
 * acres (the window's default frame takes a day's jobs together, so the order within a day is moot).
 */
const FIELD_OPS = `field_ops as (
  select d.field_id, d.operation, sum(d.acres) as acres, sum(d.hours) as hours, ${cents('sum(d.cost)')} as cost_cents,
         to_char(min(d.day) filter (where ${PROGRESS_SQL.finished('d.cum', 'f.acres')}), 'YYYY-MM-DD') as date_finished,
         count(*)::int as jobs, (count(*) filter (where d.measured))::int as jobs_measured,
         (sum(d.acres) filter (where d.measured))::float8 as measured_acres,
         (sum(d.acres_typed) filter (where d.measured))::float8 as measured_typed_acres,
         (sum(d.skipped_acres) filter (where d.measured))::float8 as skipped_acres,
         (sum(d.worked_twice_acres) filter (where d.measured))::float8 as worked_twice_acres
  from (select field_id, operation, day, acres, hours, coalesce(machine_cents, 0) + coalesce(labour_cents, 0) + coalesce(fuel_cents, 0) as cost,
               measured, acres_typed, skipped_acres, worked_twice_acres,
               sum(acres) over (partition by field_id, operation order by day) as cum from done) d
  join fields f on f.id = d.field_id
  group by d.field_id, d.operation, f.acres
)`;

const PLAN_HOURS = `plan_hours as (
  select field_id, operation, (summary->>'hours')::float8 as hours
  from pass_plans
  where farm_id = :farmId and jsonb_typeof(summary->'hours') = 'number' and (summary->>'hours')::float8 > 0
)`;

/** Season order of an operation column. */
const opOrder = (column: string) => `array_position(:ops::text[], ${column}::text)`;

const SECTIONS: Record<keyof SeasonRows, string> = {
  // Called-off jobs only count as such: they log no acres or hours.
  operationLogs: `select coalesce(d.operation, c.operation) as operation,
      coalesce(d.acres, 0)::float8 as acres, coalesce(d.hours, 0)::float8 as hours, coalesce(d.engine_hours, 0)::float8 as engine_hours,
      coalesce(d.jobs, 0)::int as jobs_finished, coalesce(c.jobs, 0)::int as jobs_called_off,
      coalesce(d.cost_cents, 0) as cost_cents, coalesce(d.machine_cents, 0) as machine_cents, coalesce(d.labour_cents, 0) as labour_cents,
      coalesce(d.fuel_cents, 0) as fuel_cents, d.cost_per_acre_cents, coalesce(d.unpriced, 0)::int as jobs_unpriced,
      coalesce(d.jobs_measured, 0)::int as jobs_measured, coalesce(d.acres_measured, 0)::float8 as acres_measured
    from (select operation, sum(acres) as acres, sum(hours) as hours, sum(engine_hours) as engine_hours, count(*) as jobs,
                 count(*) filter (where measured) as jobs_measured, sum(acres) filter (where measured) as acres_measured,
                 ${cents(COST)} as cost_cents, ${cents('sum(machine_cents)')} as machine_cents, ${cents('sum(labour_cents)')} as labour_cents,
                 ${cents('sum(fuel_cents)')} as fuel_cents, ${perAcre('sum(acres)')} as cost_per_acre_cents,
                 count(*) filter (where unpriced) as unpriced
          from done group by operation) d
    full join (select operation, count(*) as jobs from assignments where ${IN_SEASON} and state = 'called-off' group by operation) c
      on c.operation = d.operation`,
  // Weather days lost: the days (the job's day) with at least one job called off for weather, as
  // its log says, and how many jobs. Per operation, and over the whole farm (grouping set ()),
  // where a day lost to two operations counts once. Only the weather call-offs; a call-off ends
  // a job, so each job has at most one.
  weatherDays: `select a.operation, count(distinct a.day)::int as days, count(distinct a.id)::int as jobs
    from (select id, operation, day from assignments where ${IN_SEASON} and state = 'called-off') a
    join assignment_events e on e.assignment_id = a.id and e.farm_id = :farmId and e.type = 'call-off' and e.reason = 'weather'
    group by grouping sets ((a.operation), ())`,
  // Acres planned (for the operations the farm does; fallow fields only for harrowing and tillage),
  // covered (each field capped at its acres), and the pass-plan hours of those fields' saved plans.
  operationPlans: `select o.operation,
      coalesce(sum(p.acres), 0)::float8 as acres_planned,
      coalesce(sum(${PROGRESS_SQL.covered('coalesce(d.acres, 0)', 'p.acres')}), 0)::float8 as acres_covered,
      coalesce(sum(p.acres) filter (where h.hours is not null), 0)::float8 as acres_with_plan,
      sum(h.hours)::float8 as planned_hours
    from unnest(:ops::text[]) as o(operation)
    join farm_ops fo on fo.operation = o.operation
    join planned p on not p.fallow or o.operation = any(:fallowOps::text[])
    left join field_ops d on d.field_id = p.id and d.operation = o.operation
    left join plan_hours h on h.field_id = p.id and h.operation = o.operation
    group by o.operation`,
  // Every ISO week (Monday) from the season's first to last finished job, for each operation with work.
  weeks: `select o.operation, to_char(w.week, 'YYYY-MM-DD') as week, coalesce(s.acres, 0)::float8 as acres,
      (sum(coalesce(s.acres, 0)) over (partition by o.operation order by w.week))::float8 as cumulative
    from (select distinct operation from done) o
    cross join (select generate_series(min(date_trunc('week', day)), max(date_trunc('week', day)), interval '1 week')::date as week
                from done) w
    left join (select operation, date_trunc('week', day)::date as week, sum(acres) as acres from done group by 1, 2) s
      on s.operation = o.operation and s.week = w.week
    order by ${opOrder('o.operation')}, w.week`,
  fields: `select f.id, f.name, f.acres::float8 as acres, c.crop
    from fields f left join crop_plans c on c.field_id = f.id and c.season = :year
    where f.farm_id = :farmId and (c.id is not null or exists (select 1 from field_ops d where d.field_id = f.id))
    order by lower(f.name), f.id`,
  fieldOperations: `select field_id, operation, acres::float8 as acres, hours::float8 as hours, cost_cents, date_finished,
      jobs, jobs_measured, measured_acres, measured_typed_acres, skipped_acres, worked_twice_acres
    from field_ops order by field_id, ${opOrder('operation')}`,
  // Each field's cost, rounded once from its jobs (never the sum of its rounded operations), and per acre of the field.
  fieldCosts: `select d.field_id, ${cents(COST)} as cost_cents, round(${COST} / nullif(f.acres, 0))::bigint as cost_per_acre_cents
    from done d join fields f on f.id = d.field_id group by d.field_id, f.acres`,
  // The farm's cost, rounded once, per acre worked, and the jobs that lacked a rate or the fuel price.
  costTotals: `select ${cents(COST)} as cost_cents, ${perAcre('sum(acres)')} as cost_per_acre_cents,
      (count(*) filter (where unpriced))::int as jobs_unpriced from done`,
  // The operator on the job; a mentor riding along is not counted.
  personOperations: `select s.operator_id as membership_id, u.name, s.operation, s.acres, s.hours
    from (select operator_id, operation, coalesce(sum(acres), 0)::float8 as acres, coalesce(sum(hours), 0)::float8 as hours
          from done group by operator_id, operation) s
    join memberships m on m.id = s.operator_id join users u on u.id = m.user_id
    order by lower(u.name), s.operator_id, ${opOrder('s.operation')}`,
  // Per machine and operation: the cost of the jobs it did (machine, labour and fuel) and its own hourly cost's part.
  machineOperations: `select s.machine_id, m.name, s.operation, s.acres, s.hours, s.engine_hours, s.cost_cents, s.machine_cents
    from (select machine_id, operation, coalesce(sum(acres), 0)::float8 as acres, coalesce(sum(hours), 0)::float8 as hours,
                 coalesce(sum(engine_hours), 0)::float8 as engine_hours, ${cents(COST)} as cost_cents, ${cents('sum(machine_cents)')} as machine_cents
          from done group by machine_id, operation) s
    join machines m on m.id = s.machine_id
    order by lower(m.name), s.machine_id, ${opOrder('s.operation')}`,
  machineCosts: `select machine_id, ${cents(COST)} as cost_cents, ${cents('sum(machine_cents)')} as machine_cents,
      ${perAcre('sum(acres)')} as cost_per_acre_cents from done group by machine_id`,
};

/** The one statement of the season report (a Knex raw query, so it can also be explained). */
export function seasonQuery(db: Tx, farmId: number, year: number) {
  const columns = Object.entries(SECTIONS)
    .map(([name, sql]) => `(select coalesce(json_agg(x), '[]'::json) from (${sql}) x) as "${name}"`)
    .join(',\n');
  return db.raw(`with ${DONE}, ${PLANNED}, ${FARM_OPS}, ${FIELD_OPS}, ${PLAN_HOURS}\nselect ${columns}`, {
    farmId,
    year,
    ...seasonDays(year),
    ops: [...OPERATIONS],
    fallowOps: [...FALLOW_OPERATIONS],
    fuelDefaults: JSON.stringify(DEFAULT_FUEL_GAL_PER_ACRE),
    tolerance: FINISHED_TOLERANCE_ACRES,
  });
}

/** Every section of one farm's season, each a JSON array of grouped rows. */
export async function seasonRows(db: Tx, farmId: number, year: number): Promise<SeasonRows> {
  const { rows } = await seasonQuery(db, farmId, year);
  return rows[0] as SeasonRows;
}

export interface SeasonYearRow {
  year: number;
  acres: number;
  jobs: number;
}

/** Every season with finished work or a crop plan, newest first. */
export async function seasonYears(db: Tx, farmId: number): Promise<SeasonYearRow[]> {
  const { rows } = await db.raw(
    `with worked as (
       select ${PROGRESS_SQL.seasonOfDay} as year, coalesce(sum(acres_done), 0)::float8 as acres, count(*)::int as jobs
       from assignments where farm_id = :farmId and ${PROGRESS_SQL.isDone} group by 1
     ),
     planned as (select distinct season as year from crop_plans where farm_id = :farmId)
     select coalesce(w.year, p.year) as year, coalesce(w.acres, 0)::float8 as acres, coalesce(w.jobs, 0)::int as jobs
     from worked w full join planned p on p.year = w.year
     order by 1 desc`,
    { farmId },
  );
  return rows;
}
