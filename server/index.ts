import cluster, { type Worker } from 'node:cluster';
import path from 'node:path';
import { ClusterMemoryStorePrimary } from '@express-rate-limit/cluster-memory-store';
import PgBoss from 'pg-boss';
import { createApp } from './app';
import { JOB_SCHEMA } from './background/queue';
import { loadConfig, type Config } from './config';
import { createDb } from './db/knex';
import { createSessionStore } from './http/session';
import { createLogger, type Logger } from './logging/logger';
import { FakeMailServer } from './mail/fake-smtp';
import { FakePaymentServer } from './payments/fake-payments';
import { createPaymentService } from './payments/payments.client';
import { MailWorker } from './mail/mail-worker';
import { createTransport } from './mail/transport';
import { projectRoot } from './paths';
import { FakeForecastServer, isScenario } from './weather/fake-forecast';
import { WeatherWorker } from './weather/weather-worker';

// One process, or (WEB_CONCURRENCY > 1) a primary that forks that many server processes sharing
// the port (node:cluster). The primary serves no requests: it runs the local fake mail server,
// keeps the sign-in rate limits for all processes (so N processes do not allow N times the
// attempts), and starts a process again if one ends unexpectedly. The background job workers
// (mail, weather) run in the first server process only.

/** Set once the configuration is read; before that, failures go to stderr as plain text. */
let logger: Logger | null = null;

/** Plain text on stdout in every environment and at every LOG_LEVEL: `npm start`, the tests and the benchmarks wait for it. */
const sayListening = (config: Config, processes: number) =>
  console.log(
    `Furlong API and app listening on http://${config.host}:${config.port}${processes > 1 ? ` (${processes} server processes)` : ''}`,
  );

/** Starts the local fake mail server when no real one is configured; says what it catches. */
async function startFakeMail(config: Config): Promise<FakeMailServer | null> {
  if (config.smtpUrl) return null;
  const fakeMail = new FakeMailServer(path.join(projectRoot, '.data', 'mail'));
  await fakeMail.start(config.fakeSmtpPort);
  const seen = new Set<unknown>();
  setInterval(() => {
    for (const m of fakeMail.messages) {
      if (seen.has(m)) continue;
      seen.add(m);
      const links = m.text.match(/https?:\/\/\S+/g) ?? [];
      console.log(`mail caught for ${m.to.join(', ')}: "${m.subject}" ${links.join(' ')}`);
    }
  }, 500).unref();
  return fakeMail;
}

/** Starts the local fake forecast server when no forecast service is configured. */
async function startFakeWeather(config: Config, log: Logger): Promise<FakeForecastServer | null> {
  if (config.weatherUrl) return null;
  const fake = new FakeForecastServer();
  if (isScenario(config.fakeWeatherScenario)) fake.scenario = config.fakeWeatherScenario;
  await fake.start(config.fakeWeatherPort);
  log.info({ port: fake.port, scenario: fake.scenario }, 'local fake forecast server started (WEATHER_URL is unset)');
  return fake;
}

/**
 * Starts the local fake payment server when no payment service is configured. Its events go to
 * this server's webhook on loopback, signed as the service signs them.
 */
async function startFakePayments(config: Config, log: Logger): Promise<FakePaymentServer | null> {
  if (config.paymentSecretKey) return null;
  const fake = new FakePaymentServer();
  await fake.start(config.fakePaymentsPort);
  const host = config.host === '0.0.0.0' || config.host === '::' ? '127.0.0.1' : config.host;
  fake.webhookUrl = `http://${host}:${config.port}/api/payments/webhook`;
  log.info({ port: fake.port }, 'local fake payment server started (STRIPE_SECRET_KEY is unset)');
  return fake;
}

/** The forecast endpoint: WEATHER_URL, or the local fake's on FAKE_WEATHER_PORT. */
const weatherUrlOf = (config: Config, fake: FakeForecastServer | null): string =>
  config.weatherUrl ?? `http://127.0.0.1:${fake?.port ?? config.fakeWeatherPort}/v1/forecast`;

async function primary(config: Config, log: Logger): Promise<void> {
  log.info({ env: config.env, logLevel: config.logLevel, processes: config.webConcurrency }, 'starting');
  new ClusterMemoryStorePrimary().init();
  const fakeMail = await startFakeMail(config);
  const fakeWeather = await startFakeWeather(config, log);
  const fakePayments = await startFakePayments(config, log);
  const env = {
    FAKE_SMTP_PORT: String(fakeMail?.port ?? config.fakeSmtpPort),
    FAKE_WEATHER_PORT: String(fakeWeather?.port ?? config.fakeWeatherPort),
    FAKE_PAYMENTS_PORT: String(fakePayments?.port ?? config.fakePaymentsPort),
  };
  let stopping = false;
  let listening = 0;
  const restarts: number[] = [];
  const fork = (background: boolean): Worker => {
    const worker = cluster.fork({ ...env, FURLONG_BACKGROUND: background ? '1' : '0' });
    worker.once('listening', () => {
      if (++listening === config.webConcurrency) sayListening(config, config.webConcurrency);
    });
    worker.once('exit', (code, signal) => {
      if (stopping) return;
      // A process that keeps ending at once (bad configuration, database gone) is not restarted
      // forever: five ends within a minute stop everything with the reason in the log.
      const now = Date.now();
      restarts.push(now);
      while (restarts.length && restarts[0] < now - 60_000) restarts.shift();
      log.error({ pid: worker.process.pid, code, signal }, 'a server process ended; starting another');
      if (restarts.length >= 5) {
        fatal('server processes keep ending; stopping', `last: code ${code}, signal ${signal}`);
        void shutdown(1);
        return;
      }
      fork(background);
    });
    return worker;
  };
  for (let i = 0; i < config.webConcurrency; i++) fork(i === 0);

  const shutdown = async (code = 0) => {
    if (stopping) return;
    stopping = true;
    log.info('shutting down the server processes');
    const workers = Object.values(cluster.workers ?? {}).filter((w): w is Worker => !!w);
    await Promise.all(
      workers.map(
        (w) =>
          new Promise<void>((resolve) => {
            if (w.isDead()) return resolve();
            w.once('exit', () => resolve());
            w.process.kill('SIGTERM');
          }),
      ),
    );
    await fakeMail?.stop().catch(() => undefined);
    await fakeWeather?.stop().catch(() => undefined);
    await fakePayments?.stop().catch(() => undefined);
    log.info({ exitCode: code }, 'stopped');
    process.exit(code);
  };
  process.on('SIGTERM', () => void shutdown());
  process.on('SIGINT', () => void shutdown());
}

/** One server process: the app on the port, and (when `background`) the job workers. */
async function serve(config: Config, log: Logger, { background, single }: { background: boolean; single: boolean }): Promise<void> {
  if (single) log.info({ env: config.env, logLevel: config.logLevel }, 'starting');
  const db = createDb(config.databaseUrl);
  const sessions = createSessionStore(config.databaseUrl);
  const fakeMail = single ? await startFakeMail(config) : null;
  const fakeWeather = single ? await startFakeWeather(config, log) : null;
  const fakePayments = single ? await startFakePayments(config, log) : null;

  let boss: PgBoss | null = null;
  let mail: MailWorker | null = null;
  let weather: WeatherWorker | null = null;
  if (background) {
    // pg-boss's own upkeep: expiring jobs whose worker died, archiving, deleting old ones.
    // Failed jobs stay 30 days where the owner's list finds them.
    boss = new PgBoss({
      connectionString: config.databaseUrl,
      schema: JOB_SCHEMA,
      max: 2,
      migrate: false,
      schedule: false,
      maintenanceIntervalSeconds: 60,
      archiveFailedAfterSeconds: 30 * 86_400,
    });
    boss.on('error', (err: Error) => log.warn({ error: err.message }, 'background job upkeep failed; it is tried again'));
    await boss.start();
    mail = new MailWorker(db, createTransport(config.smtpUrl, fakeMail?.port ?? config.fakeSmtpPort), {
      from: config.mailFrom,
      logger: log.child({ worker: 'mail' }),
    });
    mail.start();
    weather = new WeatherWorker(db, { url: weatherUrlOf(config, fakeWeather), logger: log.child({ worker: 'weather' }) });
    weather.start();
  }

  const payments = createPaymentService({ ...config, fakePaymentsPort: fakePayments?.port ?? config.fakePaymentsPort });
  const app = createApp({ config, db, sessions, payments, nudgeMail: () => mail?.nudge(), logger: log });
  const server = app.listen(config.port, config.host, () => {
    if (single) sayListening(config, 1);
    else log.info({ background }, 'server process listening');
  });

  // Ctrl-C under `npm start` reaches this process twice (the terminal's SIGINT, then the
  // supervisor's SIGTERM): the second signal must not close the pools a second time.
  let stopping = false;
  const shutdown = async () => {
    if (stopping) return;
    stopping = true;
    log.info('shutting down: finishing the requests under way');
    // Let requests under way finish (idle keep-alive sockets close now), then close the rest.
    const closed = new Promise((r) => server.close(r));
    server.closeIdleConnections();
    const force = setTimeout(() => server.closeAllConnections(), 5000);
    await closed;
    clearTimeout(force);
    let code = 0;
    for (const [what, close] of [
      ['the mail worker', async () => mail?.stop()],
      ['the weather worker', async () => weather?.stop()],
      ['the background job upkeep', async () => boss?.stop({ graceful: false, wait: true })],
      ['the fake mail server', async () => fakeMail?.stop()],
      ['the fake forecast server', async () => fakeWeather?.stop()],
      ['the fake payment server', async () => fakePayments?.stop()],
      ['the sessions pool', () => sessions.close()],
      ['the database pool', () => db.destroy()],
    ] as const) {
      try {
        await close();
      } catch (err) {
        log.error({ error: err instanceof Error ? err.message : String(err) }, `closing ${what} failed`);
        code = 1;
      }
    }
    log.info({ exitCode: code }, 'stopped');
    process.exit(code);
  };
  process.on('SIGTERM', () => void shutdown());
  process.on('SIGINT', () => void shutdown());
}

async function main(): Promise<void> {
  const config = loadConfig();
  const log = createLogger(config);
  logger = log;
  if (cluster.isWorker) {
    await serve(config, log.child({ pid: process.pid }), { background: process.env.FURLONG_BACKGROUND === '1', single: false });
  } else if (config.webConcurrency > 1) {
    await primary(config, log);
  } else {
    await serve(config, log, { background: true, single: true });
  }
}

/** Why the process ends: the error's code, stack and cause. */
function describe(err: unknown): string {
  if (!(err instanceof Error)) return String(err);
  const e = err as Error & { code?: string };
  const lines = [`${e.code ? `${e.code} ` : ''}${e.stack ?? e.message}`];
  if (e.cause) lines.push(`caused by: ${describe(e.cause)}`);
  return lines.join('\n');
}

// A failure nothing handled leaves the process in a state nobody planned for: say what it was,
// then end (the primary, `npm start` or a service manager, restarts or reports it). Requests'
// own failures never get here: Express 5 passes a rejected handler to the error handler.
process.on('uncaughtException', (err, origin) => {
  fatal(`the server stops after an unexpected error (${origin})`, describe(err));
  process.exit(1);
});
process.on('unhandledRejection', (reason) => {
  fatal('the server stops after an unexpected error (unhandled rejection)', describe(reason));
  process.exit(1);
});

main().catch((err: unknown) => {
  fatal('the server could not start', err instanceof Error ? err.message : String(err));
  process.exit(1);
});

/**
 * The last words of the process. Through the logger when it is there and not silenced; otherwise
 * on stderr as before, so a crash is never lost (tests run with LOG_LEVEL silent). pino writes
 * what it holds before the process exits.
 */
function fatal(what: string, detail: string): void {
  if (logger?.isLevelEnabled('fatal')) logger.fatal({ detail }, what);
  else console.error(`furlong: ${what}:\n${detail}`);
}
