// Reports from the field: problem entries of the jobs' logs, with the job, field and machine they
// concern, and the owner's review of each.
import type { FieldReport } from '../../shared/schemas/run-sheet';
import type { Tx } from '../db/knex';

const COLUMNS = [
  'e.id',
  'e.reason as kind',
  'e.note',
  'e.at',
  'e.review',
  'e.hazard_id',
  'u.name as by_name',
  'a.id as job_id',
  'a.day as job_day',
  'a.operation',
  'a.state as job_state',
  'f.id as field_id',
  'f.name as field_name',
  'm.id as machine_id',
  'm.name as machine_name',
];

const reportsOf = (db: Tx, farmId: number) =>
  db('assignment_events as e')
    .join('assignments as a', 'a.id', 'e.assignment_id')
    .join('fields as f', 'f.id', 'a.field_id')
    .join('machines as m', 'm.id', 'a.machine_id')
    .leftJoin('users as u', 'u.id', 'e.by_user_id')
    .where({ 'e.farm_id': farmId, 'e.type': 'problem' });

type ReportRow = Record<string, unknown> & { at: Date };

const toReport = (r: ReportRow): FieldReport => ({
  id: r.id as number,
  kind: r.kind as FieldReport['kind'],
  note: (r.note as string | null) ?? null,
  at: r.at.toISOString(),
  by: (r.by_name as string | null) ?? null,
  review: r.review as FieldReport['review'],
  job: {
    id: r.job_id as number,
    date: r.job_day as string,
    operation: r.operation as FieldReport['job']['operation'],
    state: r.job_state as string,
  },
  field: { id: r.field_id as number, name: r.field_name as string },
  machine: { id: r.machine_id as number, name: r.machine_name as string },
  hazardId: (r.hazard_id as number | null) ?? null,
});

/** A farm's open reports, newest first. */
export async function openReports(db: Tx, farmId: number): Promise<FieldReport[]> {
  const rows: ReportRow[] = await reportsOf(db, farmId)
    .andWhere('e.review', 'open')
    .orderBy([
      { column: 'e.at', order: 'desc' },
      { column: 'e.id', order: 'desc' },
    ])
    .select(COLUMNS);
  return rows.map(toReport);
}

/** One report of a farm, locked for its review; undefined when the farm has no such report. */
export async function lockReport(db: Tx, farmId: number, id: number): Promise<FieldReport | undefined> {
  const row: ReportRow | undefined = await reportsOf(db, farmId).andWhere('e.id', id).forUpdate('e').first(COLUMNS);
  return row && toReport(row);
}

/** A new problem entry waits for the owner. */
export const markOpen = (db: Tx, id: number) => db('assignment_events').where({ id, type: 'problem' }).update({ review: 'open' });

export const setReview = (db: Tx, id: number, review: 'confirmed' | 'dismissed', byUserId: number) =>
  db('assignment_events').where({ id }).update({ review, reviewed_by_user_id: byUserId, reviewed_at: db.fn.now() });

/** A reported hazard the owner confirms becomes one of the field's confirmed hazards. */
export const confirmHazard = (db: Tx, farmId: number, hazardId: number) =>
  db('hazards').where({ farm_id: farmId, id: hazardId, status: 'reported' }).update({ status: 'confirmed' });

/** The farm's active owners, to be told of a report at once. */
export const ownersToTell = (db: Tx, farmId: number): Promise<Array<{ email: string; name: string }>> =>
  db('memberships as ms')
    .join('users as u', 'u.id', 'ms.user_id')
    .where({ 'ms.farm_id': farmId, 'ms.role': 'owner', 'ms.status': 'active' })
    .orderBy('u.id')
    .select('u.email', 'u.name');
