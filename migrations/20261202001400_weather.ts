import type { Knex } from 'knex';

// Forecasts per farm point and issue time, their hourly rows in SI units, and each farm's weather
// limits per operation. A point is a 0.05 degree grid cell holding one or more of the farm's
// fields (shared/weather/grid.ts). Points, forecasts and limits are farm tables and move the
// farm's revision (a new forecast or a failed refresh changes what the board shows); hourly rows
// are written and deleted only with their forecast row, which moves it for them.
const FARM_TABLES = ['weather_points', 'weather_forecasts', 'weather_limits'] as const;

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('weather_points', (t) => {
    t.comment('A forecast point of a farm: the centre of a 0.05 degree grid cell holding some of its fields');
    t.increments('id');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.integer('lat_index').notNullable().comment('round(latitude / 0.05)');
    t.integer('lon_index').notNullable().comment('round(longitude / 0.05)');
    t.double('latitude').notNullable().comment('lat_index * 0.05, degrees WGS84');
    t.double('longitude').notNullable().comment('lon_index * 0.05, degrees WGS84');
    t.timestamp('last_attempt_at', { useTz: true }).nullable().comment('Last time the forecast service was asked');
    t.timestamp('last_success_at', { useTz: true }).nullable().comment('Last time a good forecast was stored');
    t.timestamp('last_failure_at', { useTz: true }).nullable().comment('Last time the service failed or answered garbage');
    t.text('last_error').nullable().comment('Why the last failure happened, in plain words');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['farm_id', 'lat_index', 'lon_index']);
  });

  await knex.schema.createTable('weather_forecasts', (t) => {
    t.comment('One forecast of a point as fetched; the newest good one is shown, older ones are kept two days');
    t.increments('id');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.integer('point_id').notNullable().references('weather_points.id').onDelete('CASCADE');
    t.timestamp('issued_at', { useTz: true })
      .notNullable()
      .comment('The hour the forecast was fetched (the wire format carries no model run time)');
    t.timestamp('fetched_at', { useTz: true }).notNullable();
    t.timestamp('starts_at', { useTz: true }).notNullable().comment('Time of the first hourly row, UTC');
    t.integer('hour_count').notNullable();
    t.double('answered_latitude').notNullable().comment('The model grid point the service answered for');
    t.double('answered_longitude').notNullable();
    t.specificType('elevation_m', 'real').notNullable();
    t.unique(['point_id', 'issued_at']);
    t.index(['farm_id']);
  });

  await knex.schema.createTable('weather_hours', (t) => {
    t.comment('One forecast hour in SI units (real: the float32 the service sends, kept exactly); null where the service had no value');
    t.integer('forecast_id').notNullable().references('weather_forecasts.id').onDelete('CASCADE');
    t.timestamp('time', { useTz: true }).notNullable().comment('The hour; precipitation is the sum over the hour before it');
    t.specificType('temperature_c', 'real').nullable().comment('Air temperature at 2 m, degrees C');
    t.specificType('relative_humidity_pct', 'real').nullable().comment('Relative humidity at 2 m, percent');
    t.specificType('dew_point_c', 'real').nullable().comment('Dew point at 2 m, degrees C');
    t.specificType('precipitation_mm', 'real').nullable().comment('Precipitation over the hour before, mm');
    t.specificType('precipitation_probability_pct', 'real').nullable().comment('Chance of precipitation, percent');
    t.specificType('wind_speed_ms', 'real').nullable().comment('Wind speed at 10 m, m/s');
    t.specificType('wind_gust_ms', 'real').nullable().comment('Wind gusts at 10 m, m/s');
    t.specificType('wind_direction_deg', 'real').nullable().comment('Wind direction at 10 m, degrees from north, where it blows from');
    t.specificType('cloud_cover_pct', 'real').nullable().comment('Total cloud cover, percent');
    t.specificType('soil_temperature_c', 'real').nullable().comment('Soil temperature at 6 cm, degrees C');
    t.primary(['forecast_id', 'time']);
  });

  await knex.schema.createTable('weather_limits', (t) => {
    t.comment('The owner weather limits per operation; missing keys take the defaults of shared/weather/limits.ts');
    t.integer('farm_id').primary().references('farms.id').onDelete('CASCADE');
    t.jsonb('limits').notNullable();
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  for (const table of FARM_TABLES) {
    await knex.raw(
      `CREATE CONSTRAINT TRIGGER ${table}_farm_revision AFTER INSERT OR UPDATE OR DELETE ON ${table}
       DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION bump_farm_revision()`,
    );
  }
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('weather_limits');
  await knex.schema.dropTableIfExists('weather_hours');
  await knex.schema.dropTableIfExists('weather_forecasts');
  await knex.schema.dropTableIfExists('weather_points');
}
