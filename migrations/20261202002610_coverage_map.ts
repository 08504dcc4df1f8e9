import type { Knex } from 'knex';

// What a job's track covered, drawn on its map: the covered ground and the ground worked twice
// beside the skips the table already keeps. Null for a track measured before these were kept.
// A track may also be read from a TimeLog now (source_format).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('assignment_coverage', (t) => {
    t.jsonb('covered_geometry').nullable().comment('Work region under the swath as a GeoJSON MultiPolygon, lon/lat');
    t.jsonb('twice_geometry').nullable().comment('Work region under two or more passes as a GeoJSON MultiPolygon, lon/lat');
  });
  // A track may now also come from an ISO 11783-10 TimeLog.
  await knex.raw("COMMENT ON COLUMN assignment_coverage.source_format IS 'gpx, geojson or timelog (ISO 11783-10 TimeLog in a TASKDATA.zip)'");
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw("COMMENT ON COLUMN assignment_coverage.source_format IS 'gpx or geojson'");
  await knex.schema.alterTable('assignment_coverage', (t) => {
    t.dropColumn('twice_geometry');
    t.dropColumn('covered_geometry');
  });
}
