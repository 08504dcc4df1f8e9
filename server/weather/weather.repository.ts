import type { WeatherLimits } from '../../shared/weather/limits';
import type { Tx } from '../db/knex';
import type { HourValues, PointForecast } from './forecast.client';
import { HOURLY } from './forecast.client';

export interface WeatherPointRow {
  id: number;
  farm_id: number;
  lat_index: number;
  lon_index: number;
  latitude: number;
  longitude: number;
  last_attempt_at: Date | null;
  last_success_at: Date | null;
  last_failure_at: Date | null;
  last_error: string | null;
}

export interface WeatherForecastRow {
  id: number;
  farm_id: number;
  point_id: number;
  issued_at: Date;
  fetched_at: Date;
  starts_at: Date;
  hour_count: number;
  answered_latitude: number;
  answered_longitude: number;
  elevation_m: number;
}

export type WeatherHourRow = { forecast_id: number; time: Date } & HourValues;

interface Cell {
  latIndex: number;
  lonIndex: number;
  latitude: number;
  longitude: number;
}

export async function fieldBoundaries(db: Tx, farmId: number): Promise<{ id: number; boundary: { type: string; coordinates: unknown } }[]> {
  return db('fields').where({ farm_id: farmId }).select('id', 'boundary');
}

export async function fieldBoundary(
  db: Tx,
  farmId: number,
  fieldId: number,
): Promise<{ id: number; boundary: { type: string; coordinates: unknown } } | undefined> {
  return db('fields').where({ farm_id: farmId, id: fieldId }).first('id', 'boundary');
}

export async function cropOf(db: Tx, farmId: number, fieldId: number, season: number): Promise<string | null> {
  const row = await db('crop_plans').where({ farm_id: farmId, field_id: fieldId, season }).first('crop');
  return (row?.crop as string | undefined) ?? null;
}

/** Farms with at least one field: the ones whose forecasts the scheduler keeps fresh. */
export async function farmsWithFields(db: Tx): Promise<number[]> {
  const rows: { farm_id: number }[] = await db('fields').distinct('farm_id').orderBy('farm_id');
  return rows.map((r) => r.farm_id);
}

/** The farm's points for these cells, made when missing. */
export async function ensurePoints(db: Tx, farmId: number, cells: readonly Cell[]): Promise<WeatherPointRow[]> {
  if (!cells.length) return [];
  await db('weather_points')
    .insert(
      cells.map((c) => ({ farm_id: farmId, lat_index: c.latIndex, lon_index: c.lonIndex, latitude: c.latitude, longitude: c.longitude })),
    )
    .onConflict(['farm_id', 'lat_index', 'lon_index'])
    .ignore();
  return db('weather_points')
    .where({ farm_id: farmId })
    .whereIn(
      ['lat_index', 'lon_index'],
      cells.map((c) => [c.latIndex, c.lonIndex]),
    )
    .orderBy('id');
}

export async function pointOfCell(db: Tx, farmId: number, latIndex: number, lonIndex: number): Promise<WeatherPointRow | undefined> {
  return db('weather_points').where({ farm_id: farmId, lat_index: latIndex, lon_index: lonIndex }).first();
}

/** Records a failed refresh of these points: their last forecast stays, shown as stale. */
export async function markFailed(db: Tx, pointIds: readonly number[], at: Date, reason: string): Promise<void> {
  if (!pointIds.length) return;
  await db('weather_points')
    .whereIn('id', pointIds)
    .update({ last_attempt_at: at, last_failure_at: at, last_error: reason.slice(0, 500) });
}

/** Rows per insert: 12 columns each, well inside PostgreSQL's 65,535 bound parameters. */
const HOUR_ROWS_PER_INSERT = 2000;
/** Older forecasts are kept this long (a called-off job may point at the hour it was judged on). */
const KEEP_MS = 2 * 86_400_000;

/**
 * Stores good forecasts of several points in `tx` (the caller's one transaction): the forecast
 * row, its hours, the point's success; forecasts older than two days (not the newest) are dropped.
 */
export async function storeForecasts(
  tx: Tx,
  farmId: number,
  items: readonly { point: WeatherPointRow; forecast: PointForecast }[],
  fetchedAt: Date,
): Promise<number[]> {
  const issuedAt = new Date(Math.floor(fetchedAt.getTime() / 3_600_000) * 3_600_000);
  const ids: number[] = [];
  const hourRows: Record<string, unknown>[] = [];
  for (const { point, forecast } of items) {
    // A second fetch within the same hour replaces the first (only when forced: refreshes are hourly at most).
    await tx('weather_forecasts').where({ point_id: point.id, issued_at: issuedAt }).delete();
    const [row] = await tx('weather_forecasts')
      .insert({
        farm_id: farmId,
        point_id: point.id,
        issued_at: issuedAt,
        fetched_at: fetchedAt,
        starts_at: forecast.start,
        hour_count: forecast.hours.length,
        answered_latitude: forecast.answeredLatitude,
        answered_longitude: forecast.answeredLongitude,
        elevation_m: forecast.elevationM,
      })
      .returning('id');
    ids.push(row.id as number);
    const start = forecast.start.getTime();
    forecast.hours.forEach((h, i) => hourRows.push({ forecast_id: row.id, time: new Date(start + i * 3_600_000), ...h }));
  }
  for (let i = 0; i < hourRows.length; i += HOUR_ROWS_PER_INSERT)
    await tx('weather_hours').insert(hourRows.slice(i, i + HOUR_ROWS_PER_INSERT));
  const pointIds = items.map((i) => i.point.id);
  await tx('weather_points')
    .whereIn('id', pointIds)
    .update({ last_attempt_at: fetchedAt, last_success_at: fetchedAt, last_failure_at: null, last_error: null });
  await tx('weather_forecasts')
    .whereIn('point_id', pointIds)
    .where('fetched_at', '<', new Date(fetchedAt.getTime() - KEEP_MS))
    .whereNotIn('id', ids)
    .delete();
  return ids;
}

export async function latestForecast(db: Tx, pointId: number): Promise<WeatherForecastRow | undefined> {
  return db('weather_forecasts').where({ point_id: pointId }).orderBy('issued_at', 'desc').orderBy('id', 'desc').first();
}

export async function forecastHours(db: Tx, forecastId: number): Promise<WeatherHourRow[]> {
  return db('weather_hours')
    .where({ forecast_id: forecastId })
    .orderBy('time')
    .select('forecast_id', 'time', ...HOURLY.map((h) => h.column));
}

export async function storedLimits(db: Tx, farmId: number): Promise<Partial<WeatherLimits> | null> {
  const row = await db('weather_limits').where({ farm_id: farmId }).first('limits');
  return (row?.limits as Partial<WeatherLimits> | undefined) ?? null;
}

export async function saveLimits(db: Tx, farmId: number, limits: WeatherLimits): Promise<void> {
  await db('weather_limits')
    .insert({ farm_id: farmId, limits: JSON.stringify(limits), updated_at: db.fn.now() })
    .onConflict('farm_id')
    .merge(['limits', 'updated_at']);
}

/**
 * The boundaries of these fields and of the farm's first field (the lowest id), each once: what
 * the board needs to place its day's fields, and a point for the day's strip when it has none.
 */
export async function boundariesForBoard(
  db: Tx,
  farmId: number,
  fieldIds: readonly number[],
): Promise<{ id: number; name: string; boundary: { type: string; coordinates: unknown } }[]> {
  return db('fields')
    .where({ farm_id: farmId })
    .where((q) => {
      q.whereIn('id', [...fieldIds]).orWhere('id', db('fields').where({ farm_id: farmId }).min('id'));
    })
    .orderBy('id')
    .select('id', 'name', 'boundary');
}

/** The crop planned on each of these fields in a season (fields without one are left out). */
export async function cropsOf(db: Tx, farmId: number, fieldIds: readonly number[], season: number): Promise<Map<number, string>> {
  if (!fieldIds.length) return new Map();
  const rows: { field_id: number; crop: string }[] = await db('crop_plans')
    .where({ farm_id: farmId, season })
    .whereIn('field_id', [...fieldIds])
    .select('field_id', 'crop');
  return new Map(rows.map((r) => [r.field_id, r.crop]));
}

/** A point with its newest forecast (if any) and one of that forecast's hours (if any in the range). */
export type PointHourRow = {
  point_id: number;
  lat_index: number;
  lon_index: number;
  last_failure_at: Date | null;
  last_error: string | null;
  forecast_id: number | null;
  fetched_at: Date | null;
  /** The forecast's last hour (of all its hours, not only those asked for). */
  last_time: Date | null;
  time: Date | null;
} & HourValues;

/**
 * One query for several points: each of the farm's points in these cells, joined to its newest
 * forecast and that forecast's hours from `from` (included) to `to` (excluded), in point and time
 * order. A point without a forecast comes once with nulls; a cell without a point not at all.
 */
export async function newestHoursOfCells(
  db: Tx,
  farmId: number,
  cells: readonly { latIndex: number; lonIndex: number }[],
  from: Date,
  to: Date,
): Promise<PointHourRow[]> {
  if (!cells.length) return [];
  return db('weather_points as p')
    .joinRaw(
      'LEFT JOIN LATERAL (SELECT f.id, f.fetched_at, (SELECT max(wh.time) FROM weather_hours wh WHERE wh.forecast_id = f.id) AS last_time ' +
        'FROM weather_forecasts f WHERE f.point_id = p.id ORDER BY f.issued_at DESC, f.id DESC LIMIT 1) nf ON true',
    )
    .leftJoin('weather_hours as h', (j) => {
      j.on('h.forecast_id', 'nf.id')
        .andOn('h.time', '>=', db.raw('?', [from]))
        .andOn('h.time', '<', db.raw('?', [to]));
    })
    .where('p.farm_id', farmId)
    .whereIn(
      ['p.lat_index', 'p.lon_index'],
      cells.map((c) => [c.latIndex, c.lonIndex]),
    )
    .orderBy('p.id')
    .orderBy('h.time')
    .select(
      'p.id as point_id',
      'p.lat_index',
      'p.lon_index',
      'p.last_failure_at',
      'p.last_error',
      'nf.id as forecast_id',
      'nf.fetched_at',
      'nf.last_time',
      'h.time',
      ...HOURLY.map((h) => `h.${h.column}`),
    );
}
