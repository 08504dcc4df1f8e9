import fs from 'node:fs';
import path from 'node:path';

/**
 * The project's folder (the one with package.json), found from this file whether the server
 * runs from its TypeScript sources (server/) or from the compiled build (dist/server/server/).
 */
function findRoot(from: string): string {
  for (let dir = from; ; dir = path.dirname(dir)) {
    if (fs.existsSync(path.join(dir, 'package.json')) && fs.existsSync(path.join(dir, 'migrations'))) return dir;
    if (path.dirname(dir) === dir) throw new Error(`Furlong's project folder was not found above ${from}`);
  }
}

export const projectRoot = findRoot(__dirname);
