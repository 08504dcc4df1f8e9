// The weather of a board day, from the stored forecasts only (the forecast service is asked in the
// background, never on a board read): each card's go / caution / no-go over its window, and the
// day's hourly strip for the farm. The board never fails because of weather: when the weather
// cannot be read, the day has no verdicts and no strip.
import { DateTime } from 'luxon';
import { DAY_START_MIN, type BoardWeather, type CardWeather, type DayStrip } from '../../shared/schemas/board';
import { seasonOf } from '../jobs/progress';
import { judgeHour, judgeWindow, type WeatherHour } from '../../shared/weather/rules';
import { WEATHER_OPERATIONS, type WeatherOperation } from '../../shared/weather/limits';
import type { Tx } from '../db/knex';
import { logMessage } from '../http/errors';
import { weatherOfFields, type FieldsWeather, type StoredForecast } from '../weather/weather.service';
import { formatMinutes } from './clock';
import type { ConflictCard } from './conflicts';
import type { DayContext } from './day-context';

export const NO_WEATHER: BoardWeather = { cards: [], strip: null };

const isWeatherOperation = (op: string): op is WeatherOperation => (WEATHER_OPERATIONS as readonly string[]).includes(op);

/** The farm's working day when a card has no window: from the board's day start for the farm's day limit. */
export const workingDay = (dayHoursLimit: number): { start: number; end: number } => ({
  start: DAY_START_MIN,
  end: DAY_START_MIN + Math.round(dayHoursLimit * 60),
});

/** Minutes after the day's midnight of a forecast hour written with its offset (may be negative, or past 24:00). */
function minutesOf(day: DateTime, time: string): number {
  return Math.round(DateTime.fromISO(time, { setZone: true }).diff(day, 'minutes').minutes);
}

/**
 * The hours a window covers: each forecast hour from the one the window starts in up to, not
 * including, the one it ends at (07:30–12:00 → 07:00 … 11:00), as indexes into `hours`.
 */
function hoursIn(hours: readonly WeatherHour[], midnight: DateTime, window: { start: number; end: number }): number[] {
  const from = Math.floor(window.start / 60) * 60;
  const out: number[] = [];
  hours.forEach((h, i) => {
    const m = minutesOf(midnight, h.time);
    if (m >= from && m < window.end) out.push(i);
  });
  return out;
}

const staleFields = (f: StoredForecast) => ({
  fetchedAt: f.fetchedAt.toISOString(),
  ageMinutes: f.ageMinutes,
  stale: f.stale,
  staleReason: f.staleReason,
  staleAfter: f.staleAfter.toISOString(),
});

function cardWeather(c: ConflictCard, ctx: DayContext, w: FieldsWeather, midnight: DateTime): CardWeather | null {
  const op = c.a.operation;
  if (!isWeatherOperation(op)) return null;
  const field = w.fields.get(c.a.field.id);
  const forecast = field ? w.points.get(field.point) : null;
  if (!field || !forecast) return null;
  const window = c.window ?? workingDay(ctx.farm.dayHoursLimit);
  const at = hoursIn(forecast.hours, midnight, window);
  // A forecast that does not reach this day (or the window): no verdict rather than a guess.
  if (!at.length) return null;
  const v = judgeWindow(at.map((i) => judgeHour(forecast.hours, i, w.limits, ctx.farm.units, field.crop)[op]));
  return {
    assignmentId: c.a.id,
    verdict: v.verdict,
    reason: v.verdict === 'go' ? null : (v.reasons[0] ?? null),
    reasons: v.reasons,
    from: formatMinutes(window.start),
    to: formatMinutes(window.end),
    over: c.window ? 'card' : 'working-day',
    blocking: w.limits[op].blocking,
    ...staleFields(forecast),
  };
}

/**
 * The strip's point: the point of most of the day's fields (on a tie, the one whose first card
 * comes first on the board), else the farm's first field's.
 */
function stripPoint(ctx: DayContext, w: FieldsWeather): { point: string; fieldName: string; basis: DayStrip['basis'] } | null {
  const counts = new Map<string, { n: number; fieldName: string }>();
  const seen = new Set<number>();
  for (const c of ctx.cards) {
    const field = w.fields.get(c.a.field.id);
    if (!field || seen.has(c.a.field.id)) continue;
    seen.add(c.a.field.id);
    const was = counts.get(field.point);
    counts.set(field.point, { n: (was?.n ?? 0) + 1, fieldName: was?.fieldName ?? field.name });
  }
  let best: { point: string; fieldName: string } | null = null;
  let most = 0;
  for (const [point, { n, fieldName }] of counts) if (n > most) [best, most] = [{ point, fieldName }, n];
  if (best) return { ...best, basis: 'most-fields' };
  const first = w.firstFieldId === null ? undefined : w.fields.get(w.firstFieldId);
  return first ? { point: first.point, fieldName: first.name, basis: 'first-field' } : null;
}

function dayStrip(ctx: DayContext, w: FieldsWeather, midnight: DateTime): DayStrip | null {
  const where = stripPoint(ctx, w);
  const forecast = where ? w.points.get(where.point) : null;
  if (!where || !forecast) return null;
  // The working day, stretched to the day's earliest and latest card, within the calendar day.
  const work = workingDay(ctx.farm.dayHoursLimit);
  const start = Math.max(0, Math.min(work.start, ...ctx.cards.map((c) => c.start)));
  const end = Math.min(24 * 60, Math.max(work.end, ...ctx.cards.map((c) => c.end)));
  const hours = hoursIn(forecast.hours, midnight, { start, end }).map((i) => {
    const h = forecast.hours[i];
    return {
      time: h.time.slice(11, 16),
      temperatureC: h.temperatureC,
      windSpeedKmh: h.windSpeedKmh,
      windGustKmh: h.windGustKmh,
      precipitationMm: h.precipitationMm,
      precipitationProbabilityPct: h.precipitationProbabilityPct,
    };
  });
  if (!hours.length) return null;
  return { basis: where.basis, fieldName: where.fieldName, ...staleFields(forecast), hours };
}

/** The day's weather, or none (logged by the caller's `onError`) when it cannot be read. */
export async function loadDayWeather(
  db: Tx,
  ctx: DayContext,
  options: { now?: Date; onError?: (err: unknown) => void } = {},
): Promise<BoardWeather> {
  const read = async (q: Tx): Promise<BoardWeather> => {
    const midnight = DateTime.fromISO(ctx.day, { zone: ctx.farm.timeZone }).startOf('day');
    // A day before and after: the rules look back for rain (hours after it) and ahead (rain-free hours).
    const w = await weatherOfFields(q, ctx.farmId, [...new Set(ctx.cards.map((c) => c.a.field.id))], {
      from: midnight.minus({ days: 1 }).toJSDate(),
      to: midnight.plus({ days: 2 }).toJSDate(),
      timeZone: ctx.farm.timeZone,
      season: seasonOf(ctx.day),
      now: options.now,
    });
    const cards: CardWeather[] = [];
    for (const c of ctx.cards) {
      const cw = cardWeather(c, ctx, w, midnight);
      if (cw) cards.push(cw);
    }
    return { cards, strip: dayStrip(ctx, w, midnight) };
  };
  try {
    // Inside a transaction, a savepoint: a failed weather read must not spoil the caller's work.
    return db.isTransaction ? await db.transaction((sp) => read(sp)) : await read(db);
  } catch (err) {
    options.onError?.(new Error(`the board's weather could not be read: ${logMessage(err)}`));
    return NO_WEATHER;
  }
}
