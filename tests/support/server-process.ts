import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';

const root = path.resolve(__dirname, '..', '..');

/** A free TCP port on loopback. */
export async function freePort(): Promise<number> {
  const probe = net.createServer().listen(0, '127.0.0.1');
  await new Promise((r) => probe.once('listening', r));
  const port = (probe.address() as net.AddressInfo).port;
  await new Promise((r) => probe.close(r));
  return port;
}

export interface ServerProcess {
  url: string;
  child: ChildProcess;
  /** Resident memory of the whole server process (main thread and worker threads), MB. */
  rssMb(): number;
  /** Everything the server printed. */
  output(): string;
  stop(): Promise<void>;
}

/** The compiled server (`tsc -p tsconfig.build.json`, a step of `npm test` and `npm start`). */
const COMPILED = path.join(root, 'dist', 'server', 'server', 'index.js');

/**
 * The real server as its own process on a free loopback port: from its TypeScript sources, or
 * (`compiled`) the build `npm start` runs.
 */
export async function startServerProcess(env: NodeJS.ProcessEnv, { compiled = false } = {}): Promise<ServerProcess> {
  const port = await freePort();
  if (compiled && !fs.existsSync(COMPILED)) throw new Error(`${COMPILED} is missing: build it with npx tsc -p tsconfig.build.json`);
  const child = spawn(process.execPath, compiled ? [COMPILED] : ['--import', 'tsx', 'server/index.ts'], {
    cwd: root,
    env: { ...process.env, NODE_ENV: 'test', HOST: '127.0.0.1', PORT: String(port), FAKE_SMTP_PORT: '0', WEB_CONCURRENCY: '1', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  child.stdout!.on('data', (c: Buffer) => (out += c.toString()));
  child.stderr!.on('data', (c: Buffer) => (out += c.toString()));
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`the server did not start:\n${out}`)), 30_000);
    child.once('exit', (code) => reject(new Error(`the server exited with ${code} before listening:\n${out}`)));
    const check = () => {
      if (out.includes('listening on')) {
        clearTimeout(timer);
        resolve();
      } else setTimeout(check, 50);
    };
    check();
  });
  return {
    url: `http://127.0.0.1:${port}`,
    child,
    rssMb: () => {
      const status = fs.readFileSync(`/proc/${child.pid}/status`, 'utf8');
      return Number(/VmRSS:\s+(\d+)/.exec(status)?.[1] ?? 0) / 1024;
    },
    output: () => out,
    stop: async () => {
      if (child.exitCode !== null || child.signalCode) return;
      const exited = new Promise((r) => child.once('exit', r));
      child.kill('SIGTERM');
      const force = setTimeout(() => child.kill('SIGKILL'), 8000);
      await exited;
      clearTimeout(force);
    },
  };
}

/** A browser-like client over real HTTP: keeps the session cookie and sends the XSRF header. */
export class HttpClient {
  protected cookies = new Map<string, string>();

  constructor(readonly base: string) {}

  /** A client on another server (another process) with this one's cookies: the same session. */
  sameSessionOn(base: string): HttpClient {
    const other = new HttpClient(base);
    other.cookies = new Map(this.cookies);
    return other;
  }

  private remember(res: Response): void {
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const i = pair.indexOf('=');
      this.cookies.set(pair.slice(0, i), pair.slice(i + 1));
    }
  }

  async request(
    method: string,
    url: string,
    body?: unknown,
    signal?: AbortSignal,
    extraHeaders: Record<string, string> = {},
  ): Promise<{ status: number; body: unknown; ms: number }> {
    const headers: Record<string, string> = { ...extraHeaders, cookie: [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ') };
    const xsrf = this.cookies.get('XSRF-TOKEN');
    if (xsrf) headers['x-xsrf-token'] = decodeURIComponent(xsrf);
    let payload: FormData | string | undefined;
    if (body instanceof FormData) payload = body;
    else if (body !== undefined) {
      headers['content-type'] = 'application/json';
      payload = JSON.stringify(body);
    }
    const started = performance.now();
    const res = await fetch(this.base + url, { method, headers, body: payload, signal });
    const text = await res.text();
    const ms = performance.now() - started;
    this.remember(res);
    let parsed: unknown = text;
    try {
      parsed = JSON.parse(text);
    } catch {
      /* not JSON */
    }
    return { status: res.status, body: parsed, ms };
  }

  async signIn(email: string, password: string): Promise<void> {
    await this.request('GET', '/api/health');
    const res = await this.request('POST', '/api/auth/login', { email, password });
    if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  }
}
