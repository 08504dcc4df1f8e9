import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('pass_plans', (t) => {
    t.comment('The saved pass plan of a field for one operation: its settings and the computed figures');
    t.increments('id');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.integer('field_id').notNullable().references('fields.id').onDelete('CASCADE');
    t.string('operation', 20).notNullable().comment('harrowing, tillage, seeding, spraying, swathing, combining, baling');
    t.integer('implement_id').nullable().comment('The implement planned with, if any');
    t.double('width_m').notNullable().comment('Working width, metres');
    t.integer('headland_passes').notNullable();
    t.double('heading_deg').nullable().comment('Chosen heading, degrees from true north; null means auto (fewest turns)');
    t.string('coverage', 10).notNullable().comment('full or gaps-ok');
    t.double('speed_mph').notNullable();
    t.double('efficiency').notNullable();
    t.double('turn_seconds').notNullable();
    t.jsonb('summary').notNullable().comment('The computed figures (acres, passes, turns, hours, heading) when saved');
    t.integer('updated_by').nullable().references('users.id').onDelete('SET NULL');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['field_id', 'operation']);
    t.index(['farm_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('pass_plans');
}
