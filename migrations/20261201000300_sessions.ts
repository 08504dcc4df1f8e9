import type { Knex } from 'knex';

// The table connect-pg-simple expects (its table.sql), so sign-ins survive a server restart.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('session', (t) => {
    t.comment('Signed-in sessions (express-session via connect-pg-simple)');
    t.string('sid').notNullable().primary();
    t.json('sess').notNullable();
    t.timestamp('expire', { precision: 6, useTz: false }).notNullable();
    t.index(['expire'], 'IDX_session_expire');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('session');
}
