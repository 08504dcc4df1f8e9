// Forecasts: refreshing a farm's points from the forecast service (background only), and the
// field's forecast with its verdicts for the screens (database only: no request waits on the service).
import { DateTime } from 'luxon';
import type { UnitSystem } from '../../shared/schemas/auth';
import type { FieldForecast, ForecastHour, WeatherLimitsAnswer } from '../../shared/schemas/weather';
import { yearIn } from '../../shared/calendar';
import { formatAge } from '../../shared/figures';
import { roundTo } from '../../shared/round';
import { boundaryCentre, gridCellOf, type GridCell } from '../../shared/weather/grid';
import {
  DEFAULT_LIMITS,
  LIMIT_SOURCES,
  seedCropOf,
  WEATHER_OPERATIONS,
  type SeedCrop,
  type WeatherLimits,
} from '../../shared/weather/limits';
import { judgeHour, type WeatherHour } from '../../shared/weather/rules';
import type { Place } from '../../shared/weather/sun';
import { deltaTC } from '../../shared/weather/wet-bulb';
import type { Db, Tx } from '../db/knex';
import { AppError } from '../http/errors';
import { logMessage } from '../http/errors';
import { silentLogger, type Logger } from '../logging/logger';
import { fetchForecasts, ForecastError, MAX_POINTS_PER_REQUEST, type PointForecast } from './forecast.client';
import {
  boundariesForBoard,
  cropOf,
  cropsOf,
  ensurePoints,
  fieldBoundaries,
  fieldBoundary,
  forecastHours,
  latestForecast,
  markFailed,
  newestHoursOfCells,
  pointOfCell,
  saveLimits,
  storedLimits,
  storeForecasts,
  type PointHourRow,
  type WeatherPointRow,
} from './weather.repository';

/** A point is refreshed at most this often (after a good forecast). */
export const REFRESH_EVERY_MS = 3_600_000;
/** After a failure, the service is asked again for that point no sooner than this. */
export const RETRY_AFTER_MS = 10 * 60_000;
/** A forecast older than this is shown as stale even when no refresh failed (the worker is behind). */
export const STALE_AFTER_MS = 2 * 3_600_000;

export interface RefreshOptions {
  /** The forecast endpoint (config.weatherUrl, or the local fake's). */
  url: string;
  now?: Date;
  timeoutMs?: number;
  logger?: Logger;
}

export interface RefreshOutcome {
  /** The farm's points (cells with fields). */
  points: number;
  /** Points that got a new forecast. */
  refreshed: number;
  /** Points whose refresh failed (their last forecast stays, stale). */
  failed: number;
  /** Why, when some failed. */
  error?: string;
}

/** The cells of the farm's fields, each once. */
function cellsOf(fields: { boundary: { type: string; coordinates: unknown } }[]): GridCell[] {
  const cells = new Map<string, GridCell>();
  for (const f of fields) {
    const centre = boundaryCentre(f.boundary);
    if (!centre) continue;
    const cell = gridCellOf(centre[1], centre[0]);
    cells.set(`${cell.latIndex},${cell.lonIndex}`, cell);
  }
  return [...cells.values()];
}

const isDue = (p: WeatherPointRow, now: number): boolean =>
  (!p.last_success_at || p.last_success_at.getTime() <= now - REFRESH_EVERY_MS) &&
  (!p.last_attempt_at || p.last_attempt_at.getTime() <= now - RETRY_AFTER_MS);

/**
 * Refreshes the farm's points that are due: one request per hundred points, with no transaction
 * open while the service is asked; each request's good answer is stored in one transaction, and a
 * failed or bad one is logged and refused (its points keep their last forecast, marked failed).
 */
export async function refreshFarmWeather(db: Db, farmId: number, options: RefreshOptions): Promise<RefreshOutcome> {
  const now = options.now ?? new Date();
  const log = options.logger ?? silentLogger();
  const points = await ensurePoints(db, farmId, cellsOf(await fieldBoundaries(db, farmId)));
  const due = points.filter((p) => isDue(p, now.getTime()));
  const outcome: RefreshOutcome = { points: points.length, refreshed: 0, failed: 0 };
  for (let i = 0; i < due.length; i += MAX_POINTS_PER_REQUEST) {
    const batch = due.slice(i, i + MAX_POINTS_PER_REQUEST);
    let forecasts: PointForecast[];
    try {
      forecasts = await fetchForecasts(options.url, batch, { timeoutMs: options.timeoutMs });
    } catch (err) {
      const reason = err instanceof ForecastError ? err.message : `the forecast could not be read (${logMessage(err)})`;
      log.warn(
        { farmId, points: batch.length, kind: err instanceof ForecastError ? err.kind : 'other', error: reason },
        'forecast refused',
      );
      await markFailed(
        db,
        batch.map((p) => p.id),
        now,
        reason,
      );
      outcome.failed += batch.length;
      outcome.error = reason;
      continue;
    }
    await db.transaction((tx) =>
      storeForecasts(
        tx,
        farmId,
        batch.map((point, k) => ({ point, forecast: forecasts[k] })),
        now,
      ),
    );
    outcome.refreshed += batch.length;
  }
  if (due.length) log.info({ farmId, ...outcome }, 'forecasts refreshed');
  return outcome;
}

/** The farm's limits: the owner's, with the defaults for anything not set (a key added later), and no key that is gone. */
export async function farmLimits(db: Tx, farmId: number): Promise<WeatherLimits> {
  const stored = (await storedLimits(db, farmId)) ?? {};
  const merged = {} as Record<string, unknown>;
  for (const op of WEATHER_OPERATIONS) {
    const mine = (stored[op] ?? {}) as Record<string, unknown>;
    const base = DEFAULT_LIMITS[op] as unknown as Record<string, unknown>;
    // Only today's keys: a limit that was replaced (inversion hours once were clock hours) is dropped.
    merged[op] = Object.fromEntries(Object.keys(base).map((k) => [k, k in mine ? mine[k] : base[k]]));
  }
  const seeding = merged.seeding as WeatherLimits['seeding'];
  seeding.soilMinC = { ...DEFAULT_LIMITS.seeding.soilMinC, ...(stored.seeding?.soilMinC ?? {}) };
  return merged as unknown as WeatherLimits;
}

export async function limitsAnswer(db: Tx, farmId: number): Promise<WeatherLimitsAnswer> {
  return { limits: await farmLimits(db, farmId), defaults: DEFAULT_LIMITS, sources: LIMIT_SOURCES as WeatherLimitsAnswer['sources'] };
}

export async function changeLimits(db: Tx, farmId: number, limits: WeatherLimits): Promise<WeatherLimitsAnswer> {
  await saveLimits(db, farmId, limits);
  return limitsAnswer(db, farmId);
}

const r2 = (n: number | null): number | null => (n === null ? null : roundTo(n, 2));
const kmh = (ms: number | null): number | null => (ms === null ? null : roundTo(ms * 3.6, 2));

/** How long ago a forecast was fetched, as every screen writes it (shared/figures.ts): "40 min", "2.5 h". */
const ageText = (ageMs: number): string => formatAge(ageMs / 60_000);

/** Why a stored forecast is stale (a failure since it was fetched, or none newer for two hours), or null. */
function staleReasonOf(fetchedAt: Date, lastFailureAt: Date | null, lastError: string | null, now: Date): string | null {
  const ageMs = now.getTime() - fetchedAt.getTime();
  if (lastFailureAt && lastFailureAt.getTime() > fetchedAt.getTime())
    return `Forecast from ${ageText(ageMs)} ago: the last refresh failed (${lastError ?? 'no reason given'})`;
  return ageMs > STALE_AFTER_MS ? `Forecast from ${ageText(ageMs)} ago: no newer forecast has arrived` : null;
}

/** A stored hour as the API gives it: the time in the farm's zone, wind in km/h, figures to 2 decimals. */
interface StoredHourColumns {
  temperature_c: number | null;
  relative_humidity_pct: number | null;
  dew_point_c: number | null;
  precipitation_mm: number | null;
  precipitation_probability_pct: number | null;
  wind_speed_ms: number | null;
  wind_gust_ms: number | null;
  wind_direction_deg: number | null;
  cloud_cover_pct: number | null;
  soil_temperature_c: number | null;
}
const luxonIso = (ms: number, timeZone: string): string =>
  DateTime.fromMillis(ms, { zone: timeZone }).toISO({ suppressMilliseconds: true })!;

/**
 * Writes instants of a run of hours on the farm's clock, exactly as luxon's ISO form
 * ("2026-05-14T10:00:00-05:00"). Working out a zone's offset is the costly part of that, and a
 * run of a few days has one offset unless a clock change falls inside it: when the first and last
 * instants share one, it is worked out once; otherwise every instant goes through luxon.
 */
export function clockWriter(timeZone: string, firstMs: number, lastMs: number): (ms: number) => string {
  const first = DateTime.fromMillis(firstMs, { zone: timeZone });
  const last = DateTime.fromMillis(lastMs, { zone: timeZone });
  if (!first.isValid || first.offset !== last.offset) return (ms) => luxonIso(ms, timeZone);
  const shift = first.offset * 60_000;
  const suffix = first.toISO({ suppressMilliseconds: true })!.slice(19);
  return (ms) => (ms % 1000 === 0 ? new Date(ms + shift).toISOString().slice(0, 19) + suffix : luxonIso(ms, timeZone));
}

/** A writer for the times of some stored rows (see clockWriter). */
const writerFor = (times: readonly Date[], timeZone: string): ((ms: number) => string) =>
  times.length ? clockWriter(timeZone, times[0].getTime(), times[times.length - 1].getTime()) : (ms) => luxonIso(ms, timeZone);

const weatherHourOf = (h: StoredHourColumns, time: Date, write: (ms: number) => string): WeatherHour => ({
  time: write(time.getTime()),
  temperatureC: r2(h.temperature_c),
  relativeHumidityPct: r2(h.relative_humidity_pct),
  dewPointC: r2(h.dew_point_c),
  precipitationMm: r2(h.precipitation_mm),
  precipitationProbabilityPct: r2(h.precipitation_probability_pct),
  windSpeedKmh: kmh(h.wind_speed_ms),
  windGustKmh: kmh(h.wind_gust_ms),
  windDirectionDeg: r2(h.wind_direction_deg),
  cloudCoverPct: r2(h.cloud_cover_pct),
  soilTemperatureC: r2(h.soil_temperature_c),
});

/**
 * A field's forecast as the screens show it: every hour of the newest stored forecast of the
 * field's point, with Delta T and each operation's verdict, times in the farm's zone. Never asks
 * the service: without a stored forecast it answers no hours, marked stale.
 */
export async function fieldForecast(
  db: Db,
  who: { farmId: number; timeZone: string; units: UnitSystem },
  fieldId: number,
  now = new Date(),
): Promise<FieldForecast> {
  const field = await fieldBoundary(db, who.farmId, fieldId);
  if (!field) throw new AppError(404, 'not_found', 'That field was not found on this farm');
  const centre = boundaryCentre(field.boundary);
  if (!centre) throw new AppError(422, 'no_boundary', 'This field has no boundary to place its forecast');
  const cell = gridCellOf(centre[1], centre[0]);
  const point = await pointOfCell(db, who.farmId, cell.latIndex, cell.lonIndex);
  const forecast = point ? await latestForecast(db, point.id) : undefined;
  const base = { fieldId, point: { latitude: cell.latitude, longitude: cell.longitude } };
  const crop = seedCropOf(await cropOf(db, who.farmId, fieldId, yearIn(who.timeZone, now)));
  if (!forecast || !point) {
    return {
      ...base,
      issuedAt: null,
      fetchedAt: null,
      ageMinutes: null,
      stale: true,
      staleReason: point?.last_error
        ? `No forecast yet: ${point.last_error}`
        : 'No forecast yet: it is fetched in the background within a few minutes of adding a field',
      seedingCrop: crop,
      hours: [],
    };
  }
  const ageMs = now.getTime() - forecast.fetched_at.getTime();
  const staleReason = staleReasonOf(forecast.fetched_at, point.last_failure_at, point.last_error, now);
  const rows = await forecastHours(db, forecast.id);
  const write = writerFor(
    rows.map((h) => h.time),
    who.timeZone,
  );
  const hours = rows.map((h) => weatherHourOf(h, h.time, write));
  const limits = await farmLimits(db, who.farmId);
  const judged: ForecastHour[] = hours.map((h, i) => ({
    ...h,
    deltaTC: h.temperatureC === null || h.relativeHumidityPct === null ? null : roundTo(deltaTC(h.temperatureC, h.relativeHumidityPct), 2),
    verdicts: judgeHour(hours, i, limits, who.units, crop, cell),
  }));
  return {
    ...base,
    issuedAt: forecast.issued_at.toISOString(),
    fetchedAt: forecast.fetched_at.toISOString(),
    ageMinutes: Math.max(0, Math.floor(ageMs / 60_000)),
    stale: staleReason !== null,
    staleReason,
    seedingCrop: crop,
    hours: judged,
  };
}

/** The newest stored forecast of one point, as the board reads it. */
export interface StoredForecast {
  fetchedAt: Date;
  ageMinutes: number;
  stale: boolean;
  staleReason: string | null;
  /** When it turns stale by age alone. */
  staleAfter: Date;
  /** The forecast point (its sunrise and sunset bound spraying's inversion hours). */
  place: Place;
  /** The forecast's last hour, however far past the range asked for. */
  lastHour: Date | null;
  /** Its hours in the range asked for, in time order, times in the farm's zone. */
  hours: WeatherHour[];
}

/** What the board needs of the weather for some fields: read from the database only. */
export interface FieldsWeather {
  /** Per field asked for (and the farm's first field): its name, its point's key and its crop for seeding. */
  fields: Map<number, { name: string; point: string; crop: SeedCrop | null }>;
  /** The farm's first field (lowest id), or null without fields. */
  firstFieldId: number | null;
  /** Per point key: its newest forecast, or null when none is stored. */
  points: Map<string, StoredForecast | null>;
  limits: WeatherLimits;
}

const pointKey = (latIndex: number, lonIndex: number): string => `${latIndex},${lonIndex}`;
function storedForecastOf(rows: readonly PointHourRow[], cell: GridCell, timeZone: string, now: Date): StoredForecast | null {
  const first = rows[0];
  if (!first.forecast_id || !first.fetched_at) return null;
  const fetchedAt = first.fetched_at;
  const ageMs = now.getTime() - fetchedAt.getTime();
  const staleReason = staleReasonOf(fetchedAt, first.last_failure_at, first.last_error, now);
  const timed = rows.filter((h): h is PointHourRow & { time: Date } => h.time !== null);
  const write = writerFor(
    timed.map((h) => h.time),
    timeZone,
  );
  const hours = timed.map((h) => weatherHourOf(h, h.time, write));
  return {
    fetchedAt,
    ageMinutes: Math.max(0, Math.floor(ageMs / 60_000)),
    stale: staleReason !== null,
    staleReason,
    staleAfter: new Date(fetchedAt.getTime() + STALE_AFTER_MS),
    place: { latitude: cell.latitude, longitude: cell.longitude },
    lastHour: first.last_time,
    hours,
  };
}

/**
 * The stored weather of some fields for the board, hours from `from` to `to` (excluded): the
 * fields' points, crops and limits, and the newest forecast of every point in one query. Never
 * asks the forecast service and makes no points: a field whose point has no forecast yet gets null.
 */
export async function weatherOfFields(
  db: Tx,
  farmId: number,
  fieldIds: readonly number[],
  options: { from: Date; to: Date; timeZone: string; season: number; now?: Date; limits?: WeatherLimits },
): Promise<FieldsWeather> {
  const now = options.now ?? new Date();
  const boundaries = await boundariesForBoard(db, farmId, fieldIds);
  const crops = await cropsOf(db, farmId, fieldIds, options.season);
  const fields: FieldsWeather['fields'] = new Map();
  const cells = new Map<string, GridCell>();
  for (const f of boundaries) {
    const centre = boundaryCentre(f.boundary);
    if (!centre) continue;
    const cell = gridCellOf(centre[1], centre[0]);
    const key = pointKey(cell.latIndex, cell.lonIndex);
    cells.set(key, cell);
    fields.set(f.id, { name: f.name, point: key, crop: seedCropOf(crops.get(f.id)) });
  }
  const rows = await newestHoursOfCells(db, farmId, [...cells.values()], options.from, options.to);
  const byPoint = new Map<string, PointHourRow[]>();
  for (const r of rows) {
    const key = pointKey(r.lat_index, r.lon_index);
    const list = byPoint.get(key);
    if (list) list.push(r);
    else byPoint.set(key, [r]);
  }
  const points: FieldsWeather['points'] = new Map();
  for (const [key, cell] of cells) {
    const list = byPoint.get(key);
    points.set(key, list ? storedForecastOf(list, cell, options.timeZone, now) : null);
  }
  return { fields, firstFieldId: boundaries[0]?.id ?? null, points, limits: options.limits ?? (await farmLimits(db, farmId)) };
}
