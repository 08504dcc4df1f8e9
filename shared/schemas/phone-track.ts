// The track a job operator's phone records while the job is underway (the run sheet's "Record
// track"), sent to the farm's own server in chunks, and what the server keeps of it.
import * as z from 'zod';
import { MAX_POINTS_PER_CHUNK } from '../limits';

/** Points kept for one job: more than a 24-hour day at one point a second. */
export const MAX_PHONE_TRACK_POINTS = 100_000;

export const trackPointInput = z.object({
  /** When the phone took the position (ISO 8601). */
  at: z.iso.datetime({ offset: true, message: 'Use a date and time such as 2026-05-01T08:30:00Z' }),
  lat: z.number().min(-90, 'Latitude is between −90 and 90').max(90, 'Latitude is between −90 and 90'),
  lon: z.number().min(-180, 'Longitude is between −180 and 180').max(180, 'Longitude is between −180 and 180'),
  /** The radius of the phone's uncertainty, metres. */
  accuracyM: z.number().min(0, 'Accuracy cannot be negative').max(100_000).nullable().optional(),
  /** Direction of travel, degrees clockwise from true north (null while standing). */
  headingDeg: z.number().min(0).max(360).nullable().optional(),
  /** Speed over ground, m/s. */
  speedMps: z.number().min(0, 'Speed cannot be negative').max(200).nullable().optional(),
});
export type TrackPointInput = z.infer<typeof trackPointInput>;

/** POST /api/assignments/:id/track-points: one chunk; the same chunk id sent again adds nothing. */
export const trackChunkBody = z.object({
  chunkId: z.uuid({ message: 'The chunk id must be a UUID made on the phone' }),
  points: z
    .array(trackPointInput)
    .min(1, 'A chunk holds at least one point')
    .max(MAX_POINTS_PER_CHUNK, `A chunk holds at most ${MAX_POINTS_PER_CHUNK} points`),
});
export type TrackChunk = z.infer<typeof trackChunkBody>;

/** The answer to a chunk, the same for the first send and a resend. */
export interface TrackChunkAnswer {
  chunkId: string;
  points: number;
}

/** GET /api/assignments/:id/track-points: the job's phone track, in the order it was recorded. */
export interface PhoneTrack {
  assignmentId: number;
  points: Array<{ at: string; lat: number; lon: number; accuracyM: number | null; headingDeg: number | null; speedMps: number | null }>;
}
