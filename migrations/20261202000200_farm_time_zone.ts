import type { Knex } from 'knex';

// A farm's calendar: which day is "today" and "tomorrow" on its board and run sheets. Farms of the
// northern plains mostly keep Central time, so that is where a farm starts; the owner can change it.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('farms', (t) => {
    t.string('time_zone', 64).notNullable().defaultTo('America/Chicago').comment('IANA time zone of the farm, for its today and tomorrow');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('farms', (t) => {
    t.dropColumn('time_zone');
  });
}
