import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('farms', (t) => {
    t.comment('A farm: the unit every piece of farm data belongs to');
    t.increments('id');
    t.string('name', 160).notNullable();
    t.string('units', 10).notNullable().defaultTo('us').comment("us (acres, ft, mph) or metric (ha, m, km/h)");
    t.decimal('day_hours_limit', 5, 2).notNullable().defaultTo(12).comment('Most planned hours one person may be given in a day');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw("ALTER TABLE farms ADD CONSTRAINT farms_units_check CHECK (units IN ('us','metric'))");

  await knex.schema.createTable('users', (t) => {
    t.comment('A person who can sign in; their farms and roles are in memberships');
    t.increments('id');
    t.string('email', 254).notNullable().comment('Stored lower-case');
    t.string('name', 120).notNullable();
    t.string('password_hash', 100).nullable().comment('bcrypt; null until an invitation is accepted');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['email']);
  });

  await knex.schema.createTable('memberships', (t) => {
    t.comment("The role of a person on a farm; removed members keep their row so their history stays");
    t.increments('id');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.integer('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.string('role', 10).notNullable().comment("owner, operator or viewer");
    t.string('status', 10).notNullable().defaultTo('active').comment("invited, active or removed");
    t.timestamp('invited_at', { useTz: true }).nullable();
    t.timestamp('joined_at', { useTz: true }).nullable();
    t.timestamp('removed_at', { useTz: true }).nullable();
    t.unique(['farm_id', 'user_id']);
    t.index(['user_id']);
  });
  await knex.raw("ALTER TABLE memberships ADD CONSTRAINT memberships_role_check CHECK (role IN ('owner','operator','viewer'))");
  await knex.raw("ALTER TABLE memberships ADD CONSTRAINT memberships_status_check CHECK (status IN ('invited','active','removed'))");
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('memberships');
  await knex.schema.dropTable('users');
  await knex.schema.dropTable('farms');
}
