// `npm start` supervision (scripts/start.mjs through scripts/lib/setup.mjs's Supervisor): whenever
// the web server ends, or the script itself is stopped or fails, PostgreSQL is stopped and the
// reason is printed. A stand-in script (support/supervised.mjs) plays both parts.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { sleep } from './support/fault-cluster';

interface Run {
  output: string;
  code: number | null;
  signal: NodeJS.Signals | null;
  databaseStopped: boolean;
  childAlive: boolean;
}

async function supervise(how: string | undefined, act: (pids: { script: number; child: number }) => void): Promise<Run> {
  const marker = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'furlong-supervise-')), 'stopped');
  const script = spawn(process.execPath, [path.join(__dirname, 'support', 'supervised.mjs'), marker, ...(how ? [how] : [])], {
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  script.stdout.on('data', (b: Buffer) => (output += b.toString()));
  script.stderr.on('data', (b: Buffer) => (output += b.toString()));
  const ended = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    script.on('exit', (code, signal) => resolve({ code, signal })),
  );
  while (!/child (\d+)/.test(output)) await sleep(20);
  const child = Number(/child (\d+)/.exec(output)![1]);
  act({ script: script.pid!, child });
  const { code, signal } = await ended;
  let childAlive = true;
  try {
    process.kill(child, 0);
  } catch {
    childAlive = false;
  }
  if (childAlive) process.kill(child, 'SIGKILL');
  return { output, code, signal, databaseStopped: fs.existsSync(marker), childAlive };
}

describe('npm start supervision', () => {
  it('when the web server is killed by SIGKILL, then PostgreSQL is stopped and the reason printed', async () => {
    const run = await supervise(undefined, ({ child }) => process.kill(child, 'SIGKILL'));
    expect(run.output).toContain('the web server ended: killed by SIGKILL');
    expect(run).toMatchObject({ databaseStopped: true, code: 1 });
  });

  it('when the web server exits with code 3 on its own, then PostgreSQL is stopped and the code printed', async () => {
    const run = await supervise('3', () => undefined);
    expect(run.output).toContain('the web server ended: exited with code 3');
    expect(run).toMatchObject({ databaseStopped: true, code: 3 });
  });

  it.each(['SIGINT', 'SIGTERM', 'SIGHUP'] as const)(
    'when the script gets %s, then the web server and PostgreSQL are stopped',
    async (signal) => {
      const run = await supervise(undefined, ({ script }) => process.kill(script, signal));
      expect(run).toMatchObject({ databaseStopped: true, childAlive: false, code: 0 });
    },
  );

  it('when the script itself fails, then the web server and PostgreSQL are stopped and the error printed', async () => {
    const run = await supervise('throw', () => undefined);
    expect(run.output).toContain('stopping after an unexpected error: Error: something in the supervisor broke');
    expect(run).toMatchObject({ databaseStopped: true, childAlive: false, code: 1 });
  });
});
