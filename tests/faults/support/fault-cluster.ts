import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import net from 'node:net';
import path from 'node:path';

/**
 * The PostgreSQL cluster the fault tests may stop and start: its own, set up by
 * `npm test -- faults` (scripts/test.mjs), never the one other tests use.
 */
export interface FaultCluster {
  url: string;
  bin: string;
  dir: string;
  log: string;
  options: string;
}

export function faultCluster(): FaultCluster {
  const env = process.env;
  const missing = ['FAULT_DATABASE_URL', 'FAULT_PG_BIN', 'FAULT_PG_DIR', 'FAULT_PG_LOG', 'FAULT_PG_OPTIONS'].filter((k) => !env[k]);
  if (missing.length) throw new Error(`${missing.join(', ')} not set: run the fault tests with \`npm test -- faults\``);
  return {
    url: env.FAULT_DATABASE_URL!,
    bin: env.FAULT_PG_BIN!,
    dir: env.FAULT_PG_DIR!,
    log: env.FAULT_PG_LOG!,
    options: env.FAULT_PG_OPTIONS!,
  };
}

function pgCtl(c: FaultCluster, args: string[]): void {
  execFileSync('runuser', ['-u', 'postgres', '--', path.join(c.bin, 'pg_ctl'), ...args], { stdio: 'pipe' });
}

/** Stops PostgreSQL the way an administrator's restart does: connections end with 57P01. */
export function stopPostgres(c: FaultCluster): void {
  pgCtl(c, ['stop', '-w', '-m', 'fast', '-D', c.dir]);
}

export function startPostgres(c: FaultCluster): void {
  pgCtl(c, ['start', '-w', '-t', '60', '-D', c.dir, '-l', c.log, '-o', c.options]);
}

export function isPostgresRunning(c: FaultCluster): boolean {
  try {
    pgCtl(c, ['status', '-D', c.dir]);
    return true;
  } catch {
    return false;
  }
}

export async function freePort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as net.AddressInfo;
  await new Promise((resolve) => server.close(resolve));
  return port;
}

export const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** The real server (`server/index.ts`) in its own process, as `npm start` runs it. */
export class ServerProcess {
  output = '';
  exit: { code: number | null; signal: NodeJS.Signals | null } | null = null;
  private constructor(
    readonly child: ChildProcess,
    readonly port: number,
  ) {}

  static async start(databaseUrl: string, secret: string): Promise<ServerProcess> {
    const port = await freePort();
    const root = path.resolve(__dirname, '..', '..', '..');
    const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
      cwd: root,
      env: {
        ...process.env,
        NODE_ENV: 'test',
        PORT: String(port),
        HOST: '127.0.0.1',
        DATABASE_URL: databaseUrl,
        SESSION_SECRET: secret,
        FAKE_SMTP_PORT: '0',
        WEB_CONCURRENCY: '1',
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    const s = new ServerProcess(child, port);
    child.stdout!.on('data', (b: Buffer) => (s.output += b.toString()));
    child.stderr!.on('data', (b: Buffer) => (s.output += b.toString()));
    child.on('exit', (code, signal) => (s.exit = { code, signal }));
    const deadline = Date.now() + 60_000;
    while (!s.output.includes('listening on')) {
      if (s.exit) throw new Error(`the server ended before listening: ${JSON.stringify(s.exit)}\n${s.output}`);
      if (Date.now() > deadline) throw new Error(`the server did not start:\n${s.output}`);
      await sleep(100);
    }
    return s;
  }

  get base(): string {
    return `http://127.0.0.1:${this.port}`;
  }

  async stop(): Promise<void> {
    if (this.exit) return;
    const ended = new Promise((resolve) => this.child.once('exit', resolve));
    this.child.kill('SIGTERM');
    await ended;
  }
}

/** A browser-like client over real HTTP: keeps its cookies and sends the XSRF header. */
export class HttpClient {
  private cookies = new Map<string, string>();

  constructor(private readonly base: string) {}

  private remember(res: Response): void {
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const i = pair.indexOf('=');
      this.cookies.set(pair.slice(0, i), decodeURIComponent(pair.slice(i + 1)));
    }
  }

  async request(method: string, url: string, body?: object | FormData): Promise<{ status: number; body: unknown }> {
    const headers: Record<string, string> = {
      cookie: [...this.cookies].map(([k, v]) => `${k}=${encodeURIComponent(v)}`).join('; '),
      'x-xsrf-token': this.cookies.get('XSRF-TOKEN') ?? '',
    };
    let payload: string | FormData | undefined;
    if (body instanceof FormData) payload = body;
    else if (body) {
      headers['content-type'] = 'application/json';
      payload = JSON.stringify(body);
    }
    const res = await fetch(this.base + url, { method, headers, body: payload });
    this.remember(res);
    const text = await res.text();
    let parsed: unknown = text;
    try {
      parsed = JSON.parse(text);
    } catch {
      /* not JSON */
    }
    return { status: res.status, body: parsed };
  }

  async signIn(email: string, password: string): Promise<void> {
    await this.request('GET', '/api/health');
    const res = await this.request('POST', '/api/auth/login', { email, password });
    if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`);
  }
}
