// `npm test`: the same set-up as `npm start` into a separate test cluster and database, then
// lint, type-check, unit, API, fault, client and browser tests; one summary line at the end.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { LocalCluster, ensureChromium, ensureNodeModules, ensureXmllint, intEnv, log, root, run } from './lib/setup.mjs';

const only = process.argv.slice(2); // e.g. `npm test -- api browser` runs just those steps
const want = (step) => only.length === 0 || only.includes(step);
const artifacts = path.join(root, 'artifacts');
fs.mkdirSync(artifacts, { recursive: true });

ensureNodeModules();
if (want('browser')) ensureChromium();
if (want('api')) ensureXmllint();
// The test cluster and its fresh databases, for the steps that use them (all of them when no
// step is named). `npm test -- faults` alone leaves the test cluster untouched.
const needsTestDb = want('api') || want('browser');
const cluster = needsTestDb ? new LocalCluster('pg-test', intEnv('FURLONG_TEST_DB_PORT', 54339)) : null;
// The fault tests stop and start PostgreSQL: they get a cluster of their own.
const faultCluster = want('faults') ? new LocalCluster('pg-fault', intEnv('FURLONG_FAULT_DB_PORT', 54349)) : null;

const env = {
  ...process.env,
  NODE_ENV: 'test',
  ARTIFACTS_DIR: artifacts,
  FORCE_COLOR: '0',
};
if (cluster) {
  cluster.start();
  cluster.ensureDatabase('furlong_test', { fresh: true });
  cluster.ensureDatabase('furlong_migrate', { fresh: true });
  Object.assign(env, {
    TEST_DATABASE_URL: cluster.url('furlong_test'),
    DATABASE_URL: cluster.url('furlong_test'),
    MIGRATION_DATABASE_URL: cluster.url('furlong_migrate'),
  });
}

let passed = 0;
let failed = 0;
const lines = [];

function step(name, cmd, args) {
  const started = Date.now();
  log(`── ${name}`);
  const res = spawnSync(cmd, args, { cwd: root, env, stdio: 'inherit' });
  const ok = res.status === 0;
  lines.push(`${ok ? 'ok  ' : 'FAIL'} ${name} (${((Date.now() - started) / 1000).toFixed(1)} s)`);
  return ok;
}

function check(name, cmd, args) {
  if (step(name, cmd, args)) passed++;
  else failed++;
}

function jest(name, config, extra = []) {
  const out = path.join(artifacts, `jest-${name}.json`);
  fs.rmSync(out, { force: true });
  const ok = step(`${name} tests`, 'node', [
    'node_modules/jest/bin/jest.js',
    '-c',
    config,
    '--ci',
    '--json',
    '--outputFile',
    out,
    ...extra,
  ]);
  if (!fs.existsSync(out)) {
    failed++;
    return;
  }
  const r = JSON.parse(fs.readFileSync(out, 'utf8'));
  passed += r.numPassedTests;
  failed += r.numFailedTests;
  // A suite that failed to run (syntax error, failing hook) has no failed tests of its own.
  const broken = r.testResults.filter((s) => s.status === 'failed' && s.assertionResults.every((a) => a.status !== 'failed')).length;
  failed += broken;
  if (!ok && r.numFailedTests === 0 && broken === 0) failed++;
  lines[lines.length - 1] += ` — ${r.numPassedTests} passed, ${r.numFailedTests + broken} failed`;
}

try {
  if (cluster) run('node', ['--import', 'tsx', 'scripts/prepare-db.ts', '--fast-retries'], { env });
  if (want('lint')) check('lint', 'node', ['node_modules/eslint/bin/eslint.js', '.', '--max-warnings=0']);
  if (want('lint')) check('formatting (prettier --check)', 'node', ['node_modules/prettier/bin/prettier.cjs', '--check', '.']);
  if (want('typecheck')) {
    check('type-check server and shared', 'node', ['node_modules/typescript/bin/tsc', '-p', 'tsconfig.server.json', '--noEmit']);
    check('type-check app', 'node', ['node_modules/typescript/bin/tsc', '-p', 'tsconfig.app.json', '--noEmit']);
    check('type-check browser tests', 'node', ['node_modules/typescript/bin/tsc', '-p', 'tsconfig.e2e.json', '--noEmit']);
    // Jest compiles the client specs without checking their types: a fixture missing a field would pass unseen.
    check('type-check client specs', 'node', ['node_modules/typescript/bin/tsc', '-p', 'tsconfig.spec.json', '--noEmit']);
  }
  // The compiled server, as `npm start` runs it: tests/api/processes.test.ts starts it.
  if (want('api')) check('build server', 'node', ['node_modules/typescript/bin/tsc', '-p', 'tsconfig.build.json']);
  if (want('unit')) jest('unit', 'jest.unit.config.js');
  if (want('api')) jest('api', 'jest.api.config.js', ['--runInBand']);
  if (faultCluster) {
    faultCluster.start();
    faultCluster.ensureDatabase('furlong_fault', { fresh: true });
    const url = faultCluster.url('furlong_fault');
    run('node', ['--import', 'tsx', 'scripts/prepare-db.ts', '--migrate-only', '--fast-retries'], { env: { ...env, DATABASE_URL: url } });
    Object.assign(env, {
      FAULT_DATABASE_URL: url,
      FAULT_PG_BIN: faultCluster.bin,
      FAULT_PG_DIR: faultCluster.dir,
      FAULT_PG_LOG: faultCluster.logFile,
      FAULT_PG_OPTIONS: faultCluster.serverOptions(),
    });
    jest('faults', 'jest.faults.config.js', ['--runInBand']);
  }
  if (want('client')) jest('client', 'jest.client.config.js');
  if (want('browser')) {
    check('build the app', 'node', ['node_modules/@angular/cli/bin/ng.js', 'build', '--configuration', 'production']);
    jest('browser', 'jest.browser.config.js', ['--runInBand']);
  }
} catch (err) {
  log(err.message);
  failed++;
} finally {
  if (cluster?.startedHere) cluster.stop();
  // The fault tests may have left it stopped or restarted it; it is only theirs, so it stops.
  if (faultCluster) faultCluster.stop();
}

process.stdout.write(`\n${lines.join('\n')}\n\nScreenshots and reports: artifacts/\n${passed} passed, ${failed} failed\n`);
process.exit(failed > 0 ? 1 : 0);
