// The architecture rules of eslint.config.mjs fire: each probe file below breaks one rule, is
// written into the tree for the time of the test (the rules read real paths), linted with the
// project's own configuration, and removed.
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

const root = path.resolve(__dirname, '..');
const PROBES: Array<{ file: string; code: string; rule: RegExp }> = [
  {
    file: 'shared/lint-probe.ts',
    code: "import { createApp } from '../server/app';\nexport const probe = createApp;\n",
    rule: /type "server" are not allowed in elements of type "shared"/,
  },
  {
    file: 'src/app/features/run-sheet/run-sheet-job/lint-probe.ts',
    code: "import { createApp } from '../../../../../server/app';\nexport const probe = createApp;\n",
    rule: /type "server" are not allowed in elements of type "app-component"/,
  },
  {
    file: 'src/app/features/run-sheet/lint-probe.ts',
    code: "import { AssignmentCard } from '../board/assignment-card/assignment-card';\nexport const probe = AssignmentCard;\n",
    rule: /type "app-component" and captured values: feature="board"/,
  },
  {
    file: 'server/jobs/lint-probe.ts',
    code: "import { boardRoutes } from '../board/board.routes';\nexport const probe = boardRoutes;\n",
    rule: /feature="board" are not allowed in elements of type "server" and captured values: feature="jobs"/,
  },
  {
    file: 'server/crew/lint-probe.service.ts',
    code: "import knex from 'knex';\nexport const probe = knex;\n",
    rule: /module source "knex"/,
  },
  {
    file: 'server/board/lint-probe-figure.ts',
    code: 'export const probe = (acres: number): string => `${acres.toFixed(1)} ac`;\n',
    rule: /no-restricted-syntax: Write figures with shared\/figures\.ts/,
  },
  {
    file: 'src/app/features/board/lint-probe-figure.ts',
    code: 'export const probe = (hours: number): string => `${hours.toFixed(2)} h`;\n',
    rule: /no-restricted-syntax: Write figures with shared\/figures\.ts/,
  },
  {
    file: 'src/app/features/pass-plan/lint-probe-number-format.ts',
    code: "export const probe = (rate: number): string => `${new Intl.NumberFormat('en-US').format(rate)} ac/h`;\n",
    rule: /no-restricted-syntax: Write figures with shared\/figures\.ts \(figure, formatCount/,
  },
  {
    file: 'shared/schemas/lint-probe-zod.ts',
    code: "import { z } from 'zod';\nexport const probe = z.string();\n",
    rule: /no-restricted-syntax: Import zod as a namespace/,
  },
  {
    file: 'server/crew/lint-probe-promise.ts',
    code: 'async function later(): Promise<void> {}\nexport function probe(): void {\n  later();\n}\n',
    rule: /no-floating-promises/,
  },
];

describe('the lint rules of the architecture', () => {
  it('when a file breaks a boundary, the knex rule, the promise rules or writes a figure with toFixed or a number format of its own, or imports the named z of zod, then eslint fails and names it', () => {
    for (const p of PROBES) fs.writeFileSync(path.join(root, p.file), p.code);
    let out = '';
    try {
      execFileSync(process.execPath, ['node_modules/eslint/bin/eslint.js', '--format', 'json', ...PROBES.map((p) => p.file)], {
        cwd: root,
        stdio: ['ignore', 'pipe', 'ignore'],
        maxBuffer: 16 * 1024 * 1024,
      });
    } catch (err) {
      out = String((err as { stdout?: Buffer }).stdout ?? '');
    } finally {
      for (const p of PROBES) fs.rmSync(path.join(root, p.file), { force: true });
    }
    const results = JSON.parse(out || '[]') as Array<{ filePath: string; messages: Array<{ message: string; ruleId: string | null }> }>;
    for (const p of PROBES) {
      const found = results.find((r) => r.filePath.endsWith(p.file));
      const said = (found?.messages ?? []).map((m) => `${m.ruleId}: ${m.message}`).join('\n');
      expect({ file: p.file, said }).toEqual({ file: p.file, said: expect.stringMatching(p.rule) });
    }
  }, 180_000);
});

describe('figures in templates', () => {
  // Templates are not linted by ESTree selectors: a plain scan keeps toFixed and Angular's number
  // pipe (its own rounding and digits) out of them, so a figure in a template comes from shared/figures.ts.
  it('when the app templates are read, then none writes a figure with toFixed or the number pipe', () => {
    const found: string[] = [];
    const walk = (dir: string): void => {
      for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
        const p = path.join(dir, e.name);
        if (e.isDirectory()) walk(p);
        else if (e.name.endsWith('.html'))
          fs.readFileSync(p, 'utf8')
            .split('\n')
            .forEach((line, i) => {
              if (/\.toFixed\(|\|\s*number\b/.test(line)) found.push(`${path.relative(root, p)}:${i + 1}: ${line.trim()}`);
            });
      }
    };
    walk(path.join(root, 'src'));
    expect(found).toEqual([]);
  });
});
