import { localProjection } from '@shared/geo/local-projection';

/** One position the phone recorded for a job's track. */
export interface RecordedFix {
  /** When the phone took it, ms since 1970. */
  at: number;
  lat: number;
  lon: number;
  /** Radius of the phone's uncertainty, metres (null when not given). */
  accuracyM: number | null;
  /** Direction of travel, degrees clockwise from true north (null while standing or not given). */
  headingDeg: number | null;
  /** Speed over ground, m/s (null when not given). */
  speedMps: number | null;
}

/**
 * Which fixes are kept: at least a second and two metres after the last one kept (a phone gives
 * fixes several times a second, and a standing phone's fixes wander a metre or two), and none whose
 * uncertainty is wider than 50 m (a fix from the phone network rather than satellites). Common
 * practice, no published source.
 */
export const THINNING = { minIntervalMs: 1000, minDistanceM: 2, maxAccuracyM: 50 };

/**
 * Whether to keep a new fix after the last one kept (null: none yet).
 *
 * @example keepFix(null, { at: 0, lat: 47.6, lon: -99.9, accuracyM: 5, headingDeg: null, speedMps: null }) // true
 */
export function keepFix(last: RecordedFix | null, next: RecordedFix, rule = THINNING): boolean {
  if (!Number.isFinite(next.lat) || !Number.isFinite(next.lon) || !Number.isFinite(next.at)) return false;
  if (next.accuracyM !== null && next.accuracyM > rule.maxAccuracyM) return false;
  if (!last) return true;
  if (next.at - last.at < rule.minIntervalMs) return false;
  const [x, y] = localProjection([last.lon, last.lat]).forward([next.lon, next.lat]);
  return Math.hypot(x, y) >= rule.minDistanceM;
}

/** A fix from the Geolocation API's position, heading and speed kept only when the phone gives them. */
export function fixOf(pos: GeolocationPosition): RecordedFix {
  const c = pos.coords;
  const num = (v: number | null | undefined) => (typeof v === 'number' && Number.isFinite(v) ? v : null);
  return {
    at: pos.timestamp,
    lat: c.latitude,
    lon: c.longitude,
    accuracyM: num(c.accuracy),
    headingDeg: num(c.heading),
    speedMps: num(c.speed),
  };
}
