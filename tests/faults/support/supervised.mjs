// A stand-in for `npm start` (scripts/start.mjs) with the same Supervisor: the child plays the
// web server, and writing the marker file plays stopping PostgreSQL.
//   node supervised.mjs <marker> [child exit code after 300 ms | "throw"]
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import { Supervisor } from '../../../scripts/lib/setup.mjs';

const [marker, how] = process.argv.slice(2);
const supervisor = new Supervisor(() => fs.writeFileSync(marker, 'database stopped'), { graceMs: 2000 }).watchThisProcess();
const exitAfter = how && how !== 'throw' ? `setTimeout(() => process.exit(${Number(how)}), 300);` : '';
const child = spawn(process.execPath, ['-e', `process.on('SIGTERM', () => process.exit(0)); setInterval(() => {}, 1000); ${exitAfter}`], {
  stdio: 'ignore',
});
supervisor.adopt(child, 'the web server');
process.stdout.write(`child ${child.pid}\n`);
if (how === 'throw')
  setTimeout(() => {
    throw new Error('something in the supervisor broke');
  }, 300);
