import type { Knex } from 'knex';

// A revision number per farm that changes whenever any of the farm's data changes, however it was
// changed: through the API, the mail worker, a seed or a hand-written statement. Readers that keep
// a computed answer (the work board) compare it with this one number instead of recomputing.
//
// Each farm table has a deferred row trigger. It runs at commit, after every lock the transaction
// takes, and bumps the revision once per farm and transaction (a transaction-local setting
// remembers that it did). Values come from one sequence, so a revision is never used twice, even
// for a farm id that a test database hands out again.
const FARM_TABLES = [
  'farms',
  'users',
  'memberships',
  'fields',
  'hazards',
  'crop_plans',
  'pass_plans',
  'machines',
  'implements',
  'implement_hitches',
  'crew_skills',
  'board_days',
  'board_changes',
  'assignments',
  'assignment_events',
  'work_orders',
  'mail_outbox',
] as const;

export async function up(knex: Knex): Promise<void> {
  await knex.raw('CREATE SEQUENCE farm_revision_seq');
  await knex.schema.createTable('farm_revisions', (t) => {
    t.comment('Changes whenever any data of the farm changes; cached readings are valid while it stays the same');
    t.integer('farm_id').primary().references('farms.id').onDelete('CASCADE');
    t.bigInteger('revision').notNullable().defaultTo(knex.raw("nextval('farm_revision_seq')"));
  });
  await knex.raw(`
    CREATE FUNCTION bump_farm_revision() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE
      changed jsonb := to_jsonb(CASE WHEN TG_OP = 'DELETE' THEN OLD ELSE NEW END);
      farm integer;
    BEGIN
      FOR farm IN
        SELECT (changed->>'id')::int WHERE TG_TABLE_NAME = 'farms'
        UNION SELECT m.farm_id FROM memberships m WHERE TG_TABLE_NAME = 'users' AND m.user_id = (changed->>'id')::int
        UNION SELECT (changed->>'farm_id')::int WHERE TG_TABLE_NAME NOT IN ('farms', 'users')
      LOOP
        CONTINUE WHEN farm IS NULL OR current_setting('furlong.revised_' || farm, true) = 'y';
        PERFORM set_config('furlong.revised_' || farm, 'y', true);
        INSERT INTO farm_revisions (farm_id)
          SELECT farm WHERE EXISTS (SELECT 1 FROM farms WHERE id = farm)
          ON CONFLICT (farm_id) DO UPDATE SET revision = nextval('farm_revision_seq');
      END LOOP;
      RETURN NULL;
    END $$
  `);
  for (const table of FARM_TABLES) {
    await knex.raw(
      `CREATE CONSTRAINT TRIGGER ${table}_farm_revision AFTER INSERT OR UPDATE OR DELETE ON ${table}
       DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION bump_farm_revision()`,
    );
  }
  await knex.raw('INSERT INTO farm_revisions (farm_id) SELECT id FROM farms');
}

export async function down(knex: Knex): Promise<void> {
  for (const table of FARM_TABLES) await knex.raw(`DROP TRIGGER IF EXISTS ${table}_farm_revision ON ${table}`);
  await knex.raw('DROP FUNCTION IF EXISTS bump_farm_revision()');
  await knex.schema.dropTableIfExists('farm_revisions');
  await knex.raw('DROP SEQUENCE IF EXISTS farm_revision_seq');
}
