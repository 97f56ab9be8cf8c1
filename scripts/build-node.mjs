// Bundles the Node-side entry points (CLI, piscina worker, server, job runner, start script)
// into dist/node with esbuild. Node 20 cannot load .ts in worker threads, so the piscina pool
// loads the built worker; the CLI runs built JavaScript so that a whole `analyze` process starts fast.
// node_modules stay external: only the project's own code is bundled.
import { build } from 'esbuild';
import { existsSync } from 'node:fs';

const entries = {
  'cli/analyze': 'server/cli/analyze.ts',
  'workers/analysis': 'workers/analysis.ts',
  'server/index': 'server/index.ts',
  'server/jobs/runner': 'server/jobs/runner.ts',
  'scripts/start': 'scripts/start.ts',
};
const entryPoints = Object.fromEntries(Object.entries(entries).filter(([, src]) => existsSync(src)));
if (Object.keys(entryPoints).length > 0) {
  await build({
    entryPoints,
    outdir: 'dist/node',
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    packages: 'external',
    sourcemap: true,
    logLevel: 'warning',
  });
}
