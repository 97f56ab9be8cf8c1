// Where the project lives on disk, found from this file (works from server/ under tsx and from the
// esbuild bundle in dist/node/…), so .data and dist/client resolve the same either way.
import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

/** The project root: the nearest folder above this module holding package.json and server/. */
export function projectRoot(): string {
  let dir = dirname(fileURLToPath(import.meta.url));
  for (;;) {
    if (existsSync(join(dir, 'package.json')) && existsSync(join(dir, 'server'))) return dir;
    const up = dirname(dir);
    if (up === dir) return process.cwd();
    dir = up;
  }
}

/** `<project>/.data`: git-ignored runtime state (database files, the generated session secret). */
export function dataDir(): string {
  return join(projectRoot(), '.data');
}
