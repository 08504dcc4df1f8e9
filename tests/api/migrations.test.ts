import { createDb, migrationConfig } from '../../server/db/knex';

// `npm test` makes an empty database for this test alone (MIGRATION_DATABASE_URL).
describe('migrations', () => {
  it('when run up and down on an empty database, then every table is created and removed cleanly', async () => {
    const url = process.env.MIGRATION_DATABASE_URL;
    if (!url) throw new Error('MIGRATION_DATABASE_URL is not set: run with npm test');
    const db = createDb(url);
    const tables = async () =>
      (
        await db('information_schema.tables')
          .where({ table_schema: 'public' })
          .whereNotIn('table_name', ['knex_migrations', 'knex_migrations_lock'])
          .pluck('table_name')
      ).sort();
    try {
      await db.migrate.rollback(migrationConfig, true);
      expect(await tables()).toEqual([]);
      const [, applied] = await db.migrate.latest(migrationConfig);
      expect(applied.length).toBeGreaterThan(0);
      expect(await tables()).toEqual(expect.arrayContaining(['farms', 'users', 'memberships', 'session', 'mail_outbox', 'auth_tokens']));
      await db.migrate.rollback(migrationConfig, true);
      expect(await tables()).toEqual([]);
      await db.migrate.latest(migrationConfig);
      const [, again] = await db.migrate.latest(migrationConfig);
      expect(again).toEqual([]);
    } finally {
      await db.destroy();
    }
  });
});
