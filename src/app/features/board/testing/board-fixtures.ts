// Boards, crews and run-sheet jobs for the board and run-sheet specs (never imported by the app).
import type { Board, BoardAssignment, CardWeather, DayStrip } from '@shared/schemas/board';
import type { RunSheetItem } from '@shared/schemas/run-sheet';
import type { CrewMember, Implement, Machine } from '@shared/schemas/fleet';

export const TOMAS = { membershipId: 12, name: 'Tomas Reyes' };
export const ADA = { membershipId: 13, name: 'Ada Lindqvist' };
export const MILO = { membershipId: 14, name: 'Milo Sorensen' };
export const INGRID = { membershipId: 11, name: 'Ingrid Sorensen' };

export const CREW: CrewMember[] = [
  { ...INGRID, role: 'owner', skills: {} },
  { ...TOMAS, role: 'operator', skills: { harrowing: 'mentor', seeding: 'qualified' } },
  { ...ADA, role: 'operator', skills: { seeding: 'qualified', spraying: 'qualified' } },
  { ...MILO, role: 'operator', skills: { harrowing: 'learning' } },
  { membershipId: 15, name: 'Walt Sorensen', role: 'viewer', skills: {} },
];

export const MACHINES: Machine[] = [
  {
    id: 1,
    name: '4WD 620',
    kind: 'tractor-4wd',
    powerHp: 620,
    engineHours: 4210.5,
    serviceIntervalHours: 500,
    hoursAtLastService: 4000,
    serviceDueInHours: 289.5,
    serviceWarning: null,
    notes: null,
  },
  {
    id: 2,
    name: 'MFWD 250',
    kind: 'tractor-mfwd',
    powerHp: 250,
    engineHours: 1800,
    serviceIntervalHours: null,
    hoursAtLastService: null,
    serviceDueInHours: null,
    serviceWarning: null,
    notes: null,
  },
  {
    id: 3,
    name: 'Sprayer 120',
    kind: 'sprayer-sp',
    powerHp: 300,
    engineHours: 900,
    serviceIntervalHours: null,
    hoursAtLastService: null,
    serviceDueInHours: null,
    serviceWarning: null,
    notes: null,
  },
];

export const IMPLEMENTS: Implement[] = [
  {
    id: 21,
    name: '84 ft heavy harrow',
    kind: 'harrow',
    widthM: 25.6,
    transportWidthM: 6,
    operations: ['harrowing'],
    machineIds: [],
    minPowerHp: 300,
    notes: null,
  },
  {
    id: 22,
    name: '60 ft air drill',
    kind: 'air-drill',
    widthM: 18.288,
    transportWidthM: 6,
    operations: ['seeding'],
    machineIds: [1],
    minPowerHp: null,
    notes: null,
  },
  {
    id: 23,
    name: '120 ft boom',
    kind: 'sprayer',
    widthM: 36.6,
    transportWidthM: 4,
    operations: ['spraying'],
    machineIds: [3],
    minPowerHp: null,
    notes: null,
  },
];

export function card(
  id: number,
  operator: { membershipId: number; name: string },
  order: number,
  over: Partial<BoardAssignment> = {},
): BoardAssignment {
  return {
    id,
    date: '2031-05-15',
    order,
    state: 'planned',
    field: { id: 100 + id, name: `Field ${id}`, acres: 160 },
    operation: 'harrowing',
    operator,
    machine: { id: 1, name: '4WD 620', kind: 'tractor-4wd' },
    implement: { id: 21, name: '84 ft heavy harrow', kind: 'harrow', widthM: 25.6 },
    mentor: null,
    plannedStart: null,
    plannedEnd: null,
    startTime: '07:00',
    endTime: '09:00',
    acresPlanned: 160,
    acresToDo: 160,
    acresLeft: over.acresLeft ?? over.acresToDo ?? 160,
    planHours: 2,
    planSource: 'estimate',
    // Without a window the card books its planned hours.
    bookedHours: over.bookedHours ?? over.planHours ?? 2,
    fitsWindow: true,
    note: null,
    problemCount: 0,
    log: {
      startedAt: null,
      finishedAt: null,
      acresDone: null,
      acresTyped: null,
      acresMeasured: false,
      hoursWorked: null,
      engineHoursStart: null,
      engineHoursEnd: null,
      callOffReason: null,
    },
    ...over,
  };
}

export function board(assignments: BoardAssignment[], over: Partial<Board> = {}): Board {
  return {
    date: '2031-05-15',
    version: 4,
    publishedAt: null,
    dayHoursLimit: 10,
    assignments,
    conflicts: [],
    operators: [],
    orders: [],
    weather: { cards: [], strip: null, note: null },
    nextDayWithWork: null,
    ...over,
  };
}

export function job(over: Partial<RunSheetItem> = {}): RunSheetItem {
  const base = card(7, TOMAS, 1);
  return {
    ...base,
    role: 'operator',
    field: {
      id: 107,
      name: 'North Quarter',
      acres: 160,
      boundary: {
        type: 'Polygon',
        coordinates: [
          [
            [-99.9, 47.6],
            [-99.89, 47.6],
            [-99.89, 47.61],
            [-99.9, 47.6],
          ],
        ],
      },
      hazards: { type: 'FeatureCollection', features: [] },
    },
    machine: { id: 1, name: '4WD 620', kind: 'tractor-4wd', engineHours: 4210.5 },
    passPlan: null,
    cautions: ['Look up before folding the implement.', "Furlong's plans are aids."],
    events: [],
    worked: { engineHours: null, clockHours: null },
    ...over,
  };
}

/** A card's weather: fetched a few minutes ago, fresh until two hours after. */
export function cardWeather(assignmentId: number, over: Partial<CardWeather> = {}): CardWeather {
  const fetched = new Date(Date.now() - 5 * 60_000);
  return {
    assignmentId,
    verdict: 'go',
    reason: null,
    reasons: [],
    from: '07:00',
    to: '19:00',
    over: 'working-day',
    blocking: false,
    fetchedAt: fetched.toISOString(),
    ageMinutes: 5,
    stale: false,
    staleReason: null,
    staleAfter: new Date(fetched.getTime() + 2 * 3_600_000).toISOString(),
    ...over,
  };
}

/** A day's strip over 07:00–10:00 with a windy, wet 09:00. */
export function dayStrip(over: Partial<DayStrip> = {}): DayStrip {
  const fetched = new Date(Date.now() - 20 * 60_000);
  return {
    basis: 'most-fields',
    fieldName: 'North Quarter',
    fetchedAt: fetched.toISOString(),
    ageMinutes: 20,
    stale: false,
    staleReason: null,
    staleAfter: new Date(fetched.getTime() + 2 * 3_600_000).toISOString(),
    hours: [
      { time: '07:00', temperatureC: 10, windSpeedKmh: 8, windGustKmh: 12, precipitationMm: 0, precipitationProbabilityPct: 5 },
      { time: '08:00', temperatureC: 12.5, windSpeedKmh: 12, windGustKmh: 18, precipitationMm: 0, precipitationProbabilityPct: 10 },
      { time: '09:00', temperatureC: 15, windSpeedKmh: 30, windGustKmh: 45, precipitationMm: 2.54, precipitationProbabilityPct: 80 },
    ],
    ...over,
  };
}
