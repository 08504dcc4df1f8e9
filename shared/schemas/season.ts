// Season report: the address parameters and the shape of what the API answers. Areas are acres,
// times are hours; the screen converts to hectares for a metric farm.
import * as z from 'zod';
import { OPERATIONS } from '../operations';

/** A crop year in the address: four digits, 1990–2100. */
export const seasonYear = z
  .string()
  .regex(/^\d{4}$/, 'The season is a year written with four digits, such as 2026')
  .transform(Number)
  .pipe(z.number().min(1990, 'The season is a year from 1990 to 2100').max(2100, 'The season is a year from 1990 to 2100'));

export const seasonParams = z.object({ year: seasonYear });
/** `/:year/export/:table.csv`: the table name is checked by the route, so an unknown one gets a 404 that lists the tables. */
export const seasonExportParams = seasonParams.extend({ table: z.string() });

/** The tables of the season report that download as CSV. */
export const SEASON_TABLES = ['operations', 'fields', 'people', 'machines', 'weekly'] as const;
export type SeasonTable = (typeof SEASON_TABLES)[number];
export const isSeasonTable = (s: string): s is SeasonTable => (SEASON_TABLES as readonly string[]).includes(s);

const operation = z.enum(OPERATIONS);
const num = z.number();
const maybe = z.number().nullable();
const day = z.string().regex(/^\d{4}-\d{2}-\d{2}$/);
/** Money: whole cents. */
const cents = z.number().int();

export const operationSeason = z.object({
  operation,
  /** Acres of the fields with a crop this season, if the farm does the operation (its fleet can, or work was logged); fallow fields only for harrowing and tillage. */
  acresPlanned: num,
  /** Of those planned acres, how many were covered at least once (each field capped at its acres). */
  acresCovered: num,
  /** Σ acres logged, every field, repeat passes included. */
  acresFinished: num,
  hoursLogged: num,
  engineHours: num,
  /** Σ pass-plan hours over the planned fields that have a saved plan; null when none has one. */
  plannedHours: maybe,
  /** Acres of the planned fields that have a saved plan (what plannedHours covers). */
  acresWithPlan: num,
  acresPerHour: maybe,
  plannedAcresPerHour: maybe,
  /** acresCovered ÷ acresPlanned, 0–1; 0 when nothing is planned. */
  progress: num,
  jobsFinished: z.number().int(),
  jobsCalledOff: z.number().int(),
  /** Days of the season with at least one job of this operation called off for weather. */
  weatherDaysLost: z.number().int(),
  /** Jobs of this operation called off for weather (a subset of jobsCalledOff). */
  jobsCalledOffForWeather: z.number().int(),
  /** What the finished jobs cost (machine + labour + fuel), whole cents, rounded once from the exact sum (shared/money.ts). */
  costCents: cents,
  /** Its parts, each rounded once from its own exact sum (so they may differ from costCents by a cent). */
  machineCents: cents,
  labourCents: cents,
  fuelCents: cents,
  /** costCents per acre finished, whole cents; null without acres. */
  costPerAcreCents: cents.nullable(),
  /** Finished jobs whose machine or operator had no hourly cost, or done while the farm had no fuel price: the cost is short by them. */
  jobsUnpriced: z.number().int(),
  /** Of the finished jobs, those whose acres were measured from their track (the rest were typed). */
  jobsMeasured: z.number().int(),
  /** Of acresFinished, the acres measured from tracks. */
  acresMeasured: num,
});
export type OperationSeason = z.infer<typeof operationSeason>;

export const weekSeason = z.object({
  operation,
  /** Monday of the ISO week (YYYY-MM-DD); the first week of a season may start in late December. */
  week: day,
  acresFinished: num,
  cumulativeAcres: num,
});
export type WeekSeason = z.infer<typeof weekSeason>;

export const fieldOperationSeason = z.object({
  acres: num,
  hours: num,
  costCents: cents,
  /** The day the field was first fully covered for the operation; null while acres remain. */
  dateFinished: day.nullable(),
  /** Finished jobs of this field and operation. */
  jobs: z.number().int(),
  /** What the tracks of the jobs measured from a track say (those jobs count these acres); null when no job was measured. */
  measured: z
    .object({
      /** How many of the jobs were measured (the rest count typed acres). */
      jobs: z.number().int(),
      /** Acres their tracks covered: what those jobs count. */
      coveredAcres: num,
      /** Acres of the work region their tracks missed (slivers left out). */
      skippedAcres: num,
      /** Acres under two or more passes. */
      workedTwiceAcres: num,
      /** What was typed for those jobs, shown beside the measured figure. */
      typedAcres: maybe,
    })
    .nullable(),
});
export type FieldOperationSeason = z.infer<typeof fieldOperationSeason>;

export const fieldSeason = z.object({
  fieldId: z.number().int(),
  field: z.string(),
  crop: z.string().nullable(),
  acres: num,
  operations: z.partialRecord(operation, fieldOperationSeason),
  totalAcres: num,
  totalHours: num,
  /** What the field's finished jobs cost, every operation, whole cents. */
  costCents: cents,
  /** costCents per acre of the field (its size, not the acres worked); null for a field without acres or work. */
  costPerAcreCents: cents.nullable(),
});
export type FieldSeason = z.infer<typeof fieldSeason>;

export const personSeason = z.object({
  membershipId: z.number().int(),
  name: z.string(),
  operations: z.partialRecord(operation, z.object({ acres: num, hours: num })),
  totalAcres: num,
  totalHours: num,
  acresPerHour: maybe,
});
export type PersonSeason = z.infer<typeof personSeason>;

export const machineSeason = z.object({
  machineId: z.number().int(),
  machine: z.string(),
  /** Σ (meter at finish − meter at start) over jobs with both readings, h. */
  engineHours: num,
  acres: num,
  hours: num,
  acresPerEngineHour: maybe,
  /** What the jobs done with this machine cost (machine + labour + fuel), whole cents. */
  costCents: cents,
  /** Of that, the machine's own hourly cost × its hours. */
  machineCents: cents,
  /** costCents per acre the machine finished; null without acres. */
  costPerAcreCents: cents.nullable(),
  operations: z.array(z.object({ operation, acres: num, hours: num, engineHours: num, costCents: cents, machineCents: cents })),
});
export type MachineSeason = z.infer<typeof machineSeason>;

export const seasonTotals = z.object({
  acresFinished: num,
  hoursLogged: num,
  engineHours: num,
  acresPerHour: maybe,
  jobsFinished: z.number().int(),
  jobsCalledOff: z.number().int(),
  /** Days with at least one job called off for weather, whatever the operation (a day counts once). */
  weatherDaysLost: z.number().int(),
  jobsCalledOffForWeather: z.number().int(),
  fieldsWorked: z.number().int(),
  /** What all finished jobs cost, whole cents, rounded once (not the sum of the operations' rounded figures). */
  costCents: cents,
  /** costCents per acre finished; null without acres. */
  costPerAcreCents: cents.nullable(),
  jobsUnpriced: z.number().int(),
});

export const seasonSummary = z.object({
  year: z.number().int(),
  operations: z.array(operationSeason),
  weekly: z.array(weekSeason),
  byField: z.array(fieldSeason),
  byPerson: z.array(personSeason),
  byMachine: z.array(machineSeason),
  totals: seasonTotals,
});
export type SeasonSummary = z.infer<typeof seasonSummary>;

/** `GET /api/season`: the seasons with crop plans or logged work, newest first. */
export const seasonIndex = z.object({
  current: z.number().int(),
  /** The season to open first: the newest with logged work, else the current year. */
  latestWorked: z.number().int(),
  seasons: z.array(z.object({ year: z.number().int(), acresFinished: num, jobs: z.number().int() })),
});
export type SeasonIndex = z.infer<typeof seasonIndex>;
