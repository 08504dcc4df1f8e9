import type { FeatureCollection, LineString, MultiPolygon, Polygon } from 'geojson';
import type { Operation } from '../operations';
import type { AssignmentState } from './jobs';

/** Coverage measured from a track file for one job (POST /api/assignments/:id/coverage). */
export interface JobCoverage {
  assignmentId: number;
  fieldAcres: number;
  workRegionAcres: number;
  coveredAcres: number;
  skippedAcres: number;
  sliverAcres: number;
  workedTwiceAcres: number;
  skipCount: number;
  trackLengthM: number;
  widthM: number;
  /** Each skip, largest first: acres and centroid [lon, lat]. */
  skips: Array<{ acres: number; centroid: [number, number] }>;
  skipGeometry: MultiPolygon | null;
  /** The work region under the swath, for the map (null when nothing was covered, or measured before it was kept). */
  coveredGeometry: MultiPolygon | null;
  /** The ground under two or more passes, for the map. */
  twiceGeometry: MultiPolygon | null;
  sourceName: string;
  /** `phone`: the track the run sheet recorded on the operator's phone. */
  sourceFormat: 'gpx' | 'geojson' | 'timelog' | 'phone';
  computedAt: string;
}

/** A job's coverage with what its map needs (GET /api/assignments/:id/coverage). */
export interface JobCoverageView {
  job: {
    id: number;
    day: string;
    operation: Operation;
    state: AssignmentState;
    /** The operation's coverage rule: `full` (seeding, spraying) flags every skip. */
    coverageRule: 'full' | 'gaps-ok';
    acresDone: number | null;
    acresTyped: number | null;
    acresMeasured: boolean;
  };
  field: { id: number; name: string; acres: number; boundary: Polygon | MultiPolygon; hazards: FeatureCollection };
  /** null until a track is measured. */
  coverage: JobCoverage | null;
  /**
   * The passes of the field's saved pass plan for the job's operation, as lines (pass number in
   * `properties.pass`), for the map under the coverage; null when no plan is saved.
   */
  passes: FeatureCollection<LineString> | null;
}
