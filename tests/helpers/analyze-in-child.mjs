// Child process for tests/server/cli/bad-captures.test.ts: runs the BUILT worker entry
// (dist/node/workers/analysis.js, the code the job runner's pool runs) on each file named on the
// command line, one after another, and prints one JSON line per file — its outcome, the stable
// error code, and this process's resident memory after it — then the peak resident memory.
import { readFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import { pathToFileURL } from 'node:url';

const [root, ...files] = process.argv.slice(2);
const { analyzeFile } = await import(pathToFileURL(join(root, 'dist', 'node', 'workers', 'analysis.js')).href);

function rssMb() {
  const line = readFileSync('/proc/self/status', 'utf8').split('\n').find((l) => l.startsWith('VmRSS:'));
  return line ? Number(line.replace(/\D+/g, '')) / 1024 : process.memoryUsage().rss / 2 ** 20;
}

for (const path of files) {
  let outcome;
  try {
    await analyzeFile({ path, name: basename(path) });
    outcome = { file: basename(path), ok: true, code: null };
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    const m = /^\[([a-z_]+)\] /.exec(message);
    outcome = { file: basename(path), ok: false, code: m ? m[1] : 'untyped', message: message.slice(0, 300) };
  }
  process.stdout.write(`${JSON.stringify({ ...outcome, rssMb: Math.round(rssMb()) })}\n`);
}
process.stdout.write(`${JSON.stringify({ peakRssMb: Math.round(process.resourceUsage().maxRSS / 1024) })}\n`);
