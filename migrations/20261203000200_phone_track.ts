import type { Knex } from 'knex';

// The track a job's operator's phone recorded while the job was underway: the points as sent, and
// each chunk the phone sent them in (its id made on the phone), so a chunk sent again adds nothing.
// Not a board table: points arrive every few seconds and change nothing the board shows, so they
// do not move the farm's revision; the coverage measured from them does (assignment_coverage).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('assignment_track_chunks', (t) => {
    t.comment('Chunks of phone-track points received for a job; the id is made on the phone, a resend is recorded once');
    t.integer('assignment_id').notNullable().references('assignments.id').onDelete('CASCADE').comment('The job');
    t.uuid('chunk_id').notNullable().comment('Chunk id made on the phone (UUID)');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.integer('user_id').nullable().references('users.id').onDelete('SET NULL').comment('Who sent it');
    t.integer('point_count').notNullable().comment('Points in the chunk');
    t.timestamp('received_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['assignment_id', 'chunk_id']);
    t.index(['farm_id']);
  });
  await knex.schema.createTable('assignment_track_points', (t) => {
    t.comment("Positions the phone of the job operator recorded while the job was underway (Geolocation API, WGS84)");
    t.bigIncrements('id');
    t.integer('assignment_id').notNullable().references('assignments.id').onDelete('CASCADE').comment('The job');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.uuid('chunk_id').notNullable().comment('The chunk it came in');
    t.timestamp('at', { useTz: true }).notNullable().comment('When the phone took the position');
    t.double('lat').notNullable().comment('Latitude, degrees (WGS84)');
    t.double('lon').notNullable().comment('Longitude, degrees (WGS84)');
    t.double('accuracy_m').nullable().comment('Radius of the uncertainty the phone gave, metres');
    t.double('heading_deg').nullable().comment('Direction of travel the phone gave, degrees clockwise from true north');
    t.double('speed_mps').nullable().comment('Speed the phone gave, metres per second');
    t.index(['assignment_id', 'at']);
    t.index(['farm_id']);
  });
  await knex.raw(
    "COMMENT ON COLUMN assignment_coverage.source_format IS 'gpx, geojson, timelog (ISO 11783-10 TimeLog in a TASKDATA.zip) or phone (the track the run sheet recorded)'",
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw("COMMENT ON COLUMN assignment_coverage.source_format IS 'gpx, geojson or timelog (ISO 11783-10 TimeLog in a TASKDATA.zip)'");
  await knex.schema.dropTableIfExists('assignment_track_points');
  await knex.schema.dropTableIfExists('assignment_track_chunks');
}
