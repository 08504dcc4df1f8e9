// Benchmark of the server under load (not a test): node --import tsx scripts/bench-server.ts
// A generated farm of 200 fields with 10 seasons of logs (50,000 finished jobs) in a database of
// its own (furlong_bench on the test cluster, made fresh each run), the real app on a loopback port,
// and autocannon with one signed-in owner's cookie. The server runs as `npm start` runs it, in a
// process of its own (server/index.ts), so that autocannon does not share its event loop.
// Targets: season summary < 100 ms median for one reader (one connection: a report is opened by a
// person, not a crowd; the 10-connection figure is printed beside it for information); work board
// for a busy day (40 jobs) < 30 ms p95 at 50 connections; no errors. Each run lasts 10 s. Exits 1
// when a target is missed.
import { spawn, type ChildProcess } from 'node:child_process';
import { createRequire } from 'node:module';
import net, { type AddressInfo } from 'node:net';
import path from 'node:path';
import bcrypt from 'bcryptjs';
import { createDb, migrationConfig, type Db } from '../server/db/knex';
// @ts-expect-error -- the set-up helpers are plain ES modules without types
import { LocalCluster } from './lib/setup.mjs';

interface Histogram {
  p50: number;
  p90: number;
  p97_5: number;
  p99: number;
  max: number;
}
interface CannonResult {
  latency: Histogram;
  requests: { total: number; average: number };
  errors: number;
  timeouts: number;
  non2xx: number;
}
interface CannonInstance extends Promise<CannonResult> {
  on(event: 'response', fn: (client: unknown, status: number, bytes: number, ms: number) => void): void;
}
// autocannon ships no types; this is the part of its API used here.
const autocannon = createRequire(__filename)('autocannon') as (opts: object) => CannonInstance;

const SEASONS = 10;
const LAST_SEASON = 2026;
const FIELDS = 200;
const JOBS_PER_FIELD_OPERATION = 5;
/** The operations logged each season, with the month and day their window opens. */
const WINDOWS: Array<[string, number, number]> = [
  ['harrowing', 4, 10],
  ['seeding', 4, 25],
  ['spraying', 6, 1],
  ['swathing', 8, 5],
  ['combining', 8, 20],
];
const BOARD_DAY = `${LAST_SEASON}-06-10`;
const DURATION_S = 10;
const PASSWORD = 'bench-owner-password';

async function generate(db: Db): Promise<number> {
  const [farm] = await db('farms').insert({ name: 'Bench Farm', units: 'us' }).returning('id');
  const farmId = farm.id as number;
  const hash = bcrypt.hashSync(PASSWORD, 4);
  const [owner] = await db('users').insert({ email: 'owner@bench.test', name: 'Bench Owner', password_hash: hash }).returning('id');
  await db('memberships').insert({ farm_id: farmId, user_id: owner.id, role: 'owner', status: 'active' });
  const operators: number[] = [];
  for (let i = 1; i <= 8; i++) {
    const [u] = await db('users')
      .insert({ email: `op${i}@bench.test`, name: `Operator ${i}` })
      .returning('id');
    const [m] = await db('memberships').insert({ farm_id: farmId, user_id: u.id, role: 'operator', status: 'active' }).returning('id');
    operators.push(m.id);
  }
  // Each operator has a machine and an implement of their own for each operation, as a crew of
  // eight would need to work side by side (one shared sprayer for eight people would make every
  // card on the board clash with every other).
  const machine = async (name: string, kind: string, hp: number) =>
    (await db('machines').insert({ farm_id: farmId, name, kind, power_hp: hp }).returning('id'))[0].id as number;
  const implement = async (name: string, kind: string, widthM: number, op: string) =>
    (
      await db('implements')
        .insert({ farm_id: farmId, name, kind, width_m: widthM, operations: [op] })
        .returning('id')
    )[0].id as number;
  const FLEET: Record<string, [string, string, number, string, string, number]> = {
    harrowing: ['4WD A', 'tractor-4wd', 500, 'Harrow', 'harrow', 25.6],
    seeding: ['4WD B', 'tractor-4wd', 450, 'Drill', 'air-drill', 18.3],
    spraying: ['Sprayer', 'sprayer-sp', 340, 'Boom', 'sprayer', 36.6],
    swathing: ['Swather', 'swather-sp', 190, 'Swather header', 'swather', 9.1],
    combining: ['Combine', 'combine', 430, 'Draper', 'combine-header', 12.2],
  };
  /** Machine and implement ids in the order (operation in WINDOWS, then operator 1–8). */
  const machineIds: number[] = [];
  const implementIds: number[] = [];
  for (const [op] of WINDOWS) {
    const [mName, mKind, hp, iName, iKind, widthM] = FLEET[op];
    for (let k = 1; k <= operators.length; k++) {
      machineIds.push(await machine(`${mName} ${k}`, mKind, hp));
      implementIds.push(await implement(`${iName} ${k}`, iKind, widthM, op));
    }
  }

  // Fields: 80–640 acres, small squares on a grid (the boundary is not read by these routes).
  await db.raw(
    `insert into fields (farm_id, name, boundary, area_m2, acres)
     select :farmId, 'Field ' || lpad(n::text, 3, '0'),
            jsonb_build_object('type', 'Polygon', 'coordinates', jsonb_build_array(jsonb_build_array(
              jsonb_build_array(-100 + (n % 20) * 0.02, 47 + (n / 20) * 0.02), jsonb_build_array(-99.99 + (n % 20) * 0.02, 47 + (n / 20) * 0.02),
              jsonb_build_array(-99.99 + (n % 20) * 0.02, 47.01 + (n / 20) * 0.02), jsonb_build_array(-100 + (n % 20) * 0.02, 47 + (n / 20) * 0.02)))),
            (80 + (n * 37) % 561) * 4046.8564224, 80 + (n * 37) % 561
     from generate_series(1, :fields::int) as n`,
    { farmId, fields: FIELDS },
  );
  await db.raw(
    `insert into crop_plans (farm_id, field_id, season, crop)
     select :farmId, f.id, y, (array['spring wheat', 'durum', 'barley', 'canola', 'field peas', 'summer fallow'])[1 + (f.id + y) % 6]
     from fields f cross join generate_series(:first::int, :last::int) as y where f.farm_id = :farmId`,
    { farmId, first: LAST_SEASON - SEASONS + 1, last: LAST_SEASON },
  );
  await db.raw(
    `insert into pass_plans (farm_id, field_id, operation, width_m, headland_passes, coverage, speed_mph, efficiency, turn_seconds, summary)
     select :farmId, f.id, op, 20, 2, 'gaps-ok', 6, 0.8, 20, jsonb_build_object('hours', round(f.acres / 45, 2), 'fieldAcres', f.acres)
     from fields f cross join unnest(array['harrowing', 'seeding', 'spraying']) as op where f.farm_id = :farmId`,
    { farmId },
  );
  // The logs: every field, every season, five jobs per operation, spread over each operation's window.
  await db.raw(
    `with w(op, month, first_day, idx) as (select * from unnest(:ops::text[], :months::int[], :days::int[]) with ordinality),
     f as (select id, acres, row_number() over (order by id) as n from fields where farm_id = :farmId)
     insert into assignments (farm_id, day, field_id, operation, operator_id, machine_id, implement_id, run_order, state, acres_planned,
                              acres_done, hours_worked, engine_hours_start, engine_hours_end, call_off_reason)
     select :farmId, make_date(y, w.month, w.first_day) + ((f.n * 3 + j * 5) % 25)::int, f.id, w.op,
            (:operators::int[])[1 + (f.n + j) % 8],
            (:machines::int[])[(w.idx - 1) * 8 + 1 + (f.n + j) % 8], (:implements::int[])[(w.idx - 1) * 8 + 1 + (f.n + j) % 8], 1 + j,
            case when (f.n + j + y) % 50 = 0 then 'called-off' else 'finished' end,
            round(f.acres / 5, 4),
            case when (f.n + j + y) % 50 = 0 then null else round(f.acres / 5, 4) end,
            case when (f.n + j + y) % 50 = 0 then null else round(f.acres / 5 / (30 + (f.n % 15)), 2) end,
            1000 + (y - :first::int) * 400 + j * 10,
            case when (f.n + j + y) % 50 = 0 then null else 1000 + (y - :first::int) * 400 + j * 10 + round(f.acres / 5 / 28, 1) end,
            case when (f.n + j + y) % 50 = 0 then 'weather' end
     from generate_series(:first::int, :last::int) as y cross join f cross join w cross join generate_series(0, :jobs::int - 1) as j`,
    {
      farmId,
      first: LAST_SEASON - SEASONS + 1,
      last: LAST_SEASON,
      jobs: JOBS_PER_FIELD_OPERATION,
      ops: WINDOWS.map((w) => w[0]),
      months: WINDOWS.map((w) => w[1]),
      days: WINDOWS.map((w) => w[2]),
      machines: machineIds,
      implements: implementIds,
      operators,
    },
  );
  // A visibility map and fresh statistics, as autovacuum would leave a farm's database.
  await db.raw('vacuum analyze');
  return farmId;
}

interface Run {
  name: string;
  target: string;
  measured: string;
  pass: boolean;
  detail: string;
}

async function measure(
  url: string,
  cookie: string,
  connections: number,
  seconds = DURATION_S,
): Promise<{ r: CannonResult; times: number[] }> {
  const times: number[] = [];
  // The headers a browser sends with the app's requests: the session cookie and the encodings it takes.
  const inst = autocannon({ url, connections, duration: seconds, headers: { cookie, 'accept-encoding': 'gzip, deflate, br' } });
  inst.on('response', (_c, _status, _bytes, ms) => times.push(ms));
  const r = await inst;
  times.sort((a, b) => a - b);
  return { r, times };
}

const ms = (n: number) => `${n.toFixed(1)} ms`;
const pct = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)] ?? Number.NaN;

async function freePort(): Promise<number> {
  const probe = net.createServer().listen(0, '127.0.0.1');
  await new Promise((r) => probe.once('listening', r));
  const { port } = probe.address() as AddressInfo;
  await new Promise((r) => probe.close(r));
  return port;
}

/** Resolves once a started server prints that it listens; rejects if it exits first. */
function listening(child: ChildProcess, name: string): Promise<void> {
  return new Promise<void>((resolve, reject) => {
    child.once('exit', (code) => reject(new Error(`${name} exited with ${code} before listening`)));
    child.stdout!.on('data', (chunk: Buffer) => {
      if (chunk.toString().includes('listening on')) resolve();
    });
  });
}

/** Starts server/index.ts on a free loopback port and resolves once it listens. */
async function startServer(databaseUrl: string): Promise<{ child: ChildProcess; base: string }> {
  const port = await freePort();
  const env = {
    ...process.env,
    NODE_ENV: 'development',
    DATABASE_URL: databaseUrl,
    HOST: '127.0.0.1',
    PORT: String(port),
    SESSION_SECRET: 'bench-secret-bench-secret-bench-secret-0123',
    FAKE_SMTP_PORT: '0',
  };
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: path.resolve(__dirname, '..'),
    env,
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  await listening(child, 'the server');
  return { child, base: `http://127.0.0.1:${port}` };
}

/**
 * The machine's own ceiling, for reading the board figures: Express with no middleware at all,
 * answering every request with the same number of bytes as the board, in a process of its own.
 */
async function startBareExpress(bytes: number): Promise<{ child: ChildProcess; base: string }> {
  const port = await freePort();
  const code = `const express = require('express'); const body = Buffer.alloc(${bytes}, 120); const app = express();
    app.get('/', (_req, res) => { res.type('json').send(body); });
    app.listen(${port}, '127.0.0.1', () => console.log('listening on ${port}'));`;
  const child = spawn(process.execPath, ['-e', code], { cwd: path.resolve(__dirname, '..'), stdio: ['ignore', 'pipe', 'inherit'] });
  await listening(child, 'bare Express');
  return { child, base: `http://127.0.0.1:${port}` };
}

async function stopServer(child: ChildProcess | null): Promise<void> {
  if (!child || child.exitCode !== null) return;
  const exited = new Promise((r) => child.once('exit', r));
  child.kill('SIGTERM');
  await exited;
}

async function main(): Promise<void> {
  const cluster = new LocalCluster('pg-test', 54339);
  cluster.start();
  cluster.ensureDatabase('furlong_bench', { fresh: true });
  const url: string = cluster.url('furlong_bench');
  const db = createDb(url);
  let server: ChildProcess | null = null;
  try {
    await db.migrate.latest(migrationConfig);
    let t = performance.now();
    await generate(db);
    const [{ count }] = await db('assignments').where({ state: 'finished' }).count<Array<{ count: number }>>('* as count');
    console.log(
      `generated ${FIELDS} fields, ${SEASONS} seasons, ${count} finished jobs in ${((performance.now() - t) / 1000).toFixed(1)} s`,
    );

    const started = await startServer(url);
    server = started.child;
    const base = started.base;

    // Sign in once, as the browser does (XSRF cookie, then the login with its header).
    const first = await fetch(`${base}/api/health`);
    const xsrf = /XSRF-TOKEN=([^;]+)/.exec(first.headers.getSetCookie().join('; '))?.[1] ?? '';
    const login = await fetch(`${base}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-xsrf-token': decodeURIComponent(xsrf), cookie: `XSRF-TOKEN=${xsrf}` },
      body: JSON.stringify({ email: 'owner@bench.test', password: PASSWORD }),
    });
    if (login.status !== 200) throw new Error(`sign-in failed: ${login.status} ${await login.text()}`);
    const sid = login.headers
      .getSetCookie()
      .map((c) => c.split(';')[0])
      .find((c) => c.startsWith('furlong.sid='));
    const cookie = [`XSRF-TOKEN=${xsrf}`, sid].join('; ');

    const summaryUrl = `${base}/api/season/${LAST_SEASON}/summary`;
    const boardUrl = `${base}/api/board?date=${BOARD_DAY}`;
    for (const u of [summaryUrl, boardUrl]) {
      const res = await fetch(u, { headers: { cookie } });
      if (res.status !== 200) throw new Error(`${u} answered ${res.status}: ${(await res.text()).slice(0, 300)}`);
      for (let i = 0; i < 20; i++) await (await fetch(u, { headers: { cookie } })).arrayBuffer();
    }
    const sample = (await (await fetch(summaryUrl, { headers: { cookie } })).json()) as { totals: { jobsFinished: number } };
    const boardRes = await fetch(boardUrl, { headers: { cookie, 'accept-encoding': 'gzip' } });
    const boardBytes = Number(boardRes.headers.get('content-length'));
    const board = (await boardRes.json()) as { assignments?: unknown[] };
    console.log(
      `season ${LAST_SEASON}: ${sample.totals.jobsFinished} finished jobs; board ${BOARD_DAY}: ${board.assignments?.length ?? '?'} jobs, ${boardBytes} bytes gzipped`,
    );

    const runs: Run[] = [];
    t = performance.now();
    // The cost every signed-in request pays (session, principal, rolling cookie), for reading the rest.
    const floor = await measure(`${base}/api/auth/me`, cookie, 1);
    runs.push({
      name: `signed-in floor (GET /api/auth/me), 1 connection, ${DURATION_S} s`,
      target: '(information)',
      measured: `median ${ms(pct(floor.times, 50))}`,
      pass: true,
      detail: `p95 ${ms(pct(floor.times, 95))}, ${floor.r.requests.total} requests`,
    });
    const one = await measure(summaryUrl, cookie, 1);
    runs.push({
      name: `season summary, 1 connection, ${DURATION_S} s`,
      target: 'median < 100 ms',
      measured: `median ${ms(pct(one.times, 50))}`,
      pass: pct(one.times, 50) < 100,
      detail: `p95 ${ms(pct(one.times, 95))}, ${one.r.requests.total} requests`,
    });
    const ten = await measure(summaryUrl, cookie, 10);
    runs.push({
      name: `season summary, 10 connections, ${DURATION_S} s`,
      target: '(information)',
      measured: `median ${ms(pct(ten.times, 50))}`,
      pass: true,
      detail: `p95 ${ms(pct(ten.times, 95))}, ${ten.r.requests.total} requests`,
    });
    const sErrors = [one, ten].reduce((n, m) => n + m.r.errors + m.r.timeouts + m.r.non2xx, 0);
    runs.push({
      name: 'season summary errors',
      target: '0',
      measured: String(sErrors),
      pass: sErrors === 0,
      detail: 'errors, timeouts and non-2xx answers',
    });
    const b1 = await measure(boardUrl, cookie, 1);
    runs.push({
      name: `work board for a day, 1 connection, ${DURATION_S} s`,
      target: '(information)',
      measured: `p95 ${ms(pct(b1.times, 95))}`,
      pass: true,
      detail: `median ${ms(pct(b1.times, 50))}, ${b1.r.requests.total} requests`,
    });
    // Three seconds of the same load first, unmeasured: the server's code is compiled hot by then.
    await measure(boardUrl, cookie, 50, 3);
    const b = await measure(boardUrl, cookie, 50);
    const bErrors = [b1, b].reduce((n, m) => n + m.r.errors + m.r.timeouts + m.r.non2xx, 0);
    runs.push({
      name: `work board for a day, 50 connections, ${DURATION_S} s`,
      target: 'p95 < 30 ms',
      measured: `p95 ${ms(pct(b.times, 95))}`,
      pass: pct(b.times, 95) < 30,
      detail: `median ${ms(pct(b.times, 50))}, ${b.r.requests.total} requests`,
    });
    const bare = await startBareExpress(boardBytes);
    try {
      await measure(bare.base, '', 50, 3);
      const e = await measure(bare.base, '', 50);
      runs.push({
        name: `bare Express, same bytes, 50 connections, ${DURATION_S} s`,
        target: '(information)',
        measured: `p95 ${ms(pct(e.times, 95))}`,
        pass: true,
        detail: `median ${ms(pct(e.times, 50))}, ${e.r.requests.total} requests`,
      });
    } finally {
      await stopServer(bare.child);
    }
    runs.push({
      name: 'work board errors',
      target: '0',
      measured: String(bErrors),
      pass: bErrors === 0,
      detail: 'errors, timeouts and non-2xx answers',
    });

    console.table(
      runs.map((r) => ({
        bench: r.name,
        target: r.target,
        measured: r.measured,
        result: r.target.startsWith('(') ? '—' : r.pass ? 'PASS' : 'FAIL',
        detail: r.detail,
      })),
    );
    console.log(`measured in ${((performance.now() - t) / 1000).toFixed(0)} s`);
    process.exitCode = runs.every((r) => r.pass) ? 0 : 1;
  } finally {
    await stopServer(server);
    await db.destroy();
    if (cluster.startedHere) cluster.stop();
  }
}

main().catch((err: Error) => {
  console.error(err);
  process.exit(1);
});
