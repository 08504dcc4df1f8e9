import type { Knex } from 'knex';

// Files sent with an outbox message (an invoice's PDF), kept with it so a retry sends the same bytes.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('mail_attachments', (t) => {
    t.comment('Files attached to an outbox message, sent with every attempt');
    t.increments('id');
    t.integer('mail_id').notNullable().references('mail_outbox.id').onDelete('CASCADE');
    t.string('filename', 200).notNullable();
    t.string('content_type', 100).notNullable();
    t.binary('content').notNullable();
    t.index(['mail_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('mail_attachments');
}
