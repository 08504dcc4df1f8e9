import type { Knex } from 'knex';

// What a logged track really covered of a job's field: one row per job (the latest track sent
// replaces the one before), with the figures, the skips as GeoJSON and the file they came from.
// A farm table: it moves the farm's revision like the others (migrations/20261202000100).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('assignment_coverage', (t) => {
    t.comment('Coverage measured from a track file for one job: covered, skipped and twice-worked acres');
    t.integer('assignment_id').primary().references('assignments.id').onDelete('CASCADE').comment('The job');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.double('width_m').notNullable().comment('Working width used, metres (the job implement)');
    t.double('field_acres').notNullable().comment('Field acres on the WGS84 ellipsoid');
    t.double('work_region_acres').notNullable().comment('Field minus hazard clearance zones, acres');
    t.double('covered_acres').notNullable().comment('Work region under the swath, acres');
    t.double('skipped_acres').notNullable().comment('Work region not under the swath, slivers left out, acres');
    t.double('sliver_acres').notNullable().comment('Uncovered slivers below the skip threshold, acres');
    t.double('worked_twice_acres').notNullable().comment('Work region under two or more passes, acres');
    t.integer('skip_count').notNullable().comment('Number of skips');
    t.double('track_length_m').notNullable().comment('Length of the whole track, metres');
    t.jsonb('skips').notNullable().comment('Each skip: acres and centroid [lon, lat]');
    t.jsonb('skip_geometry').nullable().comment('Skips as a GeoJSON MultiPolygon, lon/lat');
    t.text('source_name').notNullable().comment('Name of the track file sent');
    t.text('source_format').notNullable().comment('gpx or geojson');
    t.integer('computed_by').nullable().references('users.id').onDelete('SET NULL').comment('Who sent the track');
    t.timestamp('computed_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['farm_id']);
  });
  await knex.raw(
    `CREATE CONSTRAINT TRIGGER assignment_coverage_farm_revision AFTER INSERT OR UPDATE OR DELETE ON assignment_coverage
     DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION bump_farm_revision()`,
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER IF EXISTS assignment_coverage_farm_revision ON assignment_coverage');
  await knex.schema.dropTableIfExists('assignment_coverage');
}
