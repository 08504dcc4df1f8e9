import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('mail_outbox', (t) => {
    t.comment('Every e-mail is written here first and sent by a worker with retries, so none is lost');
    t.increments('id');
    t.integer('farm_id').nullable().references('farms.id').onDelete('CASCADE');
    t.string('kind', 20).notNullable().comment("invite, reset, work-order");
    t.string('ref', 80).nullable().comment('What the message is about, e.g. a board day and person');
    t.string('to_address', 254).notNullable();
    t.string('subject', 300).notNullable();
    t.text('text_body').notNullable();
    t.text('html_body').nullable();
    t.string('status', 10).notNullable().defaultTo('queued').comment("queued, sent or failed (gave up)");
    t.integer('attempts').notNullable().defaultTo(0);
    t.timestamp('next_attempt_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.text('last_error').nullable();
    t.timestamp('sent_at', { useTz: true }).nullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['status', 'next_attempt_at']);
    t.index(['farm_id', 'kind', 'ref']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('mail_outbox');
}
