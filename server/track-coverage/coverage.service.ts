// Coverage of a job from a track file: who may send one, the field and implement it is measured
// against, the computation in a compute worker, and the stored figures.
import type { FeatureCollection } from 'geojson';
import { OPERATION_INFO } from '../../shared/operations';
import type { JobCoverage, JobCoverageView } from '../../shared/schemas/track-coverage';
import type { CoverageResult } from '../../shared/track-coverage/coverage';
import type { AppDeps } from '../app-deps';
import { getField, hazardsOfField } from '../fields/fields.repository';
import { hazardFeature } from '../fields/fields.service';
import { AppError, forbidden, notFound } from '../http/errors';
import type { SessionPrincipal } from '../http/session-user';
import { getAssignment } from '../jobs/assignments.repository';
import { getPlan } from '../plans/plans.service';
import { lockJob, touchBoard } from '../run-sheet/job-lock';
import { coverageOf, implementWidthM, saveCoverage, type DbCoverageRow } from './coverage.repository';
import { takeMeasuredAcres } from './measured-acres';

function view(r: DbCoverageRow): JobCoverage {
  return {
    assignmentId: r.assignment_id,
    fieldAcres: r.field_acres,
    workRegionAcres: r.work_region_acres,
    coveredAcres: r.covered_acres,
    skippedAcres: r.skipped_acres,
    sliverAcres: r.sliver_acres,
    workedTwiceAcres: r.worked_twice_acres,
    skipCount: r.skip_count,
    trackLengthM: r.track_length_m,
    widthM: r.width_m,
    skips: r.skips,
    skipGeometry: r.skip_geometry,
    coveredGeometry: r.covered_geometry,
    twiceGeometry: r.twice_geometry,
    sourceName: r.source_name,
    sourceFormat: r.source_format,
    computedAt: new Date(r.computed_at).toISOString(),
  };
}

/**
 * Measures what a track file covered of a job's field with the job's implement, and stores it
 * with the job (replacing an earlier measure). The owner and the job's operator may send one;
 * a file that cannot be read or measured is refused with a 400 and nothing is saved. A finished
 * job takes the measured acres at once (measured-acres.ts).
 */
export async function measureJobCoverage(
  deps: AppDeps,
  by: SessionPrincipal,
  id: number,
  file: { name: string; data: Buffer } | undefined,
): Promise<JobCoverage> {
  const { boundary, hazards, widthM } = await coverageGround(deps, by, id);
  if (!file) throw new AppError(400, 'no_file', 'Choose a track file to upload: GPX, GeoJSON, or a TASKDATA.zip with a TimeLog');
  const r = await deps.compute.run('trackCoverage', { name: file.name, data: file.data, boundary, hazards, widthM });
  return storeCoverage(deps, by, id, widthM, r, { name: file.name, format: r.format });
}

/** A job's field boundary, hazards and implement width, the owner's or the job's operator's to measure. */
export async function coverageGround(deps: AppDeps, by: SessionPrincipal, id: number) {
  const a = await getAssignment(deps.db, by.farmId, id);
  if (!a) throw notFound('That job');
  if (by.role !== 'owner' && a.operator_id !== by.membershipId) throw forbidden("This job is on someone else's run sheet");
  const field = await getField(deps.db, by.farmId, a.field_id);
  if (!field) throw notFound('That field');
  const widthM = await implementWidthM(deps.db, by.farmId, a.implement_id);
  if (!widthM) throw notFound('That implement');
  const hazards: FeatureCollection = {
    type: 'FeatureCollection',
    features: (await hazardsOfField(deps.db, by.farmId, field.id)).map(hazardFeature),
  };
  return { job: a, boundary: field.boundary, hazards, widthM };
}

/**
 * Stores a measured coverage with the job, replacing an earlier one; a finished job takes the
 * measured acres at once (measured-acres.ts). Used for a track file and for the phone track.
 */
export async function storeCoverage(
  deps: AppDeps,
  by: SessionPrincipal,
  id: number,
  widthM: number,
  r: CoverageResult,
  source: { name: string; format: DbCoverageRow['source_format']; trackPoints?: number },
): Promise<JobCoverage> {
  const saved = await deps.db.transaction(async (tx) => {
    // Locked as a tap locks it, so a finish at the same moment either sees this track or is seen by it.
    const job = await lockJob(tx, by, id, 'operator');
    // Two measures of a growing phone track may end in either order: the one of more points stands.
    const had = source.trackPoints === undefined ? undefined : await coverageOf(tx, by.farmId, id);
    if (had?.source_format === 'phone' && (had.track_points ?? 0) > source.trackPoints!) return had;
    const row = await saveCoverage(tx, {
      assignment_id: id,
      farm_id: by.farmId,
      width_m: widthM,
      field_acres: r.fieldAcres,
      work_region_acres: r.workRegionAcres,
      covered_acres: r.coveredAcres,
      skipped_acres: r.skippedAcres,
      sliver_acres: r.sliverAcres,
      worked_twice_acres: r.workedTwiceAcres,
      skip_count: r.skipCount,
      track_length_m: r.trackLengthM,
      skips: r.skips,
      skip_geometry: r.geometry.skipped,
      covered_geometry: r.geometry.covered,
      twice_geometry: r.geometry.twice,
      source_name: source.name.slice(0, 255),
      source_format: source.format,
      computed_by: by.id,
      track_points: source.trackPoints ?? null,
    });
    const said = await takeMeasuredAcres(tx, by, job, row);
    if (said) await touchBoard(tx, by, job, `Measured a track of a finished job (${said})`);
    return row;
  });
  return view(saved);
}

/**
 * A job's measured coverage with its field, for the job's map: the owner and the job's operator
 * (and its mentor, who rides along) may read it; null coverage until a track is measured.
 */
export async function jobCoverage(deps: AppDeps, by: SessionPrincipal, id: number): Promise<JobCoverageView> {
  const a = await getAssignment(deps.db, by.farmId, id);
  if (!a) throw notFound('That job');
  if (by.role !== 'owner' && a.operator_id !== by.membershipId && a.mentor_id !== by.membershipId)
    throw forbidden("This job is on someone else's run sheet");
  const field = await getField(deps.db, by.farmId, a.field_id);
  if (!field) throw notFound('That field');
  const hazards = (await hazardsOfField(deps.db, by.farmId, field.id)).map(hazardFeature);
  const c = await coverageOf(deps.db, by.farmId, id);
  // The saved plan's passes, drawn under the coverage: where the work was meant to go.
  const plan = await getPlan(deps, by.farmId, field.id, a.operation).catch((err: unknown) => {
    if (err instanceof AppError && err.status === 404) return null;
    throw err;
  });
  return {
    job: {
      id: a.id,
      day: a.day,
      operation: a.operation,
      state: a.state,
      coverageRule: OPERATION_INFO[a.operation].coverage,
      acresDone: a.acres_done,
      acresTyped: a.acres_source === 'measured' ? a.acres_typed : a.acres_done,
      acresMeasured: a.acres_source === 'measured',
    },
    field: {
      id: field.id,
      name: field.name,
      acres: field.acres,
      boundary: field.boundary,
      hazards: { type: 'FeatureCollection', features: hazards },
    },
    coverage: c ? view(c) : null,
    passes: plan ? { type: 'FeatureCollection', features: plan.result.passes.features } : null,
  };
}
