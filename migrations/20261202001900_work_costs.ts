import type { Knex } from 'knex';

// What the farm's own work costs: an hourly cost per machine (ownership and operating, entered by
// the owner), an hourly labour cost per person, and per farm the fuel price and the fuel used per
// acre for each operation where the owner changed the default (shared/costs.ts has the defaults
// and their sources). Money is whole cents. These live apart from machines and memberships so
// that no query an operator can reach ever reads a rate.
const FARM_TABLES = ['cost_settings', 'machine_costs', 'labour_costs'] as const;

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('cost_settings', (t) => {
    t.comment('Per farm: the fuel price and the owner fuel use per acre for operations where the default was changed');
    t.integer('farm_id').primary().references('farms.id').onDelete('CASCADE');
    t.integer('fuel_price_cents').nullable().comment('Diesel price in whole cents per US gallon; null until the owner enters it');
    t.jsonb('fuel_gal_per_acre')
      .notNullable()
      .defaultTo('{}')
      .comment('Operation to US gallons per acre; a missing operation takes the published default');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw('ALTER TABLE cost_settings ADD CONSTRAINT cost_settings_fuel_price_check CHECK (fuel_price_cents >= 0)');

  await knex.schema.createTable('machine_costs', (t) => {
    t.comment('The owner hourly cost of a machine per engine hour, ownership and operating together, fuel apart');
    t.integer('machine_id').primary().references('machines.id').onDelete('CASCADE');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.integer('hourly_cents').notNullable().comment('Whole cents per engine hour');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['farm_id']);
  });
  await knex.raw('ALTER TABLE machine_costs ADD CONSTRAINT machine_costs_hourly_check CHECK (hourly_cents >= 0)');

  await knex.schema.createTable('labour_costs', (t) => {
    t.comment('The owner hourly labour cost of a person of the farm');
    t.integer('membership_id').primary().references('memberships.id').onDelete('CASCADE');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.integer('hourly_cents').notNullable().comment('Whole cents per hour worked');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['farm_id']);
  });
  await knex.raw('ALTER TABLE labour_costs ADD CONSTRAINT labour_costs_hourly_check CHECK (hourly_cents >= 0)');

  for (const table of FARM_TABLES) {
    await knex.raw(
      `CREATE CONSTRAINT TRIGGER ${table}_farm_revision AFTER INSERT OR UPDATE OR DELETE ON ${table}
       DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION bump_farm_revision()`,
    );
  }
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('labour_costs');
  await knex.schema.dropTableIfExists('machine_costs');
  await knex.schema.dropTableIfExists('cost_settings');
}
