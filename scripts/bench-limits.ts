// Benchmark of the budgets (not a test): node --import tsx scripts/bench-limits.ts
// Prints, each beside its reference from the same run:
//  - the worst pass-plan preview inside the budgets, in a compute worker: time and memory;
//  - the largest boundary the budget allows: the check's time, beside a general-purpose library's
//    validity check (JTS IsValidOp) of the same boundary;
//  - a signed-in member's ordinary read (GET /api/fields) p95 while 5 hostile previews run,
//    beside the same read with no hostile load.
// Targets (2-core machine): the worst preview inside the budget finishes inside the compute time
// limit and under the memory limit; the largest boundary checks in < 1 s; the ordinary read's p95
// under hostile load < 1 s. Exits 1 when a target is missed.
import IsValidOp from 'jsts/org/locationtech/jts/operation/valid/IsValidOp.js';
import { checkBoundary } from '../shared/geo/boundary-check';
import { projectionForField } from '../shared/geo/local-projection';
import { COMPUTE_MEMORY_LIMIT_MB, COMPUTE_TIME_LIMIT_MS, MAX_BOUNDARY_VERTICES, MAX_PASSES } from '../shared/limits';
import { readJsts } from '../shared/plan/jsts-ops';
import { createComputePool } from '../server/compute/pool';
import { createDb, migrationConfig } from '../server/db/knex';
import { makeFarm } from '../tests/support/farm-factory';
import { combBoundary, squareBoundary } from '../tests/support/hostile-shapes';
import { HttpClient, startServerProcess } from '../tests/support/server-process';
// @ts-expect-error -- the set-up helpers are plain ES modules without types
import { LocalCluster } from './lib/setup.mjs';

interface Row {
  what: string;
  target: string;
  measured: string;
  reference: string;
  pass: boolean;
}
const rows: Row[] = [];
const ms = (n: number) => `${n.toFixed(0)} ms`;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const p95 = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.ceil(0.95 * xs.length) - 1)];
const rssMb = () => process.memoryUsage().rss / 1024 / 1024;

async function worstPreview(): Promise<void> {
  const pool = createComputePool({ threads: 1 });
  const square = squareBoundary(1609);
  const widthM = (Math.hypot(1609, 1609) / MAX_PASSES) * 1.01;
  const cases = [
    {
      what: `section at the pass budget (${MAX_PASSES.toLocaleString('en-US')} passes, auto heading)`,
      input: { boundary: square, widthM, headlandPasses: 0, headingDeg: 'auto' as const },
    },
    {
      what: 'comb of 10,004 points at 10 ft with 2 headland passes',
      input: { boundary: combBoundary(2_500), widthM: 3.048, headlandPasses: 2, headingDeg: 'auto' as const },
    },
  ];
  try {
    await pool.run('plan', { boundary: squareBoundary(400), widthM: 18.288 }); // start the worker
    for (const c of cases) {
      const base = rssMb();
      let peak = base;
      const sampler = setInterval(() => (peak = Math.max(peak, rssMb())), 20);
      const t = performance.now();
      let outcome = 'finished';
      try {
        const r = await pool.run('plan', c.input);
        outcome = `finished: ${r.passCount} passes, ${r.segmentCount} segments`;
      } catch (err) {
        outcome = `refused: ${(err as Error).message.slice(0, 60)}…`;
      }
      const took = performance.now() - t;
      clearInterval(sampler);
      const grew = peak - base;
      rows.push({
        what: `worst preview: ${c.what}`,
        target: `answered within the ${COMPUTE_TIME_LIMIT_MS / 1000} s limit (+1 s), memory growth < ${COMPUTE_MEMORY_LIMIT_MB} MB`,
        measured: `${ms(took)}, +${grew.toFixed(0)} MB; ${outcome}`,
        reference: `limits ${COMPUTE_TIME_LIMIT_MS / 1000} s, ${COMPUTE_MEMORY_LIMIT_MB} MB`,
        pass: took < COMPUTE_TIME_LIMIT_MS + 1000 && grew < COMPUTE_MEMORY_LIMIT_MB,
      });
    }
  } finally {
    await pool.close();
  }
}

function largestBoundary(): void {
  const timeOurs = (comb: ReturnType<typeof combBoundary>, runs: number) => {
    const ts: number[] = [];
    for (let i = 0; i < runs; i++) {
      const t = performance.now();
      if (checkBoundary(comb).length) throw new Error('the comb should be a valid boundary');
      ts.push(performance.now() - t);
    }
    return median(ts);
  };
  const largest = combBoundary(Math.floor((MAX_BOUNDARY_VERTICES - 4) / 4));
  const ours = timeOurs(largest, 5);
  // JTS's validity check grows faster than ours on combs (about 90 s at the budget here), so the
  // side-by-side reference is a comb of 16,000 points.
  const smaller = combBoundary(4_000);
  const oursSmall = timeOurs(smaller, 5);
  const geom = readJsts(projectionForField(smaller).forwardGeometry(smaller));
  const t = performance.now();
  new IsValidOp(geom).isValid();
  const jts = performance.now() - t;
  rows.push({
    what: `boundary check, comb of ${largest.coordinates[0].length.toLocaleString('en-US')} points (the budget)`,
    target: '< 1000 ms median',
    measured: `median ${ms(ours)}`,
    reference: `16,004-point comb: ours ${ms(oursSmall)}, JTS IsValidOp ${ms(jts)} (${(jts / oursSmall).toFixed(1)}× ours)`,
    pass: ours < 1000,
  });
}

async function readsUnderHostileLoad(): Promise<void> {
  const cluster = new LocalCluster('pg-test', 54339);
  cluster.start();
  cluster.ensureDatabase('furlong_bench_limits', { fresh: true });
  const url = cluster.url('furlong_bench_limits') as string;
  const db = createDb(url);
  await db.migrate.latest(migrationConfig);
  const farms = await Promise.all([makeFarm(db, 'Bench'), makeFarm(db, 'Hostile')]);
  await db.destroy();
  const server = await startServerProcess({
    DATABASE_URL: url,
    SESSION_SECRET: 'bench-secret-bench-secret-bench-secret-0123',
    NODE_ENV: 'development',
  });
  try {
    const reader = new HttpClient(server.url);
    await reader.signIn(farms[0].operator.email, farms[0].operator.password);
    const hostile = await Promise.all(
      [farms[1].owner, farms[1].viewer, farms[1].operator, farms[0].owner, farms[0].viewer].map(async (p) => {
        const c = new HttpClient(server.url);
        await c.signIn(p.email, p.password);
        return c;
      }),
    );
    const readFor = async (seconds: number) => {
      const times: number[] = [];
      const end = performance.now() + seconds * 1000;
      while (performance.now() < end) times.push((await reader.request('GET', '/api/fields')).ms);
      return times;
    };
    await readFor(2); // warm-up
    const quiet = await readFor(8);
    const comb = combBoundary(2_500);
    const previews = hostile.map((c) =>
      c.request('POST', '/api/plans/preview', { boundary: comb, widthM: 3.048, headlandPasses: 2, headingDeg: 'auto' }),
    );
    const loaded = await readFor(15);
    const answers = await Promise.all(previews);
    rows.push({
      what: 'signed-in read (GET /api/fields) p95 while 5 hostile previews run',
      target: '< 1000 ms',
      measured: `p95 ${ms(p95(loaded))} (${loaded.length} reads; previews answered ${answers.map((a) => a.status).join(', ')})`,
      reference: `no hostile load: p95 ${ms(p95(quiet))} (${quiet.length} reads)`,
      pass: p95(loaded) < 1000,
    });
  } finally {
    await server.stop();
    if (cluster.startedHere) cluster.stop();
  }
}

async function main(): Promise<void> {
  console.log('largest boundary check…');
  largestBoundary();
  console.log('worst previews inside the budgets…');
  await worstPreview();
  console.log('reads under hostile load…');
  await readsUnderHostileLoad();
  console.log('\n| what | target | measured | reference (same run) | |');
  console.log('|---|---|---|---|---|');
  for (const r of rows) console.log(`| ${r.what} | ${r.target} | ${r.measured} | ${r.reference} | ${r.pass ? 'PASS' : 'FAIL'} |`);
  process.exit(rows.every((r) => r.pass) ? 0 : 1);
}

main().catch((err: Error) => {
  console.error(err);
  process.exit(1);
});
