import type { Knex } from 'knex';

// Custom work: the neighbours a farm works for, and which fields are theirs. A job on a customer's
// field is a board job like any other; invoices (a later migration) bill the finished ones.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('customers', (t) => {
    t.comment('People or farms the farm does custom work for and bills');
    t.increments('id');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.string('name', 120).notNullable().comment('The name invoices are made out to');
    t.string('email', 254).notNullable().comment('Where invoices are mailed');
    t.text('address').nullable().comment('Postal address as it is printed on invoices, lines separated by newlines');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['farm_id']);
  });
  await knex.schema.alterTable('fields', (t) => {
    t.integer('customer_id')
      .nullable()
      .references('customers.id')
      .onDelete('SET NULL')
      .comment("The customer whose field this is (custom work); null for the farm's own field");
    t.index(['customer_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('fields', (t) => {
    t.dropColumn('customer_id');
  });
  await knex.schema.dropTable('customers');
}
