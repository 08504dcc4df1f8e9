// `npm start`: install what is missing, run the project-local PostgreSQL, migrate, load the
// demo farm once, build the app and the server, and serve app + API on one origin from the
// compiled server (WEB_CONCURRENCY processes, default: the machine's cores). Ctrl-C stops it all.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { LocalCluster, Supervisor, ensureNodeModules, intEnv, localSecret, log, root, run } from './lib/setup.mjs';

const port = intEnv('PORT', 3080);
const dbPort = intEnv('FURLONG_DB_PORT', 54329);

ensureNodeModules();
const cluster = new LocalCluster('pg-dev', dbPort);
// PostgreSQL is stopped whenever the web server ends, for whatever reason, and when this script
// is stopped or fails.
const supervisor = new Supervisor(() => cluster.stop()).watchThisProcess();

const env = {
  ...process.env,
  NODE_ENV: process.env.NODE_ENV ?? 'development',
  PORT: String(port),
  DATABASE_URL: process.env.DATABASE_URL ?? cluster.url('furlong'),
  SESSION_SECRET: process.env.SESSION_SECRET ?? localSecret('session-secret'),
};

try {
  cluster.start();
  cluster.ensureDatabase('furlong');
  run('node', ['--import', 'tsx', 'scripts/prepare-db.ts'], { env });
  log('building the app…');
  run('npx', ['ng', 'build', '--configuration', 'production'], { env });
  log('building the server…');
  run('node', ['node_modules/typescript/bin/tsc', '-p', 'tsconfig.build.json'], { env });
} catch (err) {
  supervisor.stop(1, err.message);
}

if (!supervisor.stopping) {
  const server = spawn('node', ['dist/server/server/index.js'], { cwd: root, env, stdio: 'inherit' });
  supervisor.adopt(server, 'the web server');
  waitForHealth(`http://127.0.0.1:${port}/api/health`).then(
    () => {
      if (supervisor.stopping) return;
      const accounts = JSON.parse(fs.readFileSync(path.join(root, 'seeds', 'demo-accounts.json'), 'utf8'));
      const lines = accounts.map((a) => `  ${a.role.padEnd(9)} ${a.email.padEnd(34)} ${a.password}`);
      process.stdout.write(
        `\nFurlong is running at http://127.0.0.1:${port}\n\nDemo sign-ins (role, e-mail, password):\n${lines.join('\n')}\n\n` +
          `E-mail is caught by a local fake mail server; each message is saved in .data/mail/.\nPress Ctrl-C to stop the web server and the database.\n\n`,
      );
    },
    (err) => supervisor.stop(1, err.message),
  );
}

async function waitForHealth(url) {
  for (let i = 0; i < 120 && !supervisor.stopping; i++) {
    try {
      const res = await fetch(url);
      if (res.ok) return;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error('the web server did not answer on /api/health');
}
