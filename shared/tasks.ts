/**
 * The worker task map (DEVELOPERS.md "Workers and the job runner"): each task's name with its input and output types. The
 * piscina entry points (workers/analysis.ts) declare their handlers with
 * `satisfies TaskHandlers<TaskMap>` and server/pool.ts's `runTask(name, input)` is typed from the
 * same map, so a name or type that drifts fails to compile. Outputs carry long series as float32
 * arrays, moved (not copied) out of the worker: the worker's copies are detached after the move.
 */
import type { AnalysisSettingsInput } from './schemas/analysis-settings';
import type { DriveDocument } from './drive/types';
import type { RankingEntry } from './analysis/types';

/** Analyse one stored capture file. */
export interface AnalyzeFileInput {
  /** Path of the capture on disk (WAV or CSV); read by an fs stream in the worker. */
  path: string;
  /** Partial settings; the schema fills in defaults and the drive document cylinders/firing order. */
  settings: AnalysisSettingsInput;
  /** Drive document for the ranking (null/absent: ranking []). */
  drive?: DriveDocument | null;
  /** Name used in error messages (the original upload name); defaults to the file name. */
  name?: string;
}

/** An order spectrum as float32 bins (bin k at order k·resolution). */
export interface SpectrumSeries {
  resolution: number;
  /** Block layout behind the spectrum (the stored spectra are re-ranked without re-analysing). */
  maxOrder?: number;
  samplesPerRev?: number;
  revsPerBlock?: number;
  blocks?: number;
  amplitude: Float32Array;
  floor: Float32Array;
}

/** The long series of one analysis, for the LONGBLOB columns and the plots. */
export interface AnalysisSeries {
  orders: SpectrumSeries;
  /** One per envelope band, best first. */
  envelopes: (SpectrumSeries & { bandHz: [number, number] })[];
  spectrogram: { frames: number; bins: number; binWidthHz: number; hopS: number; startS: number; amplitude: Float32Array; rpm: Float32Array };
  rpm: { timeS: Float32Array; rpm: Float32Array };
  cycle: { averageDeg: Float32Array; rmsDeg: Float32Array };
  /** Order map of a speed sweep (issue 20 item 5: order tracks), when the speed spanned ≥ 1.2×. */
  orderMap?: { resolution: number; bins: number; rows: number; rpm: Float32Array; amplitude: Float32Array };
}

export interface AnalyzeFileOutput {
  /** Exactly the `analyze --json` object (shared/analysis/analyze-json.ts). */
  summary: Record<string, unknown>;
  /** The ranking with its matched lines (for Findings). */
  ranking: RankingEntry[];
  series: AnalysisSeries;
  /** What a later re-rank over the stored spectra needs besides them (shared/analysis/types.ts RankingInput). */
  rankingContext?: { cylinders: number; cyclesAveraged: number; meanRpm: number; envelopeScores: number[] };
}

/** The pickup channel of a capture as a 48 kHz 16-bit mono WAV for listening (issue 15 item 7). */
export interface PickupAudioInput {
  path: string;
  /** 1-based channel of the pickup. */
  channel: number;
  name?: string;
}

export interface PickupAudioOutput {
  /** The whole WAV file. */
  wav: Uint8Array;
}

/** Task name → input and output. */
export interface TaskMap {
  analyzeFile: { input: AnalyzeFileInput; output: AnalyzeFileOutput };
  pickupAudio: { input: PickupAudioInput; output: PickupAudioOutput };
}

export type TaskName = keyof TaskMap;

/** A handler object for a task map: one async function per task. */
export type TaskHandlers<M> = {
  [K in keyof M]: M[K] extends { input: infer I; output: infer O } ? (input: I) => Promise<O> : never;
};

/**
 * A failed task as the worker reports it: stable `code` (a CaptureFormatError /
 * AnalysisInputError code, `validation_failed` for settings, `internal_error` otherwise) and a
 * message for the technician. Errors crossing the thread boundary keep their message, so the
 * worker encodes the code in it as "[code] message"; `parseTaskError` decodes it.
 */
export interface TaskError { code: string; message: string }

/** Encodes a task error into an Error message that survives the worker boundary. */
export function encodeTaskError(e: TaskError): string {
  return `[${e.code}] ${e.message}`;
}

/** Decodes an error from a worker into { code, message } (internal_error when not encoded). */
export function parseTaskError(err: unknown): TaskError {
  const message = err instanceof Error ? err.message : String(err);
  const m = /^\[([a-z_]+)\] ([\s\S]*)$/.exec(message);
  return m ? { code: m[1], message: m[2] } : { code: 'internal_error', message };
}
