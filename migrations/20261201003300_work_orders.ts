import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('work_orders', (t) => {
    t.comment('The work order last mailed to a person for a board day, so a re-publish mails only what changed');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.date('day').notNullable();
    t.integer('membership_id').notNullable().references('memberships.id').onDelete('CASCADE');
    t.string('kind', 10).notNullable().comment('order, or withdrawn when the person no longer has jobs that day');
    t.string('content_hash', 64).notNullable().comment('SHA-256 of what the order said');
    t.integer('mail_id').nullable().references('mail_outbox.id').onDelete('SET NULL').comment('The outbox message carrying it');
    t.integer('board_version').notNullable().comment('Board version when published');
    t.timestamp('published_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['farm_id', 'day', 'membership_id']);
  });
  await knex.raw("ALTER TABLE work_orders ADD CONSTRAINT work_orders_kind_check CHECK (kind IN ('order','withdrawn'))");
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('work_orders');
}
