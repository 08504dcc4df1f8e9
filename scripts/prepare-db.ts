// Migrates the database in DATABASE_URL and loads the demo farm if it is missing
// (`--reset-demo` reloads it), and creates the background job queues (`--fast-retries`: retries
// due a second later, for tests). Used by `npm start`, `npm test` and `npm run db:*`.
import { prepareQueues, TEST_RETRY } from '../server/background/queue';
import { createDb, migrationConfig } from '../server/db/knex';
import { seed } from '../seeds/01_demo_farm';

async function main(): Promise<void> {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set');
  const args = new Set(process.argv.slice(2));
  const db = createDb(url);
  try {
    const [, applied] = await db.migrate.latest(migrationConfig);
    if (applied.length) console.log(`furlong: migrations applied: ${applied.length}`);
    await prepareQueues(url, args.has('--fast-retries') ? TEST_RETRY : {});
    if (!args.has('--migrate-only')) await seed(db, { reset: args.has('--reset-demo') });
  } finally {
    await db.destroy();
  }
}

main().catch((err: Error) => {
  console.error(`furlong: ${err.message}`);
  process.exit(1);
});
