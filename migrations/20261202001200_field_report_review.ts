import type { Knex } from 'knex';

// A problem reported from the field (an assignment event of type problem) waits for the owner:
// open until confirmed or dismissed. The owner list reads only open reports of a farm, hence the
// partial index.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('assignment_events', (t) => {
    t.string('review', 10).nullable().comment('For a problem report: open, confirmed or dismissed by the owner; null for other events');
    t.integer('reviewed_by_user_id').nullable().references('users.id').onDelete('SET NULL').comment('Owner who confirmed or dismissed the report');
    t.timestamp('reviewed_at', { useTz: true }).nullable().comment('When the report was confirmed or dismissed');
  });
  await knex.raw(
    "ALTER TABLE assignment_events ADD CONSTRAINT assignment_events_review_check CHECK (review IS NULL OR (type = 'problem' AND review IN ('open','confirmed','dismissed')))",
  );
  // The index comes before the update: the update fires the deferred farm-revision trigger, and
  // PostgreSQL refuses CREATE INDEX on a table with trigger events pending in the transaction.
  await knex.raw("CREATE INDEX assignment_events_open_reports ON assignment_events (farm_id, at DESC) WHERE review = 'open'");
  // Reports made before this change were seen only on the field page: they are open for the owner now.
  await knex('assignment_events').where({ type: 'problem' }).update({ review: 'open' });
  // Fire the farm-revision triggers of that update now rather than at commit: migrations run in
  // one transaction, and a later one's ALTER TABLE would meet them pending.
  await knex.raw('SET CONSTRAINTS ALL IMMEDIATE');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP INDEX assignment_events_open_reports');
  await knex.raw('ALTER TABLE assignment_events DROP CONSTRAINT assignment_events_review_check');
  await knex.schema.alterTable('assignment_events', (t) => {
    t.dropColumn('reviewed_at');
    t.dropColumn('reviewed_by_user_id');
    t.dropColumn('review');
  });
}
