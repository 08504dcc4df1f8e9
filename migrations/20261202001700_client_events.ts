import type { Knex } from 'knex';

// Actions tapped on a phone with no signal arrive later, perhaps twice, perhaps after the owner
// changed the job. Each carries an id made on the device: it is recorded once per farm with the
// answer it got, so a replay gets the same answer and changes nothing; what could not be applied
// stays here as a log the owner sees. A job's moves to another person and its deletion are kept
// too (by triggers, however the change is made), so a late action can be told what happened.
const FARM_TABLES = ['client_events', 'assignment_history'] as const;

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('client_events', (t) => {
    t.comment('Actions sent with a device-made id: recorded once per farm with their first answer; the kept ones are a log for the owner');
    t.increments('id');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.uuid('client_event_id').notNullable().comment('Made on the device when the action was tapped');
    t.integer('user_id').nullable().references('users.id').onDelete('SET NULL').comment('Who sent it');
    t.integer('assignment_id').notNullable().comment('The job as sent; no reference, so the record outlives a deleted job');
    t.string('type', 12).notNullable().comment('start, pause, resume, finish, call-off');
    t.timestamp('at', { useTz: true }).notNullable().comment('When it was tapped');
    t.jsonb('input').notNullable().comment('What was sent besides type and time: acres, engine hours, reason, note');
    t.integer('event_id').nullable().references('assignment_events.id').onDelete('SET NULL').comment('The log entry it made, when applied');
    t.string('outcome', 30).nullable().comment('applied, or the code of why it was kept as a log only; null only inside its own transaction');
    t.text('message').nullable().comment('What happened, in plain words');
    t.smallint('status').nullable().comment('HTTP status of the first answer');
    // json, not jsonb: the text is kept as written, so a replay sends the first answer's keys in their order.
    t.json('response').nullable().comment('Body of the first answer, sent again for a replay');
    t.timestamp('received_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['farm_id', 'client_event_id']);
    t.index(['farm_id', 'received_at']);
  });

  await knex.schema.createTable('assignment_history', (t) => {
    t.comment('Moves of a job to another person and deletions, written by triggers on assignments');
    t.increments('id');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.integer('assignment_id').notNullable().comment('No reference: the row outlives a deleted job');
    t.string('kind', 10).notNullable().comment('moved or deleted');
    t.integer('from_operator_id').notNullable().comment('Membership that had the job');
    t.integer('to_operator_id').nullable().comment('Membership it went to (moved)');
    t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['farm_id', 'assignment_id']);
  });

  // A farm being deleted takes its jobs with it; nothing is worth keeping then (and the farm row is
  // already gone, so the insert would break the farm reference).
  await knex.raw(`
    CREATE FUNCTION keep_assignment_history() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF NOT EXISTS (SELECT 1 FROM farms WHERE id = OLD.farm_id) THEN RETURN NULL; END IF;
      IF TG_OP = 'DELETE' THEN
        INSERT INTO assignment_history (farm_id, assignment_id, kind, from_operator_id)
        VALUES (OLD.farm_id, OLD.id, 'deleted', OLD.operator_id);
      ELSIF NEW.operator_id IS DISTINCT FROM OLD.operator_id THEN
        INSERT INTO assignment_history (farm_id, assignment_id, kind, from_operator_id, to_operator_id)
        VALUES (OLD.farm_id, OLD.id, 'moved', OLD.operator_id, NEW.operator_id);
      END IF;
      RETURN NULL;
    END $$`);
  await knex.raw(
    'CREATE TRIGGER assignments_history AFTER UPDATE OF operator_id OR DELETE ON assignments FOR EACH ROW EXECUTE FUNCTION keep_assignment_history()',
  );

  for (const table of FARM_TABLES) {
    await knex.raw(
      `CREATE CONSTRAINT TRIGGER ${table}_farm_revision AFTER INSERT OR UPDATE OR DELETE ON ${table}
       DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION bump_farm_revision()`,
    );
  }
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER IF EXISTS assignments_history ON assignments');
  await knex.raw('DROP FUNCTION IF EXISTS keep_assignment_history()');
  await knex.schema.dropTableIfExists('assignment_history');
  await knex.schema.dropTableIfExists('client_events');
}
