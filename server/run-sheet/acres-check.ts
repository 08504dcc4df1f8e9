import { OPERATION_INFO } from '../../shared/operations';
import { acresDoneOn } from '../board/assignments.repository';
import type { DbAssignmentRow } from '../board/board.rows';
import { seasonOf } from '../board/day-context';
import type { Tx } from '../db/knex';
import { getField } from '../fields/fields.repository';
import { AppError } from '../http/errors';

/** Logged acres may pass what is left by 1 % of the field or half an acre (GPS and rounding; common practice, no published source). */
export const acresTolerance = (fieldAcres: number): number => Math.max(0.5, fieldAcres * 0.01);

/** Refuses acres beyond what is left of the field for the job's operation this season. */
export async function checkAcres(tx: Tx, farmId: number, a: DbAssignmentRow, acres: number): Promise<void> {
  const field = (await getField(tx, farmId, a.field_id))!;
  const done = await acresDoneOn(tx, farmId, a.field_id, a.operation, seasonOf(a.day), a.id);
  const left = Math.max(0, field.acres - done);
  if (acres > left + acresTolerance(field.acres)) {
    const r = (n: number) => Math.round(n * 10) / 10;
    throw new AppError(
      422,
      'too_many_acres',
      `${field.name} has ${r(left)} ac left to do for ${OPERATION_INFO[a.operation].label.toLowerCase()} this season; ${r(acres)} ac is more than that. Check the acres.`,
      { acres: `At most ${r(left)} ac` },
    );
  }
}
