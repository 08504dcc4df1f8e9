// The season report's tables as CSV, in the farm's units: acres or hectares (the column names say
// which), hours, engine hours. One record per entity and operation, so a spreadsheet can pivot
// them; no totals row, which would be counted twice by a sum.
import { OPERATION_INFO } from '../../shared/operations';
import type { UnitSystem } from '../../shared/schemas/auth';
import type { SeasonSummary, SeasonTable } from '../../shared/schemas/season';
import { acresToHa } from '../../shared/units';
import { toCsv, type Cell } from './csv';

export function seasonCsv(s: SeasonSummary, table: SeasonTable, units: UnitSystem): string {
  const metric = units === 'metric';
  const area = metric ? 'hectares' : 'acres';
  /** An area in the farm's unit; a rate per hour likewise. */
  const a = (acres: number | null): number | null => (acres === null ? null : metric ? acresToHa(acres) : acres);
  const label = (op: keyof typeof OPERATION_INFO) => OPERATION_INFO[op].label;

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
        ]),
        [11, 12, 13, 14],
      );
    case 'fields':
      return toCsv(
        ['field', 'crop', `field_${area}`, 'operation', `${area}_finished`, 'hours_logged', 'date_finished'],
        s.byField.flatMap((f): Cell[][] => {
          const ops = Object.entries(f.operations) as Array<
            [keyof typeof OPERATION_INFO, { acres: number; hours: number; dateFinished: string | null }]
          >;
          if (!ops.length) return [[f.field, f.crop, a(f.acres), '', 0, 0, '']];
          return ops.map(([op, v]) => [f.field, f.crop, a(f.acres), label(op), a(v.acres), v.hours, v.dateFinished]);
        }),
      );
    case 'people':
      return toCsv(
        ['person', 'operation', `${area}_finished`, 'hours_logged', `${area}_per_hour`],
        s.byPerson.flatMap((p) =>
          (Object.entries(p.operations) as Array<[keyof typeof OPERATION_INFO, { acres: number; hours: number }]>).map(
            ([op, v]): Cell[] => [p.name, label(op), a(v.acres), v.hours, v.hours > 0 ? a(v.acres / v.hours) : null],
          ),
        ),
      );
    case 'machines':
      return toCsv(
        ['machine', 'operation', `${area}_finished`, 'hours_logged', 'engine_hours', `${area}_per_engine_hour`],
        s.byMachine.flatMap((m) =>
          m.operations.map((o): Cell[] => [
            m.machine,
            label(o.operation),
            a(o.acres),
            o.hours,
            o.engineHours,
            o.engineHours > 0 ? a(o.acres / o.engineHours) : null,
          ]),
        ),
      );
    case 'weekly':
      return toCsv(
        ['operation', 'week_starting', `${area}_finished`, `cumulative_${area}`],
        s.weekly.map((w): Cell[] => [label(w.operation), w.week, a(w.acresFinished), a(w.cumulativeAcres)]),
      );
  }
}
