import type { Knex } from 'knex';

// The board tells the owner what changed in a person's order since it was published (added,
// moved, edited, removed jobs), not only that it changed: that needs what each published job was,
// not only the hash of the whole order. Orders published before this keep a null list and show
// only that they changed. work_orders already has the farm revision trigger.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('work_orders', (t) => {
    t.jsonb('jobs')
      .nullable()
      .comment('Per published job: its id, its place in the day (times and running order) and a hash of the rest of what the order said of it');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('work_orders', (t) => {
    t.dropColumn('jobs');
  });
}
