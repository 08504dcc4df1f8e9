// The season's money on the screen: whole cents from the API, shown once as dollars and cents,
// totals taken from the API (rounded once there), never added up from rounded rows.
import { OPERATIONS } from '@shared/operations';
import type { SeasonSummary } from '@shared/schemas/season';
import { costPerArea, formatCell, machinesTable, operationsTable } from './season-shaping';
import { ZERO_OPERATION } from './testing/season-fixtures';

// Two operations whose rounded costs add up to a cent less than the farm's exactly rounded total
// (97,511 + 50,428 = 147,939 ¢ against 147,940 ¢), as the API can answer.
const S: SeasonSummary = {
  year: 2026,
  operations: OPERATIONS.map((operation) =>
    operation === 'harrowing'
      ? { ...ZERO_OPERATION, operation, acresFinished: 200.75, costCents: 97511, costPerAcreCents: 486 }
      : operation === 'spraying'
        ? { ...ZERO_OPERATION, operation, acresFinished: 160.37, costCents: 50428, costPerAcreCents: 314 }
        : { ...ZERO_OPERATION, operation },
  ),
  weekly: [],
  byField: [],
  byPerson: [],
  byMachine: [
    {
      machineId: 1,
      machine: 'Big tractor',
      engineHours: 10,
      acres: 200.75,
      hours: 9,
      acresPerEngineHour: 20.075,
      costCents: 97511,
      machineCents: 60000,
      costPerAcreCents: 486,
      operations: [],
    },
  ],
  totals: {
    acresFinished: 361.12,
    hoursLogged: 0,
    engineHours: 0,
    acresPerHour: null,
    jobsFinished: 3,
    jobsCalledOff: 0,
    weatherDaysLost: 0,
    jobsCalledOffForWeather: 0,
    fieldsWorked: 2,
    costCents: 147940,
    costPerAcreCents: 410,
    jobsUnpriced: 0,
  },
};

describe('season costs on the screen', () => {
  it('when the operations table is made, then each row shows its cost and the totals row the farm total from the API', () => {
    const t = operationsTable(S, 'us');
    expect(t.columns.filter((c) => c.kind === 'money').map((c) => c.label)).toEqual(['Cost', 'Cost per ac']);
    const harrowing = t.rows.find((r) => r['operation'] === 'Harrowing')!;
    expect(formatCell(harrowing['cost'], 'money')).toBe('$975.11');
    expect(formatCell(harrowing['costPerArea'], 'money')).toBe('$4.86');
    // Not 147,939 (the sum of the rounded rows): the total is the API's, rounded once.
    expect(t.totals['cost']).toBe(147940);
    expect(formatCell(t.totals['cost'], 'money')).toBe('$1,479.40');
  });

  it('when the farm is metric, then cost per hectare is the cents over the hectares, rounded once to the cent', () => {
    // 97,511 ¢ ÷ (200.75 ac × 0.40468564224 ha/ac, international acre) = 97,511 ÷ 81.2406 = 1,200.27 ¢/ha → 1,200 ¢ (worked by hand).
    expect(costPerArea(486, 97511, 200.75, 'metric')).toBe(1200);
    expect(operationsTable(S, 'metric').columns.find((c) => c.key === 'costPerArea')!.label).toBe('Cost per ha');
    expect(costPerArea(null, 0, 0, 'metric')).toBeNull();
  });

  it('when the machines table is made, then it shows the machine own cost and the cost of its jobs', () => {
    const t = machinesTable(S, 'us');
    const row = t.rows[0];
    expect([formatCell(row['machineCost'], 'money'), formatCell(row['cost'], 'money')]).toEqual(['$600.00', '$975.11']);
    expect(t.totals['cost']).toBe(147940);
  });
});
