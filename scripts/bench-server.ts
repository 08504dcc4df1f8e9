// Benchmark of the server under load (not a test): node --import tsx scripts/bench-server.ts
// A generated farm of 200 fields with 10 seasons of logs (50,000 finished jobs) in a database of
// its own (furlong_bench on the test cluster, made fresh each run), the real server on a loopback
// port, and autocannon with one signed-in owner's cookie. The server runs as `npm start` runs it:
// compiled (dist/server, built here first when missing or older than the sources), in processes of
// its own, so that autocannon does not share its event loop.
// Printed side by side in one run: the work board (a busy day, 40 jobs) and the fields list (200
// fields) at 20 and 50 connections, with 1 and 2 server processes (WEB_CONCURRENCY), each beside
// bare Express answering the same bytes at the same processes (node:cluster for 2) — the ceiling
// when the load tool, PostgreSQL and the server share the machine's cores; and start-up time and
// resident memory (the process and its children) of the TypeScript-loader run and the compiled
// run, before and after the same load.
// Targets: season summary < 100 ms median for one reader (one connection: a report is opened by a
// person, not a crowd; the 10-connection figure is printed beside it for information); work board
// < 30 ms p95 at 50 connections on one process; no errors. Each measurement lasts 5 s after 2 s
// of the same load unmeasured. Exits 1 when a target is missed.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import http from 'node:http';
import { createRequire } from 'node:module';
import net, { type AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import bcrypt from 'bcryptjs';
import { prepareQueues } from '../server/background/queue';
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
/** Each measurement, after WARM_UP_S of the same load unmeasured (the server's code is compiled hot by then). */
const DURATION_S = 5;
const WARM_UP_S = 2;
const CONNECTIONS = [20, 50];
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
    `insert into pass_plans (farm_id, field_id, operation, width_m, headland_passes, coverage, speed_mps, efficiency, turn_seconds, summary)
     select :farmId, f.id, op, 20, 2, 'gaps-ok', 2.68224 /* 6 mph */, 0.8, 20, jsonb_build_object('hours', round(f.acres / 45, 2), 'fieldAcres', f.acres)
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

interface Measured {
  r: CannonResult;
  times: number[];
  seconds: number;
}

async function measure(url: string, cookie: string, connections: number, seconds = DURATION_S): Promise<Measured> {
  const times: number[] = [];
  // The headers a browser sends with the app's requests: the session cookie and the encodings it takes.
  const inst = autocannon({ url, connections, duration: seconds, headers: { cookie, 'accept-encoding': 'gzip, deflate, br' } });
  inst.on('response', (_c, _status, _bytes, ms) => times.push(ms));
  const r = await inst;
  times.sort((a, b) => a - b);
  return { r, times, seconds };
}

/** The same load unmeasured first (the server's code is compiled hot by then), then measured. */
async function measureWarm(url: string, cookie: string, connections: number): Promise<Measured> {
  await measure(url, cookie, connections, WARM_UP_S);
  return measure(url, cookie, connections);
}

const ms = (n: number) => `${n.toFixed(1)} ms`;
const pct = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)] ?? Number.NaN;
const perSecond = (m: Measured) => m.times.length / m.seconds;
const failures = (m: Measured) => m.r.errors + m.r.timeouts + m.r.non2xx;
const mb = (kb: number) => `${(kb / 1024).toFixed(0)} MB`;

async function freePort(): Promise<number> {
  const probe = net.createServer().listen(0, '127.0.0.1');
  await new Promise((r) => probe.once('listening', r));
  const { port } = probe.address() as AddressInfo;
  await new Promise((r) => probe.close(r));
  return port;
}

/** Resolves once a started server prints that it listens; rejects, with what it printed, if it exits first. */
function listening(child: ChildProcess, name: string): Promise<void> {
  return new Promise<void>((resolve, reject) => {
    let seen = false;
    let said = '';
    child.once('exit', (code) => {
      if (!seen) reject(new Error(`${name} exited with ${code} before listening:\n${said.slice(-4000)}`));
    });
    // The request log lines keep coming on stdout: once the server listens they are read and dropped.
    child.stdout!.on('data', (chunk: Buffer) => {
      if (seen) return;
      said += chunk.toString();
      if (said.includes('listening on')) {
        seen = true;
        said = '';
        resolve();
      }
    });
  });
}

/**
 * Resident memory of a process and all its descendants (the server processes under a cluster
 * primary), in kB: VmRSS of each from /proc (Linux). Threads (compute workers, pino's transport)
 * are part of their process's figure.
 */
function treeRssKb(root: number): number {
  const children = new Map<number, number[]>();
  for (const entry of fs.readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const stat = fs.readFileSync(`/proc/${entry}/stat`, 'utf8');
      // The command name (2nd field) is in parentheses and may hold spaces: the parent id is the 2nd field after it.
      const ppid = Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]);
      children.set(ppid, [...(children.get(ppid) ?? []), Number(entry)]);
    } catch {
      // The process ended while the list was read.
    }
  }
  let total = 0;
  const todo = [root];
  while (todo.length) {
    const pid = todo.pop()!;
    try {
      const m = /VmRSS:\s+(\d+) kB/.exec(fs.readFileSync(`/proc/${pid}/status`, 'utf8'));
      total += m ? Number(m[1]) : 0;
    } catch {
      // Gone.
    }
    todo.push(...(children.get(pid) ?? []));
  }
  return total;
}

const ROOT = path.resolve(__dirname, '..');

/** How the server is started: TypeScript through the tsx loader, or the compiled build (as `npm start` runs it). */
type Build = 'tsx' | 'compiled';
const SERVER_ARGS: Record<Build, string[]> = {
  tsx: ['--import', 'tsx', 'server/index.ts'],
  compiled: ['dist/server/server/index.js'],
};

/** The newest modification time of the files under `dir` that `keep` accepts (0 when there are none). */
function newest(dir: string, keep: (file: string) => boolean): number {
  if (!fs.existsSync(dir)) return 0;
  let t = 0;
  for (const entry of fs.readdirSync(dir, { withFileTypes: true, recursive: true })) {
    const file = path.join(entry.parentPath, entry.name);
    if (entry.isFile() && keep(file)) t = Math.max(t, fs.statSync(file).mtimeMs);
  }
  return t;
}

/** Compiles the server (tsconfig.build.json) when dist/server is missing or older than its sources. */
function ensureBuild(): string {
  const out = path.join(ROOT, 'dist', 'server');
  const sources = Math.max(
    ...['server', 'shared'].map((d) => newest(path.join(ROOT, d), (f) => f.endsWith('.ts') && !f.endsWith('.spec.ts'))),
    fs.statSync(path.join(ROOT, 'tsconfig.build.json')).mtimeMs,
  );
  if (fs.existsSync(path.join(out, 'server', 'index.js')) && newest(out, () => true) >= sources) return 'up to date';
  const t = performance.now();
  const res = spawnSync('npx', ['tsc', '-p', 'tsconfig.build.json'], { cwd: ROOT, stdio: 'inherit' });
  if (res.status !== 0) throw new Error('the server build (npx tsc -p tsconfig.build.json) failed');
  return `built in ${((performance.now() - t) / 1000).toFixed(1)} s`;
}

interface Started {
  child: ChildProcess;
  base: string;
  /** From spawn to "listening on", ms. */
  startMs: number;
}

/** Starts the server on a free loopback port and resolves once it (all its processes) listens. */
async function startServer(databaseUrl: string, build: Build, processes: number): Promise<Started> {
  const port = await freePort();
  const env = {
    ...process.env,
    NODE_ENV: 'development',
    DATABASE_URL: databaseUrl,
    HOST: '127.0.0.1',
    PORT: String(port),
    SESSION_SECRET: 'bench-secret-bench-secret-bench-secret-0123',
    FAKE_SMTP_PORT: '0',
    WEB_CONCURRENCY: String(processes),
  };
  const t = performance.now();
  const child = spawn(process.execPath, SERVER_ARGS[build], { cwd: ROOT, env, stdio: ['ignore', 'pipe', 'inherit'] });
  await listening(child, `the server (${build}, ${processes} process${processes > 1 ? 'es' : ''})`);
  return { child, base: `http://127.0.0.1:${port}`, startMs: performance.now() - t };
}

/**
 * The machine's own ceiling, for reading the server's figures: Express with no middleware at all,
 * answering every request with `bytes` bytes, in a process of its own, or in `processes` processes
 * sharing the port through node:cluster as the server's do.
 */
async function startBareExpress(bytes: number, processes: number): Promise<Started> {
  const port = await freePort();
  // A file, not `node -e`: node:cluster forks the primary's script.
  const file = path.join(os.tmpdir(), `furlong-bench-bare-${process.pid}.cjs`);
  fs.writeFileSync(
    file,
    `const cluster = require('node:cluster');
    if (${processes} > 1 && cluster.isPrimary) {
      let up = 0;
      for (let i = 0; i < ${processes}; i++) cluster.fork().once('listening', () => { if (++up === ${processes}) console.log('listening on ${port}'); });
      process.on('SIGTERM', () => { for (const w of Object.values(cluster.workers)) w.kill(); process.exit(0); });
    } else {
      const express = require(${JSON.stringify(createRequire(__filename).resolve('express'))});
      const body = Buffer.alloc(${bytes}, 120);
      const app = express();
      app.get('/', (_req, res) => { res.type('json').send(body); });
      app.listen(${port}, '127.0.0.1', () => { if (${processes} === 1) console.log('listening on ${port}'); });
    }`,
  );
  const t = performance.now();
  const child = spawn(process.execPath, [file], { cwd: ROOT, stdio: ['ignore', 'pipe', 'inherit'] });
  child.once('exit', () => fs.rmSync(file, { force: true }));
  await listening(child, 'bare Express');
  return { child, base: `http://127.0.0.1:${port}`, startMs: performance.now() - t };
}

async function stopServer(child: ChildProcess | null): Promise<void> {
  if (!child || child.exitCode !== null) return;
  const exited = new Promise((r) => child.once('exit', r));
  child.kill('SIGTERM');
  await exited;
}

/** The bytes of an answer's body as they cross the wire (compressed when the server compresses). */
function wireBytes(url: string, cookie: string): Promise<{ status: number; bytes: number; encoding: string }> {
  return new Promise((resolve, reject) => {
    http
      .get(url, { headers: { cookie, 'accept-encoding': 'gzip, deflate, br' } }, (res) => {
        let bytes = 0;
        res.on('data', (c: Buffer) => (bytes += c.length));
        res.on('end', () =>
          resolve({ status: res.statusCode ?? 0, bytes, encoding: String(res.headers['content-encoding'] ?? 'identity') }),
        );
      })
      .on('error', reject);
  });
}

/** Signs in once, as the browser does (XSRF cookie, then the login with its header); returns the cookie header. */
async function signIn(base: string): Promise<string> {
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
  return [`XSRF-TOKEN=${xsrf}`, sid].join('; ');
}

/** The routes measured side by side, with the bytes each answer takes on the wire. */
interface Route {
  name: string;
  path: string;
  bytes: number;
}

/** One cell of the throughput table: a route, a number of connections, a number of processes. */
interface Cell {
  route: string;
  connections: number;
  processes: number;
  server: Measured;
  bare?: Measured;
}

/** Reads each route once per process (each server process keeps its own caches), unmeasured. */
async function prime(base: string, cookie: string, paths: string[]): Promise<void> {
  for (const p of paths) {
    for (let i = 0; i < 20; i++) {
      const res = await fetch(`${base}${p}`, { headers: { cookie } });
      if (res.status !== 200) throw new Error(`${p} answered ${res.status}: ${(await res.text()).slice(0, 300)}`);
      await res.arrayBuffer();
    }
  }
}

/** Every route at every connection count, on one running server. */
async function matrix(base: string, cookie: string, routes: Route[], processes: number): Promise<Cell[]> {
  const cells: Cell[] = [];
  for (const route of routes) {
    for (const connections of CONNECTIONS) {
      cells.push({ route: route.name, connections, processes, server: await measureWarm(`${base}${route.path}`, cookie, connections) });
    }
  }
  return cells;
}

/** Bare Express answering each route's bytes at each connection count, at `processes` processes. */
async function bareMatrix(cells: Cell[], routes: Route[], processes: number): Promise<void> {
  for (const route of routes) {
    const bare = await startBareExpress(route.bytes, processes);
    try {
      for (const connections of CONNECTIONS) {
        const cell = cells.find((c) => c.route === route.name && c.connections === connections && c.processes === processes)!;
        cell.bare = await measureWarm(bare.base, '', connections);
      }
    } finally {
      await stopServer(bare.child);
    }
  }
}

interface StartUp {
  build: Build;
  startMs: number;
  rssStartKb: number;
  rssLoadKb: number;
  cells: Cell[];
}

async function main(): Promise<void> {
  const cluster = new LocalCluster('pg-test', 54339);
  cluster.start();
  cluster.ensureDatabase('furlong_bench', { fresh: true });
  const url: string = cluster.url('furlong_bench');
  const db = createDb(url);
  let server: ChildProcess | null = null;
  const t0 = performance.now();
  try {
    console.log(`server build: ${ensureBuild()}`);
    await db.migrate.latest(migrationConfig);
    // The background job queues, as scripts/prepare-db.ts makes them for `npm start`.
    await prepareQueues(url);
    let t = performance.now();
    await generate(db);
    const [{ count }] = await db('assignments').where({ state: 'finished' }).count<Array<{ count: number }>>('* as count');
    console.log(
      `generated ${FIELDS} fields, ${SEASONS} seasons, ${count} finished jobs in ${((performance.now() - t) / 1000).toFixed(1)} s`,
    );

    const summaryPath = `/api/season/${LAST_SEASON}/summary`;
    const boardPath = `/api/board?date=${BOARD_DAY}`;
    const fieldsPath = '/api/fields';
    const runs: Run[] = [];
    const cells: Cell[] = [];
    const startUps: StartUp[] = [];
    let routes: Route[] = [];
    t = performance.now();

    // One process, TypeScript loader, then compiled: start-up time and memory before and after the
    // same load (the throughput matrix); the compiled one also takes the targets' runs.
    for (const build of ['tsx', 'compiled'] as const) {
      const started = await startServer(url, build, 1);
      server = started.child;
      const rssStartKb = treeRssKb(server.pid!);
      const cookie = await signIn(started.base);
      await prime(started.base, cookie, [summaryPath, boardPath, fieldsPath]);
      if (!routes.length) {
        const board = await wireBytes(`${started.base}${boardPath}`, cookie);
        const fields = await wireBytes(`${started.base}${fieldsPath}`, cookie);
        const sample = (await (await fetch(`${started.base}${summaryPath}`, { headers: { cookie } })).json()) as {
          totals: { jobsFinished: number };
        };
        const fieldList = (await (await fetch(`${started.base}${fieldsPath}`, { headers: { cookie } })).json()) as unknown[];
        console.log(
          `season ${LAST_SEASON}: ${sample.totals.jobsFinished} finished jobs; board ${BOARD_DAY}: ${board.bytes} bytes (${board.encoding}); ` +
            `fields list: ${fieldList.length} fields, ${fields.bytes} bytes (${fields.encoding})`,
        );
        routes = [
          { name: 'work board', path: boardPath, bytes: board.bytes },
          { name: 'fields list', path: fieldsPath, bytes: fields.bytes },
        ];
      }
      const own = await matrix(started.base, cookie, routes, 1);
      if (build === 'compiled') cells.push(...own);
      startUps.push({ build, startMs: started.startMs, rssStartKb, rssLoadKb: treeRssKb(server.pid!), cells: own });

      if (build === 'compiled') {
        // The cost every signed-in request pays (session, principal, rolling cookie), for reading the rest.
        const floor = await measure(`${started.base}/api/auth/me`, cookie, 1);
        runs.push({
          name: `signed-in floor (GET /api/auth/me), 1 connection, ${DURATION_S} s`,
          target: '(information)',
          measured: `median ${ms(pct(floor.times, 50))}`,
          pass: true,
          detail: `p95 ${ms(pct(floor.times, 95))}, ${floor.r.requests.total} requests`,
        });
        const one = await measure(`${started.base}${summaryPath}`, cookie, 1);
        runs.push({
          name: `season summary, 1 connection, ${DURATION_S} s`,
          target: 'median < 100 ms',
          measured: `median ${ms(pct(one.times, 50))}`,
          pass: pct(one.times, 50) < 100,
          detail: `p95 ${ms(pct(one.times, 95))}, ${one.r.requests.total} requests`,
        });
        const ten = await measure(`${started.base}${summaryPath}`, cookie, 10);
        runs.push({
          name: `season summary, 10 connections, ${DURATION_S} s`,
          target: '(information)',
          measured: `median ${ms(pct(ten.times, 50))}`,
          pass: true,
          detail: `p95 ${ms(pct(ten.times, 95))}, ${ten.r.requests.total} requests`,
        });
        const sErrors = failures(one) + failures(ten);
        runs.push({
          name: 'season summary errors',
          target: '0',
          measured: String(sErrors),
          pass: sErrors === 0,
          detail: 'errors, timeouts and non-2xx answers',
        });
        const b = own.find((c) => c.route === 'work board' && c.connections === 50)!.server;
        runs.push({
          name: `work board for a day, 50 connections, 1 process, ${DURATION_S} s`,
          target: 'p95 < 30 ms',
          measured: `p95 ${ms(pct(b.times, 95))}`,
          pass: pct(b.times, 95) < 30,
          detail: `median ${ms(pct(b.times, 50))}, ${b.r.requests.total} requests`,
        });
      }
      await stopServer(server);
      server = null;
    }

    // Two processes (node:cluster), compiled.
    const two = await startServer(url, 'compiled', 2);
    server = two.child;
    const cookie2 = await signIn(two.base);
    // Each process keeps its own board cache: enough reads that both have built theirs.
    await prime(two.base, cookie2, [boardPath, fieldsPath]);
    cells.push(...(await matrix(two.base, cookie2, routes, 2)));
    await stopServer(server);
    server = null;

    await bareMatrix(cells, routes, 1);
    await bareMatrix(cells, routes, 2);

    const routeErrors = cells.reduce((n, c) => n + failures(c.server), 0);
    runs.push({
      name: 'work board and fields list errors',
      target: '0',
      measured: String(routeErrors),
      pass: routeErrors === 0,
      detail: 'errors, timeouts and non-2xx answers, every run of the table below',
    });

    console.log('\nTargets');
    console.table(
      runs.map((r) => ({
        bench: r.name,
        target: r.target,
        measured: r.measured,
        result: r.target.startsWith('(') ? '—' : r.pass ? 'PASS' : 'FAIL',
        detail: r.detail,
      })),
    );

    console.log(
      `\nThroughput, compiled server (${WARM_UP_S} s warm-up, ${DURATION_S} s measured each); "× bare": the server's figure over ` +
        'bare Express answering the same bytes at the same connections and processes (requests/s: higher is better; p95: lower is better)',
    );
    console.table(
      cells.map((c) => ({
        route: c.route,
        connections: c.connections,
        processes: c.processes,
        'requests/s': Math.round(perSecond(c.server)),
        p95: ms(pct(c.server.times, 95)),
        'bare requests/s': c.bare ? Math.round(perSecond(c.bare)) : '?',
        'bare p95': c.bare ? ms(pct(c.bare.times, 95)) : '?',
        'requests/s × bare': c.bare ? (perSecond(c.server) / perSecond(c.bare)).toFixed(2) : '?',
        'p95 × bare': c.bare ? (pct(c.server.times, 95) / pct(c.bare.times, 95)).toFixed(1) : '?',
      })),
    );

    console.log('\nStart-up and memory, 1 process: TypeScript loader (before) and compiled build (after); the same load for both');
    const at = (s: StartUp, route: string, connections: number) =>
      s.cells.find((c) => c.route === route && c.connections === connections)!.server;
    console.table(
      startUps.map((s) => ({
        run: s.build === 'tsx' ? 'node --import tsx server/index.ts' : 'node dist/server/server/index.js',
        'spawn → listening': ms(s.startMs),
        'RSS after start': mb(s.rssStartKb),
        'RSS after load': mb(s.rssLoadKb),
        'board 50 conn. req/s': Math.round(perSecond(at(s, 'work board', 50))),
        'fields 50 conn. req/s': Math.round(perSecond(at(s, 'fields list', 50))),
      })),
    );
    console.log(
      `measured in ${((performance.now() - t) / 1000).toFixed(0)} s; whole bench ${((performance.now() - t0) / 1000).toFixed(0)} s`,
    );
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
