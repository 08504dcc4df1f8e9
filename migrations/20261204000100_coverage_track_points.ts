import type { Knex } from 'knex';

// How many phone-track points a coverage was measured from, so a chunk stored after a finish's
// measure read the points is seen to be missing from it, whatever the clocks say.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('assignment_coverage', (t) => {
    t.integer('track_points').nullable().comment('Phone-track points measured (source phone); null for a track file');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('assignment_coverage', (t) => {
    t.dropColumn('track_points');
  });
}
