import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('fields', (t) => {
    t.comment('A field of a farm: its boundary (GeoJSON, WGS84 lon/lat) and its area on the ellipsoid');
    t.increments('id');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.string('name', 120).notNullable();
    t.jsonb('boundary').notNullable().comment('GeoJSON Polygon or MultiPolygon, RFC 7946');
    t.double('area_m2').notNullable().comment('Geodesic area on the WGS84 ellipsoid, holes subtracted, m2');
    t.decimal('acres', 12, 4).notNullable().comment('area_m2 / 4046.8564224');
    t.text('notes').nullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['farm_id']);
  });
  await knex.raw('CREATE UNIQUE INDEX fields_farm_name_unique ON fields (farm_id, lower(name))');

  await knex.schema.createTable('hazards', (t) => {
    t.comment('Something on or beside a field to keep clear of, with a clearance distance');
    t.increments('id');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.integer('field_id').notNullable().references('fields.id').onDelete('CASCADE');
    t.string('kind', 20).notNullable().comment('bin, rock, power, draw, waterway, fence, neighbour, other');
    t.jsonb('geometry').notNullable().comment('GeoJSON Point, LineString or Polygon');
    t.double('clearance_m').notNullable().defaultTo(0).comment('Keep-out distance around it, metres');
    t.text('note').nullable();
    t.string('status', 10).notNullable().defaultTo('confirmed').comment('confirmed, or reported by an operator and not yet confirmed');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['field_id']);
    t.index(['farm_id']);
  });
  await knex.raw(
    "ALTER TABLE hazards ADD CONSTRAINT hazards_kind_check CHECK (kind IN ('bin','rock','power','draw','waterway','fence','neighbour','other'))",
  );

  await knex.schema.createTable('crop_plans', (t) => {
    t.comment('The crop planned on a field for a season (crop year)');
    t.increments('id');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.integer('field_id').notNullable().references('fields.id').onDelete('CASCADE');
    t.integer('season').notNullable();
    t.string('crop', 60).notNullable();
    t.string('variety_note', 200).nullable();
    t.unique(['field_id', 'season']);
    t.index(['farm_id', 'season']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('crop_plans');
  await knex.schema.dropTable('hazards');
  await knex.schema.dropTable('fields');
}
