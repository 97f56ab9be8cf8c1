/**
 * Scores the ranking on a folder of real recordings: each recording is a
 * two-channel WAV (channel 1 the reference, channel 2 the pickup) listed in a truth file of the
 * open-data kit's `cwru-dev` format: a JSON array of `{ file, record, sampleRateHz, rpm,
 * component, fault, order, channelScale? }`, where a healthy baseline has `component` and `fault`
 * null. Every recording is analysed through the shared pipeline with the drive document and the
 * settings the kit names (`--ref-per-cycle 2 --cylinders 4`: one pulse per revolution, the
 * cylinder count only sets which orders count as engine-synchronous), and judged by
 * shared/ranking/judge-ranking.ts. A healthy baseline passes when no entry scores above
 * `HEALTHY_MAX_SCORE`.
 *
 * Used by `npm run accuracy -- --data DIR` and by the open-data fixture test.
 */
import { createReadStream, existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { z } from 'zod';
import { parseCaptureStream } from '../shared/formats/parse-capture-stream';
import { runPipeline } from '../shared/analysis/pipeline';
import { resolveSettings } from '../shared/analysis/resolve-settings';
import { rankCapture } from '../shared/ranking/rank-capture';
import { judgeRanking } from '../shared/ranking/judge-ranking';
import type { RankingEntry } from '../shared/analysis/types';
import type { DriveDocument } from '../shared/drive/types';

/** Highest score any entry may reach on a healthy baseline. */
export const HEALTHY_MAX_SCORE = 0.3;

const FaultSchema = z.enum(['shaft', 'outer_race', 'inner_race', 'ball', 'cage', 'belt']);

/** One row of a `cwru-dev`-format truth file. */
export const TruthRowSchema = z.object({
  file: z.string().min(1).max(260),
  record: z.number().int().optional(),
  sampleRateHz: z.number().positive().optional(),
  rpm: z.number().positive().optional(),
  component: z.string().min(1).max(200).nullable(),
  fault: FaultSchema.nullable(),
  order: z.number().positive().nullable().optional(),
  channelScale: z.array(z.number().finite()).max(8).optional(),
});
export type TruthRow = z.infer<typeof TruthRowSchema>;

/** The verdict on one recording. */
export interface RecordingVerdict {
  row: TruthRow;
  /** 'healthy' for a baseline, else the fault kind. */
  kind: string;
  ok: boolean;
  partPlace: number;
  first: { component: string; fault: string; score: number } | null;
  ranking: RankingEntry[];
}

/** Reads and checks a truth file; throws an Error naming the file and the first bad row. */
export function readTruth(path: string): TruthRow[] {
  let json: unknown;
  try {
    json = JSON.parse(readFileSync(path, 'utf8'));
  } catch (e) {
    throw new Error(`${path}: not readable JSON (${(e as Error).message}); give a truth file in the cwru-dev format`);
  }
  const parsed = z.array(TruthRowSchema).max(10_000).safeParse(json);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new Error(`${path}: row ${String(issue.path[0])} field ${issue.path.slice(1).join('.') || '(row)'}: ${issue.message}`);
  }
  return parsed.data;
}

/** Analyses and judges one recording of a truth file found in `dir`. */
export async function scoreRecording(dir: string, row: TruthRow, drive: DriveDocument): Promise<RecordingVerdict> {
  const path = join(dir, row.file);
  if (!existsSync(path)) throw new Error(`${path}: listed in the truth file but missing; copy the recording beside its truth file`);
  const capture = await parseCaptureStream(createReadStream(path, { highWaterMark: 1 << 20 }), { name: row.file });
  const settings = resolveSettings({ refPerCycle: 2, cylinders: 4, refChannel: 1, pickupChannel: 2, channelScales: row.channelScale ?? [] }, drive);
  const result = runPipeline(capture, settings, { rank: (input) => rankCapture(drive, input) });
  const ranking = result.ranking;
  const first = ranking[0] ? { component: ranking[0].component, fault: ranking[0].fault, score: ranking[0].score } : null;
  if (row.component === null || row.fault === null) {
    return { row, kind: 'healthy', ok: !first || first.score <= HEALTHY_MAX_SCORE, partPlace: 0, first, ranking };
  }
  const verdict = judgeRanking(ranking, { component: row.component, fault: row.fault });
  return { row, kind: row.fault, ok: verdict.topPartAndFault, partPlace: verdict.partPlace, first, ranking };
}

/** Summary lines: per fault kind (and the healthy baseline) how many were ranked right. */
export function summarise(verdicts: readonly RecordingVerdict[]): string[] {
  const kinds = [...new Set(verdicts.map((v) => v.kind))];
  const lines = ['fault kind | recordings | part + fault first', '--- | --- | ---'];
  for (const kind of kinds) {
    const of = verdicts.filter((v) => v.kind === kind);
    const label = kind === 'healthy' ? `healthy (nothing above ${HEALTHY_MAX_SCORE})` : kind.replace('_', ' ');
    lines.push(`${label} | ${of.length} | ${of.filter((v) => v.ok).length}/${of.length}`);
  }
  const faulty = verdicts.filter((v) => v.kind !== 'healthy');
  lines.push(`all faulty | ${faulty.length} | ${faulty.filter((v) => v.ok).length}/${faulty.length}`);
  return lines;
}
