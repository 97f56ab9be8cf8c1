/**
 * `npm run accuracy`: ranking and pipeline accuracy over many seeds of generated captures.
 *
 * Every named scenario of tests/helpers/scenarios.ts (three invented engines, six fault kinds,
 * near-equal ratios, an outer-ring-turning backside idler, a second belt, a cam-driven part, a
 * truly indistinguishable pair, creep to 3 %, SNR to −3 dB, distractors) and the generator's
 * standard and clunk cases for each engine (shared/synth/sweep.ts: every reference kind, speed
 * wander to ±5 %) are generated for seeds 1…N, analysed once by the pipeline with the ranking, and
 * judged twice: the ranking against our targets (planted part first ≥ 95 %, part and fault
 * first ≥ 90 %, part in the top three in all runs, indistinguishable pairs both in the top two
 * naming each other) and the pipeline against our pipeline checks (table of shared/synth/sweep.ts).
 *
 * Flags: --seeds N (default 20), --only TEXT (cases whose name contains it), --no-pipeline-table,
 * --generator today|real (the generator's `realism`: today's settings, or closer to real engines,
 * shared/synth/realism.ts; default today).
 * With --data DIR it scores real recordings instead (scripts/real-recordings.ts): DIR holds WAVs
 * and a truth file in the open-data kit's cwru-dev format (DIR/truth.json, or --truth FILE), read
 * with the drive document --drive FILE (default DIR's *.drive.json, else the checkout's test-rig
 * document); it prints part + fault first by fault kind.
 * A report, not a test: it prints tables and exits 0 unless the arguments are bad.
 */
import { parseArgs } from 'node:util';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseDriveDocument } from '../shared/schemas/drive';
import { readTruth, scoreRecording, summarise, type RecordingVerdict } from './real-recordings';
import { runPipeline } from '../shared/analysis/pipeline';
import { AnalysisSettingsSchema } from '../shared/schemas/analysis-settings';
import { rankCapture } from '../shared/ranking/rank-capture';
import { judgeRanking, type RankingVerdict } from '../shared/ranking/judge-ranking';
import { generateCapture } from '../shared/synth/generate-capture';
import { judgeAccuracy, settingsFromTruth } from '../shared/synth/accuracy';
import { accuracyCasesFor, clunkCasesFor, formatSweepTable, type SweepRow } from '../shared/synth/sweep';
import type { GenerateOptionsInput } from '../shared/synth/options';
import type { DriveDocument } from '../shared/drive/types';
import { drives, scenarios } from '../tests/helpers/scenarios';
import { candidateLines } from '../shared/drive/candidate-lines';
import { patternsCoincide } from '../shared/ranking/indistinguishable';
import type { Fault } from '../shared/drive/types';

interface Case {
  name: string;
  drive: DriveDocument;
  options: Omit<GenerateOptionsInput, 'drive' | 'seed'>;
  indistinguishableFrom: string[];
}

interface Args { seeds: number; only: string | null; pipelineTable: boolean; data: string | null; truth: string | null; drive: string | null; realism: 'today' | 'real' }

function parse(): Args {
  try {
    const { values } = parseArgs({
      options: {
        seeds: { type: 'string', default: '20' }, only: { type: 'string' }, 'no-pipeline-table': { type: 'boolean', default: false },
        data: { type: 'string' }, truth: { type: 'string' }, drive: { type: 'string' }, generator: { type: 'string', default: 'today' },
      },
      allowPositionals: false,
    });
    const seeds = Number(values.seeds);
    if (!Number.isInteger(seeds) || seeds < 1 || seeds > 1000) throw new Error(`--seeds must be a whole number from 1 to 1000, got ${values.seeds}`);
    if (values.generator !== 'today' && values.generator !== 'real') throw new Error(`--generator must be today or real, got ${values.generator}`);
    if (values.data !== undefined && !existsSync(values.data)) throw new Error(`--data ${values.data}: no such folder; give the folder holding the recordings and their truth.json`);
    return {
      seeds, only: values.only ?? null, pipelineTable: !values['no-pipeline-table'],
      data: values.data ?? null, truth: values.truth ?? null, drive: values.drive ?? null, realism: values.generator,
    };
  } catch (error) {
    process.stderr.write(`accuracy: ${(error as Error).message}\n`);
    process.exit(2);
  }
}

/** Parts whose whole line pattern for the fault equals the planted part's (same ratio and bearing). */
function partnersOf(drive: DriveDocument, component: string, fault: Fault): string[] {
  const all = candidateLines(drive);
  const planted = all.find((c) => c.component.toLowerCase() === component.toLowerCase());
  if (!planted || planted.target === 'belt') return [];
  return all.filter((c) => c !== planted && c.target === 'component' && patternsCoincide(planted, c, fault, 1 / 32, 100)).map((c) => c.component);
}

function allCases(): Case[] {
  const out: Case[] = scenarios.map((s) => ({ name: s.name, drive: s.drive, options: s.options, indistinguishableFrom: [...s.indistinguishableFrom] }));
  for (const [label, drive] of Object.entries(drives)) {
    for (const c of [...accuracyCasesFor(drive), ...clunkCasesFor(drive)]) {
      const planted = c.options.fault;
      const partners = planted ? partnersOf(drive, planted.component, planted.fault) : [];
      out.push({ name: `${label}: ${c.name}`, drive, options: { durationS: 6, sampleRateHz: 24000, ...c.options }, indistinguishableFrom: partners });
    }
  }
  return out;
}

const pct = (n: number, d: number): string => (d === 0 ? '—' : `${((100 * n) / d).toFixed(0)} %`);

/** The checkout's drive document of the bearing test rig (the open-data kit's test-rig.drive.json). */
const TEST_RIG_DRIVE = fileURLToPath(new URL('../tests/shared/drive/fixtures/test-rig.drive.json', import.meta.url));

async function scoreData(args: Args): Promise<void> {
  const dir = args.data!;
  const truthPath = args.truth ?? join(dir, 'truth.json');
  const drivePath = args.drive ?? readdirSync(dir).filter((f) => f.endsWith('.drive.json')).map((f) => join(dir, f))[0] ?? TEST_RIG_DRIVE;
  let rows;
  let drive;
  try {
    rows = readTruth(truthPath);
    drive = parseDriveDocument(JSON.parse(readFileSync(drivePath, 'utf8')));
  } catch (e) {
    process.stderr.write(`accuracy: ${(e as Error).message}\n`);
    process.exit(2);
  }
  const verdicts: RecordingVerdict[] = [];
  const t0 = performance.now();
  for (const row of rows) {
    const v = await scoreRecording(dir, row, drive);
    verdicts.push(v);
    const expected = v.kind === 'healthy' ? 'healthy' : `${row.component} / ${row.fault}`;
    const top = v.ranking.slice(0, 3).map((e) => `${e.component} / ${e.fault} ${e.score.toFixed(2)}`).join('; ');
    process.stdout.write(`${v.ok ? 'ok  ' : 'MISS'} ${row.file}: ${expected}; first ${top}\n`);
  }
  process.stdout.write(`\nReal recordings (${rows.length} from ${truthPath}, drive ${drivePath})\n\n${summarise(verdicts).join('\n')}\n`);
  process.stdout.write(`\n${rows.length} recordings in ${((performance.now() - t0) / 1000).toFixed(0)} s\n`);
}

async function main(): Promise<void> {
  const args = parse();
  if (args.data) {
    await scoreData(args);
    return;
  }
  const cases = allCases().filter((c) => !args.only || c.name.includes(args.only));
  if (cases.length === 0) {
    process.stderr.write(`accuracy: no case name contains "${args.only}"\n`);
    process.exit(2);
  }
  const rankingRows: { c: Case; planted: string; verdicts: RankingVerdict[] }[] = [];
  const sweepRows: SweepRow[] = [];
  const t0 = performance.now();
  for (const c of cases) {
    const verdicts: RankingVerdict[] = [];
    let planted = '';
    for (let seed = 1; seed <= args.seeds; seed += 1) {
      const capture = generateCapture({ ...c.options, drive: c.drive, seed, realism: args.realism });
      const fault = capture.truth.fault!;
      planted = `${fault.component} / ${fault.fault}`;
      const settings = AnalysisSettingsSchema.parse(settingsFromTruth(capture.truth));
      const started = performance.now();
      const result = runPipeline({ channels: capture.channels, sampleRateHz: capture.sampleRateHz }, settings, { rank: (input) => rankCapture(c.drive, input) });
      sweepRows.push({ caseName: c.name, seed, outcome: judgeAccuracy(capture.truth, result), pipelineMs: performance.now() - started, warnings: result.warnings.map((w) => w.code) });
      const verdict = judgeRanking(result.ranking, { component: fault.component, fault: fault.fault, indistinguishableFrom: c.indistinguishableFrom });
      verdicts.push(verdict);
      if (!verdict.topPartAndFault) {
        process.stderr.write(`  miss: ${c.name} seed ${seed}: first ${verdict.first?.component} / ${verdict.first?.fault} (${verdict.first?.score}), planted part place ${verdict.partPlace}\n`);
      }
    }
    rankingRows.push({ c, planted, verdicts });
    process.stderr.write(`${c.name}: done (${((performance.now() - t0) / 1000).toFixed(0)} s)\n`);
  }

  const lines = ['scenario | planted part / fault | runs | top-1 part | top-1 part + fault | top-3 part | pair named', '--- | --- | --- | --- | --- | --- | ---'];
  const all = rankingRows.flatMap((r) => r.verdicts);
  for (const { c, planted, verdicts } of rankingRows) {
    const n = verdicts.length;
    const pairs = verdicts.filter((v) => v.pairNamed !== null);
    lines.push(`${c.name} | ${planted} | ${n} | ${pct(verdicts.filter((v) => v.topPart).length, n)} | ${pct(verdicts.filter((v) => v.topPartAndFault).length, n)} | ${pct(verdicts.filter((v) => v.topThreePart).length, n)} | ${pairs.length === 0 ? '—' : pct(pairs.filter((v) => v.pairNamed).length, pairs.length)}`);
  }
  const n = all.length;
  const top1 = all.filter((v) => v.topPart).length;
  const top1f = all.filter((v) => v.topPartAndFault).length;
  const top3 = all.filter((v) => v.topThreePart).length;
  const pairs = all.filter((v) => v.pairNamed !== null);
  const pairsOk = pairs.filter((v) => v.pairNamed).length;
  lines.push(`all | | ${n} | ${pct(top1, n)} | ${pct(top1f, n)} | ${pct(top3, n)} | ${pairs.length === 0 ? '—' : pct(pairsOk, pairs.length)}`);
  const verdict = (ok: boolean) => (ok ? 'met' : 'MISSED');
  process.stdout.write(`\nRanking accuracy (${args.seeds} seeds per case, generator ${args.realism}; our targets)\n\n${lines.join('\n')}\n\n`);
  process.stdout.write(`planted part first ${pct(top1, n)} (target ≥ 95 %: ${verdict(top1 / n >= 0.95)}); part and fault first ${pct(top1f, n)} (target ≥ 90 %: ${verdict(top1f / n >= 0.9)}); `
    + `part in the top three ${pct(top3, n)} (target 100 %: ${verdict(top3 === n)}); pairs named ${pairs.length === 0 ? '—' : pct(pairsOk, pairs.length)} (target 100 %: ${verdict(pairsOk === pairs.length)})\n`);
  if (args.pipelineTable) process.stdout.write(`\nPipeline accuracy on the same runs (our pipeline checks)\n\n${formatSweepTable(sweepRows)}\n`);
  process.stdout.write(`\n${n} runs in ${((performance.now() - t0) / 1000).toFixed(0)} s\n`);
}

void main();
