// The weather of a board day, from the stored forecasts only (the forecast service is asked in the
// background, never on a board read): each card's go / caution / no-go over its window, and the
// day's hourly strip for the farm. The board never fails because of weather: when the weather
// cannot be read, the day has no verdicts and no strip.
import { DateTime } from 'luxon';
import { DAY_START_MIN, type BoardWeather, type CardWeather, type DayStrip } from '../../shared/schemas/board';
import { seasonOf } from '../jobs/progress';
import type { UnitSystem } from '../../shared/schemas/auth';
import { judgeOperation, judgeWindow, type Verdict } from '../../shared/weather/rules';
import { WEATHER_OPERATIONS, type SeedCrop, type WeatherLimits, type WeatherOperation } from '../../shared/weather/limits';
import type { Tx } from '../db/knex';
import { logMessage } from '../http/errors';
import { farmLimits, weatherOfFields, type FieldsWeather, type StoredForecast } from '../weather/weather.service';
import { FORECAST_DAYS } from '../weather/forecast.client';
import { formatMinutes } from './clock';
import { weatherWindowOf, type ConflictCard } from './conflicts';
import type { DayContext } from './day-context';

export const NO_WEATHER: BoardWeather = { cards: [], strip: null, note: null };

/** What the board says on a day the stored forecasts do not reach. */
export const BEYOND_FORECAST = `No forecast yet: forecasts reach ${FORECAST_DAYS} days ahead`;

const isWeatherOperation = (op: string): op is WeatherOperation => (WEATHER_OPERATIONS as readonly string[]).includes(op);

/** The farm's working day when a card has no window: from the board's day start for the farm's day limit. */
export const workingDay = (dayHoursLimit: number): { start: number; end: number } => ({
  start: DAY_START_MIN,
  end: DAY_START_MIN + Math.round(dayHoursLimit * 60),
});

/**
 * The hours a window covers: each forecast hour from the one the window starts in up to, not
 * including, the one it ends at (07:30–12:00 → 07:00 … 11:00), as indexes into the hours.
 * `minutes`: each hour's minutes after the day's midnight (may be negative, or past 24:00).
 */
function hoursIn(minutes: readonly number[], window: { start: number; end: number }): number[] {
  const from = Math.floor(window.start / 60) * 60;
  const out: number[] = [];
  minutes.forEach((m, i) => {
    if (m >= from && m < window.end) out.push(i);
  });
  return out;
}

/**
 * One board read's view of the stored forecasts: each point's hours as minutes after the day's
 * midnight (worked out once per point, not once per card), and each verdict judged once per
 * point, operation, crop and hour however many cards ask for it (cards on neighbouring fields
 * share a point, and windows overlap).
 */
class DayForecasts {
  private readonly minutes = new Map<string, number[]>();
  private readonly verdicts = new Map<string, Verdict>();

  constructor(
    private readonly w: FieldsWeather,
    private readonly midnightMs: number,
    private readonly units: UnitSystem,
  ) {}

  minutesOf(point: string, forecast: StoredForecast): number[] {
    let m = this.minutes.get(point);
    if (!m) {
      // Elapsed minutes since midnight, as the hours' instants differ from it (Date.parse reads the offset).
      m = forecast.hours.map((h) => Math.round((Date.parse(h.time) - this.midnightMs) / 60_000));
      this.minutes.set(point, m);
    }
    return m;
  }

  verdict(point: string, forecast: StoredForecast, i: number, op: WeatherOperation, crop: SeedCrop | null): Verdict {
    const key = `${point}|${op}|${op === 'seeding' ? crop : ''}|${i}`;
    let v = this.verdicts.get(key);
    if (!v) {
      v = judgeOperation(op, forecast.hours, i, this.w.limits, this.units, crop, forecast.place);
      this.verdicts.set(key, v);
    }
    return v;
  }
}

const staleFields = (f: StoredForecast) => ({
  fetchedAt: f.fetchedAt.toISOString(),
  ageMinutes: f.ageMinutes,
  stale: f.stale,
  staleReason: f.staleReason,
  staleAfter: f.staleAfter.toISOString(),
});

function cardWeather(c: ConflictCard, ctx: DayContext, w: FieldsWeather, day: DayForecasts): CardWeather | null {
  const op = c.a.operation;
  if (!isWeatherOperation(op)) return null;
  const field = w.fields.get(c.a.field.id);
  const forecast = field ? w.points.get(field.point) : null;
  if (!field || !forecast) return null;
  const own = weatherWindowOf(c);
  const window = own ?? workingDay(ctx.farm.dayHoursLimit);
  const at = hoursIn(day.minutesOf(field.point, forecast), window);
  // A forecast that does not reach this day (or the window): no verdict rather than a guess.
  if (!at.length) return null;
  const v = judgeWindow(at.map((i) => day.verdict(field.point, forecast, i, op, field.crop)));
  return {
    assignmentId: c.a.id,
    verdict: v.verdict,
    reason: v.verdict === 'go' ? null : (v.reasons[0] ?? null),
    reasons: v.reasons,
    from: formatMinutes(window.start),
    to: formatMinutes(window.end),
    over: own ? 'card' : 'working-day',
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

function dayStrip(ctx: DayContext, w: FieldsWeather, day: DayForecasts): DayStrip | null {
  const where = stripPoint(ctx, w);
  const forecast = where ? w.points.get(where.point) : null;
  if (!where || !forecast) return null;
  // The working day, stretched to the day's earliest and latest card, within the calendar day.
  const work = workingDay(ctx.farm.dayHoursLimit);
  const start = Math.max(0, Math.min(work.start, ...ctx.cards.map((c) => c.start)));
  const end = Math.min(24 * 60, Math.max(work.end, ...ctx.cards.map((c) => c.end)));
  const hours = hoursIn(day.minutesOf(where.point, forecast), { start, end }).map((i) => {
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

/**
 * The forecast hours a day's verdicts can look at, and no more (the board reads them on every
 * miss of its cache): from as many hours before midnight as the farm's rules look back for rain
 * (straw or crop still wet), to the end of the latest window plus the hours spraying looks ahead
 * for rain, and an hour's slack for a window ending inside an hour.
 */
export function hoursToRead(ctx: DayContext, midnightMs: number, limits: WeatherLimits): { from: Date; to: Date } {
  const back = Math.max(limits.harrowing.wetAfterRainHours, limits.swathing.afterRainHours, limits.combining.afterRainHours);
  const lastMin = Math.max(24 * 60, workingDay(ctx.farm.dayHoursLimit).end, ...ctx.cards.map((c) => c.end));
  const ahead = limits.spraying.rainFreeHours + 1;
  return { from: new Date(midnightMs - back * 3_600_000), to: new Date(midnightMs + lastMin * 60_000 + ahead * 3_600_000) };
}

/** The day's weather, or none (logged by the caller's `onError`) when it cannot be read. */
export async function loadDayWeather(
  db: Tx,
  ctx: DayContext,
  options: { now?: Date; onError?: (err: unknown) => void } = {},
): Promise<BoardWeather> {
  const read = async (q: Tx): Promise<BoardWeather> => {
    const midnight = DateTime.fromISO(ctx.day, { zone: ctx.farm.timeZone }).startOf('day');
    const limits = await farmLimits(q, ctx.farmId);
    const w = await weatherOfFields(q, ctx.farmId, [...new Set(ctx.cards.map((c) => c.a.field.id))], {
      ...hoursToRead(ctx, midnight.toMillis(), limits),
      timeZone: ctx.farm.timeZone,
      season: seasonOf(ctx.day),
      now: options.now,
      limits,
    });
    const day = new DayForecasts(w, midnight.toMillis(), ctx.farm.units);
    const cards: CardWeather[] = [];
    for (const c of ctx.cards) {
      const cw = cardWeather(c, ctx, w, day);
      if (cw) cards.push(cw);
    }
    const strip = dayStrip(ctx, w, day);
    // No strip, and the newest forecasts end before the day begins: say why, not just nothing.
    const ends = [...w.points.values()].flatMap((f) => (f?.lastHour ? [f.lastHour.getTime()] : []));
    const beyond = !strip && ends.length > 0 && Math.max(...ends) < midnight.toMillis();
    return { cards, strip, note: beyond ? BEYOND_FORECAST : null };
  };
  try {
    // Inside a transaction, a savepoint: a failed weather read must not spoil the caller's work.
    return db.isTransaction ? await db.transaction((sp) => read(sp)) : await read(db);
  } catch (err) {
    options.onError?.(new Error(`the board's weather could not be read: ${logMessage(err)}`));
    return NO_WEATHER;
  }
}
