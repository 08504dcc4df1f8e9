// Furlong under several server processes. What one process holds in memory must not outlive a
// change made through another: a sign-out through one is refused at once by every other
// (PostgreSQL LISTEN/NOTIFY, server/http/session.ts), and the sign-in limits count across all
// the processes of one server (node:cluster, the primary keeps the counts).
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { HttpClient, freePort, startServerProcess, type ServerProcess } from '../support/server-process';
import { createDb, type Db } from '../../server/db/knex';
import { testDatabaseUrl } from '../support/env';
import { TEST_SECRET } from '../support/test-app';

const env = { DATABASE_URL: testDatabaseUrl(), SESSION_SECRET: TEST_SECRET };

describe('two server processes on one database', () => {
  let a: ServerProcess;
  let b: ServerProcess;
  let db: Db;
  let farm: TestFarm;

  beforeAll(async () => {
    db = createDb(testDatabaseUrl(), { min: 0, max: 2 });
    farm = await makeFarm(db, 'Processes');
    [a, b] = await Promise.all([startServerProcess(env), startServerProcess(env)]);
  }, 60_000);
  afterAll(async () => {
    await Promise.all([a?.stop(), b?.stop()]);
    await db.destroy();
  });

  it('when a person signs out through one process, then another process that just served their session refuses it at once', async () => {
    const onA = new HttpClient(a.url);
    await onA.signIn(farm.operator.email, farm.operator.password);
    const onB = onA.sameSessionOn(b.url);
    // B reads the session and keeps it for its next requests (SESSION_REUSE_MS, 5 s).
    expect((await onB.request('GET', '/api/auth/me')).status).toBe(200);
    expect((await onB.request('GET', '/api/auth/me')).status).toBe(200);

    expect((await onA.request('POST', '/api/auth/logout')).status).toBe(204);
    // The notification crosses over in milliseconds; a kept copy would answer 200 for 5 s.
    const started = Date.now();
    let status = 200;
    while (status === 200 && Date.now() - started < 1000) {
      status = (await onB.request('GET', '/api/auth/me')).status;
      if (status === 200) await new Promise((r) => setTimeout(r, 25));
    }
    expect(status).toBe(401);
    expect(Date.now() - started).toBeLessThan(1000);
  });
});

/** The ids of the processes whose parent is `pid` (from /proc: field 4 of each stat). */
function childrenOf(pid: number): number[] {
  const out: number[] = [];
  for (const entry of fs.readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const stat = fs.readFileSync(`/proc/${entry}/stat`, 'utf8');
      const ppid = Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]);
      if (ppid === pid) out.push(Number(entry));
    } catch {
      /* the process ended meanwhile */
    }
  }
  return out;
}

/** One request on a connection of its own, so node:cluster hands each to the next process in turn. */
function post(url: string, body: object, headers: Record<string, string>): Promise<{ status: number; setCookie: string[] }> {
  return new Promise((resolve, reject) => {
    const data = JSON.stringify(body);
    const req = http.request(
      url,
      {
        method: 'POST',
        agent: false,
        headers: { 'content-type': 'application/json', 'content-length': Buffer.byteLength(data), ...headers },
      },
      (res) => {
        res.resume();
        res.on('end', () => resolve({ status: res.statusCode ?? 0, setCookie: res.headers['set-cookie'] ?? [] }));
      },
    );
    req.on('error', reject);
    req.end(data);
  });
}

describe('the compiled server with WEB_CONCURRENCY=2, as npm start runs it', () => {
  let server: ServerProcess;
  let db: Db;
  let farm: TestFarm;

  beforeAll(async () => {
    db = createDb(testDatabaseUrl(), { min: 0, max: 2 });
    farm = await makeFarm(db, 'Cluster');
    server = await startServerProcess({ ...env, WEB_CONCURRENCY: '2' }, { compiled: true });
  }, 60_000);
  afterAll(async () => {
    await server?.stop();
    await db.destroy();
  });

  it('when it starts, then it says it runs two server processes, and the primary has two children answering', async () => {
    expect(server.output()).toContain('(2 server processes)');
    expect(childrenOf(server.child.pid!)).toHaveLength(2);
    for (let i = 0; i < 4; i++) {
      const res = await new Promise<http.IncomingMessage>((resolve, reject) =>
        http.get(`${server.url}/api/health`, { agent: false }, resolve).on('error', reject),
      );
      res.resume();
      expect(res.statusCode).toBe(200);
    }
  });

  it('when one account fails to sign in five times over fresh connections, then the sixth is refused whichever process takes it', async () => {
    // The XSRF check needs a token: take one from any GET.
    const primer = new HttpClient(server.url);
    await primer.request('GET', '/api/health');
    const cookie = (primer as unknown as { cookies: Map<string, string> }).cookies;
    const xsrf = decodeURIComponent(cookie.get('XSRF-TOKEN') ?? '');
    const headers = { cookie: [...cookie].map(([k, v]) => `${k}=${v}`).join('; '), 'x-xsrf-token': xsrf };
    const statuses: number[] = [];
    for (let i = 0; i < 6; i++) {
      statuses.push((await post(`${server.url}/api/auth/login`, { email: farm.viewer.email, password: 'wrong-password' }, headers)).status);
    }
    // Per-process counts would allow five per process: the sixth would be a plain 401.
    expect(statuses).toEqual([401, 401, 401, 401, 401, 429]);
  });
});

describe('the server from its sources with WEB_CONCURRENCY=2', () => {
  let server: ServerProcess;
  afterAll(async () => {
    await server?.stop();
  });

  it('when its processes start, then none warns of a listener leak (each builds a dozen sign-in and heavy-work limits counted in the primary)', async () => {
    server = await startServerProcess({ ...env, WEB_CONCURRENCY: '2' });
    expect(server.output()).toContain('(2 server processes)');
    // Both processes have built their routes by now; give their stderr a moment to arrive.
    await new Promise((r) => setTimeout(r, 1000));
    expect(server.output()).not.toContain('MaxListenersExceededWarning');
  }, 60_000);
});

describe('Ctrl-C on the server, as `npm start` runs it', () => {
  // A terminal's Ctrl-C sends SIGINT to every process of the foreground group (the supervisor, the
  // primary and its server processes), and the supervisor (scripts/lib/setup.mjs) then sends
  // SIGTERM: each process gets two signals and must close its pools once, quietly.
  const compiled = path.resolve(__dirname, '..', '..', 'dist', 'server', 'server', 'index.js');
  async function ctrlC(extraEnv: NodeJS.ProcessEnv): Promise<{ code: number | null; signal: NodeJS.Signals | null; output: string }> {
    const port = await freePort();
    // The compiled build, as `npm start` runs it (a step of `npm test` builds it).
    const child = spawn(process.execPath, [compiled], {
      cwd: path.resolve(__dirname, '..', '..'),
      env: {
        ...process.env,
        NODE_ENV: 'test',
        HOST: '127.0.0.1',
        PORT: String(port),
        FAKE_SMTP_PORT: '0',
        LOG_LEVEL: 'info',
        ...env,
        ...extraEnv,
      },
      stdio: ['ignore', 'pipe', 'pipe'],
      // Its own process group, as a terminal gives `npm start`: the signal goes to the whole group.
      detached: true,
    });
    let output = '';
    child.stdout.on('data', (c: Buffer) => (output += c.toString()));
    child.stderr.on('data', (c: Buffer) => (output += c.toString()));
    const ended = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
      child.once('exit', (code, signal) => resolve({ code, signal })),
    );
    const started = Date.now();
    while (!output.includes('listening on') && Date.now() - started < 30_000) await new Promise((r) => setTimeout(r, 50));
    expect(output).toContain('listening on');
    // A request under way keeps a pooled connection busy, as a person's page would.
    await fetch(`http://127.0.0.1:${port}/api/health`);
    process.kill(-child.pid!, 'SIGINT');
    await new Promise((r) => setTimeout(r, 30));
    process.kill(child.pid!, 'SIGTERM');
    const force = setTimeout(() => process.kill(-child.pid!, 'SIGKILL'), 15_000);
    const end = await ended;
    clearTimeout(force);
    return { ...end, output };
  }

  it.each([
    ['one server process', '1'],
    ['two server processes', '2'],
  ])(
    'when the server with %s is sent SIGINT and then SIGTERM, then it stops with code 0 and prints no error',
    async (_what, concurrency) => {
      const run = await ctrlC({ WEB_CONCURRENCY: concurrency });
      expect(run.output).not.toMatch(/Called end on pool more than once|closing .* failed|Unhandled|Error:/);
      expect(run.output).toContain('"exitCode":0');
      expect({ code: run.code, signal: run.signal }).toEqual({ code: 0, signal: null });
    },
    60_000,
  );
});
