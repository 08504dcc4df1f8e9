// The season report's tables as CSV, in the farm's units: acres or hectares (the column names say
// which), hours, engine hours. One record per entity and operation, so a spreadsheet can pivot
// them; no totals row, which would be counted twice by a sum. Each number column has the decimals
// the season screen shows for it (shared/figures.ts), and crops read as everywhere else. Money is
// in dollars with cents (column names end in _dollars), the API's whole cents as they are: never
// rounded again. Cost per hectare on a metric farm is the only figure made here, from the cents
// and the hectares.
import { FIGURE_DECIMALS, cropName } from '../../shared/figures';
import { OPERATION_INFO } from '../../shared/operations';
import type { UnitSystem } from '../../shared/schemas/auth';
import type { FieldOperationSeason, SeasonSummary, SeasonTable } from '../../shared/schemas/season';
import { roundCents } from '../../shared/money';
import { acresToHa } from '../../shared/units';
import { toCsv, type Cell } from './csv';

export function seasonCsv(s: SeasonSummary, table: SeasonTable, units: UnitSystem): string {
  const metric = units === 'metric';
  const area = metric ? 'hectares' : 'acres';
  /** An area in the farm's unit; a rate per hour likewise. */
  const a = (acres: number | null): number | null => (acres === null ? null : metric ? acresToHa(acres) : acres);
  const label = (op: keyof typeof OPERATION_INFO) => OPERATION_INFO[op].label;
  // Decimals by kind of column: text, area (and area per hour), hours, per cent, count.
  const { area: A, hours: H, percent: P, count: C } = FIGURE_DECIMALS;
  const T = 0;
  /** Dollars with cents. */
  const M = 2;
  /** Whole cents as dollars (exact: an integer ÷ 100 written to 2 places). */
  const dollars = (cents: number | null): number | null => (cents === null ? null : cents / 100);
  /**
   * Cost per acre as the API gives it, or on a metric farm the cost's cents ÷ hectares rounded by
   * the money rule (shared/money.ts); null without area.
   */
  const perArea = (centsPerAcre: number | null, costCents: number, acres: number): number | null =>
    centsPerAcre === null || acres <= 0 ? null : metric ? roundCents(costCents / acresToHa(acres)) / 100 : centsPerAcre / 100;

  switch (table) {
    case 'operations':
      return toCsv(
        [
          'operation',
          `${area}_planned`,
          `${area}_covered`,
          `${area}_finished`,
          'progress_percent',
          'hours_logged',
          'planned_hours',
          `${area}_with_plan`,
          `${area}_per_hour`,
          `planned_${area}_per_hour`,
          'engine_hours',
          'jobs_finished',
          'jobs_called_off',
          'weather_days_lost',
          'jobs_called_off_for_weather',
          'cost_dollars',
          'machine_cost_dollars',
          'labour_cost_dollars',
          'fuel_cost_dollars',
          `cost_per_${metric ? 'hectare' : 'acre'}_dollars`,
          'jobs_without_rates',
          'jobs_measured',
          `${area}_measured`,
        ],
        s.operations.map((o): Cell[] => [
          label(o.operation),
          a(o.acresPlanned),
          a(o.acresCovered),
          a(o.acresFinished),
          o.progress * 100,
          o.hoursLogged,
          o.plannedHours,
          a(o.acresWithPlan),
          a(o.acresPerHour),
          a(o.plannedAcresPerHour),
          o.engineHours,
          o.jobsFinished,
          o.jobsCalledOff,
          o.weatherDaysLost,
          o.jobsCalledOffForWeather,
          dollars(o.costCents),
          dollars(o.machineCents),
          dollars(o.labourCents),
          dollars(o.fuelCents),
          perArea(o.costPerAcreCents, o.costCents, o.acresFinished),
          o.jobsUnpriced,
          o.jobsMeasured,
          a(o.acresMeasured),
        ]),
        [T, A, A, A, P, H, H, A, A, A, H, C, C, C, C, M, M, M, M, M, C, C, A],
      );
    case 'fields':
      return toCsv(
        [
          'field',
          'crop',
          `field_${area}`,
          'operation',
          `${area}_finished`,
          'hours_logged',
          'date_finished',
          'cost_dollars',
          'field_cost_dollars',
          `field_cost_per_${metric ? 'hectare' : 'acre'}_dollars`,
          // What tracks measured (blank when no job of the row was measured): the measured jobs
          // count the measured acres; what was typed for them is kept beside it.
          'jobs_finished',
          'jobs_measured',
          `${area}_measured`,
          `${area}_typed_on_measured_jobs`,
          `${area}_skipped`,
          `${area}_worked_twice`,
        ],
        s.byField.flatMap((f): Cell[][] => {
          const ops = Object.entries(f.operations) as Array<[keyof typeof OPERATION_INFO, FieldOperationSeason]>;
          const crop = cropName(f.crop);
          const fieldCost = [dollars(f.costCents), perArea(f.costPerAcreCents, f.costCents, f.acres)];
          if (!ops.length) return [[f.field, crop, a(f.acres), '', 0, 0, '', 0, ...fieldCost, 0, 0, null, null, null, null]];
          return ops.map(([op, v]) => [
            f.field,
            crop,
            a(f.acres),
            label(op),
            a(v.acres),
            v.hours,
            v.dateFinished,
            dollars(v.costCents),
            ...fieldCost,
            v.jobs,
            v.measured?.jobs ?? 0,
            a(v.measured?.coveredAcres ?? null),
            a(v.measured?.typedAcres ?? null),
            a(v.measured?.skippedAcres ?? null),
            a(v.measured?.workedTwiceAcres ?? null),
          ]);
        }),
        [T, T, A, T, A, H, T, M, M, M, C, C, A, A, A, A],
      );
    case 'people':
      return toCsv(
        ['person', 'operation', `${area}_finished`, 'hours_logged', `${area}_per_hour`],
        s.byPerson.flatMap((p) =>
          (Object.entries(p.operations) as Array<[keyof typeof OPERATION_INFO, { acres: number; hours: number }]>).map(
            ([op, v]): Cell[] => [p.name, label(op), a(v.acres), v.hours, v.hours > 0 ? a(v.acres / v.hours) : null],
          ),
        ),
        [T, T, A, H, A],
      );
    case 'machines':
      return toCsv(
        [
          'machine',
          'operation',
          `${area}_finished`,
          'hours_logged',
          'engine_hours',
          `${area}_per_engine_hour`,
          'cost_dollars',
          'machine_cost_dollars',
          'machine_total_cost_dollars',
          `machine_cost_per_${metric ? 'hectare' : 'acre'}_dollars`,
        ],
        s.byMachine.flatMap((m) =>
          m.operations.map((o): Cell[] => [
            m.machine,
            label(o.operation),
            a(o.acres),
            o.hours,
            o.engineHours,
            o.engineHours > 0 ? a(o.acres / o.engineHours) : null,
            dollars(o.costCents),
            dollars(o.machineCents),
            dollars(m.costCents),
            perArea(m.costPerAcreCents, m.costCents, m.acres),
          ]),
        ),
        [T, T, A, H, H, A, M, M, M, M],
      );
    case 'weekly':
      return toCsv(
        ['operation', 'week_starting', `${area}_finished`, `cumulative_${area}`],
        s.weekly.map((w): Cell[] => [label(w.operation), w.week, a(w.acresFinished), a(w.cumulativeAcres)]),
        [T, T, A, A],
      );
  }
}
