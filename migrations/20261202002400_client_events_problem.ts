import type { Knex } from 'knex';

// Problem reports written on a phone with no signal carry a device-made id too, recorded in
// client_events like the job's steps: the column's comment says so.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(
    "COMMENT ON COLUMN client_events.type IS 'start, pause, resume, finish, call-off, or problem for a report from the field'",
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw("COMMENT ON COLUMN client_events.type IS 'start, pause, resume, finish, call-off'");
}
