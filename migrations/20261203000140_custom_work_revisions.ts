import type { Knex } from 'knex';

// The custom-work tables are farm tables: like every other, a change to one moves the farm's
// revision on commit (20261202000100_farm_revisions), so a cached reading never outlives it.
// Invoice lines and mail attachments have no farm column: they change only with their invoice or
// message, whose own trigger fires.
const FARM_TABLES = ['customers', 'custom_rates', 'invoice_settings', 'invoice_counters', 'invoices', 'invoice_payments'] as const;

export async function up(knex: Knex): Promise<void> {
  for (const table of FARM_TABLES) {
    await knex.raw(
      `CREATE CONSTRAINT TRIGGER ${table}_farm_revision AFTER INSERT OR UPDATE OR DELETE ON ${table}
       DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION bump_farm_revision()`,
    );
  }
}

export async function down(knex: Knex): Promise<void> {
  for (const table of FARM_TABLES) await knex.raw(`DROP TRIGGER IF EXISTS ${table}_farm_revision ON ${table}`);
}
