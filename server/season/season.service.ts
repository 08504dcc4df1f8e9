// The season report: what the farm's logged work added up to in one crop year (the calendar year
// of each job's day). The sums come from PostgreSQL; this file only arranges them and divides.
// Rules:
// - A job's acres and hours count once it is finished, as the work board counts a field done (a
//   part-done field is a finished job with fewer acres); called-off jobs only count as called off.
// - Acres planned for an operation: the fields with a crop that season, for each operation the farm
//   does (an implement of its fleet does it, or work for it was logged that season); a fallow field
//   only for harrowing and tillage. Progress is the share of those acres covered at least once.
// - Planned hours add the saved pass plans of those fields; a field without a plan adds nothing,
//   and acresWithPlan says how many acres the planned hours cover. Pass plans are not kept per
//   season: a past season reads the plans saved now.
// - Weather days lost: the days with at least one job called off for weather (its log's reason),
//   per operation; the farm's total counts a day lost to two operations once, so it is not the
//   sum of the operations' days.
// - Costs (rules in shared/costs.ts) are whole cents, each figure rounded once in SQL from its
//   exact sum; nothing here adds or rounds money.
import { OPERATIONS, type Operation } from '../../shared/operations';
import type { FieldSeason, MachineSeason, OperationSeason, PersonSeason, SeasonIndex, SeasonSummary } from '../../shared/schemas/season';
import type { AppDeps } from '../app-deps';
import * as repo from './season.repository';
import { roundTo } from '../../shared/round';
import { yearIn } from '../../shared/calendar';

/** a ÷ b to 2 decimals, or null when there is nothing to divide by. */
/**
 * Figures leave the server to 4 decimals; the screens and the CSV round them once, for display.
 * Rounding here to 2 would round twice: 19,260.149 ac → 19,260.15 → "19,260.2" on a 1-decimal screen.
 */
const precise = (n: number): number => roundTo(n, 4);
const ratio = (a: number, b: number | null) => (b && b > 0 ? precise(a / b) : null);

export async function seasonSummary(deps: AppDeps, farmId: number, year: number): Promise<SeasonSummary> {
  const {
    operationLogs: logs,
    weatherDays,
    operationPlans: plans,
    weeks,
    fields,
    fieldOperations: fieldOps,
    personOperations: personOps,
    machineOperations: machineOps,
    fieldCosts,
    costTotals,
    machineCosts,
  } = await repo.seasonRows(deps.db, farmId, year);

  const logOf = new Map(logs.map((l) => [l.operation, l]));
  const planOf = new Map(plans.map((p) => [p.operation, p]));
  const weatherOf = new Map(weatherDays.map((w) => [w.operation, w]));
  const operations: OperationSeason[] = OPERATIONS.map((operation) => {
    const l = logOf.get(operation);
    const p = planOf.get(operation);
    const acresPlanned = p?.acres_planned ?? 0;
    const acresFinished = l?.acres ?? 0;
    const hoursLogged = l?.hours ?? 0;
    const plannedHours = p?.planned_hours ?? null;
    return {
      operation,
      acresPlanned: precise(acresPlanned),
      acresCovered: precise(p?.acres_covered ?? 0),
      acresFinished: precise(acresFinished),
      hoursLogged: precise(hoursLogged),
      engineHours: precise(l?.engine_hours ?? 0),
      plannedHours: plannedHours === null ? null : precise(plannedHours),
      acresWithPlan: precise(p?.acres_with_plan ?? 0),
      acresPerHour: ratio(acresFinished, hoursLogged),
      plannedAcresPerHour: ratio(p?.acres_with_plan ?? 0, plannedHours),
      progress: acresPlanned > 0 ? Math.min(1, precise((p?.acres_covered ?? 0) / acresPlanned)) : 0,
      jobsFinished: l?.jobs_finished ?? 0,
      jobsCalledOff: l?.jobs_called_off ?? 0,
      weatherDaysLost: weatherOf.get(operation)?.days ?? 0,
      jobsCalledOffForWeather: weatherOf.get(operation)?.jobs ?? 0,
      costCents: l?.cost_cents ?? 0,
      machineCents: l?.machine_cents ?? 0,
      labourCents: l?.labour_cents ?? 0,
      fuelCents: l?.fuel_cents ?? 0,
      costPerAcreCents: l?.cost_per_acre_cents ?? null,
      jobsUnpriced: l?.jobs_unpriced ?? 0,
      jobsMeasured: l?.jobs_measured ?? 0,
      acresMeasured: precise(l?.acres_measured ?? 0),
    };
  });
  const cost = costTotals[0];

  const totalAcres = logs.reduce((s, l) => s + l.acres, 0);
  const totalHours = logs.reduce((s, l) => s + l.hours, 0);
  return {
    year,
    operations,
    weekly: weeks.map((w) => ({
      operation: w.operation,
      week: w.week,
      acresFinished: precise(w.acres),
      cumulativeAcres: precise(w.cumulative),
    })),
    byField: byField(fields, fieldOps, fieldCosts),
    byPerson: byPerson(personOps),
    byMachine: byMachine(machineOps, machineCosts),
    totals: {
      acresFinished: precise(totalAcres),
      hoursLogged: precise(totalHours),
      engineHours: precise(logs.reduce((s, l) => s + l.engine_hours, 0)),
      acresPerHour: ratio(totalAcres, totalHours),
      jobsFinished: logs.reduce((s, l) => s + l.jobs_finished, 0),
      jobsCalledOff: logs.reduce((s, l) => s + l.jobs_called_off, 0),
      weatherDaysLost: weatherOf.get(null)?.days ?? 0,
      jobsCalledOffForWeather: weatherOf.get(null)?.jobs ?? 0,
      fieldsWorked: new Set(fieldOps.map((f) => f.field_id)).size,
      costCents: cost?.cost_cents ?? 0,
      costPerAcreCents: cost?.cost_per_acre_cents ?? null,
      jobsUnpriced: cost?.jobs_unpriced ?? 0,
    },
  };
}

function byField(fields: repo.FieldRow[], rows: repo.FieldOperationRow[], costs: repo.FieldCostRow[]): FieldSeason[] {
  const costOf = new Map(costs.map((c) => [c.field_id, c]));
  const out = new Map<number, FieldSeason>(
    fields.map((f) => [
      f.id,
      {
        fieldId: f.id,
        field: f.name,
        crop: f.crop,
        acres: precise(f.acres),
        operations: {},
        totalAcres: 0,
        totalHours: 0,
        costCents: costOf.get(f.id)?.cost_cents ?? 0,
        costPerAcreCents: costOf.get(f.id)?.cost_per_acre_cents ?? null,
      },
    ]),
  );
  for (const r of [...rows].sort((a, b) => OPERATIONS.indexOf(a.operation) - OPERATIONS.indexOf(b.operation))) {
    const f = out.get(r.field_id);
    if (!f) continue;
    f.operations[r.operation] = {
      acres: precise(r.acres),
      hours: precise(r.hours),
      costCents: r.cost_cents,
      dateFinished: r.date_finished,
      jobs: r.jobs,
      measured:
        r.jobs_measured > 0
          ? {
              jobs: r.jobs_measured,
              coveredAcres: precise(r.measured_acres ?? 0),
              skippedAcres: precise(r.skipped_acres ?? 0),
              workedTwiceAcres: precise(r.worked_twice_acres ?? 0),
              typedAcres: r.measured_typed_acres === null ? null : precise(r.measured_typed_acres),
            }
          : null,
    };
    f.totalAcres += r.acres;
    f.totalHours += r.hours;
  }
  return [...out.values()].map((f) => ({ ...f, totalAcres: precise(f.totalAcres), totalHours: precise(f.totalHours) }));
}

function byPerson(rows: repo.PersonOperationRow[]): PersonSeason[] {
  const out = new Map<number, PersonSeason>();
  for (const r of rows) {
    const p = out.get(r.membership_id) ?? {
      membershipId: r.membership_id,
      name: r.name,
      operations: {},
      totalAcres: 0,
      totalHours: 0,
      acresPerHour: null,
    };
    p.operations[r.operation] = { acres: precise(r.acres), hours: precise(r.hours) };
    p.totalAcres += r.acres;
    p.totalHours += r.hours;
    out.set(r.membership_id, p);
  }
  return [...out.values()].map((p) => ({
    ...p,
    totalAcres: precise(p.totalAcres),
    totalHours: precise(p.totalHours),
    acresPerHour: ratio(p.totalAcres, p.totalHours),
  }));
}

function byMachine(rows: repo.MachineOperationRow[], costs: repo.MachineCostRow[]): MachineSeason[] {
  const costOf = new Map(costs.map((c) => [c.machine_id, c]));
  const out = new Map<number, MachineSeason>();
  for (const r of rows) {
    const m = out.get(r.machine_id) ?? {
      machineId: r.machine_id,
      machine: r.name,
      engineHours: 0,
      acres: 0,
      hours: 0,
      acresPerEngineHour: null,
      costCents: costOf.get(r.machine_id)?.cost_cents ?? 0,
      machineCents: costOf.get(r.machine_id)?.machine_cents ?? 0,
      costPerAcreCents: costOf.get(r.machine_id)?.cost_per_acre_cents ?? null,
      operations: [],
    };
    m.operations.push({
      operation: r.operation as Operation,
      acres: precise(r.acres),
      hours: precise(r.hours),
      engineHours: precise(r.engine_hours),
      costCents: r.cost_cents,
      machineCents: r.machine_cents,
    });
    m.engineHours += r.engine_hours;
    m.acres += r.acres;
    m.hours += r.hours;
    out.set(r.machine_id, m);
  }
  return [...out.values()].map((m) => ({
    ...m,
    engineHours: precise(m.engineHours),
    acres: precise(m.acres),
    hours: precise(m.hours),
    acresPerEngineHour: ratio(m.acres, m.engineHours),
  }));
}

/** The seasons to offer in the picker. */
export async function seasonIndex(deps: AppDeps, farmId: number, timeZone: string, now = new Date()): Promise<SeasonIndex> {
  const rows = await repo.seasonYears(deps.db, farmId);
  const current = yearIn(timeZone, now);
  const worked = rows.filter((r) => r.jobs > 0).map((r) => r.year);
  const seasons = rows.map((r) => ({ year: r.year, acresFinished: precise(r.acres), jobs: r.jobs }));
  if (!seasons.some((s) => s.year === current)) seasons.push({ year: current, acresFinished: 0, jobs: 0 });
  seasons.sort((a, b) => b.year - a.year);
  return { current, latestWorked: worked.length ? Math.max(...worked) : current, seasons };
}
