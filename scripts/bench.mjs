// `npm run bench`: every benchmark with its targets (speed and memory targets live here, never in
// timed tests). Each bench prints a table and exits non-zero when a target is missed.
import { spawnSync } from 'node:child_process';
import { ensureNodeModules, log, root } from './lib/setup.mjs';

const benches = [
  ['pass plan', ['--import', 'tsx', 'scripts/bench-plan.ts']],
  ['server', ['--import', 'tsx', 'scripts/bench-server.ts']],
  ['limits', ['--import', 'tsx', 'scripts/bench-limits.ts']],
  ['request log', ['--import', 'tsx', 'scripts/bench-request-log.ts']],
  ['weather', ['--import', 'tsx', 'scripts/bench-weather.ts']],
  ['offline', ['--import', 'tsx', 'scripts/bench-offline.ts']],
  ['offline-open', ['--import', 'tsx', 'scripts/bench-offline-open.ts']],
  ['taskdata', ['--import', 'tsx', 'scripts/bench-taskdata.ts']],
  ['coverage', ['--import', 'tsx', 'scripts/bench-coverage.ts']],
];
const only = process.argv.slice(2);

ensureNodeModules();
let failed = 0;
for (const [name, args] of benches) {
  if (only.length && !only.some((o) => name.includes(o))) continue;
  log(`── bench: ${name}`);
  const res = spawnSync('node', args, { cwd: root, stdio: 'inherit', env: process.env });
  if (res.status !== 0) failed++;
}
process.exit(failed ? 1 : 0);
