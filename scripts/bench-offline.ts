// Benchmark of a phone's outbox sent after reconnecting (not a test): node --import tsx scripts/bench-offline.ts
// One operator, 40 jobs of one day, 200 actions tapped with no signal (per job: start, pause,
// resume, pause, finish with acres), each with its device-made id and tap time. After the
// reconnect the outbox sends them as the run sheet's outbox does: in tap order, up to
// OUTBOX_BATCH_MAX to a request (POST /api/run-sheet/outbox), to the real server process on
// loopback; then sends all 200 again (a phone that lost the answers), which must change nothing
// and get the first answers back.
// Target: the 200 applied in < 3 s, each exactly once (200 log entries, 200 ids recorded as
// applied, every job finished, none refused); the replay changes nothing. Exits 1 when a target is
// missed. For comparison (no target), the same outbox of another 40 jobs sent one action to a
// request (POST /api/assignments/:id/events with the short answer), as before the batch route.
// The database is furlong_bench_offline on the test cluster (FURLONG_TEST_DB_PORT), made fresh each
// run; BENCH_DATABASE_URL names another (empty or of an earlier run: its bench farm is added beside
// what is there).
import { randomUUID } from 'node:crypto';
import os from 'node:os';
import { prepareQueues } from '../server/background/queue';
import { createDb, migrationConfig, type Db } from '../server/db/knex';
import { makeFarm } from '../tests/support/farm-factory';
import { HttpClient, startServerProcess } from '../tests/support/server-process';
import { insertImplement, insertMachine } from '../tests/api/matrix/board';
// @ts-expect-error -- the set-up helpers are plain ES modules without types
import { LocalCluster, intEnv } from './lib/setup.mjs';
import { dayIn } from '../shared/calendar';
import { OUTBOX_BATCH_MAX } from '../shared/limits';
import type { OutboxAnswer } from '../shared/schemas/run-sheet';

const DATABASE = 'furlong_bench_offline';
const JOBS = 40;
const STEPS = ['start', 'pause', 'resume', 'pause', 'finish'] as const;
const TARGET_MS = 3000;

const ms = (n: number) => `${n.toFixed(n < 10 ? 1 : 0)} ms`;

/** 40 planned jobs for the farm's operator today, each on its own field, tractor and harrow. */
async function addJobs(db: Db, farmId: number, operatorId: number, day: string, set = 'A'): Promise<number[]> {
  const ids: number[] = [];
  for (let k = 0; k < JOBS; k++) {
    const lon = -99.5 + k * 0.01;
    const [f] = await db('fields')
      .insert({
        farm_id: farmId,
        name: `Bench field ${set}${k + 1}`,
        boundary: JSON.stringify({
          type: 'Polygon',
          coordinates: [
            [
              [lon, 47.2],
              [lon + 0.006, 47.2],
              [lon + 0.006, 47.204],
              [lon, 47.204],
              [lon, 47.2],
            ],
          ],
        }),
        // 0.006° × 0.004° at 47° N: about 455 m × 445 m, near enough for a bench that never reads it.
        area_m2: 202_000,
        acres: 50,
      })
      .returning('id');
    const [a] = await db('assignments')
      .insert({
        farm_id: farmId,
        day,
        field_id: f.id,
        operation: 'harrowing',
        operator_id: operatorId,
        machine_id: await insertMachine(db, farmId),
        implement_id: await insertImplement(db, farmId),
        run_order: k + 1,
        acres_planned: 50,
      })
      .returning('id');
    ids.push(a.id);
  }
  return ids;
}

interface Action {
  jobId: number;
  body: { type: string; at: string; clientEventId: string; acres?: number };
}

/** The outbox: each job's five taps a few minutes apart, jobs interleaved as a day's work is, in tap order. */
function outbox(jobIds: number[], base: number): Action[] {
  const actions: Array<Action & { t: number }> = [];
  jobIds.forEach((jobId, k) =>
    STEPS.forEach((type, s) => {
      const t = base + k * 60_000 + s * 7 * 60_000;
      actions.push({
        jobId,
        t,
        body: { type, at: new Date(t).toISOString(), clientEventId: randomUUID(), ...(type === 'finish' ? { acres: 50 } : {}) },
      });
    }),
  );
  return actions.sort((a, b) => a.t - b.t).map(({ jobId, body }) => ({ jobId, body }));
}

async function main(): Promise<void> {
  let cluster: {
    start(): void;
    stop(): void;
    ensureDatabase(n: string, o: object): void;
    url(n: string): string;
    startedHere: boolean;
  } | null = null;
  let url = process.env.BENCH_DATABASE_URL;
  if (!url) {
    cluster = new LocalCluster('pg-test', intEnv('FURLONG_TEST_DB_PORT', 54339));
    cluster!.start();
    cluster!.ensureDatabase(DATABASE, { fresh: true });
    url = cluster!.url(DATABASE);
  }
  const db = createDb(url);
  let server: Awaited<ReturnType<typeof startServerProcess>> | null = null;
  try {
    await db.migrate.latest(migrationConfig);
    await prepareQueues(url);
    const farm = await makeFarm(db, 'Bench Outbox');
    // Tapped over the last few hours (the last tap about half an hour ago).
    const base = Date.now() - 4 * 3_600_000;
    // The jobs' day is the farm's day of the first tap (the test farm keeps its zone, America/Chicago):
    // a start is taken from the job's day on at the farm, so the UTC date would refuse it in the evening there.
    const { time_zone: zone } = await db('farms').where({ id: farm.id }).first('time_zone');
    const day = dayIn(zone, new Date(base));
    const jobIds = await addJobs(db, farm.id, farm.operator.membershipId, day);
    const singleJobIds = await addJobs(db, farm.id, farm.operator.membershipId, day, 'B');
    const actions = outbox(jobIds, base);
    const singleActions = outbox(singleJobIds, base);

    server = await startServerProcess({ DATABASE_URL: url, SESSION_SECRET: 'bench-secret-bench-secret-bench-secret-0123' });
    const phone = new HttpClient(server.url);
    await phone.signIn(farm.operator.email, farm.operator.password);
    // One request first, so the server's first-request costs (pools, prepared queries) are not counted.
    await phone.request('GET', '/api/run-sheet');

    /** As the run sheet's outbox sends: in tap order, up to OUTBOX_BATCH_MAX actions to a request. */
    const sendBatched = async (queue: Action[]) => {
      const answers: Array<{ status: number; body: string }> = [];
      let requests = 0;
      const t0 = performance.now();
      for (let i = 0; i < queue.length; i += OUTBOX_BATCH_MAX) {
        const events = queue.slice(i, i + OUTBOX_BATCH_MAX).map((a) => ({ assignmentId: a.jobId, ...a.body }));
        const res = await phone.request('POST', '/api/run-sheet/outbox', { events });
        requests++;
        if (res.status !== 200) throw new Error(`The outbox route answered ${res.status}: ${JSON.stringify(res.body)}`);
        for (const r of (res.body as OutboxAnswer).results) answers.push({ status: r.status, body: JSON.stringify(r.body) });
      }
      return { ms: performance.now() - t0, answers, requests };
    };
    /** One action to a request, asking the short answer (the single route, as before the batch). */
    const sendOneByOne = async (queue: Action[]) => {
      const answers: Array<{ status: number; body: string }> = [];
      const t0 = performance.now();
      for (const a of queue) {
        const res = await phone.request('POST', `/api/assignments/${a.jobId}/events`, a.body, undefined, { prefer: 'return=minimal' });
        answers.push({ status: res.status, body: JSON.stringify(res.body) });
      }
      return { ms: performance.now() - t0, answers };
    };
    const counts = async (ids = jobIds) => ({
      events: Number((await db('assignment_events').whereIn('assignment_id', ids).count({ n: '*' }))[0].n),
      finished: Number((await db('assignments').whereIn('id', ids).where({ state: 'finished' }).count({ n: '*' }))[0].n),
      recorded: Number((await db('client_events').whereIn('assignment_id', ids).where({ outcome: 'applied' }).count({ n: '*' }))[0].n),
    });

    // The machine's floor, measured the same way: a signed-in request that reads almost nothing.
    const floor: number[] = [];
    for (let i = 0; i < 50; i++) floor.push((await phone.request('GET', '/api/auth/me')).ms);
    const floorMedian = [...floor].sort((a, b) => a - b)[25];

    const first = await sendBatched(actions);
    const refused = first.answers.filter((a) => a.status !== 201);
    const after = await counts();
    const replay = await sendBatched(actions);
    const afterReplay = await counts();
    const sameAnswers = replay.answers.every((a, i) => a.status === first.answers[i].status && a.body === first.answers[i].body);
    const single = await sendOneByOne(singleActions);
    const singleRefused = single.answers.filter((a) => a.status !== 201).length;
    const singleAfter = await counts(singleJobIds);

    const exactlyOnce =
      refused.length === 0 && after.events === actions.length && after.recorded === actions.length && after.finished === JOBS;
    const unchanged = JSON.stringify(afterReplay) === JSON.stringify(after) && sameAnswers;
    const rows = [
      {
        bench: `${actions.length} queued actions over ${JOBS} jobs replayed after reconnect, in tap order, ${OUTBOX_BATCH_MAX} to a request`,
        target: `< ${TARGET_MS} ms, each applied exactly once`,
        measured: `${ms(first.ms)} in ${first.requests} request${first.requests === 1 ? '' : 's'}; exactly once: ${exactlyOnce ? 'yes' : 'NO'} (${after.events} log entries, ${after.recorded} ids recorded as applied, ${after.finished}/${JOBS} jobs finished, ${refused.length} refused)`,
        result: first.ms < TARGET_MS && exactlyOnce ? 'PASS' : 'FAIL',
      },
      {
        bench: `the same ${actions.length} sent again (answers lost on the way)`,
        target: 'nothing changes; the first answers again',
        measured: `${ms(replay.ms)}; log entries ${afterReplay.events}, same answers: ${sameAnswers ? 'all' : 'NOT all'}`,
        result: unchanged ? 'PASS' : 'FAIL',
      },
      {
        bench: `for comparison: ${singleActions.length} more over ${JOBS} other jobs, one action to a request (short answers)`,
        target: 'none (the way before the batch route)',
        measured: `${ms(single.ms)} (${ms(single.ms / singleActions.length)} each); ${singleAfter.events} log entries, ${singleRefused} refused`,
        result: singleRefused === 0 && singleAfter.events === singleActions.length ? 'info' : 'FAIL',
      },
    ];
    if (refused.length) console.log('refused:', refused.slice(0, 3));
    console.log(
      `floor: GET /api/auth/me median ${ms(floorMedian)}; load average ${os
        .loadavg()
        .map((l) => l.toFixed(1))
        .join(' ')} on ${os.cpus().length} cores`,
    );
    console.log('\nTargets');
    console.table(rows);
    process.exitCode = rows.every((r) => r.result !== 'FAIL') ? 0 : 1;
  } finally {
    await server?.stop();
    await db.destroy();
    if (cluster?.startedHere) cluster.stop();
  }
}

main().catch((err: Error) => {
  console.error(err);
  process.exit(1);
});
