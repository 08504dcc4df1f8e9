// The coverage measured for a job, one row per job (the latest track sent replaces the last).
import type { MultiPolygon } from 'geojson';
import type { Tx } from '../db/knex';

export interface DbCoverageRow {
  assignment_id: number;
  farm_id: number;
  width_m: number;
  field_acres: number;
  work_region_acres: number;
  covered_acres: number;
  skipped_acres: number;
  sliver_acres: number;
  worked_twice_acres: number;
  skip_count: number;
  track_length_m: number;
  skips: Array<{ acres: number; centroid: [number, number] }>;
  skip_geometry: MultiPolygon | null;
  covered_geometry: MultiPolygon | null;
  twice_geometry: MultiPolygon | null;
  source_name: string;
  /** `phone`: the track the job's run sheet recorded (server/phone-track). */
  source_format: 'gpx' | 'geojson' | 'timelog' | 'phone';
  computed_by: number | null;
  computed_at: Date;
  /** Phone-track points the measure was made from (source `phone`); null for a track file. */
  track_points: number | null;
}

/** The working width of a job's implement, metres. */
export async function implementWidthM(db: Tx, farmId: number, implementId: number): Promise<number | undefined> {
  const row = await db('implements').where({ farm_id: farmId, id: implementId }).first('width_m');
  return row?.width_m;
}

export async function saveCoverage(db: Tx, row: Omit<DbCoverageRow, 'computed_at'>): Promise<DbCoverageRow> {
  const json = (g: MultiPolygon | null) => (g ? JSON.stringify(g) : null);
  const cols = {
    ...row,
    skips: JSON.stringify(row.skips),
    skip_geometry: json(row.skip_geometry),
    covered_geometry: json(row.covered_geometry),
    twice_geometry: json(row.twice_geometry),
  };
  const [saved] = await db('assignment_coverage')
    .insert({ ...cols, computed_at: db.fn.now() })
    .onConflict('assignment_id')
    .merge()
    .returning('*');
  return saved as DbCoverageRow;
}

export const coverageOf = (db: Tx, farmId: number, assignmentId: number): Promise<DbCoverageRow | undefined> =>
  db<DbCoverageRow>('assignment_coverage').where({ farm_id: farmId, assignment_id: assignmentId }).first();
