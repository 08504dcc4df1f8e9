// Which acres a finished job counts when both a typed figure and a measured one exist.
//
// The measured figure wins: at the finish, and whenever a track is measured for a job already
// finished, the job's acres (acres_done, the one figure the board and the season add) become the
// acres its track covered, and the typed figure is kept beside it as typed (acres_typed). A track
// measures what the implement really went over; a typed number is a guess from the cab.
// The owner's later correction of a finished job's acres is their word and counts (as typed)
// until a new track is measured.
import { roundTo } from '../../shared/round';
import type { Tx } from '../db/knex';
import { updateAssignment, type AssignmentColumns } from '../jobs/assignments.repository';
import { insertEvent } from '../jobs/events.repository';
import type { DbAssignmentRow } from '../jobs/jobs.rows';
import type { DbCoverageRow } from './coverage.repository';

/** The acres a job with a measured track counts: its covered acres, to the 0.0001 ac the column keeps. */
export const measuredAcres = (c: Pick<DbCoverageRow, 'covered_acres'>): number => roundTo(c.covered_acres, 4);

/** The columns a finish writes for its acres: the measured figure when the job has a track, the typed one otherwise. */
export function finishAcres(
  typed: number,
  coverage: DbCoverageRow | undefined,
): Pick<AssignmentColumns, 'acres_done' | 'acres_typed' | 'acres_source'> {
  return coverage
    ? { acres_done: measuredAcres(coverage), acres_typed: typed, acres_source: 'measured' }
    : { acres_done: typed, acres_typed: typed, acres_source: 'typed' };
}

/**
 * A track measured for a job already finished: its acres become the measured ones (the typed
 * figure kept as typed), and the change goes in the job's log. Returns a line for the board's
 * change log, or null when the job is not finished (its finish will take the measured acres).
 */
export async function takeMeasuredAcres(
  tx: Tx,
  by: { farmId: number; id: number },
  a: DbAssignmentRow,
  coverage: DbCoverageRow,
): Promise<string | null> {
  if (a.state !== 'finished') return null;
  const measured = measuredAcres(coverage);
  const typed = a.acres_source === 'measured' ? a.acres_typed : a.acres_done;
  await updateAssignment(tx, a.id, { acres_done: measured, acres_typed: typed, acres_source: 'measured' });
  const said = `acres ${a.acres_done ?? '–'} → ${measured} measured from the track ${coverage.source_name} (typed ${typed ?? '–'})`;
  await insertEvent(tx, {
    farm_id: by.farmId,
    assignment_id: a.id,
    type: 'log-edited',
    acres: measured,
    engine_hours: null,
    reason: null,
    note: said,
    hazard_id: null,
    by_user_id: by.id,
  });
  return said;
}
