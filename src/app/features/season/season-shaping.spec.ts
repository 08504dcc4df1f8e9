import { OPERATIONS, type Operation } from '@shared/operations';
import type { OperationSeason, SeasonSummary } from '@shared/schemas/season';
import {
  activeOperations,
  compareTable,
  fieldsTable,
  formatCell,
  machinesTable,
  operationsTable,
  peopleTable,
  totalsOf,
  weatherTable,
  weekCharts,
  weekLabel,
  type Column,
} from './season-shaping';
import { ZERO_OPERATION } from './testing/season-fixtures';

/** Hectares per acre: 4,046.8564224 m² (international foot, exact) ÷ 10,000 m². */
const HA_PER_ACRE = 0.40468564224;

function op(operation: Operation, over: Partial<OperationSeason> = {}): OperationSeason {
  return { operation, ...ZERO_OPERATION, ...over };
}

function summary(year: number, ops: Partial<Record<Operation, Partial<OperationSeason>>>): SeasonSummary {
  // The season's totals as the API sends them: sums of the operations, the rate to 4 decimals.
  const done = Object.values(ops);
  const acresFinished = done.reduce((s, o) => s + (o.acresFinished ?? 0), 0);
  const hoursLogged = done.reduce((s, o) => s + (o.hoursLogged ?? 0), 0);
  return {
    year,
    operations: OPERATIONS.map((o) => op(o, ops[o])),
    weekly: [
      { operation: 'seeding', week: `${year}-04-27`, acresFinished: 100, cumulativeAcres: 100 },
      { operation: 'seeding', week: `${year}-05-04`, acresFinished: 0, cumulativeAcres: 100 },
      { operation: 'seeding', week: `${year}-05-11`, acresFinished: 60.5, cumulativeAcres: 160.5 },
      { operation: 'harrowing', week: `${year}-04-27`, acresFinished: 80, cumulativeAcres: 80 },
      { operation: 'harrowing', week: `${year}-05-04`, acresFinished: 120, cumulativeAcres: 200 },
      { operation: 'harrowing', week: `${year}-05-11`, acresFinished: 0, cumulativeAcres: 200 },
    ],
    byField: [
      {
        fieldId: 1,
        field: 'North',
        crop: 'durum',
        acres: 160.5,
        operations: {
          seeding: { acres: 160.5, hours: 6, costCents: 0, dateFinished: `${year}-05-12`, jobs: 1, measured: null },
          harrowing: { acres: 120, hours: 3, costCents: 0, dateFinished: null, jobs: 1, measured: null },
        },
        totalAcres: 280.5,
        totalHours: 9,
        costCents: 0,
        costPerAcreCents: null,
      },
      {
        fieldId: 2,
        field: 'South',
        crop: null,
        acres: 80,
        operations: { harrowing: { acres: 80, hours: 2, costCents: 0, dateFinished: `${year}-04-28`, jobs: 1, measured: null } },
        totalAcres: 80,
        totalHours: 2,
        costCents: 0,
        costPerAcreCents: null,
      },
      {
        fieldId: 3,
        field: 'West',
        crop: 'canola',
        acres: 40,
        operations: {},
        totalAcres: 0,
        totalHours: 0,
        costCents: 0,
        costPerAcreCents: null,
      },
    ],
    byPerson: [
      {
        membershipId: 7,
        name: 'Ada',
        operations: { seeding: { acres: 160.5, hours: 6 } },
        totalAcres: 160.5,
        totalHours: 6,
        acresPerHour: 26.75,
      },
      {
        membershipId: 8,
        name: 'Tomas',
        operations: { harrowing: { acres: 200, hours: 5 } },
        totalAcres: 200,
        totalHours: 5,
        acresPerHour: 40,
      },
    ],
    byMachine: [
      {
        machineId: 1,
        machine: 'Big tractor',
        engineHours: 12.5,
        acres: 360.5,
        hours: 11,
        acresPerEngineHour: 28.84,
        costCents: 0,
        machineCents: 0,
        costPerAcreCents: null,
        operations: [
          { operation: 'harrowing', acres: 200, hours: 5, engineHours: 5.5, costCents: 0, machineCents: 0 },
          { operation: 'seeding', acres: 160.5, hours: 6, engineHours: 7, costCents: 0, machineCents: 0 },
        ],
      },
    ],
    totals: {
      acresFinished,
      hoursLogged,
      engineHours: 12.5,
      acresPerHour: hoursLogged > 0 ? Math.round((acresFinished / hoursLogged) * 10_000) / 10_000 : null,
      jobsFinished: 4,
      jobsCalledOff: 1,
      weatherDaysLost: 0,
      jobsCalledOffForWeather: 0,
      fieldsWorked: 2,
      costCents: 0,
      costPerAcreCents: null,
      jobsUnpriced: 0,
    },
  };
}

const S = summary(2026, {
  harrowing: {
    acresPlanned: 280.5,
    acresCovered: 200,
    acresFinished: 200,
    hoursLogged: 5,
    acresPerHour: 40,
    progress: 200 / 280.5,
    plannedHours: 4,
    acresWithPlan: 160.5,
    plannedAcresPerHour: 160.5 / 4,
  },
  seeding: {
    acresPlanned: 200.5,
    acresCovered: 160.5,
    acresFinished: 160.5,
    hoursLogged: 6,
    acresPerHour: 26.75,
    progress: 160.5 / 200.5,
    jobsCalledOff: 1,
  },
  spraying: { acresPlanned: 200.5 },
});

describe('season shaping', () => {
  it('when an operation has nothing planned, done or called off, then it gets no row or card', () => {
    expect(activeOperations(S)).toEqual(['harrowing', 'seeding', 'spraying']);
    expect(operationsTable(S, 'us').rows.map((r) => r['operation'])).toEqual(['Harrowing', 'Seeding', 'Spraying']);
  });

  it('when weeks come per operation, then each chart follows the season order with its own running total and busiest week', () => {
    const charts = weekCharts(S.weekly, 'us');
    expect(charts.map((c) => c.operation)).toEqual(['harrowing', 'seeding']);
    const seeding = S.weekly.filter((w) => w.operation === 'seeding');
    expect(charts[1].weekly).toEqual(seeding.map((w) => w.acresFinished));
    expect(charts[1].cumulative).toEqual(seeding.map((w) => w.cumulativeAcres));
    expect(charts[1].total).toBe(seeding[seeding.length - 1].cumulativeAcres);
    expect(charts[0].busiestWeek).toBe('2026-05-04');
    expect(weekLabel('2026-05-04')).toBe('May 4');
  });

  it('when the farm is metric, then chart and table areas are hectares', () => {
    const [harrow] = weekCharts(S.weekly, 'metric');
    expect(harrow.total).toBeCloseTo(200 * HA_PER_ACRE, 9);
    const t = fieldsTable(S, 'metric');
    expect(t.columns.find((c) => c.key === 'area')!.label).toBe('Area (ha)');
    expect(t.rows[0]['area']).toBeCloseTo(160.5 * HA_PER_ACRE, 9);
    expect(t.totals['area']).toBeCloseTo((160.5 + 80 + 40) * HA_PER_ACRE, 9);
    expect(operationsTable(S, 'metric').rows[0]['rate']).toBeCloseTo(40 * HA_PER_ACRE, 9);
  });

  it('when totals are made, then areas and hours add up and rates are the ratio of the sums, not the sum of the rates', () => {
    const t = operationsTable(S, 'us');
    const planned = S.operations.reduce((s, o) => s + (activeOperations(S).includes(o.operation) ? o.acresPlanned : 0), 0);
    expect(t.totals['planned']).toBeCloseTo(planned, 9);
    expect(t.totals['finished']).toBeCloseTo(200 + 160.5, 9);
    expect(t.totals['hours']).toBeCloseTo(5 + 6, 9);
    // The API's rate of the season, to its 4 decimals.
    expect(t.totals['rate']).toBeCloseTo((200 + 160.5) / (5 + 6), 4);
    expect(t.totals['progress']).toBeCloseTo((200 + 160.5) / planned, 9);
    expect(t.totals['plannedRate']).toBeCloseTo(160.5 / 4, 9);
    expect(t.totals['operation']).toBe('All operations');
  });

  it('when a rate has nothing to divide by, or a column is all gaps, then its total is empty rather than infinite or zero', () => {
    const cols: Column[] = [
      { key: 'a', label: 'a', kind: 'area', total: { sum: true } },
      { key: 'h', label: 'h', kind: 'hours', total: { sum: true } },
      { key: 'r', label: 'r', kind: 'rate', total: { ratio: ['a', 'h'] } },
    ];
    expect(totalsOf(cols, [{ a: 10, h: 0, r: null }])).toEqual({ a: 10, h: 0, r: null });
    expect(totalsOf(cols, [{ a: null, h: null, r: null }])).toEqual({ a: null, h: null, r: null });
  });

  it('when fields are listed, then each operation done this season is a column with the day it was finished', () => {
    const t = fieldsTable(S, 'us');
    expect(t.columns.map((c) => c.key)).toEqual(['field', 'crop', 'area', 'harrowing', 'seeding', 'hours', 'cost', 'costPerArea']);
    const north = t.rows.find((r) => r['field'] === 'North')!;
    expect(north['seedingDone']).toBe('done May 12');
    expect(north['harrowingDone']).toBeNull();
    expect(t.rows.find((r) => r['field'] === 'West')!['harrowing']).toBeNull();
    expect(t.totals['harrowing']).toBe(120 + 80);
    expect(t.totals['field']).toBe('3 fields');
  });

  it('when people and machines are listed, then their totals match the season totals', () => {
    const p = peopleTable(S, 'us');
    expect(p.totals['area']).toBeCloseTo(
      S.byPerson.reduce((s, x) => s + x.totalAcres, 0),
      9,
    );
    expect(p.totals['rate']).toBeCloseTo(
      S.byPerson.reduce((s, x) => s + x.totalAcres, 0) / S.byPerson.reduce((s, x) => s + x.totalHours, 0),
      4,
    );
    const m = machinesTable(S, 'us');
    expect(m.rows[0]['operations']).toBe('Harrowing, Seeding');
    expect(m.totals['rate']).toBeCloseTo(360.5 / 12.5, 9);
  });

  it('when the rows add up to a total on a rounding step, then every totals row reads as the headline does', () => {
    // 379.84 + 139.51 + 350.9 = 870.25 h by hand, which rounds half up to 870.3 h at one decimal;
    // added as IEEE 754 doubles in that order they give 870.2499999999999, which reads 870.2.
    const hours = [379.84, 139.51, 350.9];
    const base = summary(2026, {
      harrowing: { acresFinished: 3000, hoursLogged: hours[0] },
      seeding: { acresFinished: 2000, hoursLogged: hours[1] },
      spraying: { acresFinished: 4000, hoursLogged: hours[2] },
    });
    const machine = (id: number, h: number) => ({ ...base.byMachine[0], machineId: id, machine: `No. ${id}`, hours: h, engineHours: h });
    const person = (id: number, h: number) => ({ ...base.byPerson[0], membershipId: id, name: `P${id}`, totalHours: h });
    const s: SeasonSummary = {
      ...base,
      byMachine: hours.map((h, i) => machine(i + 1, h)),
      byPerson: hours.map((h, i) => person(i + 1, h)),
      byField: hours.map((h, i) => ({ ...base.byField[2], fieldId: i + 1, totalHours: h })),
      // As the API sends it: summed exactly once, then kept to 4 decimals.
      totals: { ...base.totals, hoursLogged: 870.25, engineHours: 870.25 },
    };
    expect(formatCell(s.totals.hoursLogged, 'hours')).toBe('870.3');
    const machines = machinesTable(s, 'us');
    expect(machines.totals['machine']).toBe('Whole fleet');
    expect(formatCell(machines.totals['hours'], 'hours')).toBe('870.3');
    expect(formatCell(machines.totals['engineHours'], 'hours')).toBe('870.3');
    expect(formatCell(peopleTable(s, 'us').totals['hours'], 'hours')).toBe('870.3');
    expect(formatCell(operationsTable(s, 'us').totals['hours'], 'hours')).toBe('870.3');
    expect(formatCell(fieldsTable(s, 'us').totals['hours'], 'hours')).toBe('870.3');
  });

  it('when two seasons are compared, then each operation shows both years and the change', () => {
    const before = summary(2025, {
      harrowing: { acresPlanned: 100, acresFinished: 90, hoursLogged: 3, acresPerHour: 30, progress: 0.9 },
      baling: { acresFinished: 12, hoursLogged: 1 },
    });
    const t = compareTable(before, S, 'us');
    expect(t.rows.map((r) => r['operation'])).toEqual(['Harrowing', 'Seeding', 'Spraying', 'Baling']);
    const h = t.rows[0];
    expect([h['areaA'], h['areaB'], h['change']]).toEqual([90, 200, 200 - 90]);
    expect(t.rows[3]['progressA']).toBeNull();
    expect(t.columns[1].label).toBe('2025 (ac)');
    expect(t.totals['change']).toBeCloseTo(S.totals.acresFinished - (90 + 12), 9);
  });

  it('when jobs were called off for weather, then each such operation is a row and the whole farm counts a shared day once', () => {
    // Worked by hand: spraying lost 10 and 11 June (3 jobs), harrowing lost 10 June (1 job) →
    // the farm lost 2 days, not 2 + 1; seeding's call-off was a breakdown and gets no row.
    const s = summary(2026, {
      spraying: { jobsCalledOff: 3, weatherDaysLost: 2, jobsCalledOffForWeather: 3 },
      harrowing: { jobsCalledOff: 1, weatherDaysLost: 1, jobsCalledOffForWeather: 1 },
      seeding: { jobsCalledOff: 1 },
    });
    s.totals = { ...s.totals, weatherDaysLost: 2, jobsCalledOffForWeather: 4 };
    const t = weatherTable(s);
    expect(t.columns.map((c) => c.label)).toEqual(['Operation', 'Days lost to weather', 'Jobs called off for weather']);
    expect(t.rows).toEqual([
      { operation: 'Harrowing', days: 1, jobs: 1 },
      { operation: 'Spraying', days: 2, jobs: 3 },
    ]);
    expect(t.totals).toEqual({ operation: 'Whole farm', days: 2, jobs: 4 });
  });

  it('when nothing was called off for weather, then the weather table has no rows and an empty totals row', () => {
    const t = weatherTable(S);
    expect(t.rows).toEqual([]);
    expect(t.totals).toEqual({ operation: 'Whole farm', days: null, jobs: null });
  });

  it('when cells are formatted, then numbers get one decimal and thousands, shares whole percent, and gaps a dash', () => {
    expect(formatCell(1234.56, 'area')).toBe('1,234.6');
    expect(formatCell(0.8004, 'percent')).toBe('80 %');
    expect(formatCell(null, 'rate')).toBe('—');
    expect(formatCell('North', 'text')).toBe('North');
  });
});
