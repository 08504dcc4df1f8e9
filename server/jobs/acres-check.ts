// The acres left of a job's field, read from its season's finished jobs: the check on logged
// acres, and a new card's default acres. The rules themselves are in ./progress.
import { OPERATION_INFO, type Operation } from '../../shared/operations';
import { formatArea } from '../../shared/figures';
import type { UnitSystem } from '../../shared/schemas/auth';
import type { Tx } from '../db/knex';
import { getField, type DbFieldRow } from '../fields/fields.repository';
import { AppError } from '../http/errors';
import { acresDoneOn } from './assignments.repository';
import type { DbAssignmentRow } from './jobs.rows';
import { acresLeftInRound, defaultAcresPlanned, seasonOf, tooManyAcres } from './progress';

/**
 * Refuses acres beyond what is left of the field for the job's operation this season (or of the
 * round, when the field was already done and is worked again), saying so in
 * the farm's units (`units`): a metric farm typed hectares and reads hectares back.
 */
export async function checkAcres(tx: Tx, farmId: number, units: UnitSystem, a: DbAssignmentRow, acres: number): Promise<void> {
  const field = (await getField(tx, farmId, a.field_id))!;
  const done = await acresDoneOn(tx, farmId, a.field_id, a.operation, seasonOf(a.day), a.id);
  const { left, round } = acresLeftInRound(field.acres, done);
  if (tooManyAcres(acres, left, field.acres)) {
    const area = (n: number) => formatArea(n, units);
    const what = units === 'metric' ? 'hectares' : 'acres';
    const work = OPERATION_INFO[a.operation].label.toLowerCase();
    throw new AppError(
      422,
      'too_many_acres',
      round === 1
        ? `${field.name} has ${area(left)} left to do for ${work} this season; ${area(acres)} is more than that. Check the ${what}.`
        : `${field.name} was already done for ${work} this season; this round has ${area(left)} left; ${area(acres)} is more than that. Check the ${what}.`,
      { acres: `At most ${area(left)}` },
    );
  }
}

/** Default acres for a new card: what is left of the field for the operation this season, or the whole field when nothing is. */
export async function defaultAcres(tx: Tx, farmId: number, field: DbFieldRow, operation: Operation, day: string): Promise<number> {
  return defaultAcresPlanned(field.acres, await acresDoneOn(tx, farmId, field.id, operation, seasonOf(day)));
}
