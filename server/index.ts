import path from 'node:path';
import { createApp } from './app';
import { loadConfig } from './config';
import { createDb } from './db/knex';
import { FakeMailServer } from './mail/fake-smtp';
import { OutboxWorker } from './mail/outbox-worker';
import { createTransport } from './mail/transport';
import { createSessionStore } from './http/session';
import { createLogger, type Logger } from './logging/logger';

/** Set once the configuration is read; before that, failures go to stderr as plain text. */
let logger: Logger | null = null;

async function main(): Promise<void> {
  const config = loadConfig();
  const log = createLogger(config);
  logger = log;
  log.info({ env: config.env, logLevel: config.logLevel }, 'starting');
  const db = createDb(config.databaseUrl);
  const sessions = createSessionStore(config.databaseUrl);

  let fakeMail: FakeMailServer | null = null;
  let mailPort = config.fakeSmtpPort;
  if (!config.smtpUrl) {
    fakeMail = new FakeMailServer(path.resolve(__dirname, '..', '.data', 'mail'));
    mailPort = await fakeMail.start(config.fakeSmtpPort);
    const seen = new Set<unknown>();
    setInterval(() => {
      for (const m of fakeMail!.messages) {
        if (seen.has(m)) continue;
        seen.add(m);
        const links = m.text.match(/https?:\/\/\S+/g) ?? [];
        console.log(`mail caught for ${m.to.join(', ')}: "${m.subject}" ${links.join(' ')}`);
      }
    }, 500).unref();
  }
  const worker = new OutboxWorker(db, createTransport(config.smtpUrl, mailPort), {
    from: config.mailFrom,
    logger: log.child({ worker: 'mail' }),
  });
  worker.start();

  const app = createApp({ config, db, sessions, nudgeMail: () => worker.nudge(), logger: log });
  const server = app.listen(config.port, config.host, () => {
    // Plain text on stdout in every environment and at every LOG_LEVEL: `npm start`, the tests
    // and the benchmarks wait for "listening on".
    console.log(`Furlong API and app listening on http://${config.host}:${config.port}`);
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
      ['the mail worker', () => worker.stop()],
      ['the fake mail server', async () => fakeMail?.stop()],
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

/** Why the process ends: the error's code, stack and cause. */
function describe(err: unknown): string {
  if (!(err instanceof Error)) return String(err);
  const e = err as Error & { code?: string };
  const lines = [`${e.code ? `${e.code} ` : ''}${e.stack ?? e.message}`];
  if (e.cause) lines.push(`caused by: ${describe(e.cause)}`);
  return lines.join('\n');
}

// A failure nothing handled leaves the process in a state nobody planned for: say what it was,
// then end (the supervisor, `npm start` or a service manager, restarts or reports it). Requests'
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
