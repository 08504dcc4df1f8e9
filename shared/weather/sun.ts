// Sunrise and sunset at a forecast point, for the inversion-risk hours of spraying: inversions form
// as the ground cools in the evening and last until the sun has warmed it in the morning, so the
// risk window follows the sun at the field, not the farm's clock (a June evening at 50° N is light
// until after 21:00; a December one is dark by 16:30). Computed with suncalc (times are UTC instants).
import { getTimes } from 'suncalc';

/** Where the sun is asked about: a forecast point, degrees (longitude east positive). */
export interface Place {
  latitude: number;
  longitude: number;
}

/** Sunrise and sunset of one solar day, ms since the epoch; null when the sun does not cross the horizon that day. */
export interface SunDay {
  sunrise: number | null;
  sunset: number | null;
  /** The sun stays below the horizon all day (polar night) or above it (midnight sun). */
  alwaysDown: boolean;
  alwaysUp: boolean;
}

const MS_PER_DAY = 86_400_000;
/** Julian day of the Unix epoch, and of J2000.0 (2000-01-01 12:00 TT), as suncalc counts them. */
const JULIAN_EPOCH = 2_440_587.5;
const J2000 = 2_451_545;
/** suncalc's mean-transit correction, days. */
const J0 = 0.0009;

/**
 * suncalc answers for the solar day whose noon is nearest the instant asked about, and its answer
 * depends on that day's number alone; this is that number, so the cache below is exact.
 */
const solarDayOf = (ms: number, longitude: number): number => Math.round(ms / MS_PER_DAY + JULIAN_EPOCH - J2000 - J0 + longitude / 360);

// Board and run-sheet reads judge many hours at the same few points: one suncalc call per point and
// day. Bounded so a long-running process does not grow it without end (a farm has a few points).
const cache = new Map<string, SunDay>();
const CACHE_MAX = 4096;

/** Sunrise and sunset of the solar day nearest `ms` (the day whose solar noon is closest) at `place`. */
export function sunDayAt(ms: number, place: Place): SunDay {
  const key = `${place.latitude},${place.longitude},${solarDayOf(ms, place.longitude)}`;
  const known = cache.get(key);
  if (known) return known;
  const t = getTimes(new Date(ms), place.latitude, place.longitude);
  const day: SunDay = {
    sunrise: t.sunrise ? t.sunrise.getTime() : null,
    sunset: t.sunset ? t.sunset.getTime() : null,
    alwaysDown: t.alwaysDown === true,
    alwaysUp: t.alwaysUp === true,
  };
  if (cache.size >= CACHE_MAX) cache.clear();
  cache.set(key, day);
  return day;
}

/** Where an instant stands against the inversion-risk window of its night. */
export type InversionHours =
  | { inside: false }
  | { inside: true; side: 'evening'; sunset: number }
  | { inside: true; side: 'morning'; sunrise: number }
  | { inside: true; side: 'polar-night' };

/**
 * Whether `ms` lies from `beforeSunsetH` hours before sunset to `afterSunriseH` hours after the
 * sunrise (the end excluded), taking the sunrise and sunset of the solar day nearest the instant:
 * an evening hour reads that day's sunset, an hour after midnight the coming sunrise, so every hour
 * of the night is inside. Under
 * the midnight sun the window is empty (the sun never sets); in polar night it is the whole day.
 */
export function inversionHours(ms: number, place: Place, beforeSunsetH: number, afterSunriseH: number): InversionHours {
  const day = sunDayAt(ms, place);
  if (day.sunrise === null || day.sunset === null) return day.alwaysDown ? { inside: true, side: 'polar-night' } : { inside: false };
  const evening = ms >= day.sunset - beforeSunsetH * 3_600_000;
  const morning = ms < day.sunrise + afterSunriseH * 3_600_000;
  if (!evening && !morning) return { inside: false };
  // Both only when the owner's hours are long enough for the two sides to meet at midday.
  const afternoon = ms >= (day.sunrise + day.sunset) / 2;
  return evening && (afternoon || !morning)
    ? { inside: true, side: 'evening', sunset: day.sunset }
    : { inside: true, side: 'morning', sunrise: day.sunrise };
}
