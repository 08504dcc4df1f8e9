import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('auth_tokens', (t) => {
    t.comment('One-time links e-mailed for invitations and password resets; only a hash is kept');
    t.increments('id');
    t.integer('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.integer('farm_id').nullable().references('farms.id').onDelete('CASCADE').comment('The inviting farm, for invitations');
    t.string('kind', 10).notNullable().comment("invite or reset");
    t.string('token_hash', 64).notNullable().comment('SHA-256 of the token, hex');
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('used_at', { useTz: true }).nullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['token_hash']);
    t.index(['user_id']);
  });
  await knex.raw("ALTER TABLE auth_tokens ADD CONSTRAINT auth_tokens_kind_check CHECK (kind IN ('invite','reset'))");
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('auth_tokens');
}
