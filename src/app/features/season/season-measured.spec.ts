// What tracks measured, on the season screen: the measured jobs' covered acres (what they count),
// the typed acres beside them, the skipped and twice-worked acres, and which part of an
// operation's finished acres was measured.
import { OPERATIONS } from '@shared/operations';
import type { SeasonSummary } from '@shared/schemas/season';
import { formatCell, measuredTable, operationsTable } from './season-shaping';
import { ZERO_OPERATION } from './testing/season-fixtures';

const field = (fieldId: number, name: string, operations: SeasonSummary['byField'][number]['operations']) => ({
  fieldId,
  field: name,
  crop: 'durum',
  acres: 160,
  operations,
  totalAcres: 0,
  totalHours: 0,
  costCents: 0,
  costPerAcreCents: null,
});

// Seeding of two fields: Coulee Quarter in two jobs, one measured (150.25 ac covered, 158 typed);
// Slough Eighty in one typed job.
const S: SeasonSummary = {
  year: 2026,
  operations: OPERATIONS.map((operation) =>
    operation === 'seeding'
      ? { ...ZERO_OPERATION, operation, acresPlanned: 240, acresFinished: 237.25, jobsFinished: 3, jobsMeasured: 1, acresMeasured: 150.25 }
      : { ...ZERO_OPERATION, operation },
  ),
  weekly: [],
  byField: [
    field(1, 'Coulee Quarter', {
      seeding: {
        acres: 157.25,
        hours: 9,
        costCents: 0,
        dateFinished: null,
        jobs: 2,
        measured: { jobs: 1, coveredAcres: 150.25, skippedAcres: 2.5, workedTwiceAcres: 4.75, typedAcres: 158 },
      },
    }),
    field(2, 'Slough Eighty', { seeding: { acres: 80, hours: 5, costCents: 0, dateFinished: '2026-05-04', jobs: 1, measured: null } }),
  ],
  byPerson: [],
  byMachine: [],
  totals: {
    acresFinished: 237.25,
    hoursLogged: 14,
    engineHours: 0,
    acresPerHour: null,
    jobsFinished: 3,
    jobsCalledOff: 0,
    weatherDaysLost: 0,
    jobsCalledOffForWeather: 0,
    fieldsWorked: 2,
    costCents: 0,
    costPerAcreCents: null,
    jobsUnpriced: 0,
  },
};

describe('measured acres on the season screen', () => {
  it('when a field and operation has a measured job, then its row shows covered, typed, skipped and twice-worked acres', () => {
    const t = measuredTable(S, 'us');
    expect(t.columns.map((c) => c.label)).toEqual([
      'Field',
      'Operation',
      'Jobs measured',
      'Covered, measured (ac)',
      'Typed (ac)',
      'Skipped (ac)',
      'Worked twice (ac)',
    ]);
    // Only the field with a measured job; the typed-only field has no row.
    expect(t.rows).toEqual([
      { field: 'Coulee Quarter', operation: 'Seeding', jobs: '1 of 2', covered: 150.25, typed: 158, skipped: 2.5, twice: 4.75 },
    ]);
    expect(formatCell(t.totals['covered'], 'area')).toBe('150.3');
  });

  it('when the farm is metric, then the measured areas are hectares (1 ac = 0.40468564224 ha, international acre)', () => {
    const row = measuredTable(S, 'metric').rows[0];
    expect(row['covered']).toBeCloseTo(150.25 * 0.40468564224, 9);
    expect(row['skipped']).toBeCloseTo(2.5 * 0.40468564224, 9);
  });

  it('when no job has a track, then the table is empty', () => {
    const typedOnly: SeasonSummary = { ...S, byField: [S.byField[1]] };
    expect(measuredTable(typedOnly, 'us').rows).toEqual([]);
  });

  it('when some of an operation was measured, then its finished figure says how much', () => {
    const row = operationsTable(S, 'us').rows.find((r) => r['operation'] === 'Seeding')!;
    expect(row['finished']).toBe(237.25);
    expect(row['measuredNote']).toBe('150.3 measured');
    expect(operationsTable(S, 'us').columns.find((c) => c.key === 'finished')!.note).toBe('measuredNote');
  });
});
