// Reads hourly forecasts from the forecast service (WEATHER_URL; the local fake when unset) with
// its official client, `openmeteo`, and checks every answer before anyone stores it. Never called
// on a request's path: only the weather worker calls it, with no transaction open.
import { fetchWeatherApi } from 'openmeteo';
import { Unit } from '@openmeteo/sdk/unit.js';
import { Variable } from '@openmeteo/sdk/variable.js';
import type { WeatherApiResponse } from '@openmeteo/sdk/weather-api-response.js';

/** What is asked for, in the order asked; the answer's variables come back in this order. */
export const HOURLY = [
  { name: 'temperature_2m', variable: Variable.temperature, unit: Unit.celsius, column: 'temperature_c', min: -90, max: 70 },
  {
    name: 'relative_humidity_2m',
    variable: Variable.relative_humidity,
    unit: Unit.percentage,
    column: 'relative_humidity_pct',
    min: 0,
    max: 100,
  },
  { name: 'dew_point_2m', variable: Variable.dew_point, unit: Unit.celsius, column: 'dew_point_c', min: -100, max: 60 },
  { name: 'precipitation', variable: Variable.precipitation, unit: Unit.millimetre, column: 'precipitation_mm', min: 0, max: 500 },
  {
    name: 'precipitation_probability',
    variable: Variable.precipitation_probability,
    unit: Unit.percentage,
    column: 'precipitation_probability_pct',
    min: 0,
    max: 100,
  },
  // Wind is asked in m/s (wind_speed_unit=ms): stored in SI.
  { name: 'wind_speed_10m', variable: Variable.wind_speed, unit: Unit.metre_per_second, column: 'wind_speed_ms', min: 0, max: 150 },
  { name: 'wind_gusts_10m', variable: Variable.wind_gusts, unit: Unit.metre_per_second, column: 'wind_gust_ms', min: 0, max: 200 },
  {
    name: 'wind_direction_10m',
    variable: Variable.wind_direction,
    unit: Unit.degree_direction,
    column: 'wind_direction_deg',
    min: 0,
    max: 360,
  },
  { name: 'cloud_cover', variable: Variable.cloud_cover, unit: Unit.percentage, column: 'cloud_cover_pct', min: 0, max: 100 },
  // 6 cm is the service's soil level nearest seeding depth (its levels are 0, 6, 18 and 54 cm).
  {
    name: 'soil_temperature_6cm',
    variable: Variable.soil_temperature,
    unit: Unit.celsius,
    column: 'soil_temperature_c',
    min: -80,
    max: 80,
  },
] as const;

export type HourColumn = (typeof HOURLY)[number]['column'];
/** One stored hour: SI units; null where the service has no value (it sends NaN). */
export type HourValues = Record<HourColumn, number | null>;

export interface PointForecast {
  /** The point asked for. */
  latitude: number;
  longitude: number;
  /** The model grid point the service answered for, and its elevation, m. */
  answeredLatitude: number;
  answeredLongitude: number;
  elevationM: number;
  /** The first hour, UTC; the others follow one hour apart. */
  start: Date;
  hours: HourValues[];
}

export type ForecastFailure = 'unreachable' | 'timeout' | 'error' | 'garbage';

/** A forecast that could not be had; `message` says why in plain words (for the log and the stale note). */
export class ForecastError extends Error {
  constructor(
    readonly kind: ForecastFailure,
    message: string,
  ) {
    super(message);
    this.name = 'ForecastError';
  }
}

export interface ForecastOptions {
  /** How long one request may take, ms (default 15 s). */
  timeoutMs?: number;
  /** Days of hours to ask for (default 7). */
  days?: number;
}

/** The most locations in one request (the service's documented list limit is far above what one farm needs). */
export const MAX_POINTS_PER_REQUEST = 100;
/** How many days ahead forecasts are asked for (the screens say so on a day past them). */
export const FORECAST_DAYS = 7;

/**
 * Hourly forecasts for `points`, in the same order, from the service at `url`. One request for
 * all the points; no retries here (the worker tries again on its next round); throws a
 * ForecastError when the service cannot be reached, takes too long, answers an error, or answers
 * anything that is not a whole, plausible forecast for every point.
 */
export async function fetchForecasts(
  url: string,
  points: readonly { latitude: number; longitude: number }[],
  { timeoutMs = 15_000, days = FORECAST_DAYS }: ForecastOptions = {},
): Promise<PointForecast[]> {
  if (!points.length) return [];
  if (points.length > MAX_POINTS_PER_REQUEST) throw new Error(`at most ${MAX_POINTS_PER_REQUEST} points per request`);
  const params = {
    latitude: points.map((p) => p.latitude),
    longitude: points.map((p) => p.longitude),
    hourly: HOURLY.map((h) => h.name),
    wind_speed_unit: 'ms',
    timezone: 'GMT',
    forecast_days: days,
  };
  let responses: WeatherApiResponse[];
  try {
    // retries 1: one attempt; the client's own retry waits would hold the worker for seconds.
    responses = await fetchWeatherApi(url, params, 1, 0, 0, { signal: AbortSignal.timeout(timeoutMs) });
  } catch (err) {
    throw failureOf(err, timeoutMs);
  }
  // The client does not check the HTTP status: an empty or non-FlatBuffers body comes back as no
  // answers, or as answers without hourly data, or as numbers that make no sense. All refused.
  if (responses.length !== points.length)
    throw new ForecastError('garbage', `the forecast service answered ${responses.length} forecasts for ${points.length} places`);
  return responses.map((r, i) => {
    try {
      return readForecast(r, points[i], days);
    } catch (err) {
      if (err instanceof ForecastError) throw err;
      throw new ForecastError('garbage', `the forecast service answered something that is not a forecast (${(err as Error).message})`);
    }
  });
}

function failureOf(err: unknown, timeoutMs: number): ForecastError {
  const e = err as Error & { cause?: { code?: string; message?: string } };
  if (e?.name === 'TimeoutError' || e?.name === 'AbortError')
    return new ForecastError('timeout', `the forecast service did not answer within ${Math.round(timeoutMs / 1000)} s`);
  if (e?.message === 'fetch failed')
    return new ForecastError(
      'unreachable',
      `the forecast service could not be reached (${e.cause?.code ?? e.cause?.message ?? 'no connection'})`,
    );
  if (e instanceof SyntaxError) return new ForecastError('garbage', 'the forecast service answered an error page that is not readable');
  return new ForecastError('error', `the forecast service answered with an error (${(e?.message || 'no reason given').slice(0, 200)})`);
}

function readForecast(r: WeatherApiResponse, asked: { latitude: number; longitude: number }, days: number): PointForecast {
  const hourly = r.hourly();
  if (!hourly) throw new ForecastError('garbage', 'the forecast service answered without hourly data');
  const start = Number(hourly.time());
  const end = Number(hourly.timeEnd());
  const interval = hourly.interval();
  const count = (end - start) / 3600;
  if (interval !== 3600 || count !== days * 24 || start % 3600 !== 0)
    throw new ForecastError('garbage', `the forecast service answered ${count} hours ${interval} s apart, not ${days * 24} hours`);
  // The answer's grid point is near the point asked (within half a degree: the coarsest model grid).
  if (Math.abs(r.latitude() - asked.latitude) > 0.5 || Math.abs(r.longitude() - asked.longitude) > 0.5)
    throw new ForecastError('garbage', 'the forecast service answered for another place');
  if (hourly.variablesLength() !== HOURLY.length)
    throw new ForecastError('garbage', `the forecast service answered ${hourly.variablesLength()} of ${HOURLY.length} measures`);
  const hours: HourValues[] = Array.from({ length: count }, () => ({}) as HourValues);
  HOURLY.forEach((want, k) => {
    const v = hourly.variables(k);
    if (!v || v.variable() !== want.variable || v.unit() !== want.unit)
      throw new ForecastError('garbage', `the forecast service answered another measure where ${want.name} was asked`);
    const values = v.valuesArray();
    if (!values || values.length !== count)
      throw new ForecastError('garbage', `the forecast service answered ${values?.length ?? 0} values of ${want.name} for ${count} hours`);
    for (let i = 0; i < count; i++) {
      const x = values[i];
      if (Number.isNaN(x)) hours[i][want.column] = null;
      else if (x < want.min || x > want.max || !Number.isFinite(x))
        throw new ForecastError('garbage', `the forecast service answered ${want.name} ${x}, outside ${want.min} to ${want.max}`);
      else hours[i][want.column] = x;
    }
  });
  return {
    latitude: asked.latitude,
    longitude: asked.longitude,
    answeredLatitude: r.latitude(),
    answeredLongitude: r.longitude(),
    elevationM: r.elevation(),
    start: new Date(start * 1000),
    hours,
  };
}
