// The track a job operator's phone records while the job is underway: received in chunks (each
// chunk id once per job, so a phone that resends after a lost answer adds nothing), read by the
// owner and the job's operator, and measured as a coverage source like a track file. The phone
// knows nothing of the implement's work state: every point taken while the job was underway
// counts as working (shared/track-coverage/underway-lines.ts).
import { MAX_PHONE_TRACK_POINTS, type PhoneTrack, type TrackChunk, type TrackChunkAnswer } from '../../shared/schemas/phone-track';
import type { JobCoverage } from '../../shared/schemas/track-coverage';
import { linesWhileUnderway } from '../../shared/track-coverage/underway-lines';
import type { AppDeps } from '../app-deps';
import { AppError, forbidden, notFound } from '../http/errors';
import type { SessionPrincipal } from '../http/session-user';
import { getAssignment } from '../jobs/assignments.repository';
import { eventsOfJob } from '../jobs/events.repository';
import { MAX_AGE_DAYS } from '../run-sheet/events.service';
import { coverageOf } from '../track-coverage/coverage.repository';
import { coverageGround, storeCoverage } from '../track-coverage/coverage.service';
import { claimChunk, chunkOf, insertPoints, pointCount, pointsOf } from './phone-track.repository';

/** The name a coverage measured from the phone track is stored under (the job's map shows it). */
export const PHONE_TRACK_SOURCE = 'phone track';
/** A phone's clock may run a little ahead of the server's (common practice, no published source). */
const CLOCK_SKEW_MS = 5 * 60_000;

/** The job, when `by` is its operator; the owner of the farm records no track on another's phone. */
async function ownJob(deps: AppDeps, by: SessionPrincipal, id: number) {
  const a = await getAssignment(deps.db, by.farmId, id);
  if (!a) throw notFound('That job');
  if (a.operator_id !== by.membershipId) throw forbidden("Only the phone of the job's operator records its track");
  return a;
}

/** Every point's time must be a time the phone could have taken it. */
function checkTimes(chunk: TrackChunk): void {
  const now = Date.now();
  chunk.points.forEach((p, i) => {
    const t = Date.parse(p.at);
    if (t > now + CLOCK_SKEW_MS)
      throw new AppError(
        400,
        'at_in_future',
        "A point's time is more than 5 minutes ahead of the farm's clock; check the phone's date and time",
        {
          [`points.${i}.at`]: 'In the future',
        },
      );
    if (t < now - MAX_AGE_DAYS * 86_400_000)
      throw new AppError(400, 'at_too_old', `A point was taken more than ${MAX_AGE_DAYS} days ago; check the phone's date`, {
        [`points.${i}.at`]: `More than ${MAX_AGE_DAYS} days ago`,
      });
  });
}

/**
 * Stores a chunk of the job's phone track, sent by the job's operator. The same chunk id sent
 * again for the job answers as the first time and adds nothing; the same id with another number
 * of points is refused (409). A finished job's phone-track coverage is measured again with the
 * late points (a phone may send its last chunks after the finish).
 */
export async function receiveChunk(deps: AppDeps, by: SessionPrincipal, id: number, chunk: TrackChunk): Promise<TrackChunkAnswer> {
  await ownJob(deps, by, id);
  checkTimes(chunk);
  const answer = { chunkId: chunk.chunkId, points: chunk.points.length };
  const added = await deps.db.transaction(async (tx) => {
    const fresh = await claimChunk(tx, {
      assignment_id: id,
      chunk_id: chunk.chunkId,
      farm_id: by.farmId,
      user_id: by.id,
      point_count: chunk.points.length,
    });
    if (!fresh) {
      const first = (await chunkOf(tx, id, chunk.chunkId))!;
      if (first.point_count !== chunk.points.length)
        throw new AppError(
          409,
          'chunk_reused',
          'That chunk id was already sent with other points; the phone must make a new id for new points',
        );
      return false;
    }
    if ((await pointCount(tx, by.farmId, id)) + chunk.points.length > MAX_PHONE_TRACK_POINTS)
      throw new AppError(
        422,
        'track_too_long',
        `A job keeps at most ${MAX_PHONE_TRACK_POINTS.toLocaleString('en-US')} phone-track points; recording stops here`,
      );
    await insertPoints(
      tx,
      chunk.points.map((p) => ({
        assignment_id: id,
        farm_id: by.farmId,
        chunk_id: chunk.chunkId,
        at: new Date(p.at),
        lat: p.lat,
        lon: p.lon,
        accuracy_m: p.accuracyM ?? null,
        heading_deg: p.headingDeg ?? null,
        speed_mps: p.speedMps ?? null,
      })),
    );
    return true;
  });
  // The job's state is read once the points are in: a finish that landed while they were being
  // stored measured without them, so they are measured now (a finish after this sees them).
  if (added && (await getAssignment(deps.db, by.farmId, id))?.state === 'finished') await measureAfterFinish(deps, by, id);
  return answer;
}

/** The job's phone track: the owner and the job's operator read it. */
export async function phoneTrack(deps: AppDeps, by: SessionPrincipal, id: number): Promise<PhoneTrack> {
  const a = await getAssignment(deps.db, by.farmId, id);
  if (!a) throw notFound('That job');
  if (by.role !== 'owner' && a.operator_id !== by.membershipId) throw forbidden("This job is on someone else's run sheet");
  const rows = await pointsOf(deps.db, by.farmId, id);
  return {
    assignmentId: id,
    points: rows.map((r) => ({
      at: r.at.toISOString(),
      lat: r.lat,
      lon: r.lon,
      accuracyM: r.accuracy_m,
      headingDeg: r.heading_deg,
      speedMps: r.speed_mps,
    })),
  };
}

/**
 * Measures the job's phone track with the coverage code a track file goes through, and stores it
 * like an uploaded track, its source "phone track" (replacing an earlier measure). The owner and
 * the job's operator may ask; with no two points taken while the job was underway, a 409.
 */
export async function measurePhoneTrack(deps: AppDeps, by: SessionPrincipal, id: number): Promise<JobCoverage> {
  const { boundary, hazards, widthM } = await coverageGround(deps, by, id);
  const [rows, steps] = await Promise.all([pointsOf(deps.db, by.farmId, id), eventsOfJob(deps.db, by.farmId, id)]);
  const track = linesWhileUnderway(
    rows.map((r) => ({ lon: r.lon, lat: r.lat, t: r.at.getTime() })),
    steps.map((s) => ({ type: s.type, at: new Date(s.at).getTime() })),
  );
  if (!track.length)
    throw new AppError(
      409,
      'no_phone_track',
      rows.length
        ? 'The phone track has no two points taken while the job was underway'
        : 'No phone track was recorded for this job: turn on "Record track" on the run sheet while the job is underway',
    );
  const r = await deps.compute.run('pointsCoverage', { boundary, hazards, widthM, track });
  return storeCoverage(deps, by, id, widthM, r, { name: PHONE_TRACK_SOURCE, format: 'phone', trackPoints: rows.length });
}

/**
 * After a finish (or a chunk arriving for a finished job): the phone track's coverage, unless a
 * track file was measured for the job (a file sent on purpose is not replaced by the phone's) or
 * the phone track was measured with every point it has now (counted, not timed: a chunk stored
 * after a measure read the points may have been received before the measure was saved). A
 * failure is logged; the finish stands.
 */
export async function measureAfterFinish(deps: AppDeps, by: SessionPrincipal, id: number): Promise<void> {
  try {
    const points = await pointCount(deps.db, by.farmId, id);
    if (!points) return;
    const had = await coverageOf(deps.db, by.farmId, id);
    if (had && (had.source_format !== 'phone' || had.track_points === points)) return;
    await measurePhoneTrack(deps, by, id);
  } catch (err) {
    deps.logger?.warn({ err, assignmentId: id }, 'The phone track of a finished job could not be measured');
  }
}
