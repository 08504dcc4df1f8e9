// Cost of the request log line (not a test): node --import tsx scripts/bench-request-log.ts [MODULE ...]
// Express answering 2,000 bytes of JSON through one API-style route, without any request logger
// and with `requestLogger` from server/logging/request-log.ts (or from each MODULE given, to
// compare another version), logging JSON lines at level info to /dev/null as in production.
// Each server runs in a process of its own; autocannon sends 50 connections for 5 s after 2 s
// unmeasured, in two rounds taken in turn (A B A B) so that a drift of the shared machine falls on
// both. Prints requests/s and p95 of each, and each logger's throughput over the no-logger figure.
import { spawn, type ChildProcess } from 'node:child_process';
import { createRequire } from 'node:module';
import net, { type AddressInfo } from 'node:net';
import path from 'node:path';
import type { requestLogger as RequestLogger } from '../server/logging/request-log';

interface CannonResult {
  requests: { total: number };
  errors: number;
  non2xx: number;
}
interface CannonInstance extends Promise<CannonResult> {
  on(event: 'response', fn: (client: unknown, status: number, bytes: number, ms: number) => void): void;
}
// autocannon ships no types; this is the part of its API used here.
const autocannon = createRequire(__filename)('autocannon') as (opts: object) => CannonInstance;

const ROOT = path.resolve(__dirname, '..');
const CONNECTIONS = 50;
const WARM_UP_S = 2;
const DURATION_S = 5;
const ROUNDS = 2;
const NONE = 'none';

/** The server side: `serve MODULE PORT` (MODULE `none` for no request logger). */
async function serve(module: string, port: number): Promise<void> {
  const express = (await import('express')).default;
  const { createLogger } = await import('../server/logging/logger');
  const pino = (await import('pino')).default;
  const app = express();
  if (module !== NONE) {
    const { requestLogger } = (await import(path.resolve(ROOT, module))) as { requestLogger: typeof RequestLogger };
    app.use(requestLogger(createLogger({ env: 'production', logLevel: 'info' }, pino.destination({ dest: '/dev/null', sync: false }))));
  }
  const body = JSON.stringify({ items: 'x'.repeat(1988) });
  const api = express.Router();
  api.get('/board', (_req, res) => {
    res.locals.routePattern = '/api/board';
    res.type('json').send(body);
  });
  app.use('/api', api);
  app.listen(port, '127.0.0.1', () => console.log('listening on', port));
}

async function freePort(): Promise<number> {
  const probe = net.createServer().listen(0, '127.0.0.1');
  await new Promise((r) => probe.once('listening', r));
  const { port } = probe.address() as AddressInfo;
  await new Promise((r) => probe.close(r));
  return port;
}

async function start(module: string): Promise<{ child: ChildProcess; url: string }> {
  const port = await freePort();
  const child = spawn(process.execPath, ['--import', 'tsx', __filename, 'serve', module, String(port)], {
    cwd: ROOT,
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  await new Promise<void>((resolve, reject) => {
    child.once('exit', (code) => reject(new Error(`the server (${module}) exited with ${code}`)));
    child.stdout!.on('data', (c: Buffer) => c.toString().includes('listening on') && resolve());
  });
  return { child, url: `http://127.0.0.1:${port}/api/board` };
}

async function load(url: string, seconds: number): Promise<{ perSecond: number; p95: number; failed: number }> {
  const times: number[] = [];
  const inst = autocannon({ url, connections: CONNECTIONS, duration: seconds });
  inst.on('response', (_c, _s, _b, ms) => times.push(ms));
  const r = await inst;
  times.sort((a, b) => a - b);
  return { perSecond: times.length / seconds, p95: times[Math.ceil(0.95 * times.length) - 1] ?? Number.NaN, failed: r.errors + r.non2xx };
}

async function main(): Promise<void> {
  const modules = [NONE, ...(process.argv.length > 2 ? process.argv.slice(2) : ['server/logging/request-log.ts'])];
  const results = new Map<string, Array<{ perSecond: number; p95: number; failed: number }>>(modules.map((m) => [m, []]));
  for (let round = 0; round < ROUNDS; round++) {
    for (const module of modules) {
      const { child, url } = await start(module);
      try {
        await load(url, WARM_UP_S);
        results.get(module)!.push(await load(url, DURATION_S));
      } finally {
        const exited = new Promise((r) => child.once('exit', r));
        child.kill('SIGTERM');
        await exited;
      }
    }
  }
  const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor((xs.length - 1) / 2)];
  const base = median(results.get(NONE)!.map((r) => r.perSecond));
  console.table(
    modules.map((m) => {
      const rs = results.get(m)!;
      return {
        'request logger': m === NONE ? '(none)' : m,
        'requests/s, each round': rs.map((r) => Math.round(r.perSecond)).join(' / '),
        'p95 ms, each round': rs.map((r) => r.p95.toFixed(1)).join(' / '),
        '× no logger': (median(rs.map((r) => r.perSecond)) / base).toFixed(2),
        errors: rs.reduce((n, r) => n + r.failed, 0),
      };
    }),
  );
}

if (process.argv[2] === 'serve') {
  void serve(process.argv[3], Number(process.argv[4]));
} else {
  main().catch((err: Error) => {
    console.error(err);
    process.exit(1);
  });
}
