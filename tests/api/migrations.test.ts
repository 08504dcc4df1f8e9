import { createDb, migrationConfig } from '../../server/db/knex';
import { seed } from '../../seeds/01_demo_farm';

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

  it('when the newest migrations are undone and done again over the demo farm, then each runs both ways', async () => {
    const url = process.env.MIGRATION_DATABASE_URL;
    if (!url) throw new Error('MIGRATION_DATABASE_URL is not set: run with npm test');
    const db = createDb(url);
    // A migration that changes rows and then the schema can pass on an empty database and fail on
    // a farm's (PostgreSQL refuses some DDL while the change's deferred triggers are pending).
    const SINCE = '20261202';
    try {
      await db.migrate.latest(migrationConfig);
      await seed(db, { reset: true });
      // A reported problem, which the demo has none of: the field-report migration marks old ones open.
      const job = await db('assignments').first('id', 'farm_id');
      await db('assignment_events').insert({
        farm_id: job.farm_id,
        assignment_id: job.id,
        type: 'problem',
        reason: 'breakdown',
        note: 'Hydraulic hose burst',
      });
      const current = async () => String(await db.migrate.currentVersion(migrationConfig));
      let undone = 0;
      while ((await current()) >= SINCE) {
        await db.migrate.down(migrationConfig);
        undone++;
      }
      expect(undone).toBeGreaterThan(5);
      const [, applied] = await db.migrate.latest(migrationConfig);
      expect(applied).toHaveLength(undone);
      expect(Number((await db('farms').count({ n: '*' }))[0].n)).toBeGreaterThan(0);
    } finally {
      await db.destroy();
    }
  }, 120_000);
});
