import type { Knex } from 'knex';

// The season report sums the finished and called-off jobs of one farm and one year. A partial
// index on (farm_id, day) that carries the summed columns lets PostgreSQL answer from the index
// alone, without visiting the table rows.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE INDEX assignments_season_logged ON assignments (farm_id, day)
    INCLUDE (operation, field_id, operator_id, machine_id, state, acres_done, hours_worked, engine_hours_start, engine_hours_end)
    WHERE state IN ('finished', 'called-off')
  `);
  await knex.raw("COMMENT ON INDEX assignments_season_logged IS 'Season report: logged jobs of a farm by day, with the columns it sums'");
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP INDEX IF EXISTS assignments_season_logged');
}
