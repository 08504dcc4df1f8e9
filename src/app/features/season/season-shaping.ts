// The season report shaped for the screen: chart series per operation, table rows with their
// totals, and two seasons side by side. Pure functions of the API's answer (areas in acres) and the
// farm's unit system, so the specs check them without a browser.
import { OPERATION_INFO, OPERATIONS, type Operation } from '@shared/operations';
import type { UnitSystem } from '@shared/schemas/auth';
import type { SeasonSummary, WeekSeason } from '@shared/schemas/season';
import { FIGURE_DECIMALS, areaIn, areaUnit, cropName, figure } from '@shared/figures';
import { formatMoney, roundCents } from '@shared/money';
import { acresToHa } from '@shared/units';

/** An area in the farm's unit, and its unit's short name (shared/figures.ts). */
export { areaIn, areaUnit };

export type ColumnKind = 'text' | 'area' | 'hours' | 'rate' | 'percent' | 'count' | 'date' | 'money';

/**
 * Cost per acre as the API gives it (whole cents, rounded once there), or on a metric farm the
 * cost's cents ÷ hectares, rounded once by the money rule (shared/money.ts); null without area.
 */
export function costPerArea(centsPerAcre: number | null, costCents: number, acres: number, system: UnitSystem): number | null {
  if (centsPerAcre === null || acres <= 0) return null;
  return system === 'metric' ? roundCents(costCents / acresToHa(acres)) : centsPerAcre;
}

export interface Column {
  key: string;
  label: string;
  kind: ColumnKind;
  /** How the totals row fills this column: a sum, a ratio of two row keys' sums, a fixed text, or nothing. */
  total?: { sum: true } | { ratio: [string, string] } | { text: string };
  /** A second line under the value (e.g. the day a field was finished), from this row key. */
  note?: string;
}

export type Row = Record<string, string | number | null>;

export interface Table {
  columns: Column[];
  rows: Row[];
  totals: Row;
}

/** The totals row: sums where a sum means something, ratios of sums for rates and shares; empty over a column of gaps. */
export function totalsOf(columns: readonly Column[], rows: readonly Row[]): Row {
  const sumOf = (key: string) => rows.reduce((s, r) => s + (typeof r[key] === 'number' ? (r[key] as number) : 0), 0);
  const any = (key: string) => rows.some((r) => typeof r[key] === 'number');
  const out: Row = {};
  for (const c of columns) {
    if (!c.total) out[c.key] = null;
    else if ('text' in c.total) out[c.key] = c.total.text;
    else if ('sum' in c.total) out[c.key] = any(c.key) ? sumOf(c.key) : null;
    else {
      const den = sumOf(c.total.ratio[1]);
      out[c.key] = den > 0 ? sumOf(c.total.ratio[0]) / den : null;
    }
  }
  return out;
}

const label = (op: Operation) => OPERATION_INFO[op].label;

/** Operations worth a row or a chart: something planned or something done. */
export function activeOperations(s: SeasonSummary): Operation[] {
  return s.operations.filter((o) => o.acresPlanned > 0 || o.acresFinished > 0 || o.jobsCalledOff > 0).map((o) => o.operation);
}

export interface WeekChart {
  operation: Operation;
  label: string;
  /** Week starts, YYYY-MM-DD. */
  weeks: string[];
  /** Area finished each week, farm units. */
  weekly: number[];
  /** Running total, farm units. */
  cumulative: number[];
  total: number;
  /** The week with the most work, or null when nothing was done. */
  busiestWeek: string | null;
}

/** One chart per operation with work, in season order, over the whole season's weeks. */
export function weekCharts(weekly: readonly WeekSeason[], system: UnitSystem): WeekChart[] {
  return OPERATIONS.flatMap((op) => {
    const rows = weekly.filter((w) => w.operation === op);
    if (!rows.length) return [];
    const weeklyArea = rows.map((w) => areaIn(w.acresFinished, system));
    const max = Math.max(...weeklyArea);
    return [
      {
        operation: op,
        label: label(op),
        weeks: rows.map((w) => w.week),
        weekly: weeklyArea,
        cumulative: rows.map((w) => areaIn(w.cumulativeAcres, system)),
        total: areaIn(rows[rows.length - 1].cumulativeAcres, system),
        busiestWeek: max > 0 ? rows[weeklyArea.indexOf(max)].week : null,
      },
    ];
  });
}

/** "Apr 20" for a YYYY-MM-DD week start (read as a calendar day, not shifted by time zone). */
export function weekLabel(day: string): string {
  const [y, m, d] = day.split('-').map(Number);
  return new Date(Date.UTC(y, m - 1, d)).toLocaleDateString('en-US', { month: 'short', day: 'numeric', timeZone: 'UTC' });
}

/** Planned against actual, per operation that has anything planned or done. */
export function operationsTable(s: SeasonSummary, system: UnitSystem): Table {
  const u = areaUnit(system);
  const columns: Column[] = [
    { key: 'operation', label: 'Operation', kind: 'text', total: { text: 'All operations' } },
    { key: 'planned', label: `Planned (${u})`, kind: 'area', total: { sum: true } },
    { key: 'finished', label: `Finished (${u})`, kind: 'area', total: { sum: true }, note: 'measuredNote' },
    { key: 'progress', label: 'Covered', kind: 'percent', total: { ratio: ['covered', 'planned'] } },
    { key: 'plannedHours', label: 'Planned hours', kind: 'hours', total: { sum: true } },
    { key: 'hours', label: 'Logged hours', kind: 'hours', total: { sum: true } },
    { key: 'plannedRate', label: `Planned ${u}/h`, kind: 'rate', total: { ratio: ['withPlan', 'plannedHours'] } },
    { key: 'rate', label: `Actual ${u}/h`, kind: 'rate', total: { ratio: ['finished', 'hours'] } },
    { key: 'cost', label: 'Cost', kind: 'money', total: { sum: true } },
    { key: 'costPerArea', label: `Cost per ${u}`, kind: 'money', total: { sum: true } },
  ];
  const active = new Set(activeOperations(s));
  const rows = s.operations
    .filter((o) => active.has(o.operation))
    .map((o) => ({
      operation: label(o.operation),
      planned: areaIn(o.acresPlanned, system),
      covered: areaIn(o.acresCovered, system),
      finished: areaIn(o.acresFinished, system),
      // Which of the finished figure was measured from tracks (the rest was typed).
      measuredNote: o.jobsMeasured > 0 ? `${figure(areaIn(o.acresMeasured, system), FIGURE_DECIMALS.area)} measured` : null,
      progress: o.progress,
      plannedHours: o.plannedHours,
      hours: o.hoursLogged,
      withPlan: areaIn(o.acresWithPlan, system),
      plannedRate: o.plannedAcresPerHour === null ? null : areaIn(o.plannedAcresPerHour, system),
      rate: o.acresPerHour === null ? null : areaIn(o.acresPerHour, system),
      cost: o.costCents,
      costPerArea: costPerArea(o.costPerAcreCents, o.costCents, o.acresFinished, system),
    }));
  // Money, area and hours totals come from the API, each from its exact sum, never added up from rounded rows.
  const t = seasonTotals(s, system);
  const season: Row = rows.length ? { finished: t.area, hours: t.hours, rate: t.rate } : {};
  return { columns, rows, totals: { ...totalsOf(columns, rows), ...season, ...moneyTotals(s, system) } };
}

/**
 * The season's own figures for a totals row that adds up the whole season (every finished job has
 * one field, one operator and one machine): the API adds the exact figures once, and the headline
 * shows the same ones. Adding the rows here instead adds figures already rounded, in binary
 * floating point, which can put a total on the other side of a rounding step: 379.84 + 139.51 +
 * 350.9 h gives 870.2499999999999 in IEEE 754 doubles, shown "870.2" beside the headline's "870.3"
 * for 870.25.
 */
function seasonTotals(s: SeasonSummary, system: UnitSystem) {
  const t = s.totals;
  return {
    area: areaIn(t.acresFinished, system),
    hours: t.hoursLogged,
    engineHours: t.engineHours,
    rate: t.acresPerHour === null ? null : areaIn(t.acresPerHour, system),
    ratePerEngineHour: t.engineHours > 0 ? areaIn(t.acresFinished / t.engineHours, system) : null,
    /** Each operation's finished area, for its column. */
    of: (ops: readonly Operation[]): Row =>
      Object.fromEntries(ops.map((op) => [op, areaIn(s.operations.find((o) => o.operation === op)?.acresFinished ?? 0, system)])),
  };
}

/** The farm's cost and cost per area for a totals row. */
function moneyTotals(s: SeasonSummary, system: UnitSystem): Row {
  return {
    cost: s.totals.costCents,
    costPerArea: costPerArea(s.totals.costPerAcreCents, s.totals.costCents, s.totals.acresFinished, system),
  };
}

/**
 * Weather days lost, per operation with a job called off for weather. The totals row takes the
 * farm's count from the API: a day lost to two operations counts once there, so it is not the sum
 * of the rows.
 */
export function weatherTable(s: SeasonSummary): Table {
  const columns: Column[] = [
    { key: 'operation', label: 'Operation', kind: 'text', total: { text: 'Whole farm' } },
    { key: 'days', label: 'Days lost to weather', kind: 'count' },
    { key: 'jobs', label: 'Jobs called off for weather', kind: 'count', total: { sum: true } },
  ];
  const rows = s.operations
    .filter((o) => o.jobsCalledOffForWeather > 0)
    .map((o) => ({ operation: label(o.operation), days: o.weatherDaysLost, jobs: o.jobsCalledOffForWeather }));
  const totals = rows.length ? { ...totalsOf(columns, rows), days: s.totals.weatherDaysLost } : totalsOf(columns, rows);
  return { columns, rows, totals };
}

/**
 * What tracks measured, per field and operation with at least one measured job: those jobs count
 * the acres their tracks covered (the typed acres beside them), with the ground the tracks
 * skipped and worked twice. Empty when no job has a track.
 */
export function measuredTable(s: SeasonSummary, system: UnitSystem): Table {
  const u = areaUnit(system);
  const columns: Column[] = [
    { key: 'field', label: 'Field', kind: 'text', total: { text: 'All measured jobs' } },
    { key: 'operation', label: 'Operation', kind: 'text' },
    { key: 'jobs', label: 'Jobs measured', kind: 'text' },
    { key: 'covered', label: `Covered, measured (${u})`, kind: 'area', total: { sum: true } },
    { key: 'typed', label: `Typed (${u})`, kind: 'area', total: { sum: true } },
    { key: 'skipped', label: `Skipped (${u})`, kind: 'area', total: { sum: true } },
    { key: 'twice', label: `Worked twice (${u})`, kind: 'area', total: { sum: true } },
  ];
  const rows = s.byField.flatMap((f) =>
    OPERATIONS.flatMap((op): Row[] => {
      const m = f.operations[op]?.measured;
      if (!m) return [];
      return [
        {
          field: f.field,
          operation: label(op),
          jobs: `${m.jobs} of ${f.operations[op]!.jobs}`,
          covered: areaIn(m.coveredAcres, system),
          typed: m.typedAcres === null ? null : areaIn(m.typedAcres, system),
          skipped: areaIn(m.skippedAcres, system),
          twice: areaIn(m.workedTwiceAcres, system),
        },
      ];
    }),
  );
  return { columns, rows, totals: totalsOf(columns, rows) };
}

/** Operations done anywhere this season, for the per-field and per-person columns. */
const doneOperations = (s: SeasonSummary) => OPERATIONS.filter((op) => s.operations.some((o) => o.operation === op && o.acresFinished > 0));

export function fieldsTable(s: SeasonSummary, system: UnitSystem): Table {
  const u = areaUnit(system);
  const ops = doneOperations(s);
  const columns: Column[] = [
    { key: 'field', label: 'Field', kind: 'text', total: { text: `${s.byField.length} fields` } },
    { key: 'crop', label: 'Crop', kind: 'text' },
    { key: 'area', label: `Area (${u})`, kind: 'area', total: { sum: true } },
    ...ops.map((op): Column => ({ key: op, label: `${label(op)} (${u})`, kind: 'area', total: { sum: true }, note: `${op}Done` })),
    { key: 'hours', label: 'Hours', kind: 'hours', total: { sum: true } },
    { key: 'cost', label: 'Cost', kind: 'money', total: { sum: true } },
    { key: 'costPerArea', label: `Cost per ${u} of field`, kind: 'money' },
  ];
  const rows = s.byField.map((f) => {
    const row: Row = {
      field: f.field,
      crop: cropName(f.crop),
      area: areaIn(f.acres, system),
      hours: f.totalHours,
      cost: f.costCents,
      costPerArea: costPerArea(f.costPerAcreCents, f.costCents, f.acres, system),
    };
    for (const op of ops) {
      const v = f.operations[op];
      row[op] = v ? areaIn(v.acres, system) : null;
      row[`${op}Done`] = v?.dateFinished ? `done ${weekLabel(v.dateFinished)}` : null;
    }
    return row;
  });
  // The fields' own acres are not a season figure: they stay the sum of the rows.
  const t = seasonTotals(s, system);
  const season: Row = rows.length ? { hours: t.hours, ...t.of(ops) } : {};
  return { columns, rows, totals: { ...totalsOf(columns, rows), ...season, cost: s.totals.costCents } };
}

export function peopleTable(s: SeasonSummary, system: UnitSystem): Table {
  const u = areaUnit(system);
  const ops = doneOperations(s);
  const columns: Column[] = [
    { key: 'name', label: 'Person', kind: 'text', total: { text: 'Everyone' } },
    ...ops.map((op): Column => ({ key: op, label: `${label(op)} (${u})`, kind: 'area', total: { sum: true } })),
    { key: 'area', label: `Total (${u})`, kind: 'area', total: { sum: true } },
    { key: 'hours', label: 'Hours', kind: 'hours', total: { sum: true } },
    { key: 'rate', label: `${u}/h`, kind: 'rate', total: { ratio: ['area', 'hours'] } },
  ];
  const rows = s.byPerson.map((p) => {
    const row: Row = {
      name: p.name,
      area: areaIn(p.totalAcres, system),
      hours: p.totalHours,
      rate: p.acresPerHour === null ? null : areaIn(p.acresPerHour, system),
    };
    for (const op of ops) row[op] = p.operations[op] ? areaIn(p.operations[op].acres, system) : null;
    return row;
  });
  const t = seasonTotals(s, system);
  const season: Row = rows.length ? { area: t.area, hours: t.hours, rate: t.rate, ...t.of(ops) } : {};
  return { columns, rows, totals: { ...totalsOf(columns, rows), ...season } };
}

export function machinesTable(s: SeasonSummary, system: UnitSystem): Table {
  const u = areaUnit(system);
  const columns: Column[] = [
    { key: 'machine', label: 'Machine', kind: 'text', total: { text: 'Whole fleet' } },
    { key: 'operations', label: 'Operations', kind: 'text' },
    { key: 'area', label: `Area (${u})`, kind: 'area', total: { sum: true } },
    { key: 'hours', label: 'Logged hours', kind: 'hours', total: { sum: true } },
    { key: 'engineHours', label: 'Engine hours', kind: 'hours', total: { sum: true } },
    { key: 'rate', label: `${u} per engine hour`, kind: 'rate', total: { ratio: ['area', 'engineHours'] } },
    { key: 'machineCost', label: 'Machine cost', kind: 'money' },
    { key: 'cost', label: 'Cost of its jobs', kind: 'money', total: { sum: true } },
    { key: 'costPerArea', label: `Cost per ${u}`, kind: 'money' },
  ];
  const rows = s.byMachine.map((m) => ({
    machine: m.machine,
    operations: m.operations.map((o) => label(o.operation)).join(', '),
    area: areaIn(m.acres, system),
    hours: m.hours,
    engineHours: m.engineHours,
    rate: m.acresPerEngineHour === null ? null : areaIn(m.acresPerEngineHour, system),
    machineCost: m.machineCents,
    cost: m.costCents,
    costPerArea: costPerArea(m.costPerAcreCents, m.costCents, m.acres, system),
  }));
  const t = seasonTotals(s, system);
  const season: Row = rows.length ? { area: t.area, hours: t.hours, engineHours: t.engineHours, rate: t.ratePerEngineHour } : {};
  return { columns, rows, totals: { ...totalsOf(columns, rows), ...season, cost: s.totals.costCents } };
}

/** Two seasons side by side, per operation either of them planned or worked. */
export function compareTable(a: SeasonSummary, b: SeasonSummary, system: UnitSystem): Table {
  const u = areaUnit(system);
  const ops = new Set([...activeOperations(a), ...activeOperations(b)]);
  const columns: Column[] = [
    { key: 'operation', label: 'Operation', kind: 'text', total: { text: 'All operations' } },
    { key: 'areaA', label: `${a.year} (${u})`, kind: 'area', total: { sum: true } },
    { key: 'areaB', label: `${b.year} (${u})`, kind: 'area', total: { sum: true } },
    { key: 'change', label: `Change (${u})`, kind: 'area', total: { sum: true } },
    { key: 'hoursA', label: `${a.year} hours`, kind: 'hours', total: { sum: true } },
    { key: 'hoursB', label: `${b.year} hours`, kind: 'hours', total: { sum: true } },
    { key: 'rateA', label: `${a.year} ${u}/h`, kind: 'rate', total: { ratio: ['areaA', 'hoursA'] } },
    { key: 'rateB', label: `${b.year} ${u}/h`, kind: 'rate', total: { ratio: ['areaB', 'hoursB'] } },
    { key: 'progressA', label: `${a.year} covered`, kind: 'percent' },
    { key: 'progressB', label: `${b.year} covered`, kind: 'percent' },
  ];
  const rows = OPERATIONS.filter((op) => ops.has(op)).map((op) => {
    const x = a.operations.find((o) => o.operation === op)!;
    const y = b.operations.find((o) => o.operation === op)!;
    return {
      operation: label(op),
      areaA: areaIn(x.acresFinished, system),
      areaB: areaIn(y.acresFinished, system),
      change: areaIn(y.acresFinished - x.acresFinished, system),
      hoursA: x.hoursLogged,
      hoursB: y.hoursLogged,
      rateA: x.acresPerHour === null ? null : areaIn(x.acresPerHour, system),
      rateB: y.acresPerHour === null ? null : areaIn(y.acresPerHour, system),
      progressA: x.acresPlanned > 0 ? x.progress : null,
      progressB: y.acresPlanned > 0 ? y.progress : null,
    };
  });
  const [ta, tb] = [seasonTotals(a, system), seasonTotals(b, system)];
  const seasons: Row = rows.length
    ? { areaA: ta.area, areaB: tb.area, change: tb.area - ta.area, hoursA: ta.hours, hoursB: tb.hours, rateA: ta.rate, rateB: tb.rate }
    : {};
  return { columns, rows, totals: { ...totalsOf(columns, rows), ...seasons } };
}

/**
 * A cell as text: areas, hours and rates to one decimal, shares as whole percent, empty as a dash;
 * the decimals and rounding of shared/figures.ts, which the CSV export uses too.
 */
export function formatCell(value: string | number | null | undefined, kind: ColumnKind): string {
  if (value === null || value === undefined || value === '') return '—';
  if (typeof value === 'string') return value;
  if (!Number.isFinite(value)) return '—';
  switch (kind) {
    case 'percent':
      return `${figure(value * 100, FIGURE_DECIMALS.percent)} %`;
    case 'count':
      return figure(value, FIGURE_DECIMALS.count);
    case 'hours':
      return figure(value, FIGURE_DECIMALS.hours);
    case 'money':
      return formatMoney(value);
    default:
      return figure(value, FIGURE_DECIMALS.area);
  }
}
