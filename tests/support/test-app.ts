import type { Express } from 'express';
import type { DestinationStream } from 'pino';
import request from 'supertest';
import { createApp } from '../../server/app';
import { loadConfig, type Config } from '../../server/config';
import { createDb, type Db } from '../../server/db/knex';
import { createSessionStore, type SessionStore } from '../../server/http/session';
import { createLogger } from '../../server/logging/logger';
import { FakeMailServer } from '../../server/mail/fake-smtp';
import { MailWorker } from '../../server/mail/mail-worker';
import { createTransport } from '../../server/mail/transport';
import { FakePaymentServer } from '../../server/payments/fake-payments';
import { FakeForecastServer } from '../../server/weather/fake-forecast';
import { testDatabaseUrl } from './env';

export interface TestApp {
  app: Express;
  db: Db;
  config: Config;
  mail: FakeMailServer;
  worker: MailWorker;
  /** The in-process fake forecast server; `config.weatherUrl` is its address. */
  weather: FakeForecastServer;
  /** The in-process fake payment server; the app's payment SDK is pointed at it. */
  payments: FakePaymentServer;
  sessions: SessionStore;
  /** Everything the app logged (its error handler logs only failures it did not expect). */
  logged: unknown[];
  /** Sends every queued e-mail now. */
  flushMail: () => Promise<number>;
  close: () => Promise<void>;
}

export const TEST_SECRET = 'test-secret-test-secret-test-secret-0123456789';

/**
 * The real app on the test database, with an in-process fake mail server on a free port.
 * `logTo` takes the app's JSON log lines (at LOG_LEVEL, silent unless set in `overrides`).
 */
export async function startTestApp(
  overrides: Partial<NodeJS.ProcessEnv> = {},
  { logTo }: { logTo?: DestinationStream } = {},
): Promise<TestApp> {
  const mail = new FakeMailServer();
  const port = await mail.start(0);
  const weather = new FakeForecastServer();
  await weather.start(0);
  const payments = new FakePaymentServer();
  await payments.start(0);
  const config = loadConfig({
    NODE_ENV: 'test',
    DATABASE_URL: testDatabaseUrl(),
    SESSION_SECRET: TEST_SECRET,
    PUBLIC_URL: 'http://127.0.0.1:3999',
    WEATHER_URL: weather.url,
    FAKE_PAYMENTS_PORT: String(payments.port),
    ...overrides,
  });
  const db = createDb(config.databaseUrl, { min: 0, max: 5 });
  const sessions = createSessionStore(config.databaseUrl, false);
  const worker = new MailWorker(db, createTransport(null, port), { from: config.mailFrom });
  const logged: unknown[] = [];
  const logger = logTo ? createLogger(config, logTo) : undefined;
  // FURLONG_STATIC_DIR: a build of the app made elsewhere (e.g. ng build --output-path), for browser tests.
  const staticDir = process.env.FURLONG_STATIC_DIR;
  const app = createApp({
    config,
    db,
    sessions,
    nudgeMail: () => undefined,
    log: (err) => logged.push(err),
    logger,
    ...(staticDir ? { staticDir } : {}),
  });
  return {
    app,
    db,
    config,
    mail,
    worker,
    weather,
    payments,
    sessions,
    logged,
    flushMail: () => worker.drain(),
    close: async () => {
      await worker.stop();
      await mail.stop();
      await weather.stop();
      await payments.stop();
      await sessions.close();
      await db.destroy();
    },
  };
}

type Agent = ReturnType<typeof request.agent>;

function cookieValue(setCookie: string[] | string | undefined, name: string): string | undefined {
  const list = Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : [];
  for (const c of list) {
    const [pair] = c.split(';');
    const i = pair.indexOf('=');
    if (pair.slice(0, i) === name) return decodeURIComponent(pair.slice(i + 1));
  }
  return undefined;
}

const METHODS = ['get', 'post', 'put', 'patch', 'delete', 'head', 'options'] as const;

/**
 * A browser-like client: keeps cookies and sends the XSRF header the way Angular does. Like a
 * browser, it takes a new XSRF-TOKEN from any answer that sets one (sign-in and sign-out do),
 * also for requests made straight through `agent`.
 */
export class Client {
  readonly agent: Agent;
  xsrf = '';

  constructor(readonly app: Express) {
    this.agent = request.agent(app);
    for (const m of METHODS) {
      const send = this.agent[m].bind(this.agent);
      this.agent[m] = ((url: string) => send(url).on('response', (res: request.Response) => this.take(res))) as Agent[typeof m];
    }
  }

  private take(res: request.Response): void {
    this.xsrf = cookieValue(res.headers['set-cookie'], 'XSRF-TOKEN') ?? this.xsrf;
  }

  /** Fetches the XSRF cookie (any GET under /api sets it). */
  async prime(): Promise<void> {
    await this.agent.get('/api/health');
  }

  get(path: string) {
    return this.agent.get(path);
  }
  post(path: string, body?: object | string) {
    return this.agent
      .post(path)
      .set('X-XSRF-TOKEN', this.xsrf)
      .send(body as object);
  }
  patch(path: string, body?: object) {
    return this.agent.patch(path).set('X-XSRF-TOKEN', this.xsrf).send(body);
  }
  put(path: string, body?: object) {
    return this.agent.put(path).set('X-XSRF-TOKEN', this.xsrf).send(body);
  }
  delete(path: string) {
    return this.agent.delete(path).set('X-XSRF-TOKEN', this.xsrf);
  }

  async signIn(email: string, password: string): Promise<request.Response> {
    if (!this.xsrf) await this.prime();
    const res = await this.post('/api/auth/login', { email, password });
    if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
    return res;
  }
}

export async function signedIn(app: Express, email: string, password: string): Promise<Client> {
  const c = new Client(app);
  await c.signIn(email, password);
  return c;
}

export { cookieValue };
