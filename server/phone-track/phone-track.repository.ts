// The phone track of a job: the chunks received (one row each, keyed by the phone's chunk id)
// and their points.
import type { Tx } from '../db/knex';

export interface DbTrackChunkRow {
  assignment_id: number;
  chunk_id: string;
  farm_id: number;
  user_id: number | null;
  point_count: number;
  received_at: Date;
}

export interface DbTrackPointRow {
  id: string;
  assignment_id: number;
  farm_id: number;
  chunk_id: string;
  at: Date;
  lat: number;
  lon: number;
  accuracy_m: number | null;
  heading_deg: number | null;
  speed_mps: number | null;
}

/** Records a chunk once: true when it is new, false when the same job already has that chunk id. */
export async function claimChunk(db: Tx, row: Omit<DbTrackChunkRow, 'received_at'>): Promise<boolean> {
  const added = await db('assignment_track_chunks').insert(row).onConflict(['assignment_id', 'chunk_id']).ignore().returning('chunk_id');
  return added.length > 0;
}

export const chunkOf = (db: Tx, assignmentId: number, chunkId: string): Promise<DbTrackChunkRow | undefined> =>
  db<DbTrackChunkRow>('assignment_track_chunks').where({ assignment_id: assignmentId, chunk_id: chunkId }).first();

export async function insertPoints(db: Tx, rows: Array<Omit<DbTrackPointRow, 'id'>>): Promise<void> {
  if (rows.length) await db('assignment_track_points').insert(rows);
}

export async function pointCount(db: Tx, farmId: number, assignmentId: number): Promise<number> {
  const row = await db('assignment_track_points')
    .where({ farm_id: farmId, assignment_id: assignmentId })
    .count<{ n: string }>('* as n')
    .first();
  return Number(row?.n ?? 0);
}

/** The job's points in the order they were taken. */
export const pointsOf = (db: Tx, farmId: number, assignmentId: number): Promise<DbTrackPointRow[]> =>
  db<DbTrackPointRow>('assignment_track_points')
    .where({ farm_id: farmId, assignment_id: assignmentId })
    .orderBy([{ column: 'at' }, { column: 'id' }]);
