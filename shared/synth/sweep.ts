/**
 * The accuracy sweep: generated captures of one drive over every reference kind and several seeds,
 * each run through the pipeline and judged by `judgeAccuracy`. `npm test` runs a few seeds of
 * short captures; `npm run accuracy` (scripts/accuracy.ts) calls `runAccuracySweep` with more
 * seeds and prints `formatSweepTable`. Pure apart from `performance.now()` timings.
 */
import type { ComponentSpec, DriveDocument } from '../drive/types';
import { runPipeline } from '../analysis/pipeline';
import { AnalysisSettingsSchema } from '../schemas/analysis-settings';
import { generateCapture } from './generate-capture';
import type { GenerateOptionsInput } from './options';
import { judgeAccuracy, settingsFromTruth, type AccuracyOutcome } from './accuracy';
import { encodeWav } from './encode-wav';
import { encodeCsv } from './encode-csv';
import { parseCaptureBytes } from '../formats/parse-capture-stream';

/** One named capture recipe of the sweep (the seed and drive come from the sweep). */
export interface AccuracyCase {
  name: string;
  options: Omit<GenerateOptionsInput, 'drive' | 'seed'>;
  /**
   * How the capture reaches the pipeline: in memory (default), or written as a 16-bit WAV
   * (channels scaled to 0.9 of full scale) or a scope-style CSV and read back by shared/formats.
   */
  via?: 'memory' | 'wav16' | 'csv';
}

/** Channels as the pipeline would get them after writing and reading the capture file. */
function throughFile(channels: Float32Array[], sampleRateHz: number, via: 'wav16' | 'csv'): { channels: Float32Array[]; sampleRateHz: number } {
  const bytes = via === 'wav16'
    ? encodeWav(channels.map((c) => {
      let peak = 0;
      for (let i = 0; i < c.length; i++) peak = Math.max(peak, Math.abs(c[i]));
      return Float32Array.from(c, (x) => (peak > 0 ? (0.9 * x) / peak : x));
    }), sampleRateHz, 'pcm16')
    : new TextEncoder().encode(encodeCsv(channels, sampleRateHz, { timeUnit: 'ms', preamble: ['generated capture'], separator: ';', decimalComma: true }));
  const capture = parseCaptureBytes(bytes, { name: via === 'wav16' ? 'generated.wav' : 'generated.csv' });
  return { channels: capture.channels, sampleRateHz: capture.sampleRateHz };
}

function pick(drive: DriveDocument, test: (c: ComponentSpec) => boolean, fallbackIndex: number): string {
  const parts = drive.components.filter((c) => c.kind !== 'crankshaft');
  if (parts.length === 0) throw new RangeError(`drive "${drive.name}" has no parts besides the crankshaft to plant a fault in`);
  return (parts.find(test) ?? parts[fallbackIndex % parts.length]).name;
}

/**
 * The standard cases for a drive: each reference kind once (cylinder-1 pulse, wasted spark with
 * and without the other-polarity exhaust spark, one per cylinder with a cam channel, 60-2 VR and
 * 36-1 Hall wheels, a generic 3 per cycle), speed wander 2–5 %, SNR −3 to +3 dB, creep 0.5–3 %,
 * faults of every kind spread over the drive's parts; one case goes through a 16-bit WAV file and
 * one through a scope-style CSV. No distractors: those are in `distractorCasesFor`.
 */
export function accuracyCasesFor(drive: DriveDocument): AccuracyCase[] {
  const alternator = pick(drive, (c) => c.kind === 'alternator', 0);
  const pump = pick(drive, (c) => c.kind === 'water_pump', 1);
  const outerRing = pick(drive, (c) => c.bearing?.rotatingRing === 'outer', 2);
  const shaftPart = pick(drive, (c) => c.kind === 'power_steering' || c.kind === 'ac_compressor', 3);
  const belt = drive.belts[0]?.name;
  const cases: AccuracyCase[] = [
    { name: 'cyl1 · outer race · −3 dB · ±5 %', options: { refKind: 'cyl1', tdcOffsetDeg: 8, wanderPct: 5, snrDb: -3, creepPct: 1, fault: { component: alternator, fault: 'outer_race' } } },
    { name: 'per-rev · inner race · 0 dB', options: { refKind: 'per-rev', tdcOffsetDeg: 10, wanderPct: 3, snrDb: 0, creepPct: 2, fault: { component: pump, fault: 'inner_race' } } },
    { name: 'per-rev inverted wasted spark · ball · +3 dB', options: { refKind: 'per-rev', wastedSparkInverted: true, wanderPct: 2, snrDb: 3, creepPct: 1, fault: { component: alternator, fault: 'ball' } } },
    { name: 'per-cylinder + cam · idler outer race · −3 dB · 16-bit WAV', via: 'wav16', options: { refKind: 'per-cylinder', camChannel: true, wanderPct: 2, snrDb: -3, creepPct: 1.5, fault: { component: outerRing, fault: 'outer_race' } } },
    { name: 'wheel 60-2 VR · shaft · −3 dB · ±5 %', options: { refKind: 'wheel', wheel: '60-2', tdcOffsetDeg: 84, wanderPct: 5, snrDb: -3, creepPct: 3, fault: { component: shaftPart, fault: 'shaft' } } },
    { name: 'wheel 36-1 Hall + cam · cage · 0 dB', options: { refKind: 'wheel', wheel: '36-1', wheelSensor: 'hall', camChannel: true, tdcOffsetDeg: 60, wanderPct: 3, snrDb: 0, creepPct: 0.5, fault: { component: outerRing, fault: 'cage' } } },
  ];
  if (belt) {
    cases.push({ name: '3 per cycle · belt · +3 dB · CSV (ms, decimal comma)', via: 'csv', options: { refKind: 'cyl1', refPerCycle: 3, wanderPct: 3, snrDb: 3, creepPct: 1, fault: { component: belt, fault: 'belt' } } });
  }
  return cases;
}

/**
 * Harder cases for `npm run accuracy`: random clunks louder than the fault. Spectral kurtosis
 * prefers the clunks' band, so the fault may show only in the second or third envelope band
 * (reported as `anyBandRank`).
 */
export function clunkCasesFor(drive: DriveDocument): AccuracyCase[] {
  const alternator = pick(drive, (c) => c.kind === 'alternator', 0);
  const outerRing = pick(drive, (c) => c.bearing?.rotatingRing === 'outer', 2);
  return [
    { name: 'cyl1 · outer race · 0 dB · clunks', options: { refKind: 'cyl1', wanderPct: 3, snrDb: 0, creepPct: 1, fault: { component: alternator, fault: 'outer_race' }, distractor: { kind: 'clunk' } } },
    { name: 'wheel 36-1 Hall + cam · cage · 0 dB · clunks', options: { refKind: 'wheel', wheel: '36-1', wheelSensor: 'hall', camChannel: true, tdcOffsetDeg: 60, wanderPct: 3, snrDb: 0, creepPct: 0.5, fault: { component: outerRing, fault: 'cage' }, distractor: { kind: 'clunk' } } },
  ];
}

/**
 * Cases with an impulsive distractor as loud as the fault (a tick train at an order no part has)
 * or louder (random clunks): `clunkCasesFor` plus a tick-train case. The automatic envelope band
 * may then go to the distractor, leaving the fault to the second or third band (`anyBandRank`).
 */
export function distractorCasesFor(drive: DriveDocument): AccuracyCase[] {
  const pump = pick(drive, (c) => c.kind === 'water_pump', 1);
  return [
    { name: 'per-rev · inner race · 0 dB · tick train', options: { refKind: 'per-rev', tdcOffsetDeg: 10, wanderPct: 3, snrDb: 0, creepPct: 2, fault: { component: pump, fault: 'inner_race' }, distractor: { kind: 'tick-train' } } },
    ...clunkCasesFor(drive),
  ];
}

/** One judged run. */
export interface SweepRow {
  caseName: string;
  seed: number;
  outcome: AccuracyOutcome;
  /** Pipeline time for the run, ms (informational, never asserted). */
  pipelineMs: number;
  warnings: string[];
}

/** Inputs of `runAccuracySweep`. */
export interface SweepOptions {
  drive: DriveDocument;
  seeds: readonly number[];
  cases?: readonly AccuracyCase[];
  durationS?: number;
  sampleRateHz?: number;
  /** Called after each run (progress printing). */
  onRow?: (row: SweepRow) => void;
}

/** Generates, analyses and judges every case × seed. */
export function runAccuracySweep(options: SweepOptions): SweepRow[] {
  const cases = options.cases ?? accuracyCasesFor(options.drive);
  const rows: SweepRow[] = [];
  for (const c of cases) {
    for (const seed of options.seeds) {
      const capture = generateCapture({
        ...c.options, drive: options.drive, seed,
        durationS: options.durationS ?? c.options.durationS ?? 4, sampleRateHz: options.sampleRateHz ?? c.options.sampleRateHz ?? 24000,
      });
      const settings = AnalysisSettingsSchema.parse(settingsFromTruth(capture.truth));
      const input = c.via && c.via !== 'memory' ? throughFile(capture.channels, capture.sampleRateHz, c.via) : capture;
      const t0 = performance.now();
      const result = runPipeline({ channels: input.channels, sampleRateHz: input.sampleRateHz }, settings);
      const row: SweepRow = {
        caseName: c.name, seed, outcome: judgeAccuracy(capture.truth, result), pipelineMs: performance.now() - t0,
        warnings: result.warnings.map((w) => w.code),
      };
      rows.push(row);
      options.onRow?.(row);
    }
  }
  return rows;
}

/** Hit rates and rpm errors over a sweep. Rates are fractions of the runs where the check applies. */
export interface SweepSummary {
  runs: number;
  rpmMaxErrorPct: number;
  rpmMeanErrorPct: number;
  rpmOkRate: number;
  orderHitRate: number;
  /** Planted line among the top peaks of any envelope band the pipeline kept, or of the order spectrum. */
  anyBandHitRate: number;
  tickHitRate: number;
  wheelOkRate: number | null;
  allOkRate: number;
}

function rate(flags: boolean[]): number {
  return flags.length === 0 ? 1 : flags.filter(Boolean).length / flags.length;
}

/** Summarises a sweep. */
export function summarizeSweep(rows: readonly SweepRow[]): SweepSummary {
  const errors = rows.map((r) => r.outcome.rpmErrorPct);
  const wheels = rows.flatMap((r) => (r.outcome.wheel ? [r.outcome.wheel.ok] : []));
  return {
    runs: rows.length,
    rpmMaxErrorPct: Math.max(0, ...errors),
    rpmMeanErrorPct: errors.reduce((s, e) => s + e, 0) / Math.max(1, errors.length),
    rpmOkRate: rate(rows.map((r) => r.outcome.rpmOk)),
    orderHitRate: rate(rows.flatMap((r) => (r.outcome.order ? [r.outcome.order.ok] : []))),
    anyBandHitRate: rate(rows.flatMap((r) => (r.outcome.order ? [r.outcome.order.ok || r.outcome.order.anyBandRank >= 0] : []))),
    tickHitRate: rate(rows.flatMap((r) => (r.outcome.tick ? [r.outcome.tick.ok] : []))),
    wheelOkRate: wheels.length > 0 ? rate(wheels) : null,
    allOkRate: rate(rows.map((r) => rowOk(r.outcome))),
  };
}

/** Whether every applicable check of one run passed. */
export function rowOk(o: AccuracyOutcome): boolean {
  return o.rpmOk && (o.order?.ok ?? true) && (o.tick?.ok ?? true) && (o.wheel?.ok ?? true);
}

/** A plain-text table: one line per case (hit counts over its seeds), then the totals. */
export function formatSweepTable(rows: readonly SweepRow[]): string {
  const byCase = new Map<string, SweepRow[]>();
  for (const row of rows) byCase.set(row.caseName, [...(byCase.get(row.caseName) ?? []), row]);
  const pct = (x: number) => `${(100 * x).toFixed(0)} %`;
  const lines = ['case | runs | rpm err max % | order hit | any band | tick hit | wheel ok', '--- | --- | --- | --- | --- | --- | ---'];
  for (const [name, group] of byCase) {
    const s = summarizeSweep(group);
    lines.push(`${name} | ${s.runs} | ${s.rpmMaxErrorPct.toFixed(3)} | ${pct(s.orderHitRate)} | ${pct(s.anyBandHitRate)} | ${pct(s.tickHitRate)} | ${s.wheelOkRate === null ? '—' : pct(s.wheelOkRate)}`);
  }
  const t = summarizeSweep(rows);
  lines.push(`all | ${t.runs} | ${t.rpmMaxErrorPct.toFixed(3)} (mean ${t.rpmMeanErrorPct.toFixed(3)}) | ${pct(t.orderHitRate)} | ${pct(t.anyBandHitRate)} | ${pct(t.tickHitRate)} | ${t.wheelOkRate === null ? '—' : pct(t.wheelOkRate)}`);
  return lines.join('\n');
}
