// A job's progress through its field: which jobs count, the acres left of a field for an
// operation in a season, and when a field counts as finished. The one home of these rules: the
// work board, the run sheet's checks, the assignments repository and the season report's SQL
// all take them from here.
import type { AssignmentState } from '../../shared/schemas/jobs';
import { roundTo } from '../../shared/round';

/** The season a day belongs to: its calendar year. */
export const seasonOf = (day: string): number => Number(day.slice(0, 4));

/** A season's first day and the first day after it ('YYYY-MM-DD'): `day >= from and day < to`. */
export const seasonDays = (season: number): { from: string; to: string } => ({ from: `${season}-01-01`, to: `${season + 1}-01-01` });

/**
 * Only a finished job counts toward the acres done (a part-done field is a finished job with fewer
 * acres); its acres are the acres it logged.
 */
export const DONE_STATE = 'finished' satisfies AssignmentState;

/** A field counts as finished for an operation when less than this is left, acres. */
export const FINISHED_TOLERANCE_ACRES = 0.05;

/** Whether a field with `acresLeft` still to do is finished for the operation this season. */
export const isFinishedForSeason = (acresLeft: number): boolean => acresLeft < FINISHED_TOLERANCE_ACRES;

/** Acres of a field still to do: its acres less what finished jobs did, never below 0. */
export const acresLeft = (fieldAcres: number, acresDone: number): number => Math.max(0, fieldAcres - acresDone);

/**
 * A card's acres to do, as the board shows it (to 0.01 ac): field acres less what other jobs
 * finished this season for that operation (`doneThisSeason` may include the job itself).
 */
export function acresToDo(job: { field_acres: number; state: AssignmentState; acres_done: number | null }, doneThisSeason: number): number {
  const own = job.state === DONE_STATE ? (job.acres_done ?? 0) : 0;
  return Math.max(0, roundTo(job.field_acres - (doneThisSeason - own)));
}

/**
 * A card's acres left, as the board shows it (to 0.01 ac): what is left of the field after every
 * job finished this season for that operation, the card's own included when it is finished
 * (a card that did 185.5 of 200 ac leaves 14.5 ac).
 */
export const cardAcresLeft = (fieldAcres: number, doneThisSeason: number): number => roundTo(acresLeft(fieldAcres, doneThisSeason));

/** Default acres for a new card: what is left of the field (to 0.0001 ac), or the whole field when it is finished. */
export function defaultAcresPlanned(fieldAcres: number, doneThisSeason: number): number {
  const left = fieldAcres - doneThisSeason;
  return isFinishedForSeason(left) ? fieldAcres : roundTo(left, 4);
}

/**
 * The acres a job may log on a field, before the tolerance: what is left of the field for the
 * operation this season. A field already done is worked again in a new round (a second
 * harrowing, a re-seeding after a washout): the whole field again, less what other jobs did of
 * that round. `round` is 1 for the first pass over the field this season.
 */
export function acresLeftInRound(fieldAcres: number, doneThisSeason: number): { left: number; round: number } {
  if (fieldAcres <= 0) return { left: 0, round: 1 };
  const rounds = Math.floor((doneThisSeason + FINISHED_TOLERANCE_ACRES) / fieldAcres);
  return { left: Math.min(fieldAcres, Math.max(0, fieldAcres * (rounds + 1) - doneThisSeason)), round: rounds + 1 };
}

/** Logged acres may pass what is left by 1 % of the field or half an acre (GPS and rounding; common practice, no published source). */
export const acresTolerance = (fieldAcres: number): number => Math.max(0.5, fieldAcres * 0.01);

/** Whether logging `acres` on a field with `left` acres to do is more than can be true. */
export const tooManyAcres = (acres: number, left: number, fieldAcres: number): boolean => acres > left + acresTolerance(fieldAcres);

/**
 * The same rules in SQL, for totals summed in PostgreSQL (server/season). Columns are those of
 * `assignments`, unqualified; bind `:from` and `:to` with `seasonDays`, `:tolerance` with
 * FINISHED_TOLERANCE_ACRES.
 */
export const PROGRESS_SQL = {
  inSeason: 'day >= :from::date and day < :to::date',
  /** The season (calendar year) of a job's day. */
  seasonOfDay: 'extract(year from day)::int',
  isDone: `state = '${DONE_STATE}'`,
  /** The acres a counted job did. */
  acresDone: 'coalesce(acres_done, 0)',
  /**
   * A field is finished once the acres done reach its acres less the tolerance. At exactly the
   * tolerance left this counts the field finished where `isFinishedForSeason` does not; kept as
   * the season report has always counted it.
   */
  finished: (done: string, fieldAcres: string) => `${done} >= ${fieldAcres} - :tolerance`,
  /** Acres of a field covered at least once: the acres done, at most the field's acres. */
  covered: (done: string, fieldAcres: string) => `least(${done}, ${fieldAcres})`,
};
