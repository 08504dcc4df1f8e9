import type { Knex } from 'knex';

// Every event the payment service sent to the webhook, once per event id: a replayed or
// duplicated event finds its id here and changes nothing. The outcome says what Furlong did with
// it (or why it did nothing), so an event about an unknown invoice is kept and can be looked into.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('payment_events', (t) => {
    t.comment('Events received from the payment service webhook, one row per event id');
    t.increments('id');
    t.string('event_id', 255).notNullable().unique().comment('The payment service event id (evt_...)');
    t.string('type', 100).notNullable().comment('The event type, such as checkout.session.completed');
    t.string('object_id', 255).nullable().comment('The id of the object the event is about (a checkout session)');
    t.boolean('livemode').notNullable().comment('False for test-mode events and the local fake');
    t.timestamp('event_created_at', { useTz: true }).notNullable().comment('When the payment service made the event');
    t.timestamp('received_at', { useTz: true }).notNullable().defaultTo(knex.fn.now()).comment('When the webhook first received it');
    t.integer('farm_id').nullable().references('farms.id').onDelete('SET NULL').comment('The farm it concerns, when known');
    t.string('outcome', 40).notNullable().comment('What was done: applied, ignored, unknown-invoice');
    t.text('detail').nullable().comment('The outcome in words, for the log');
    t.jsonb('payload').notNullable().comment('The event as received, after its signature was checked');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('payment_events');
}
