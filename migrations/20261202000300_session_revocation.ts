import type { Knex } from 'knex';

// A new password (set through a reset or invitation link) signs the person out everywhere else:
// sessions signed in before this moment no longer find a principal.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('users', (t) => {
    t.timestamp('sessions_revoked_at', { useTz: true }).nullable().comment('Sessions signed in before this no longer work (set with a new password)');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('users', (t) => {
    t.dropColumn('sessions_revoked_at');
  });
}
