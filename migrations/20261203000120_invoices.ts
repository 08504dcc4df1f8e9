import type { Knex } from 'knex';

// Invoices for custom work. Numbers are gapless per farm: each is taken from the farm's counter row,
// locked FOR UPDATE in the drafting transaction, when the draft is made; nothing numbered is ever
// deleted (a draft that is not wanted is voided and keeps its number). Credit notes are documents
// of their own in the same series, referencing the invoice they credit, with negative amounts. An
// invoice is never edited once sent: only its state moves (sent → paid, or void).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('invoice_settings', (t) => {
    t.comment('Per farm: the tax line added to new invoices and the currency they are in');
    t.integer('farm_id').primary().references('farms.id').onDelete('CASCADE');
    t.string('tax_name', 40).nullable().comment('The tax line label, e.g. Sales tax; null for no tax line');
    t.integer('tax_basis_points').notNullable().defaultTo(0).comment('Tax rate in hundredths of a percent (500 = 5 %)');
    t.string('currency', 3).notNullable().defaultTo('usd').comment('ISO 4217 code, lower case as the payment service writes it');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw(
    'ALTER TABLE invoice_settings ADD CONSTRAINT invoice_settings_tax_check CHECK (tax_basis_points BETWEEN 0 AND 10000)',
  );

  await knex.schema.createTable('invoice_counters', (t) => {
    t.comment('The last invoice or credit note number of a farm; locked FOR UPDATE while a number is taken, so numbers have no gaps');
    t.integer('farm_id').primary().references('farms.id').onDelete('CASCADE');
    t.integer('last_number').notNullable().defaultTo(0);
  });

  await knex.schema.createTable('invoices', (t) => {
    t.comment('Invoices and credit notes for custom work; a sent one is never edited, only its state moves');
    t.increments('id');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.integer('customer_id').notNullable().references('customers.id').comment('NO ACTION: a customer with invoices is not removed (checked at the end of the statement, so removing the farm removes both)');
    t.string('kind', 10).notNullable().defaultTo('invoice').comment('invoice, or credit (a credit note)');
    t.integer('number').notNullable().comment('Gapless per farm, shared by invoices and credit notes');
    t.string('state', 10).notNullable().defaultTo('draft').comment('draft, sent, paid, void; a credit note is issued');
    t.integer('credit_of').nullable().references('invoices.id').comment('The invoice a credit note credits');
    t.date('period_from').notNullable();
    t.date('period_to').notNullable();
    t.date('issued_on').notNullable().comment('The date printed on it (the farm day it was drafted)');
    t.string('customer_name', 120).notNullable().comment('As it was when drafted: the invoice does not change with the customer');
    t.string('customer_email', 254).notNullable();
    t.text('customer_address').nullable();
    t.string('currency', 3).notNullable();
    t.string('tax_name', 40).nullable();
    t.integer('tax_basis_points').notNullable().defaultTo(0);
    t.integer('subtotal_cents').notNullable();
    t.integer('tax_cents').notNullable();
    t.integer('total_cents').notNullable();
    t.text('note').nullable().comment('A note printed on the invoice, or the reason for a credit note');
    t.text('void_reason').nullable();
    t.timestamp('sent_at', { useTz: true }).nullable();
    t.timestamp('paid_at', { useTz: true }).nullable();
    t.timestamp('voided_at', { useTz: true }).nullable();
    t.string('checkout_session_id', 255).nullable().comment('The hosted checkout the payment link opens');
    t.text('checkout_url').nullable();
    t.integer('checkout_attempts').notNullable().defaultTo(0).comment('Calls made to create a checkout, for each call its own idempotency key');
    t.text('payment_error').nullable().comment('Why the last call to the payment service failed; cleared when one succeeds');
    t.integer('mail_id').nullable().references('mail_outbox.id').onDelete('SET NULL').comment('The outbox message that carried it');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['farm_id', 'number']);
    t.index(['farm_id', 'state']);
    t.index(['customer_id']);
  });
  await knex.raw("ALTER TABLE invoices ADD CONSTRAINT invoices_kind_check CHECK (kind IN ('invoice', 'credit'))");
  await knex.raw(
    "ALTER TABLE invoices ADD CONSTRAINT invoices_state_check CHECK ((kind = 'invoice' AND state IN ('draft', 'sent', 'paid', 'void')) OR (kind = 'credit' AND state = 'issued'))",
  );
  await knex.raw("ALTER TABLE invoices ADD CONSTRAINT invoices_credit_check CHECK ((kind = 'credit') = (credit_of IS NOT NULL))");
  await knex.raw('ALTER TABLE invoices ADD CONSTRAINT invoices_total_check CHECK (total_cents = subtotal_cents + tax_cents)');
  await knex.raw('CREATE UNIQUE INDEX invoices_one_credit ON invoices (credit_of) WHERE credit_of IS NOT NULL');
  await knex.raw("COMMENT ON INDEX invoices_one_credit IS 'An invoice is credited at most once'");

  await knex.schema.createTable('invoice_lines', (t) => {
    t.comment('One finished job billed on an invoice (or its negative on a credit note), as it was when drafted');
    t.increments('id');
    t.integer('invoice_id').notNullable().references('invoices.id').onDelete('CASCADE');
    t.integer('position').notNullable();
    t.integer('assignment_id').nullable().references('assignments.id').onDelete('SET NULL').comment('The job billed');
    t.string('field_name', 120).notNullable();
    t.string('operation', 20).notNullable();
    t.date('day').notNullable();
    t.string('unit', 5).notNullable().comment('acre or hour');
    t.decimal('quantity', 12, 4).notNullable().comment('Acres or hours billed');
    t.string('quantity_source', 10).notNullable().comment('measured (acres from the job track), typed (acres logged) or logged (hours)');
    t.integer('rate_cents').notNullable();
    t.integer('amount_cents').notNullable().comment('quantity × rate, rounded once to the cent, a half away from zero');
    t.unique(['invoice_id', 'position']);
    t.index(['assignment_id']);
  });

  await knex.schema.createTable('invoice_payments', (t) => {
    t.comment('Payments received for invoices through the payment service, one per paid checkout');
    t.increments('id');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.integer('invoice_id').notNullable().references('invoices.id').onDelete('CASCADE');
    t.string('event_id', 255).notNullable().comment('The payment event that reported it');
    t.string('checkout_session_id', 255).notNullable().unique();
    t.string('payment_intent', 255).nullable();
    t.integer('amount_cents').notNullable();
    t.string('currency', 3).notNullable();
    t.timestamp('paid_at', { useTz: true }).notNullable();
    t.index(['farm_id', 'paid_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('invoice_payments');
  await knex.schema.dropTable('invoice_lines');
  await knex.schema.dropTable('invoices');
  await knex.schema.dropTable('invoice_counters');
  await knex.schema.dropTable('invoice_settings');
}
