/**
 * `npm run generate -- --drive <file.json> --out <dir|file.wav|file.csv> [flags]`: writes one
 * generated capture and its truth JSON beside it (same base name, `.json`). The synthesis is
 * shared/synth/generate-capture.ts; this file only parses flags, reads the drive and writes files.
 * Exit 0 on success, 2 on bad input (one line on stderr naming the problem), 1 otherwise.
 */
import { mkdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { basename, dirname, extname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { parseArgs } from 'node:util';
import { parseDriveDocument } from '../shared/schemas/drive';
import { generateCapture } from '../shared/synth/generate-capture';
import { FaultKindSchema, type GenerateOptionsInput } from '../shared/synth/options';
import { RefKindSchema } from '../shared/schemas/analysis-settings';
import { encodeWav } from '../shared/synth/encode-wav';
import { encodeCsv } from '../shared/synth/encode-csv';
import type { CaptureTruth } from '../shared/synth/truth';

/** Output file formats. */
export type OutputFormat = 'wav16' | 'wavf32' | 'csv' | 'csv-ms';

/** A bad flag or value: the CLI prints its message and exits 2. */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}

const FLAGS = {
  drive: { type: 'string' }, out: { type: 'string' }, format: { type: 'string' }, preamble: { type: 'boolean' },
  seed: { type: 'string' }, 'duration-s': { type: 'string' }, 'sample-rate': { type: 'string' }, rpm: { type: 'string' },
  'wander-pct': { type: 'string' }, 'ref-kind': { type: 'string' }, 'ref-per-cycle': { type: 'string' }, wheel: { type: 'string' },
  'wheel-sensor': { type: 'string' }, 'ref-polarity': { type: 'string' }, 'tdc-offset-deg': { type: 'string' }, 'no-ringing': { type: 'boolean' },
  'wasted-spark-ratio': { type: 'string' }, 'wasted-spark-inverted': { type: 'boolean' }, cam: { type: 'boolean' },
  'fault-component': { type: 'string' }, fault: { type: 'string' }, 'fault-amplitude': { type: 'string' }, 'creep-pct': { type: 'string' },
  'rolling-slip-pct': { type: 'string' }, 'snr-db': { type: 'string' }, distractor: { type: 'string' }, 'resonance-hz': { type: 'string' },
  'rpm-end': { type: 'string' }, 'engine-level': { type: 'string' }, 'firing-fluctuation-pct': { type: 'string' },
  'impact-jitter-pct': { type: 'string' }, 'cam-lead-deg': { type: 'string' }, tick: { type: 'string', multiple: true },
  help: { type: 'boolean' },
} as const;

/** What the command line asks for: generator options (drive still a path) and where to write. */
export interface GenerateRequest {
  drivePath: string;
  out: string;
  format: OutputFormat;
  preamble: boolean;
  options: Omit<GenerateOptionsInput, 'drive'>;
}

const USAGE = 'usage: npm run generate -- --drive <engine.json> --out <dir|file.wav|file.csv> [--format wav16|wavf32|csv|csv-ms] [--preamble] '
  + '[--seed N] [--duration-s 10] [--sample-rate 48000] [--rpm 780] [--wander-pct 2] [--ref-kind cyl1|per-rev|per-cylinder|wheel] '
  + '[--ref-per-cycle N] [--wheel 60-2] [--wheel-sensor vr|hall] [--ref-polarity rising|falling] [--tdc-offset-deg 0] [--no-ringing] '
  + '[--wasted-spark-ratio 0.5] [--wasted-spark-inverted] [--cam] [--fault-component <name> --fault shaft|outer_race|inner_race|ball|cage|belt] '
  + '[--fault-amplitude A] [--creep-pct 1] [--rolling-slip-pct 1.5] [--snr-db 6] [--distractor tick-train|clunk] [--resonance-hz 4000] '
  + '[--rpm-end 2500] [--engine-level 1] [--firing-fluctuation-pct 0.3] [--impact-jitter-pct 1] [--cam-lead-deg 30] '
  + '[--tick <cylinder>:<angleDeg>:<amplitude> …]';

/** Parses one --tick value "cylinder:angleDeg:amplitude", e.g. "2:220:0.9". */
function parseTick(value: string): { cylinder: number; angleDeg: number; amplitude: number } {
  const parts = value.split(':').map(Number);
  if (parts.length !== 3 || parts.some((p) => !Number.isFinite(p)) || !Number.isInteger(parts[0]) || parts[0] < 1 || parts[1] < 0 || parts[1] >= 720 || parts[2] < 0) {
    throw new UsageError(`--tick must be <cylinder>:<angle 0–720>:<amplitude ≥ 0>, e.g. 2:220:0.9, got "${value}"`);
  }
  return { cylinder: parts[0], angleDeg: parts[1], amplitude: parts[2] };
}

function num(flag: string, value: string | undefined, integer = false): number | undefined {
  if (value === undefined) return undefined;
  const n = Number(value);
  if (value.trim() === '' || !Number.isFinite(n) || (integer && !Number.isInteger(n))) {
    throw new UsageError(`--${flag} must be ${integer ? 'a whole number' : 'a number'}, got "${value}"`);
  }
  return n;
}

function oneOf<T extends string>(flag: string, value: string | undefined, allowed: readonly T[]): T | undefined {
  if (value === undefined) return undefined;
  if (!(allowed as readonly string[]).includes(value)) throw new UsageError(`--${flag} must be one of ${allowed.join(', ')}, got "${value}"`);
  return value as T;
}

/** Parses the command line (without node and script). Throws UsageError naming the bad flag. */
export function parseGenerateArgs(argv: string[]): GenerateRequest {
  // util.parseArgs reads "-12" after a flag as another flag; join negative numbers to their flag.
  const args: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const name = argv[i].startsWith('--') ? argv[i].slice(2) : '';
    const spec = (FLAGS as Record<string, { type: string }>)[name];
    if (spec?.type === 'string' && i + 1 < argv.length && /^-\d|^-\.\d/.test(argv[i + 1])) {
      args.push(`${argv[i]}=${argv[i + 1]}`);
      i++;
    } else args.push(argv[i]);
  }
  let parsed;
  try {
    parsed = parseArgs({ args, options: FLAGS, allowPositionals: false, strict: true });
  } catch (error) {
    throw new UsageError(`${(error as Error).message.split('\n')[0]}; run with --help for the flags`);
  }
  const v = parsed.values;
  if (!v.drive) throw new UsageError('--drive <engine.json> is required (the drive document of the engine to synthesise)');
  if (!v.out) throw new UsageError('--out <dir|file.wav|file.csv> is required');
  if ((v['fault-component'] === undefined) !== (v.fault === undefined)) {
    throw new UsageError('--fault-component and --fault go together (e.g. --fault-component Alternator --fault outer_race)');
  }
  const ext = extname(v.out).toLowerCase();
  const format = oneOf('format', v.format, ['wav16', 'wavf32', 'csv', 'csv-ms'] as const) ?? (ext === '.csv' ? 'csv' : 'wav16');
  if (ext === '.wav' && format.startsWith('csv')) throw new UsageError(`--out ends in .wav but --format is ${format}`);
  if (ext === '.csv' && format.startsWith('wav')) throw new UsageError(`--out ends in .csv but --format is ${format}`);
  const faultKind = oneOf('fault', v.fault, FaultKindSchema.options);
  const distractor = oneOf('distractor', v.distractor, ['tick-train', 'clunk'] as const);
  const options: GenerateRequest['options'] = {
    seed: num('seed', v.seed, true),
    durationS: num('duration-s', v['duration-s']),
    sampleRateHz: num('sample-rate', v['sample-rate'], true),
    rpm: num('rpm', v.rpm),
    wanderPct: num('wander-pct', v['wander-pct']),
    refKind: oneOf('ref-kind', v['ref-kind'], RefKindSchema.options),
    refPerCycle: num('ref-per-cycle', v['ref-per-cycle'], true),
    wheel: v.wheel,
    wheelSensor: oneOf('wheel-sensor', v['wheel-sensor'], ['vr', 'hall'] as const),
    refPolarity: oneOf('ref-polarity', v['ref-polarity'], ['rising', 'falling'] as const),
    tdcOffsetDeg: num('tdc-offset-deg', v['tdc-offset-deg']),
    ringing: v['no-ringing'] ? false : undefined,
    wastedSparkRatio: num('wasted-spark-ratio', v['wasted-spark-ratio']),
    wastedSparkInverted: v['wasted-spark-inverted'],
    camChannel: v.cam,
    fault: faultKind && v['fault-component'] ? { component: v['fault-component'], fault: faultKind, amplitude: num('fault-amplitude', v['fault-amplitude']) ?? null } : undefined,
    creepPct: num('creep-pct', v['creep-pct']),
    rollingSlipPct: num('rolling-slip-pct', v['rolling-slip-pct']),
    snrDb: num('snr-db', v['snr-db']),
    distractor: distractor ? { kind: distractor } : undefined,
    resonanceHz: num('resonance-hz', v['resonance-hz']),
    rpmEnd: num('rpm-end', v['rpm-end']),
    engineLevel: num('engine-level', v['engine-level']),
    firingFluctuationPct: num('firing-fluctuation-pct', v['firing-fluctuation-pct']),
    impactJitterPct: num('impact-jitter-pct', v['impact-jitter-pct']),
    camLeadDeg: num('cam-lead-deg', v['cam-lead-deg']),
    injectorTicks: v.tick ? v.tick.map(parseTick) : undefined,
  };
  for (const key of Object.keys(options) as Array<keyof typeof options>) if (options[key] === undefined) delete options[key];
  return { drivePath: v.drive, out: v.out, format, preamble: v.preamble === true, options };
}

/** Bytes or text of the capture in the asked format; WAV channels scaled to 0.9 of full scale (scales go into the truth). */
export function encodeCapture(channels: Float32Array[], sampleRateHz: number, truth: CaptureTruth, format: OutputFormat, preamble: boolean): Uint8Array | string {
  if (format === 'csv' || format === 'csv-ms') {
    return encodeCsv(channels, sampleRateHz, {
      timeUnit: format === 'csv-ms' ? 'ms' : 's',
      preamble: preamble ? [`Crankwise generated capture (synthetic, invented engine "${truth.drive}")`, `seed ${truth.seed}, ${sampleRateHz} Hz, ${truth.durationS} s`] : undefined,
      separator: preamble ? ';' : ',',
      decimalComma: preamble,
      names: truth.channels,
      units: preamble ? truth.channels.map((c) => (c === 'pickup' ? 'g' : 'V')) : undefined,
    });
  }
  const scaled = channels.map((channel, i) => {
    let peak = 0;
    for (let k = 0; k < channel.length; k++) peak = Math.max(peak, Math.abs(channel[k]));
    const gain = peak > 0 ? 0.9 / peak : 1;
    truth.channelScale[i] = 1 / gain;
    return Float32Array.from(channel, (x) => x * gain);
  });
  return encodeWav(scaled, sampleRateHz, format === 'wav16' ? 'pcm16' : 'float32');
}

function outputPath(out: string, format: OutputFormat, drive: string, seed: number): string {
  const ext = format.startsWith('csv') ? '.csv' : '.wav';
  let isDir = extname(out) === '';
  try { isDir = statSync(out).isDirectory(); } catch { /* not there yet: decided by the extension */ }
  if (!isDir) return out;
  const slug = drive.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'capture';
  return join(out, `${slug}-seed${seed}${ext}`);
}

const OPTION_FLAGS: Record<string, string> = {
  seed: 'seed', durationS: 'duration-s', sampleRateHz: 'sample-rate', rpm: 'rpm', wanderPct: 'wander-pct', refKind: 'ref-kind',
  refPerCycle: 'ref-per-cycle', wheel: 'wheel', tdcOffsetDeg: 'tdc-offset-deg', wastedSparkRatio: 'wasted-spark-ratio',
  'fault.amplitude': 'fault-amplitude', creepPct: 'creep-pct', rollingSlipPct: 'rolling-slip-pct', snrDb: 'snr-db', resonanceHz: 'resonance-hz',
  rpmEnd: 'rpm-end', engineLevel: 'engine-level', firingFluctuationPct: 'firing-fluctuation-pct', impactJitterPct: 'impact-jitter-pct',
  camLeadDeg: 'cam-lead-deg',
};

/** Names the flag instead of the option key in a generator error ("generator option rpm: …" → "--rpm: …"). */
function flagNames(message: string): string {
  return message.replace(/^generator option ([\w.]+):/, (whole, key: string) => (OPTION_FLAGS[key] ? `--${OPTION_FLAGS[key]}:` : whole));
}

/** Runs the command; returns the exit code. */
export function main(argv: string[]): number {
  if (argv.includes('--help') || argv.includes('-h')) {
    process.stdout.write(`${USAGE}\n`);
    return 0;
  }
  try {
    const request = parseGenerateArgs(argv);
    let json: unknown;
    try {
      json = JSON.parse(readFileSync(request.drivePath, 'utf8'));
    } catch (error) {
      throw new UsageError(`cannot read the drive document ${request.drivePath}: ${(error as Error).message.split('\n')[0]}`);
    }
    let drive;
    try {
      drive = parseDriveDocument(json);
    } catch (error) {
      throw new UsageError(`${request.drivePath}: ${(error as Error).message}`);
    }
    let capture;
    try {
      capture = generateCapture({ ...request.options, drive });
    } catch (error) {
      if (error instanceof RangeError) throw new UsageError(flagNames(error.message));
      throw error;
    }
    const file = outputPath(request.out, request.format, drive.name, capture.truth.seed);
    const content = encodeCapture(capture.channels, capture.sampleRateHz, capture.truth, request.format, request.preamble);
    mkdirSync(dirname(file), { recursive: true });
    const truthFile = join(dirname(file), `${basename(file, extname(file))}.json`);
    writeFileSync(file, content);
    writeFileSync(truthFile, `${JSON.stringify(capture.truth, null, 2)}\n`);
    process.stdout.write(`wrote ${file} and ${truthFile}\n`);
    return 0;
  } catch (error) {
    if (error instanceof UsageError) {
      process.stderr.write(`generate: ${error.message}\n`);
      return 2;
    }
    process.stderr.write(`generate: ${(error as Error).stack ?? String(error)}\n`);
    return 1;
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  process.exitCode = main(process.argv.slice(2));
}
