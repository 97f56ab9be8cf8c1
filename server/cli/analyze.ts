import { createReadStream } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { basename } from 'node:path';
import { parseCaptureStream } from '../../shared/formats/parse-capture-stream';
import { CaptureFormatError } from '../../shared/formats/capture-format-error';
import { AnalysisInputError } from '../../shared/analysis/analysis-input-error';
import { runPipeline } from '../../shared/analysis/pipeline';
import { toAnalyzeJson } from '../../shared/analysis/analyze-json';
import { resolveSettings } from '../../shared/analysis/resolve-settings';
import { type AnalysisResult, type RankingEntry, type RankingInput } from '../../shared/analysis/types';
import { type DriveDocument } from '../../shared/drive/types';
import { FLAG_OF_FIELD, parseAnalyzeArgs, UsageError } from './analyze-args';
import { formatSummary, plainOptionError, type FitsDrive } from './format-summary';

/**
 * `npm run --silent analyze -- <capture> [flags]`: streams the capture through the shared reader,
 * runs the shared pipeline (the same code as the workers) and prints a short summary, or with
 * --json exactly one JSON object (shared/analysis/analyze-json.ts). Exit 0 on success, 2 on bad
 * input (one line on stderr naming the problem and what to do), 1 otherwise.
 */
async function main(argv: string[]): Promise<number> {
  const args = parseAnalyzeArgs(argv);
  let drive: DriveDocument | null = null;
  if (args.drive) drive = await loadDrive(args.drive);
  const settings = resolveSettings(args.settings, drive);
  const t0 = performance.now();
  const capture = await parseCaptureStream(createReadStream(args.capture, { highWaterMark: 1 << 20 }), { name: basename(args.capture), timeUnit: settings.timeUnit });
  const readMs = performance.now() - t0;
  // The ranking and the drive schema load only when a drive document is given (startup time counts).
  const rankCapture = drive ? (await import('../../shared/ranking/rank-capture')).rankCapture : null;
  const rank = drive && rankCapture ? (input: RankingInput): RankingEntry[] => rankCapture(drive!, input) : undefined;
  const result: AnalysisResult = runPipeline(capture, settings, { drive: drive ?? undefined, rank, notes: capture.notes, readMs });
  if (args.json) process.stdout.write(`${JSON.stringify(toAnalyzeJson(result))}\n`);
  else process.stdout.write(formatSummary(result, basename(args.capture), drive ? await fitsDrive(drive, result) : undefined));
  return 0;
}

/**
 * Whether a line fits a candidate window of the drive (windows widened by the spectrum's
 * resolution). Any spectrum counts: a part's shaft line often shows in the envelope too.
 */
async function fitsDrive(drive: DriveDocument, result: AnalysisResult): Promise<FitsDrive> {
  const { candidateLines } = await import('../../shared/drive/candidate-lines');
  const candidates = candidateLines(drive, { resolution: { orders: result.orders.spectrum.resolution, envelope: result.envelope.resolution } });
  return (order) => candidates.some((c) => c.lines.some((l) => order >= l.window[0] && order <= l.window[1]));
}

async function loadDrive(path: string): Promise<DriveDocument> {
  const { DriveDocumentError, parseDriveDocument } = await import('../../shared/schemas/drive');
  const text = await readFile(path, 'utf8');
  let json: unknown;
  try { json = JSON.parse(text); } catch (e) {
    throw new UsageError(`drive document ${basename(path)} is not valid JSON (${(e as Error).message}); fix the file or export it again from the Drive library`);
  }
  try {
    return parseDriveDocument(json);
  } catch (e) {
    if (e instanceof DriveDocumentError && e.issues.length > 0) {
      const first = e.issues[0];
      const { describeDrivePath } = await import('../../shared/schemas/drive');
      throw new UsageError(`engine file ${basename(path)}, ${describeDrivePath(first.path, json)}: ${first.message}${e.issues.length > 1 ? ` (and ${e.issues.length - 1} more problem${e.issues.length > 2 ? 's' : ''})` : ''}`);
    }
    throw e;
  }
}

/** One line for stderr and the exit code for an error. */
export function describeError(e: unknown): { code: number; line: string } {
  const err = e as { code?: string; message?: string; path?: string; issues?: { path: PropertyKey[]; message: string }[] };
  if (e instanceof UsageError) return { code: 2, line: e.message };
  if (e instanceof CaptureFormatError || e instanceof AnalysisInputError) return { code: 2, line: `${e.message} [${e.code}]` };
  if (err && (err.code === 'ENOENT' || err.code === 'EISDIR' || err.code === 'EACCES')) {
    const what = err.code === 'ENOENT' ? 'no such file' : err.code === 'EISDIR' ? 'is a directory, not a file' : 'cannot be read (permission denied)';
    return { code: 2, line: `${err.path ?? 'file'}: ${what}; check the path` };
  }
  if (err && Array.isArray(err.issues) && err.issues.length > 0 && (e as Error).name === 'ZodError') {
    const i = err.issues[0];
    const field = String(i.path[0] ?? '');
    return { code: 2, line: plainOptionError(FLAG_OF_FIELD[field] ?? field, i as Parameters<typeof plainOptionError>[1]) };
  }
  return { code: 1, line: `analyze failed: ${(err?.message ?? String(e)).split('\n')[0]}` };
}

main(process.argv.slice(2)).then(
  (code) => { process.exitCode = code; },
  (e) => {
    const { code, line } = describeError(e);
    process.stderr.write(`${line}\n`);
    if (code === 1 && process.env.CRANKWISE_DEBUG) process.stderr.write(`${(e as Error).stack}\n`);
    process.exitCode = code;
  },
);
