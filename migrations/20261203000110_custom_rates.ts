import type { Knex } from 'knex';

// The owner's own custom-work rates; an operation without a row takes the published default
// (shared/custom-rates.ts), so a better default later reaches farms that never set their own.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('custom_rates', (t) => {
    t.comment('The owner rate for custom work per operation, per acre or per hour, in whole cents');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.string('operation', 20).notNullable();
    t.string('unit', 5).notNullable().comment('acre or hour');
    t.integer('rate_cents').notNullable().comment('Whole cents per acre or per hour');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['farm_id', 'operation']);
  });
  await knex.raw("ALTER TABLE custom_rates ADD CONSTRAINT custom_rates_unit_check CHECK (unit IN ('acre', 'hour'))");
  await knex.raw('ALTER TABLE custom_rates ADD CONSTRAINT custom_rates_rate_check CHECK (rate_cents >= 0)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('custom_rates');
}
