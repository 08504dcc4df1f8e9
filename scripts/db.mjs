// `npm run db:migrate` / `npm run db:seed`: the same steps `npm start` runs, on the dev cluster.
import { LocalCluster, ensureNodeModules, intEnv, run } from './lib/setup.mjs';

const what = process.argv[2];
ensureNodeModules();
const cluster = new LocalCluster('pg-dev', intEnv('FURLONG_DB_PORT', 54329));
const wasRunning = cluster.isRunning();
cluster.start();
cluster.ensureDatabase('furlong');
try {
  const env = { ...process.env, DATABASE_URL: process.env.DATABASE_URL ?? cluster.url('furlong') };
  const args = what === 'migrate' ? ['--migrate-only'] : ['--reset-demo'];
  run('node', ['--import', 'tsx', 'scripts/prepare-db.ts', ...args], { env });
} finally {
  if (!wasRunning) cluster.stop();
}
