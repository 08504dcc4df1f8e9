import type { Knex } from 'knex';

// A job called off for weather keeps what the stored forecast said when it was called off: the
// forecast's issue time, the hour and that hour's verdict and first reason for the job's
// operation, read by the server (never taken from the phone). Null for other events, and for a
// call-off made while no forecast was stored.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('assignment_events', (t) => {
    t.timestamp('weather_issued_at', { useTz: true }).nullable().comment('Call-off for weather: when the forecast used was issued');
    t.timestamp('weather_hour', { useTz: true }).nullable().comment('Call-off for weather: the forecast hour that made the call');
    t.string('weather_verdict', 8).nullable().comment('Call-off for weather: go, caution or no-go for the operation at that hour');
    t.text('weather_reason').nullable().comment('Call-off for weather: the first reason for that hour, in words');
  });
  await knex.raw(
    "ALTER TABLE assignment_events ADD CONSTRAINT assignment_events_weather_check CHECK (weather_hour IS NULL OR (type = 'call-off' AND weather_issued_at IS NOT NULL AND (weather_verdict IS NULL OR weather_verdict IN ('go','caution','no-go'))))",
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE assignment_events DROP CONSTRAINT assignment_events_weather_check');
  await knex.schema.alterTable('assignment_events', (t) => {
    t.dropColumn('weather_reason');
    t.dropColumn('weather_verdict');
    t.dropColumn('weather_hour');
    t.dropColumn('weather_issued_at');
  });
}
