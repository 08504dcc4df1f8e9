import type { Knex } from 'knex';

// A finished job counts the acres its track measured when it has one (assignment_coverage), the
// typed acres otherwise. acres_done stays the one figure every total adds; these columns keep the
// typed figure beside it and say which of the two acres_done holds. The season report's index
// (20261201004000) gets the job id and these columns, so the report still reads the index alone.
const SEASON_INCLUDE = 'operation, field_id, operator_id, machine_id, state, acres_done, hours_worked, engine_hours_start, engine_hours_end';
const seasonIndex = (name: string, extra: string) =>
  `CREATE INDEX ${name} ON assignments (farm_id, day) INCLUDE (${SEASON_INCLUDE}${extra}) WHERE state IN ('finished', 'called-off')`;
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('assignments', (t) => {
    t.decimal('acres_typed', 12, 4)
      .nullable()
      .comment('Acres typed at the finish or by the owner correction, kept as typed when measured acres count instead');
    t.text('acres_source').nullable().comment('Which figure acres_done holds: typed, or measured from the job track');
  });
  await knex.raw(
    "ALTER TABLE assignments ADD CONSTRAINT assignments_acres_source_check CHECK (acres_source IN ('typed', 'measured'))",
  );
  await knex.raw(seasonIndex('assignments_season_measured', ', id, acres_typed, acres_source'));
  await knex.raw(
    "COMMENT ON INDEX assignments_season_measured IS 'Season report: logged jobs of a farm by day, with the columns it sums and which acres were measured'",
  );
  await knex.raw('DROP INDEX IF EXISTS assignments_season_logged');
  // Every log so far was typed. Last: the update leaves deferred revision triggers pending, and
  // PostgreSQL builds no index on a table with pending trigger events.
  await knex.raw("UPDATE assignments SET acres_typed = acres_done, acres_source = 'typed' WHERE acres_done IS NOT NULL");
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(seasonIndex('assignments_season_logged', ''));
  await knex.raw("COMMENT ON INDEX assignments_season_logged IS 'Season report: logged jobs of a farm by day, with the columns it sums'");
  await knex.raw('DROP INDEX IF EXISTS assignments_season_measured');
  await knex.raw('ALTER TABLE assignments DROP CONSTRAINT IF EXISTS assignments_acres_source_check');
  await knex.schema.alterTable('assignments', (t) => {
    t.dropColumn('acres_source');
    t.dropColumn('acres_typed');
  });
}
