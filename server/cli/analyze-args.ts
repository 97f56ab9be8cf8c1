import { parseArgs } from 'node:util';
import { type AnalysisSettingsInput } from '../../shared/schemas/analysis-settings';

/**
 * Command-line flags of `analyze` → a partial settings object (every field optional; the schema
 * fills in defaults, the drive document fills in cylinders and firing order where no flag gave
 * them). One flag per settings field; options may come before or after the capture path.
 */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}

/** Settings field → flag, for error messages that name what the user typed. */
export const FLAG_OF_FIELD: Record<string, string> = {
  refChannel: '--ref-channel', pickupChannel: '--pickup-channel', camChannel: '--cam-channel', refKind: '--ref-kind',
  refPerCycle: '--ref-per-cycle', wheel: '--wheel', refPolarity: '--ref-polarity', tdcOffsetDeg: '--tdc-offset-deg',
  cylinders: '--cylinders', firingOrder: '--firing-order', maxOrder: '--max-order', samplesPerRev: '--samples-per-rev',
  revsPerBlock: '--revs-per-block', envelopeBand: '--envelope-band', envelopeMaxHz: '--envelope-max-hz', timeUnit: '--time-unit',
  channelScales: '--channel-scales', minRpm: '--min-rpm', maxRpm: '--max-rpm',
  speedSource: '--speed-source', expectedRpm: '--expected-rpm',
};

export interface AnalyzeArgs {
  capture: string;
  drive: string | null;
  json: boolean;
  settings: AnalysisSettingsInput;
}

export const USAGE = `usage: npm run --silent analyze -- <capture.wav|.csv> [--drive engine.json] [--ref-channel 1] [--pickup-channel 2]
  [--cam-channel 3] [--ref-kind cyl1|per-rev|per-cylinder|wheel] [--ref-per-cycle N] [--wheel 60-2]
  [--ref-polarity rising|falling|auto] [--tdc-offset-deg 0] [--cylinders 4] [--firing-order 1-3-4-2]
  [--max-order 100] [--samples-per-rev 256] [--revs-per-block 32] [--envelope-band auto|LO-HI]
  [--envelope-max-hz 9000] [--time-unit s|ms|us] [--channel-scales 1,1] [--min-rpm 300] [--max-rpm 8000]
  [--speed-source reference|pickup] [--expected-rpm 800] [--json]`;

function num(flag: string, v: string): number {
  const x = Number(v);
  if (v.trim() === '' || !Number.isFinite(x)) throw new UsageError(`${flag} needs a number, got "${v}"`);
  return x;
}

function int(flag: string, v: string): number {
  const x = num(flag, v);
  if (!Number.isInteger(x)) throw new UsageError(`${flag} needs a whole number, got "${v}"`);
  return x;
}

/** A value that starts with a minus sign: a negative number or a list that starts with one. */
const NEGATIVE_VALUE = /^-(\d|\.\d)/;

/**
 * Joins `--flag -30` into `--flag=-30` for flags that take a value: util.parseArgs refuses a value
 * that starts with "-" as ambiguous, yet a TDC offset before the reference edge or an inverting
 * channel scale is negative.
 */
function joinNegativeValues(argv: string[], valued: ReadonlySet<string>): string[] {
  const out: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    const next = argv[i + 1];
    if (a.startsWith('--') && !a.includes('=') && valued.has(a.slice(2)) && next !== undefined && NEGATIVE_VALUE.test(next)) {
      out.push(`${a}=${next}`);
      i++;
    } else {
      out.push(a);
    }
  }
  return out;
}

/** Parses argv (without node and script) into the capture path, flags and partial settings. */
export function parseAnalyzeArgs(argv: string[]): AnalyzeArgs {
  const str = { type: 'string' as const };
  const valued = new Set(['drive', ...Object.values(FLAG_OF_FIELD).map((f) => f.slice(2))]);
  let parsed;
  try {
    parsed = parseArgs({
      args: joinNegativeValues(argv, valued),
      allowPositionals: true,
      strict: true,
      options: {
        drive: str, json: { type: 'boolean' }, help: { type: 'boolean', short: 'h' },
        'ref-channel': str, 'pickup-channel': str, 'cam-channel': str, 'ref-kind': str, 'ref-per-cycle': str, wheel: str,
        'ref-polarity': str, 'tdc-offset-deg': str, cylinders: str, 'firing-order': str, 'max-order': str,
        'samples-per-rev': str, 'revs-per-block': str, 'envelope-band': str, 'envelope-max-hz': str, 'time-unit': str,
        'channel-scales': str, 'min-rpm': str, 'max-rpm': str, 'speed-source': str, 'expected-rpm': str,
      },
    });
  } catch (e) {
    throw new UsageError(`${(e as Error).message.split('\n')[0]} (run with --help for the flags)`);
  }
  const v = parsed.values;
  if (v.help) throw new UsageError(USAGE);
  if (parsed.positionals.length !== 1) {
    throw new UsageError(parsed.positionals.length === 0 ? 'give the capture file to analyse (a .wav or .csv path)' : `one capture file at a time, got ${parsed.positionals.length}: ${parsed.positionals.join(' ')}`);
  }
  const s: AnalysisSettingsInput = {};
  if (v['ref-channel'] !== undefined) s.refChannel = int('--ref-channel', v['ref-channel']);
  if (v['pickup-channel'] !== undefined) s.pickupChannel = int('--pickup-channel', v['pickup-channel']);
  if (v['cam-channel'] !== undefined) s.camChannel = v['cam-channel'] === 'none' ? null : int('--cam-channel', v['cam-channel']);
  if (v['ref-kind'] !== undefined) s.refKind = v['ref-kind'] as AnalysisSettingsInput['refKind'];
  if (v['ref-per-cycle'] !== undefined) s.refPerCycle = int('--ref-per-cycle', v['ref-per-cycle']);
  if (v.wheel !== undefined) { s.wheel = v.wheel; if (v['ref-kind'] === undefined) s.refKind = 'wheel'; }
  if (v['ref-polarity'] !== undefined) s.refPolarity = v['ref-polarity'] as AnalysisSettingsInput['refPolarity'];
  if (v['tdc-offset-deg'] !== undefined) s.tdcOffsetDeg = num('--tdc-offset-deg', v['tdc-offset-deg']);
  if (v.cylinders !== undefined) s.cylinders = int('--cylinders', v.cylinders);
  if (v['firing-order'] !== undefined) {
    const parts = v['firing-order'].split(/[-,\s]+/).filter(Boolean);
    s.firingOrder = parts.map((p) => int('--firing-order', p));
  }
  if (v['max-order'] !== undefined) s.maxOrder = num('--max-order', v['max-order']);
  if (v['samples-per-rev'] !== undefined) s.samplesPerRev = int('--samples-per-rev', v['samples-per-rev']);
  if (v['revs-per-block'] !== undefined) s.revsPerBlock = int('--revs-per-block', v['revs-per-block']);
  if (v['envelope-band'] !== undefined) {
    const b = v['envelope-band'];
    if (b === 'auto') s.envelopeBand = 'auto';
    else {
      const m = /^\s*([\d.]+)\s*(?:-|\.\.|,|:)\s*([\d.]+)\s*$/.exec(b);
      if (!m) throw new UsageError(`--envelope-band needs "auto" or LO-HI in Hz (e.g. 2000-4000), got "${b}"`);
      s.envelopeBand = [num('--envelope-band', m[1]), num('--envelope-band', m[2])];
    }
  }
  if (v['envelope-max-hz'] !== undefined) s.envelopeMaxHz = num('--envelope-max-hz', v['envelope-max-hz']);
  if (v['time-unit'] !== undefined) s.timeUnit = v['time-unit'] as AnalysisSettingsInput['timeUnit'];
  if (v['channel-scales'] !== undefined) s.channelScales = v['channel-scales'].split(',').map((p) => num('--channel-scales', p));
  if (v['min-rpm'] !== undefined) s.minRpm = num('--min-rpm', v['min-rpm']);
  if (v['max-rpm'] !== undefined) s.maxRpm = num('--max-rpm', v['max-rpm']);
  if (v['speed-source'] !== undefined) s.speedSource = v['speed-source'] as AnalysisSettingsInput['speedSource'];
  if (v['expected-rpm'] !== undefined) s.expectedRpm = num('--expected-rpm', v['expected-rpm']);
  return { capture: parsed.positionals[0], drive: v.drive ?? null, json: v.json === true, settings: s };
}
