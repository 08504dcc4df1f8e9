import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('crew_skills', (t) => {
    t.comment('Per member and operation: qualified, learning (needs a mentor) or mentor (qualified and may teach)');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.integer('membership_id').notNullable().references('memberships.id').onDelete('CASCADE');
    t.string('operation', 20).notNullable();
    t.string('level', 10).notNullable().comment('qualified, learning or mentor');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['membership_id', 'operation']);
    t.index(['farm_id']);
  });
  await knex.raw("ALTER TABLE crew_skills ADD CONSTRAINT crew_skills_level_check CHECK (level IN ('qualified','learning','mentor'))");
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('crew_skills');
}
