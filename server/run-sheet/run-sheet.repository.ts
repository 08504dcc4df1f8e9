// What the run sheet reads besides the board day: the boundaries it draws, the name it logs, and the
// forecast notes kept with call-offs for weather.
import type { MultiPolygon, Polygon } from 'geojson';
import { DateTime } from 'luxon';
import type { CallOffWeather } from '../../shared/schemas/run-sheet';
import type { VerdictLevel } from '../../shared/weather/rules';
import type { Tx } from '../db/knex';

/** The boundaries of the given fields of a farm, by field id. */
export async function boundariesOf(db: Tx, farmId: number, fieldIds: number[]): Promise<Map<number, Polygon | MultiPolygon>> {
  const rows: Array<{ id: number; boundary: Polygon | MultiPolygon }> = fieldIds.length
    ? await db('fields').where({ farm_id: farmId }).whereIn('id', fieldIds).select('id', 'boundary')
    : [];
  return new Map(rows.map((f) => [f.id, f.boundary]));
}

/** A field's name, for the board's change log. */
export async function fieldName(db: Tx, farmId: number, fieldId: number): Promise<string> {
  const row = await db('fields').where({ farm_id: farmId, id: fieldId }).first('name');
  return row.name;
}

/**
 * The day a person's run sheet opens on: today when they have a job today (in any state: a day
 * already worked is still their day), else the first later day whose board is published and holds
 * a job of theirs (as operator or mentor) that is not called off; null when there is none.
 */
export async function nextDayWithWork(db: Tx, farmId: number, personId: number, today: string): Promise<string | null> {
  const row = await db('assignments as a')
    .leftJoin('board_days as d', (j) => j.on('d.farm_id', 'a.farm_id').andOn('d.day', 'a.day'))
    .where('a.farm_id', farmId)
    .andWhere((q) => {
      q.where('a.operator_id', personId).orWhere('a.mentor_id', personId);
    })
    .andWhere((q) => {
      q.where('a.day', today).orWhere((later) => {
        later.where('a.day', '>', today).whereNotNull('d.published_at').whereNot('a.state', 'called-off');
      });
    })
    .min<{ day: string | null }>({ day: 'a.day' })
    .first();
  return row?.day ?? null;
}

/** Keeps what the stored forecast said with a call-off for weather (its log entry). */
export async function saveCallOffWeather(db: Tx, eventId: number, w: CallOffWeather): Promise<void> {
  await db('assignment_events')
    .where({ id: eventId })
    .update({
      weather_issued_at: new Date(w.issuedAt),
      weather_hour: new Date(w.hour),
      weather_verdict: w.verdict,
      weather_reason: w.reason,
    });
}

/** The forecast notes of the call-offs of some jobs, by log entry id, hours in the farm's zone. */
export async function callOffWeatherOf(db: Tx, farmId: number, jobIds: number[], timeZone: string): Promise<Map<number, CallOffWeather>> {
  const rows: Array<{
    id: number;
    weather_issued_at: Date;
    weather_hour: Date;
    weather_verdict: VerdictLevel | null;
    weather_reason: string | null;
  }> = jobIds.length
    ? await db('assignment_events')
        .where({ farm_id: farmId, type: 'call-off' })
        .whereIn('assignment_id', jobIds)
        .whereNotNull('weather_hour')
        .select('id', 'weather_issued_at', 'weather_hour', 'weather_verdict', 'weather_reason')
    : [];
  return new Map(
    rows.map((r) => [
      r.id,
      {
        issuedAt: r.weather_issued_at.toISOString(),
        hour: DateTime.fromJSDate(r.weather_hour, { zone: timeZone }).toISO({ suppressMilliseconds: true })!,
        verdict: r.weather_verdict,
        reason: r.weather_reason,
      },
    ]),
  );
}
