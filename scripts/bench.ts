/**
 * `npm run bench`: the analysis pipeline on generated two-channel captures (10 s and 60 s at
 * 48 kHz, 10 s at 200 kHz). For each: the `analyze --json` command as a whole process (wall clock
 * and peak memory, `npm run --silent analyze` and `node dist/node/cli/analyze.js`), and the
 * pipeline's own stage timings (timingsMs, single thread) — medians of several runs, each a fresh
 * process as a real run is. Prints a table and writes docs/performance.md. A benchmark, not a test.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { encodeWav } from '../shared/synth/encode-wav';
import { generateCapture } from '../shared/synth/generate-capture';

interface Case { name: string; durationS: number; sampleRateHz: number; runs: number }
const CASES: Case[] = [
  { name: '10 s, 48 kHz', durationS: 10, sampleRateHz: 48_000, runs: 5 },
  { name: '60 s, 48 kHz', durationS: 60, sampleRateHz: 48_000, runs: 5 },
  { name: '10 s, 200 kHz', durationS: 10, sampleRateHz: 200_000, runs: 3 },
];
const STAGES = ['read', 'speed', 'orders', 'envelope', 'cycle', 'spectrogram', 'peaks', 'ranking', 'total'] as const;
const FLAGS = ['--drive', 'tests/fixtures/drives/fixture-i4-petrol.json', '--ref-kind', 'cyl1', '--cylinders', '4', '--firing-order', '1-3-4-2', '--json'];

const median = (v: number[]) => { const s = [...v].sort((a, b) => a - b); const m = s.length >> 1; return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2; };

/** Runs a command under /usr/bin/time: wall seconds, peak RSS (MB) and stdout. */
function timed(cmd: string, args: string[]): { wallS: number; cpuS: number; peakMb: number; stdout: string } {
  const useTime = existsSync('/usr/bin/time');
  const t0 = performance.now();
  const p = useTime
    ? spawnSync('/usr/bin/time', ['-f', '%M %U %S', cmd, ...args], { encoding: 'utf8', maxBuffer: 64 << 20 })
    : spawnSync(cmd, args, { encoding: 'utf8', maxBuffer: 64 << 20 });
  const wallS = (performance.now() - t0) / 1000;
  if (p.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed: ${p.stderr}`);
  const [kb, user, sys] = useTime ? (p.stderr.trim().split('\n').pop() ?? '').trim().split(' ').map(Number) : [NaN, NaN, NaN];
  return { wallS, cpuS: user + sys, peakMb: kb / 1024, stdout: p.stdout };
}

function main() {
  if (!existsSync('dist/node/cli/analyze.js')) throw new Error('dist/node/cli/analyze.js is missing: run npm run build:node first');
  const drive = JSON.parse(readFileSync('tests/fixtures/drives/fixture-i4-petrol.json', 'utf8'));
  const dir = mkdtempSync(join(tmpdir(), 'cw-bench-'));
  const rows: string[] = [];
  const results: { c: Case; stages: Record<string, number>; npmWall: number; nodeWall: number; nodeCpu: number; peakMb: number; samples: number }[] = [];
  const loadBefore = loadavg()[0];
  try {
    for (const c of CASES) {
      const g = generateCapture({ drive, seed: 11, durationS: c.durationS, sampleRateHz: c.sampleRateHz, fault: { component: 'Alternator', fault: 'outer_race' } });
      const file = join(dir, `bench-${c.durationS}s-${c.sampleRateHz}.wav`);
      writeFileSync(file, encodeWav(g.channels, c.sampleRateHz, 'pcm16'));
      const stageRuns: Record<string, number[]> = Object.fromEntries(STAGES.map((s) => [s, []]));
      const nodeWalls: number[] = [];
      const nodeCpus: number[] = [];
      const peaks: number[] = [];
      for (let r = 0; r < c.runs; r++) {
        const run = timed('node', ['dist/node/cli/analyze.js', file, ...FLAGS]);
        nodeWalls.push(run.wallS);
        nodeCpus.push(run.cpuS);
        peaks.push(run.peakMb);
        const t = JSON.parse(run.stdout).timingsMs as Record<string, number>;
        for (const s of STAGES) stageRuns[s].push(t[s]);
      }
      const npmWalls: number[] = [];
      for (let r = 0; r < c.runs; r++) npmWalls.push(timed('npm', ['run', '--silent', 'analyze', '--', file, ...FLAGS]).wallS);
      const stages = Object.fromEntries(STAGES.map((s) => [s, median(stageRuns[s])]));
      results.push({ c, stages, npmWall: median(npmWalls), nodeWall: median(nodeWalls), nodeCpu: median(nodeCpus), peakMb: Math.max(...peaks), samples: c.durationS * c.sampleRateHz });
      process.stdout.write(`${c.name}: total ${stages.total.toFixed(0)} ms, npm run analyze ${median(npmWalls).toFixed(2)} s\n`);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  const header = `| capture | ${STAGES.join(' | ')} | analyze (npm run) | analyze (node) | analyze CPU | peak memory |`;
  rows.push(header, `|${'---|'.repeat(STAGES.length + 5)}`);
  for (const r of results) {
    rows.push(`| ${r.c.name} | ${STAGES.map((s) => r.stages[s].toFixed(0)).join(' | ')} | ${r.npmWall.toFixed(2)} s | ${r.nodeWall.toFixed(2)} s | ${r.nodeCpu.toFixed(2)} s | ${r.peakMb.toFixed(0)} MB |`);
  }
  const [r10, r60] = results;
  const nlogn = (n: number) => n * Math.log2(n);
  const growth = r60.stages.total / r10.stages.total;
  const bound = nlogn(r60.samples) / nlogn(r10.samples);
  const loadAfter = loadavg()[0];
  const table = rows.join('\n');
  const doc = `# Performance

Measured by \`npm run bench\` (scripts/bench.ts) on ${new Date().toISOString().slice(0, 10)}: generated two-channel 16-bit WAV
captures of the fixture I4 engine (cylinder-1 reference, alternator outer-race fault), analysed with
\`analyze --json --ref-kind cyl1 --cylinders 4 --firing-order 1-3-4-2\`. Stage columns are the
pipeline's own \`timingsMs\` in milliseconds (single thread, one fresh process per run, median of
${CASES.map((c) => c.runs).join('/')} runs); "analyze" columns are whole-process wall clock (median), "analyze CPU" the
process's user + system CPU seconds (median; the better figure when other work shares the cores);
peak memory is the largest resident set of any run (\`/usr/bin/time\`).

Machine: ${cpus().length} × ${cpus()[0]?.model ?? 'CPU'}, Node ${process.version}; 1-minute load average
${loadBefore.toFixed(1)} before and ${loadAfter.toFixed(1)} after the run (other work shared the machine, so wall
clock and stage times include waiting for a core).

${table}

Growth from 10 s to 60 s at 48 kHz: ${growth.toFixed(2)}× in pipeline time, against ${bound.toFixed(2)}× for
n log n (and 6× for linear).

Our targets, for 60 s at 48 kHz, against this run:

| target | measured | met |
|---|---|---|
| \`npm run --silent analyze -- file.wav --json\` ≤ 1.2 s wall clock | ${r60.npmWall.toFixed(2)} s (CPU ${r60.nodeCpu.toFixed(2)} s) | ${r60.npmWall <= 1.2 ? 'yes' : 'no'} |
| \`timingsMs.total\` ≤ 0.6 s | ${(r60.stages.total / 1000).toFixed(2)} s | ${r60.stages.total <= 600 ? 'yes' : 'no'} |
| peak memory ≤ 300 MB | ${r60.peakMb.toFixed(0)} MB | ${r60.peakMb <= 300 ? 'yes' : 'no'} |
| growth 10 s → 60 s no worse than n log n | ${growth.toFixed(2)}× vs ${bound.toFixed(2)}× | ${growth <= bound ? 'yes' : 'no'} |

Much of the time is fixed per process rather than per sample (the 10 s capture costs more than a
sixth of the 60 s one): V8 compiles each hot loop on first use in a one-shot process, and the
envelope band choice (spectral kurtosis over a bounded number of frames plus a quick envelope
spectrum of every candidate band over six blocks) does the same work for any length.

What keeps it fast: each FFT size is planned once per run (a plan cache created at the pipeline's
entry); the pickup is decimated by half-band filters straight from the float32 channel before
anything else; anti-alias filtering is overlap-save in blocks; the envelope spectra of all bands
share one FFT per block, and their blocks stop overlapping once 16 whole blocks fit (the average
is steady by then; the overlap only doubled the 64k-point FFTs); the cycle-normalised spectral
kurtosis keeps its frame powers rather than running a second STFT pass; the high-rate residual has
only the samples per revolution the usable band needs; band choice and the cycle view look at a
bounded number of blocks and cycles; the reference pulse search skips to the next threshold
crossing in one tight loop per polarity; long scans sit in small functions of their own, so V8
compiles them once with type feedback instead of deoptimising them mid-call (the quantile's
interpolation was deoptimised 13 times per run); the CLI is one esbuild bundle that loads only
fft.js and zod from node_modules.
`;
  writeFileSync('docs/performance.md', doc);
  process.stdout.write(`\n${table}\n\ngrowth 10 s → 60 s: ${growth.toFixed(2)}× (n log n: ${bound.toFixed(2)}×); wrote docs/performance.md\n`);
}

main();
