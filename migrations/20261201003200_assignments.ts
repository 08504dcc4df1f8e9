import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('board_days', (t) => {
    t.comment('One work board day of a farm; its version goes up with every change so stale saves are refused');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.date('day').notNullable();
    t.integer('version').notNullable().defaultTo(0);
    t.timestamp('published_at', { useTz: true }).nullable().comment('When work orders were last published');
    t.primary(['farm_id', 'day']);
  });

  await knex.schema.createTable('board_changes', (t) => {
    t.comment('What each version of a board day changed, to tell someone with a stale board what happened');
    t.increments('id');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.date('day').notNullable();
    t.integer('version').notNullable().comment('The board version this change produced');
    t.integer('by_user_id').nullable().references('users.id').onDelete('SET NULL');
    t.text('summary').notNullable().comment('Plain words, e.g. Added North Section harrowing for Tomas');
    t.specificType('assignment_ids', 'integer[]').notNullable().defaultTo('{}');
    t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['farm_id', 'day', 'version']);
  });

  await knex.schema.createTable('assignments', (t) => {
    t.comment('A job on the work board: field, operation, operator, machine, implement on a day; and what was logged');
    t.increments('id');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.date('day').notNullable();
    t.integer('field_id').notNullable().references('fields.id').onDelete('CASCADE').comment('Deleting a field deletes its work history');
    t.string('operation', 20).notNullable();
    t.integer('operator_id').notNullable().references('memberships.id').comment('Membership doing the job');
    t.integer('machine_id').notNullable().references('machines.id');
    t.integer('implement_id').notNullable().references('implements.id');
    t.integer('mentor_id').nullable().references('memberships.id').comment('Membership mentoring a learner');
    t.integer('run_order').notNullable().comment('1-based place in the operator day');
    t.integer('start_min').nullable().comment('Planned start, minutes after midnight; null means back-to-back from 07:00');
    t.integer('end_min').nullable().comment('Planned end, minutes after midnight');
    t.text('note').nullable().comment('The owner note to the operator');
    t.string('state', 12).notNullable().defaultTo('planned').comment('planned, underway, paused, finished, called-off');
    t.decimal('acres_planned', 12, 4).notNullable();
    t.timestamp('started_at', { useTz: true }).nullable();
    t.timestamp('finished_at', { useTz: true }).nullable();
    t.decimal('acres_done', 12, 4).nullable().comment('Acres finished, logged at finish; the season totals add these');
    t.decimal('hours_worked', 7, 2).nullable().comment('Hours underway from start to finish less pauses');
    t.decimal('engine_hours_start', 9, 1).nullable().comment('Meter reading at start, h');
    t.decimal('engine_hours_end', 9, 1).nullable().comment('Meter reading at finish, h');
    t.string('call_off_reason', 10).nullable().comment('weather, breakdown or other');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['farm_id', 'day']);
    t.index(['farm_id', 'field_id', 'operation']);
    t.index(['operator_id', 'day']);
    t.index(['machine_id']);
    t.index(['implement_id']);
  });
  await knex.raw(
    "ALTER TABLE assignments ADD CONSTRAINT assignments_state_check CHECK (state IN ('planned','underway','paused','finished','called-off'))",
  );
  await knex.raw(
    'ALTER TABLE assignments ADD CONSTRAINT assignments_times_check CHECK (end_min IS NULL OR start_min IS NULL OR end_min > start_min)',
  );

  await knex.schema.createTable('assignment_events', (t) => {
    t.comment('The log of a job: start, pause, resume, finish, call-off, problems and owner corrections');
    t.increments('id');
    t.integer('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
    t.integer('assignment_id').notNullable().references('assignments.id').onDelete('CASCADE');
    t.string('type', 12).notNullable().comment('start, pause, resume, finish, call-off, problem, log-edited, log-deleted');
    t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.decimal('acres', 12, 4).nullable();
    t.decimal('engine_hours', 9, 1).nullable();
    t.string('reason', 10).nullable().comment('Call-off reason or problem kind');
    t.text('note').nullable();
    t.integer('hazard_id').nullable().references('hazards.id').onDelete('SET NULL').comment('A hazard reported with a problem');
    t.integer('by_user_id').nullable().references('users.id').onDelete('SET NULL');
    t.index(['assignment_id', 'at']);
    t.index(['farm_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('assignment_events');
  await knex.schema.dropTable('assignments');
  await knex.schema.dropTable('board_changes');
  await knex.schema.dropTable('board_days');
}
