import path from 'node:path';
import { createApp } from './app';
import { loadConfig } from './config';
import { createDb } from './db/knex';
import { FakeMailServer } from './mail/fake-smtp';
import { OutboxWorker } from './mail/outbox-worker';
import { createTransport } from './mail/transport';
import { createSessionStore } from './http/session';

async function main(): Promise<void> {
  const config = loadConfig();
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
  const worker = new OutboxWorker(db, createTransport(config.smtpUrl, mailPort), { from: config.mailFrom });
  worker.start();

  const app = createApp({ config, db, sessions, nudgeMail: () => worker.nudge() });
  const server = app.listen(config.port, config.host, () => {
    console.log(`Furlong API and app listening on http://${config.host}:${config.port}`);
  });

  const shutdown = async () => {
    // Let requests under way finish (idle keep-alive sockets close now), then close the rest.
    const closed = new Promise((r) => server.close(r));
    server.closeIdleConnections();
    const force = setTimeout(() => server.closeAllConnections(), 5000);
    await closed;
    clearTimeout(force);
    await worker.stop();
    await fakeMail?.stop();
    await sessions.close();
    await db.destroy();
    process.exit(0);
  };
  process.once('SIGTERM', () => void shutdown());
  process.once('SIGINT', () => void shutdown());
}

main().catch((err: Error) => {
  console.error(err.message);
  process.exit(1);
});
