import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('machines', (t) => {
    t.comment('Tractors and self-propelled machines of a farm, with their engine-hour meter and service interval');
    t.increments('id');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.string('name', 80).notNullable();
    t.string('kind', 20).notNullable().comment('tractor-4wd, tractor-mfwd, combine, sprayer-sp, swather-sp');
    t.decimal('power_hp', 7, 1).notNullable().comment('Rated engine power, hp');
    t.decimal('engine_hours', 9, 1).notNullable().defaultTo(0).comment('Latest engine-hour meter reading, h');
    t.decimal('service_interval_hours', 7, 1).nullable().comment('Engine hours between services; null when not tracked');
    t.decimal('hours_at_last_service', 9, 1).nullable().comment('Meter reading at the last service, h');
    t.text('notes').nullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['id', 'farm_id'], { indexName: 'machines_id_farm_unique' });
    t.index(['farm_id']);
  });
  await knex.raw('CREATE UNIQUE INDEX machines_farm_name_unique ON machines (farm_id, lower(name))');
  await knex.raw(
    "ALTER TABLE machines ADD CONSTRAINT machines_kind_check CHECK (kind IN ('tractor-4wd','tractor-mfwd','combine','sprayer-sp','swather-sp'))",
  );
  await knex.raw(
    'ALTER TABLE machines ADD CONSTRAINT machines_numbers_check CHECK (power_hp > 0 AND engine_hours >= 0 AND (service_interval_hours IS NULL OR service_interval_hours > 0))',
  );

  await knex.schema.createTable('implements', (t) => {
    t.comment('Implements, headers and booms; a self-propelled machine header or boom is an implement it alone carries');
    t.increments('id');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.string('name', 80).notNullable();
    t.string('kind', 20).notNullable().comment('harrow, air-drill, sprayer, swather, combine-header, baler, disk, cultivator');
    t.double('width_m').notNullable().comment('Working width, metres');
    t.double('transport_width_m').nullable().comment('Width folded for the road, metres');
    t.specificType('operations', 'text[]').notNullable().comment('Operations it does');
    t.decimal('min_power_hp', 7, 1).nullable().comment('Least tractor power to pull it, hp; null when any will do');
    t.text('notes').nullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['id', 'farm_id'], { indexName: 'implements_id_farm_unique' });
    t.index(['farm_id']);
  });
  await knex.raw('CREATE UNIQUE INDEX implements_farm_name_unique ON implements (farm_id, lower(name))');
  await knex.raw(
    "ALTER TABLE implements ADD CONSTRAINT implements_kind_check CHECK (kind IN ('harrow','air-drill','sprayer','swather','combine-header','baler','disk','cultivator'))",
  );
  await knex.raw(
    'ALTER TABLE implements ADD CONSTRAINT implements_width_check CHECK (width_m > 0 AND (transport_width_m IS NULL OR transport_width_m > 0))',
  );

  await knex.schema.createTable('implement_hitches', (t) => {
    t.comment('Which machines may pull or carry an implement; none listed means any tractor with enough power');
    t.integer('farm_id').notNullable();
    t.integer('implement_id').notNullable();
    t.integer('machine_id').notNullable();
    t.primary(['implement_id', 'machine_id']);
    t.foreign(['implement_id', 'farm_id']).references(['id', 'farm_id']).inTable('implements').onDelete('CASCADE');
    t.foreign(['machine_id', 'farm_id']).references(['id', 'farm_id']).inTable('machines').onDelete('CASCADE');
    t.index(['machine_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('implement_hitches');
  await knex.schema.dropTable('implements');
  await knex.schema.dropTable('machines');
}
